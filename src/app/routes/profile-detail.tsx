import { useState } from 'react';
import { Link, useParams } from 'react-router-dom';
import { Button } from '../../components/ui/button.tsx';
import { PageHeader } from '../../components/ui/page-header.tsx';
import { QueryState } from '../../components/ui/query-state.tsx';
import { SafetyNotice } from '../../components/ui/safety-notice.tsx';
import { useArchiveProfile } from '../../features/profiles/api/archive-profile.ts';
import { useProfile } from '../../features/profiles/api/get-profile.ts';
import { ParameterTable } from '../../features/profiles/components/parameter-table.tsx';
import { ProfileForm } from '../../features/profiles/components/profile-form.tsx';
import { VersionCompare } from '../../features/profiles/components/version-compare.tsx';
import { VersionTable } from '../../features/profiles/components/version-table.tsx';
import { WhatIfPanel } from '../../features/profiles/components/what-if-panel.tsx';
import { useSites } from '../../features/sites/api/get-sites.ts';
import { useOrg } from '../org-context.ts';

export default function ProfileDetailRoute() {
  const { orgId, role } = useOrg();
  const { profileId = '' } = useParams();
  const profile = useProfile(orgId, profileId);
  const sites = useSites(orgId);
  const archive = useArchiveProfile(orgId, profileId);
  const [editing, setEditing] = useState(false);
  const [message, setMessage] = useState<string | null>(null);
  const editor = role === 'owner' || role === 'manager' || role === 'biologist';

  return (
    <QueryState query={profile}>
      {(data) => {
        const open = editor && !data.archivedAt;
        return (
          <div className="space-y-8">
            <PageHeader title={data.name}>
              <Link to={`/o/${orgId}/profiles`} className="rounded-md border border-tide-700 px-4 py-2 text-sm font-semibold text-tide-700 hover:bg-tide-50">
                All organisms
              </Link>
              {open && !editing && (
                <Button variant="secondary" onClick={() => {
                    setEditing(true);
                    setMessage(null);
                  }}>
                  Edit profile
                </Button>
              )}
              {open && (
                <Button variant="secondary" disabled={archive.isPending} onClick={() => window.confirm(`Archive ${data.name}? Its versions and forecasts are kept.`) && archive.mutate()}>
                  Archive
                </Button>
              )}
            </PageHeader>
            <p className="text-sm">
              <span className="italic">{data.taxon}</span> · version {data.latest.version} {data.latest.used ? '(used by forecasts)' : '(not used yet)'}
              {data.archivedAt && <span className="ml-2 rounded bg-ink-soft px-2 py-0.5 text-xs text-white">archived</span>}
            </p>
            {message && (
              <p role="status" className="rounded-md border border-kelp-500 bg-white p-3 text-sm">
                {message}
              </p>
            )}

            {editing && (
              <section aria-labelledby="edit-heading" className="space-y-4">
                <h2 id="edit-heading" className="text-lg font-bold text-tide-900">Edit profile</h2>
                <ProfileForm key={data.latest.id} orgId={orgId} profile={data} onSaved={(_id, text) => {
                    setEditing(false);
                    setMessage(text);
                  }} />
                <Button variant="secondary" onClick={() => setEditing(false)}>
                  Cancel
                </Button>
              </section>
            )}

            <QueryState query={sites}>{(list) => <WhatIfPanel orgId={orgId} profile={data} sites={list.sites} canSave={open} />}</QueryState>

            <section aria-labelledby="params-heading" className="space-y-3">
              <h2 id="params-heading" className="text-lg font-bold text-tide-900">Version {data.latest.version} parameters</h2>
              <ParameterTable params={data.latest.params} />
              <p className="text-xs text-ink-soft">Ranges and sources: docs/organisms.md.</p>
            </section>

            <section aria-labelledby="versions-heading" className="space-y-3">
              <h2 id="versions-heading" className="text-lg font-bold text-tide-900">Versions</h2>
              <VersionTable versions={data.versions} />
            </section>

            {data.versions.length > 1 && (
              <section aria-labelledby="compare-heading" className="space-y-3">
                <h2 id="compare-heading" className="text-lg font-bold text-tide-900">Compare versions</h2>
                <VersionCompare key={data.latest.id} versions={data.versions} />
              </section>
            )}
            <SafetyNotice compact />
          </div>
        );
      }}
    </QueryState>
  );
}
