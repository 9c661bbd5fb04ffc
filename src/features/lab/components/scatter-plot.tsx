import type { ComparisonPair } from '../../../../shared/schemas/lab.schema.ts';

const SIZE = 320;
const PAD = 48;

/** Forecast against observed cells/L on log axes, with the 1:1 line; values under the detection limit drawn at half the limit, hollow. */
export function ScatterPlot({ pairs }: { pairs: ComparisonPair[] }) {
  const points = pairs
    .filter((p): p is ComparisonPair & { forecast: number } => p.forecast !== null)
    .map((p) => {
      const floor = p.detectionLimit / 2;
      return { id: p.resultId, x: Math.log10(Math.max(p.belowDetection ? floor : p.observed, floor)), y: Math.log10(p.forecast < p.detectionLimit ? floor : p.forecast), hollow: p.belowDetection, label: `${p.sampleId}: observed ${p.observed}, forecast ${Math.round(p.forecast)} cells/L` };
    });
  if (points.length === 0) return <p className="text-sm text-ink-soft">No result has a forecast to compare with yet.</p>;
  const values = points.flatMap((p) => [p.x, p.y]);
  const lo = Math.floor(Math.min(...values));
  const hi = Math.max(lo + 1, Math.ceil(Math.max(...values)));
  const scale = (v: number) => PAD + ((v - lo) / (hi - lo)) * (SIZE - 2 * PAD);
  const ticks = Array.from({ length: hi - lo + 1 }, (_, i) => lo + i);
  return (
    <svg role="img" aria-label={`Forecast against observed, ${points.length} results, log scales, with the 1:1 line`} viewBox={`0 0 ${SIZE} ${SIZE}`} className="w-full max-w-sm">
      <rect x={PAD} y={PAD} width={SIZE - 2 * PAD} height={SIZE - 2 * PAD} fill="white" stroke="var(--color-line)" />
      {ticks.map((t) => (
        <g key={t} className="text-[9px]" fill="var(--color-ink-soft)">
          <line x1={scale(t)} x2={scale(t)} y1={PAD} y2={SIZE - PAD} stroke="var(--color-line)" />
          <line x1={PAD} x2={SIZE - PAD} y1={SIZE - scale(t)} y2={SIZE - scale(t)} stroke="var(--color-line)" />
          <text x={scale(t)} y={SIZE - PAD + 14} textAnchor="middle">10{superscript(t)}</text>
          <text x={PAD - 6} y={SIZE - scale(t) + 3} textAnchor="end">10{superscript(t)}</text>
        </g>
      ))}
      <line x1={scale(lo)} y1={SIZE - scale(lo)} x2={scale(hi)} y2={SIZE - scale(hi)} stroke="var(--color-ink-soft)" strokeDasharray="4 3" />
      <text x={scale(hi) - 4} y={SIZE - scale(hi) + 12} textAnchor="end" className="text-[9px]" fill="var(--color-ink-soft)">1:1</text>
      {points.map((p) => (
        <circle key={p.id} cx={scale(p.x)} cy={SIZE - scale(p.y)} r={4} fill={p.hollow ? 'white' : 'var(--color-ramp-2)'} stroke="var(--color-ramp-2)" strokeWidth={1.5}>
          <title>{p.label}</title>
        </circle>
      ))}
      <text x={SIZE / 2} y={SIZE - 8} textAnchor="middle" className="text-[10px]" fill="var(--color-ink)">Observed (cells/L)</text>
      <text x={12} y={SIZE / 2} textAnchor="middle" transform={`rotate(-90 12 ${SIZE / 2})`} className="text-[10px]" fill="var(--color-ink)">Forecast (cells/L)</text>
    </svg>
  );
}

const DIGITS = '⁰¹²³⁴⁵⁶⁷⁸⁹';
const superscript = (n: number) => `${n < 0 ? '⁻' : ''}${String(Math.abs(n)).split('').map((d) => DIGITS[Number(d)]).join('')}`;
