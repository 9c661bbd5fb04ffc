import { useState } from 'react';
import type { ProfileVersion } from '../../../../shared/schemas/organism.schema.ts';
import { changedParameters, PARAMETERS, parameterValue } from '../../../../shared/schemas/organism-parameters.ts';
import { SelectField } from '../../../components/ui/field.tsx';

/** Two versions side by side; changed values are highlighted and marked. */
export function VersionCompare({ versions }: { versions: ProfileVersion[] }) {
  const [leftId, setLeftId] = useState(versions[1]?.id ?? versions[0]!.id);
  const [rightId, setRightId] = useState(versions[0]!.id);
  const left = versions.find((v) => v.id === leftId) ?? versions[0]!;
  const right = versions.find((v) => v.id === rightId) ?? versions[0]!;
  const changed = new Set(changedParameters(left.params, right.params));
  const pick = (value: string, set: (id: string) => void) => set(value);
  return (
    <div className="space-y-3">
      <div className="grid max-w-xl gap-4 sm:grid-cols-2">
        <SelectField label="Compare version" value={left.id} onChange={(e) => pick(e.target.value, setLeftId)}>
          {versions.map((v) => (
            <option key={v.id} value={v.id}>
              v{v.version}
            </option>
          ))}
        </SelectField>
        <SelectField label="with version" value={right.id} onChange={(e) => pick(e.target.value, setRightId)}>
          {versions.map((v) => (
            <option key={v.id} value={v.id}>
              v{v.version}
            </option>
          ))}
        </SelectField>
      </div>
      <p className="text-sm" data-testid="changed-count">
        {changed.size === 0 ? 'No parameter differs.' : `${changed.size} parameter${changed.size === 1 ? '' : 's'} differ${changed.size === 1 ? 's' : ''}.`}
      </p>
      <div className="overflow-x-auto rounded-lg border border-line bg-white">
        <table className="w-full text-left text-sm">
          <thead className="bg-tide-50 text-ink-soft">
            <tr>
              <th scope="col" className="px-3 py-2">Parameter</th>
              <th scope="col" className="px-3 py-2">v{left.version}</th>
              <th scope="col" className="px-3 py-2">v{right.version}</th>
              <th scope="col" className="px-3 py-2">Unit</th>
            </tr>
          </thead>
          <tbody>
            {PARAMETERS.map((p) => {
              const differs = changed.has(p.key);
              return (
                <tr key={p.key} data-changed={differs} className={`border-t border-line ${differs ? 'bg-ember-100 font-semibold' : ''}`}>
                  <th scope="row" className="px-3 py-2">
                    {p.label}
                    {differs && <span className="ml-2 rounded bg-ember-600 px-1.5 py-0.5 text-xs text-white">changed</span>}
                  </th>
                  <td className="px-3 py-2 tabular-nums">{parameterValue(left.params, p.key)}</td>
                  <td className="px-3 py-2 tabular-nums">{parameterValue(right.params, p.key)}</td>
                  <td className="px-3 py-2">{p.unit}</td>
                </tr>
              );
            })}
            <tr className={`border-t border-line ${left.note !== right.note ? 'bg-ember-100' : ''}`}>
              <th scope="row" className="px-3 py-2">Note</th>
              <td className="px-3 py-2 text-ink-soft">{left.note || '—'}</td>
              <td className="px-3 py-2 text-ink-soft">{right.note || '—'}</td>
              <td />
            </tr>
          </tbody>
        </table>
      </div>
    </div>
  );
}
