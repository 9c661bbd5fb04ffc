import { Link } from 'react-router-dom';
import type { Site } from '../../../../shared/schemas/site.schema.ts';

const fmt = (n: number, digits = 1) => n.toLocaleString('en-GB', { maximumFractionDigits: digits });

export function SiteList({ orgId, sites, canEdit }: { orgId: string; sites: Site[]; canEdit: boolean }) {
  if (sites.length === 0) return <p className="text-ink-soft">No sites yet.{canEdit ? ' Add the first lease with “New site”.' : ''}</p>;
  return (
    <div className="overflow-x-auto rounded-lg border border-line bg-white">
      <table className="w-full text-left text-sm">
        <thead className="bg-tide-50 text-ink-soft">
          <tr>
            <th scope="col" className="px-3 py-2">Site</th>
            <th scope="col" className="px-3 py-2">Position</th>
            <th scope="col" className="px-3 py-2">Water depth</th>
            <th scope="col" className="px-3 py-2">Gear band (depth below surface)</th>
            <th scope="col" className="px-3 py-2">Time zone</th>
            <th scope="col" className="px-3 py-2"><span className="sr-only">Links</span></th>
          </tr>
        </thead>
        <tbody>
          {sites.map((site) => (
            <tr key={site.id} className="border-t border-line">
              <td className="px-3 py-2 font-semibold">
                {canEdit ? <Link className="text-tide-700 underline" to={`/o/${orgId}/sites/${site.id}/edit`}>{site.name}</Link> : site.name}
                {site.archivedAt && <span className="ml-2 rounded bg-line px-1 text-xs">archived</span>}
              </td>
              <td className="px-3 py-2">{fmt(site.latitudeDeg, 3)}°, {fmt(site.longitudeDeg, 3)}°</td>
              <td className="px-3 py-2">{fmt(site.waterDepthM)} m</td>
              <td className="px-3 py-2">{fmt(site.gearTopM)}–{fmt(site.gearBottomM)} m</td>
              <td className="px-3 py-2">{site.timeZone}</td>
              <td className="space-x-3 px-3 py-2">
                <Link className="text-tide-700 underline" to={`/o/${orgId}/sites/${site.id}/forecast`} aria-label={`Forecast at ${site.name}`}>
                  Forecast
                </Link>
                <Link className="text-tide-700 underline" to={`/o/${orgId}/sites/${site.id}/tides`} aria-label={`Tides at ${site.name}`}>
                  Tides
                </Link>
              </td>
            </tr>
          ))}
        </tbody>
      </table>
    </div>
  );
}
