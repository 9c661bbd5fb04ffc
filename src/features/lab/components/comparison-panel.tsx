import { useState } from 'react';
import type { Profile } from '../../../../shared/schemas/organism.schema.ts';
import type { Site } from '../../../../shared/schemas/site.schema.ts';
import { QueryState } from '../../../components/ui/query-state.tsx';
import { useComparison } from '../api/get-comparison.ts';
import { cells, depthLabel, inZone } from './format.ts';
import { ScatterPlot } from './scatter-plot.tsx';
import { SkillTable } from './skill-table.tsx';

/** Results against the forecasts current when they were sampled, for one organism profile. */
export function ComparisonPanel({ orgId, profiles, sites }: { orgId: string; profiles: Profile[]; sites: Site[] }) {
  const [profileId, setProfileId] = useState(profiles[0]?.id ?? '');
  const [siteId, setSiteId] = useState('');
  const comparison = useComparison(orgId, profileId, siteId || undefined);
  const zoneOf = new Map(sites.map((s) => [s.id, s.timeZone]));
  return (
    <section aria-labelledby="comparison-heading" className="space-y-3">
      <h2 id="comparison-heading" className="text-lg font-bold text-tide-900">Forecasts against lab counts</h2>
      <div className="flex flex-wrap gap-3">
        <label className="flex flex-col text-sm">
          Organism profile
          <select className="rounded-md border border-line bg-white px-2 py-1" value={profileId} onChange={(e) => setProfileId(e.target.value)}>
            {profiles.map((p) => (
              <option key={p.id} value={p.id}>{p.name}</option>
            ))}
          </select>
        </label>
        <label className="flex flex-col text-sm">
          Site
          <select className="rounded-md border border-line bg-white px-2 py-1" value={siteId} onChange={(e) => setSiteId(e.target.value)}>
            <option value="">All sites</option>
            {sites.map((s) => (
              <option key={s.id} value={s.id}>{s.name}</option>
            ))}
          </select>
        </label>
      </div>
      {!profileId ? (
        <p className="text-sm text-ink-soft">No organism profiles yet.</p>
      ) : (
        <QueryState query={comparison}>
          {(data) => (
            <div className="space-y-4">
              <p className="text-sm text-ink-soft">
                Taxa mapped to this profile: {data.taxa.length ? data.taxa.join(', ') : 'none (map them under “Taxa and organism profiles”)'}. Each result is matched to the forecast that was current when it was sampled: at the bottle's depth, or averaged over the hose's range, interpolated between outputs. {data.censoring}
              </p>
              <div className="flex flex-wrap items-start gap-6">
                <SkillTable comparison={data} />
                <ScatterPlot pairs={data.pairs} />
              </div>
              {data.pairs.length > 0 && (
                <div className="overflow-x-auto">
                  <table className="w-full text-left text-sm">
                    <thead>
                      <tr className="border-b border-line">
                        <th className="px-2 py-1">Sample</th>
                        <th className="px-2 py-1">Site</th>
                        <th className="px-2 py-1">Sampled (site time)</th>
                        <th className="px-2 py-1">Depth below surface</th>
                        <th className="px-2 py-1 text-right">Observed cells/L</th>
                        <th className="px-2 py-1 text-right">Forecast cells/L</th>
                        <th className="px-2 py-1">Forecast</th>
                      </tr>
                    </thead>
                    <tbody>
                      {data.pairs.map((p) => (
                        <tr key={p.resultId} className="border-b border-line">
                          <td className="px-2 py-1">{p.sampleId}</td>
                          <td className="px-2 py-1">{p.siteName}</td>
                          <td className="px-2 py-1">{inZone(p.sampledAt, zoneOf.get(p.siteId) ?? 'UTC')}</td>
                          <td className="px-2 py-1">{depthLabel(p.depthTopM, p.depthBottomM)} ({p.method})</td>
                          <td className="px-2 py-1 text-right">{p.belowDetection ? `< ${cells(p.detectionLimit)}` : cells(p.observed)}</td>
                          <td className="px-2 py-1 text-right">{cells(p.forecast)}</td>
                          <td className="px-2 py-1 text-xs">
                            {p.forecast === null ? 'none covers this time' : `version ${p.version}${p.forecastMadeAfterSample ? ', made after the sample' : ''}`}
                          </td>
                        </tr>
                      ))}
                    </tbody>
                  </table>
                </div>
              )}
            </div>
          )}
        </QueryState>
      )}
    </section>
  );
}
