import { PageHeader } from '../../components/ui/page-header.tsx';
import { QueryState } from '../../components/ui/query-state.tsx';
import { SafetyNotice } from '../../components/ui/safety-notice.tsx';
import { useLabProfiles } from '../../features/lab/api/get-lab-profiles.ts';
import { useLabSites } from '../../features/lab/api/get-lab-sites.ts';
import { CalibrationPanel } from '../../features/lab/components/calibration-panel.tsx';
import { ComparisonPanel } from '../../features/lab/components/comparison-panel.tsx';
import { ManualEntryForm } from '../../features/lab/components/manual-entry-form.tsx';
import { ResultsTable } from '../../features/lab/components/results-table.tsx';
import { TaxonMapping } from '../../features/lab/components/taxon-mapping.tsx';
import { UploadPanel } from '../../features/lab/components/upload-panel.tsx';
import { useOrg } from '../org-context.ts';

/** The biologist's lab workbench: results in, compared with the forecasts, and calibration. Crew read. */
export default function LabRoute() {
  const { orgId, role } = useOrg();
  const sites = useLabSites(orgId);
  const profiles = useLabProfiles(orgId);
  const canEdit = role === 'owner' || role === 'manager' || role === 'biologist';

  return (
    <QueryState query={sites}>
      {(siteData) => (
        <div className="space-y-8">
          <PageHeader title="Lab results" />
          <p className="text-sm text-ink-soft">Depths in m below the surface; cells per litre; times shown in each site's zone.</p>
          {canEdit ? (
            <section aria-labelledby="add-heading" className="space-y-4">
              <h2 id="add-heading" className="text-lg font-bold text-tide-900">Add results</h2>
              <UploadPanel orgId={orgId} />
              <ManualEntryForm orgId={orgId} sites={siteData.sites} />
            </section>
          ) : (
            <p className="text-sm text-ink-soft">Biologists, managers and owners add results and calibrate; you can read them here.</p>
          )}
          <ResultsTable orgId={orgId} sites={siteData.sites} />
          <QueryState query={profiles}>
            {(profileData) => (
              <>
                <TaxonMapping orgId={orgId} profiles={profileData.profiles} canEdit={canEdit} />
                <ComparisonPanel orgId={orgId} profiles={profileData.profiles} sites={siteData.sites} />
                <CalibrationPanel orgId={orgId} profiles={profileData.profiles} sites={siteData.sites} canEdit={canEdit} />
              </>
            )}
          </QueryState>
          <SafetyNotice compact />
        </div>
      )}
    </QueryState>
  );
}
