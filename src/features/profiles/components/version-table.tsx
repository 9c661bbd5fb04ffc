import type { ProfileVersion } from '../../../../shared/schemas/organism.schema.ts';
import { shortDate } from './format.ts';

/** Every version, newest first. */
export function VersionTable({ versions }: { versions: ProfileVersion[] }) {
  return (
    <div className="overflow-x-auto rounded-lg border border-line bg-white">
      <table className="w-full text-left text-sm">
        <thead className="bg-tide-50 text-ink-soft">
          <tr>
            <th scope="col" className="px-3 py-2">Version</th>
            <th scope="col" className="px-3 py-2">Made</th>
            <th scope="col" className="px-3 py-2">By</th>
            <th scope="col" className="px-3 py-2">State</th>
            <th scope="col" className="px-3 py-2">Note</th>
          </tr>
        </thead>
        <tbody>
          {versions.map((v) => (
            <tr key={v.id} className="border-t border-line align-top">
              <td className="px-3 py-2 font-semibold">v{v.version}</td>
              <td className="px-3 py-2">{shortDate(v.createdAt)}</td>
              <td className="px-3 py-2">{v.createdBy ?? '—'}</td>
              <td className="px-3 py-2">{v.used ? 'used by forecasts (fixed)' : 'not used yet (editable)'}</td>
              <td className="px-3 py-2 text-ink-soft">{v.note || '—'}</td>
            </tr>
          ))}
        </tbody>
      </table>
    </div>
  );
}
