import { useState } from 'react';
import { useNavigate } from 'react-router-dom';
import { Button } from '../../components/ui/button.tsx';
import { PageHeader } from '../../components/ui/page-header.tsx';
import { QueryState } from '../../components/ui/query-state.tsx';
import { useProfiles } from '../../features/profiles/api/get-profiles.ts';
import { ProfileForm } from '../../features/profiles/components/profile-form.tsx';
import { ProfileList } from '../../features/profiles/components/profile-list.tsx';
import { useOrg } from '../org-context.ts';

const canEditProfiles = (role: string) => role === 'owner' || role === 'manager' || role === 'biologist';

export default function ProfilesRoute() {
  const { orgId, role } = useOrg();
  const profiles = useProfiles(orgId);
  const navigate = useNavigate();
  const [creating, setCreating] = useState(false);
  const editor = canEditProfiles(role);
  return (
    <div className="space-y-6">
      <PageHeader title="Organisms">
        {editor && !creating && <Button onClick={() => setCreating(true)}>New profile</Button>}
      </PageHeader>
      <p className="max-w-3xl text-sm text-ink-soft">
        Each organism profile says how one organism settles, swims and grows. Forecasts record the version they used; a used version is never changed, so edits to it make a new version.
      </p>
      {creating && (
        <section aria-labelledby="new-profile-heading" className="space-y-4">
          <h2 id="new-profile-heading" className="text-lg font-bold text-tide-900">New profile</h2>
          <ProfileForm orgId={orgId} onSaved={(profileId) => navigate(`/o/${orgId}/profiles/${profileId}`)} />
          <Button variant="secondary" onClick={() => setCreating(false)}>
            Cancel
          </Button>
        </section>
      )}
      <QueryState query={profiles}>{(data) => <ProfileList orgId={orgId} profiles={data.profiles} />}</QueryState>
    </div>
  );
}
