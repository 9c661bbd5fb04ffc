import { Link } from 'react-router-dom';
import type { Profile } from '../../../../shared/schemas/organism.schema.ts';
import { figure } from './format.ts';

export function ProfileList({ orgId, profiles }: { orgId: string; profiles: Profile[] }) {
  if (profiles.length === 0) return <p className="text-sm text-ink-soft">No organism profiles yet.</p>;
  return (
    <div className="overflow-x-auto rounded-lg border border-line bg-white">
      <table className="w-full text-left text-sm">
        <thead className="bg-tide-50 text-ink-soft">
          <tr>
            <th scope="col" className="px-3 py-2">Profile</th>
            <th scope="col" className="px-3 py-2">Taxon</th>
            <th scope="col" className="px-3 py-2">Version</th>
            <th scope="col" className="px-3 py-2">Settling (m/day)</th>
            <th scope="col" className="px-3 py-2">Swims</th>
            <th scope="col" className="px-3 py-2">Trigger (cells/L)</th>
          </tr>
        </thead>
        <tbody>
          {profiles.map((p) => (
            <tr key={p.id} className="border-t border-line">
              <td className="px-3 py-2">
                <Link to={`/o/${orgId}/profiles/${p.id}`} className="font-semibold text-tide-700 underline">
                  {p.name}
                </Link>
              </td>
              <td className="px-3 py-2 italic">{p.taxon}</td>
              <td className="px-3 py-2">v{p.latest.version}</td>
              <td className="px-3 py-2 tabular-nums">{figure(p.latest.params.settlingVelocityMPerDay)}</td>
              <td className="px-3 py-2">{p.latest.params.swimming ? `${p.latest.params.swimming.speedMPerHour} m/h` : 'no'}</td>
              <td className="px-3 py-2 tabular-nums">{figure(p.latest.params.triggerCellsPerL)}</td>
            </tr>
          ))}
        </tbody>
      </table>
    </div>
  );
}
