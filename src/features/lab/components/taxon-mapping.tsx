import { useState } from 'react';
import type { Profile } from '../../../../shared/schemas/organism.schema.ts';
import { Button } from '../../../components/ui/button.tsx';
import { QueryState } from '../../../components/ui/query-state.tsx';
import { useTaxa } from '../api/get-taxa.ts';
import { useSetTaxa } from '../api/set-taxa.ts';

/** Which organism profile each taxon (as the lab writes it) stands for. */
export function TaxonMapping({ orgId, profiles, canEdit }: { orgId: string; profiles: Profile[]; canEdit: boolean }) {
  const taxa = useTaxa(orgId);
  const save = useSetTaxa(orgId);
  const [changes, setChanges] = useState<Record<string, string>>({});
  return (
    <section aria-labelledby="taxa-heading" className="space-y-3">
      <h2 id="taxa-heading" className="text-lg font-bold text-tide-900">Taxa and organism profiles</h2>
      <p className="text-sm text-ink-soft">Results are compared with the forecasts of the profile their taxon is mapped to.</p>
      <QueryState query={taxa}>
        {(data) =>
          data.taxa.length === 0 ? (
            <p className="text-sm text-ink-soft">No taxa yet: upload or enter results first.</p>
          ) : (
            <div className="space-y-2">
              <table className="text-left text-sm">
                <thead>
                  <tr className="border-b border-line">
                    <th className="px-2 py-1">Taxon</th>
                    <th className="px-2 py-1 text-right">Results</th>
                    <th className="px-2 py-1">Organism profile</th>
                  </tr>
                </thead>
                <tbody>
                  {data.taxa.map((t) => (
                    <tr key={t.taxon} className="border-b border-line">
                      <td className="px-2 py-1 italic">{t.taxon}</td>
                      <td className="px-2 py-1 text-right">{t.resultCount}</td>
                      <td className="px-2 py-1">
                        <select
                          aria-label={`Profile for ${t.taxon}`}
                          disabled={!canEdit}
                          className="rounded-md border border-line bg-white px-2 py-1"
                          value={changes[t.taxon] ?? t.profileId ?? ''}
                          onChange={(e) => setChanges((c) => ({ ...c, [t.taxon]: e.target.value }))}
                        >
                          <option value="">— none —</option>
                          {profiles.map((p) => (
                            <option key={p.id} value={p.id}>{p.name}</option>
                          ))}
                        </select>
                      </td>
                    </tr>
                  ))}
                </tbody>
              </table>
              {canEdit && (
                <Button
                  disabled={Object.keys(changes).length === 0 || save.isPending}
                  onClick={() => save.mutate(Object.entries(changes).map(([taxon, profileId]) => ({ taxon, profileId: profileId || null })), { onSuccess: () => setChanges({}) })}
                >
                  Save mapping
                </Button>
              )}
              {save.isSuccess && <p role="status" className="text-sm text-kelp-500">Mapping saved.</p>}
              {save.error && <p role="alert" className="text-sm text-alarm-600">{save.error.message}</p>}
            </div>
          )
        }
      </QueryState>
    </section>
  );
}
