import type { ConstituentSet } from '../../../../shared/schemas/tides.schema.ts';
import { Button } from '../../../components/ui/button.tsx';
import { useActivateConstituentSet } from '../api/activate-constituent-set.ts';
import { siteDate, SOURCE_LABELS } from './format.ts';

/** Every version of the site's constituents, newest first; editors pick the active one. */
export function SetVersions({ orgId, siteId, sets, timeZone, canEdit }: { orgId: string; siteId: string; sets: ConstituentSet[]; timeZone: string; canEdit: boolean }) {
  const activate = useActivateConstituentSet(orgId, siteId);
  if (sets.length === 0) return <p className="text-sm text-ink-soft">No constituent sets yet.</p>;
  return (
    <div className="overflow-x-auto rounded-lg border border-line bg-white">
      <table className="w-full text-left text-sm">
        <thead className="bg-tide-50 text-ink-soft">
          <tr>
            <th scope="col" className="px-3 py-2">Version</th>
            <th scope="col" className="px-3 py-2">Source</th>
            <th scope="col" className="px-3 py-2">Contents</th>
            <th scope="col" className="px-3 py-2">Made ({timeZone})</th>
            <th scope="col" className="px-3 py-2">By</th>
            <th scope="col" className="px-3 py-2"><span className="sr-only">State</span></th>
          </tr>
        </thead>
        <tbody>
          {sets.map((set) => (
            <tr key={set.id} className="border-t border-line align-top">
              <td className="px-3 py-2 font-semibold">v{set.version}</td>
              <td className="px-3 py-2">
                {SOURCE_LABELS[set.source]}
                {set.stationName && <span className="block text-xs text-ink-soft">{set.stationName} ({set.stationId})</span>}
                {set.label && set.source !== 'feed' && <span className="block text-xs text-ink-soft">{set.label}</span>}
              </td>
              <td className="px-3 py-2">
                {set.kind === 'both' ? 'current and level' : set.kind}
                {set.notes && <span className="block text-xs text-ink-soft">{set.notes}</span>}
              </td>
              <td className="px-3 py-2">{siteDate(set.createdAt, timeZone)}</td>
              <td className="px-3 py-2">{set.createdBy?.displayName ?? 'scheduled refresh'}</td>
              <td className="px-3 py-2">
                {set.active ? (
                  <span className="rounded bg-kelp-500 px-2 py-0.5 text-xs font-semibold text-white">active</span>
                ) : (
                  canEdit && (
                    <Button variant="secondary" className="px-2 py-1 text-xs" disabled={activate.isPending} onClick={() => activate.mutate(set.id)}>
                      Make v{set.version} active
                    </Button>
                  )
                )}
              </td>
            </tr>
          ))}
        </tbody>
      </table>
      {activate.error && <p role="alert" className="p-3 text-sm font-semibold text-alarm-600">{activate.error.message}</p>}
    </div>
  );
}
