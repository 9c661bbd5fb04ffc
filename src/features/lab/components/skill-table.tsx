import type { Comparison } from '../../../../shared/schemas/lab.schema.ts';
import { metric } from './format.ts';

/** Bias, RMSE and correlation on log10 cells/L, per profile version and overall. */
export function SkillTable({ comparison }: { comparison: Comparison }) {
  const rows = [...comparison.byVersion.map((v) => ({ key: v.profileVersionId, label: `Version ${v.version}`, skill: v.skill })), { key: 'all', label: 'All versions', skill: comparison.overall }];
  return (
    <table className="text-left text-sm" aria-label="Forecast skill">
      <thead>
        <tr className="border-b border-line">
          <th className="px-2 py-1">Profile version</th>
          <th className="px-2 py-1 text-right">Results</th>
          <th className="px-2 py-1 text-right">Bias (log10)</th>
          <th className="px-2 py-1 text-right">RMSE (log10)</th>
          <th className="px-2 py-1 text-right">Correlation</th>
        </tr>
      </thead>
      <tbody>
        {rows.map((r) => (
          <tr key={r.key} className="border-b border-line">
            <th scope="row" className="px-2 py-1 font-normal">{r.label}</th>
            <td className="px-2 py-1 text-right">{r.skill.n}</td>
            <td className="px-2 py-1 text-right">{metric(r.skill.bias)}</td>
            <td className="px-2 py-1 text-right">{metric(r.skill.rmse)}</td>
            <td className="px-2 py-1 text-right">{metric(r.skill.correlation)}</td>
          </tr>
        ))}
      </tbody>
    </table>
  );
}
