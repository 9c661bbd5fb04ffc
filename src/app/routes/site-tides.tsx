import { Link, useParams } from 'react-router-dom';
import { PageHeader } from '../../components/ui/page-header.tsx';
import { QueryState } from '../../components/ui/query-state.tsx';
import { SafetyNotice } from '../../components/ui/safety-notice.tsx';
import { useSite } from '../../features/sites/api/get-site.ts';
import { useConstituentSets } from '../../features/tides/api/get-constituent-sets.ts';
import { useTidePreview } from '../../features/tides/api/get-tide-preview.ts';
import { ConstituentTable } from '../../features/tides/components/constituent-table.tsx';
import { ConstituentUploadForm } from '../../features/tides/components/constituent-upload-form.tsx';
import { FeedStationPicker } from '../../features/tides/components/feed-station-picker.tsx';
import { siteDate, SOURCE_LABELS } from '../../features/tides/components/format.ts';
import { RecordUploadForm } from '../../features/tides/components/record-upload-form.tsx';
import { SetVersions } from '../../features/tides/components/set-versions.tsx';
import { TidePreviewChart } from '../../features/tides/components/tide-preview-chart.tsx';
import { canManage, useOrg } from '../org-context.ts';

export default function SiteTidesRoute() {
  const { orgId, role } = useOrg();
  const { siteId = '' } = useParams();
  const site = useSite(orgId, siteId);
  const sets = useConstituentSets(orgId, siteId);
  const preview = useTidePreview(orgId, siteId);
  const editor = canManage(role);

  return (
    <QueryState query={site}>
      {(siteData) => {
        const zone = siteData.timeZone;
        return (
          <div className="space-y-8">
            <PageHeader title={`Tides at ${siteData.name}`}>
              <Link to={`/o/${orgId}/sites`} className="rounded-md border border-tide-700 px-4 py-2 text-sm font-semibold text-tide-700 hover:bg-tide-50">
                All sites
              </Link>
            </PageHeader>
            <p className="text-sm text-ink-soft">Times in {zone}. Currents are depth-mean, in m/s; levels in m above chart datum.</p>

            <section aria-labelledby="active-heading" className="space-y-3">
              <h2 id="active-heading" className="text-lg font-bold text-tide-900">Active constituents</h2>
              <QueryState query={sets}>
                {(data) => {
                  const active = data.sets.find((s) => s.active);
                  if (!active) return <p className="text-sm text-ink-soft">No active set yet: forecasts for this site need one.{editor ? ' Fetch one from the tide feed or upload a table or a record below.' : ' Ask a manager to add one.'}</p>;
                  return (
                    <>
                      <p className="text-sm">
                        Version {active.version}: {SOURCE_LABELS[active.source]}
                        {active.stationName ? ` (${active.stationName})` : active.label ? ` (${active.label})` : ''}, made {siteDate(active.createdAt, zone)}
                        {active.createdBy ? ` by ${active.createdBy.displayName}` : ''}.
                      </p>
                      <ConstituentTable set={active} />
                    </>
                  );
                }}
              </QueryState>
            </section>

            <section aria-labelledby="preview-heading" className="space-y-3">
              <h2 id="preview-heading" className="text-lg font-bold text-tide-900">Next 7 days</h2>
              <QueryState query={preview}>
                {(data) => (data.preview ? <TidePreviewChart preview={data.preview} timeZone={zone} /> : <p className="text-sm text-ink-soft">No preview without an active set.</p>)}
              </QueryState>
            </section>

            <section aria-labelledby="versions-heading" className="space-y-3">
              <h2 id="versions-heading" className="text-lg font-bold text-tide-900">Versions</h2>
              <QueryState query={sets}>{(data) => <SetVersions orgId={orgId} siteId={siteId} sets={data.sets} timeZone={zone} canEdit={editor} />}</QueryState>
            </section>

            {editor && (
              <section aria-labelledby="new-heading" className="space-y-4">
                <h2 id="new-heading" className="text-lg font-bold text-tide-900">Add constituents</h2>
                <FeedStationPicker orgId={orgId} siteId={siteId} timeZone={zone} />
                <ConstituentUploadForm orgId={orgId} siteId={siteId} />
                <RecordUploadForm orgId={orgId} siteId={siteId} timeZone={zone} />
              </section>
            )}
            <SafetyNotice compact />
          </div>
        );
      }}
    </QueryState>
  );
}
