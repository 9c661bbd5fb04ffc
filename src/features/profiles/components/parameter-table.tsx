import type { OrganismParams } from '../../../../shared/schemas/organism.schema.ts';
import { PARAMETERS, parameterValue } from '../../../../shared/schemas/organism-parameters.ts';

/** A version's parameters with unit, explanation and typical range. */
export function ParameterTable({ params }: { params: OrganismParams }) {
  return (
    <div className="overflow-x-auto rounded-lg border border-line bg-white">
      <table className="w-full text-left text-sm">
        <thead className="bg-tide-50 text-ink-soft">
          <tr>
            <th scope="col" className="px-3 py-2">Parameter</th>
            <th scope="col" className="px-3 py-2">Value</th>
            <th scope="col" className="px-3 py-2">Unit</th>
            <th scope="col" className="px-3 py-2">Typical (source)</th>
          </tr>
        </thead>
        <tbody>
          {PARAMETERS.map((p) => (
            <tr key={p.key} className="border-t border-line align-top">
              <th scope="row" className="px-3 py-2 font-semibold">
                {p.label}
                <span className="block text-xs font-normal text-ink-soft">{p.explanation}</span>
              </th>
              <td className="px-3 py-2 tabular-nums">{parameterValue(params, p.key)}</td>
              <td className="px-3 py-2">{p.unit}</td>
              <td className="px-3 py-2 text-xs text-ink-soft">{p.typical}</td>
            </tr>
          ))}
        </tbody>
      </table>
    </div>
  );
}
