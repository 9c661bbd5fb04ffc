import { useState } from 'react';
import type { Site } from '../../../../shared/schemas/site.schema.ts';
import { QueryState } from '../../../components/ui/query-state.tsx';
import { exportUrl, useResults } from '../api/get-results.ts';
import { cells, depthLabel, inZone } from './format.ts';

/** The organisation's lab results, filtered by site and taxon, with the Darwin Core export of the same filter. */
export function ResultsTable({ orgId, sites }: { orgId: string; sites: Site[] }) {
  const [siteId, setSiteId] = useState('');
  const [taxon, setTaxon] = useState('');
  const filters = { siteId: siteId || undefined, taxon: taxon.trim() || undefined };
  const results = useResults(orgId, filters);
  const zoneOf = new Map(sites.map((s) => [s.id, s.timeZone]));

  return (
    <section aria-labelledby="results-heading" className="space-y-3">
      <div className="flex flex-wrap items-end gap-3">
        <h2 id="results-heading" className="mr-auto text-lg font-bold text-tide-900">Results</h2>
        <label className="flex flex-col text-sm">
          Site
          <select className="rounded-md border border-line bg-white px-2 py-1" value={siteId} onChange={(e) => setSiteId(e.target.value)}>
            <option value="">All sites</option>
            {sites.map((s) => (
              <option key={s.id} value={s.id}>{s.name}</option>
            ))}
          </select>
        </label>
        <label className="flex flex-col text-sm">
          Taxon
          <input className="rounded-md border border-line bg-white px-2 py-1" value={taxon} onChange={(e) => setTaxon(e.target.value)} placeholder="All taxa" />
        </label>
        <a href={exportUrl(orgId, filters)} className="rounded-md border border-tide-700 px-3 py-1.5 text-sm font-semibold text-tide-700 hover:bg-tide-50" download>
          Export (Darwin Core CSV)
        </a>
      </div>
      <QueryState query={results}>
        {(data) =>
          data.results.length === 0 ? (
            <p className="text-sm text-ink-soft">No results yet.</p>
          ) : (
            <div className="overflow-x-auto">
              <table className="w-full text-left text-sm">
                <thead>
                  <tr className="border-b border-line">
                    <th className="px-2 py-1">Sample</th>
                    <th className="px-2 py-1">Site</th>
                    <th className="px-2 py-1">Sampled (site time)</th>
                    <th className="px-2 py-1">Depth below surface</th>
                    <th className="px-2 py-1">Method</th>
                    <th className="px-2 py-1">Taxon</th>
                    <th className="px-2 py-1 text-right">Cells/L</th>
                    <th className="px-2 py-1 text-right">Detection limit</th>
                  </tr>
                </thead>
                <tbody>
                  {data.results.map((r) => (
                    <tr key={r.id} className="border-b border-line">
                      <td className="px-2 py-1">{r.sampleId}</td>
                      <td className="px-2 py-1">{r.siteName}</td>
                      <td className="px-2 py-1">{inZone(r.sampledAt, zoneOf.get(r.siteId) ?? 'UTC')}</td>
                      <td className="px-2 py-1">{depthLabel(r.depthTopM, r.depthBottomM)}</td>
                      <td className="px-2 py-1">{r.method}</td>
                      <td className="px-2 py-1 italic">{r.taxon}</td>
                      <td className="px-2 py-1 text-right">{r.belowDetection ? `< ${cells(r.detectionLimit)}` : cells(r.cellsPerL)}</td>
                      <td className="px-2 py-1 text-right">{cells(r.detectionLimit)}</td>
                    </tr>
                  ))}
                </tbody>
              </table>
            </div>
          )
        }
      </QueryState>
    </section>
  );
}
