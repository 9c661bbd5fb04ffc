import type { Preview } from '../../../../shared/schemas/tides.schema.ts';
import { bearingOf, num, siteTime } from './format.ts';
import { LineChart } from './line-chart.tsx';

/** The 7-day preview: depth-mean current along the main axis and speed, level, with slack water marked. */
export function TidePreviewChart({ preview, timeZone }: { preview: Preview; timeZone: string }) {
  const startMs = Date.parse(preview.start);
  const stepMs = preview.stepMinutes * 60_000;
  const indexOf = (iso: string) => Math.round((Date.parse(iso) - startMs) / stepMs);
  const dayTicks = preview.times
    .map((t, at) => ({ at, t }))
    .filter(({ at }) => at % Math.round((24 * 60) / preview.stepMinutes) === 0)
    .map(({ at, t }) => ({ at, label: siteTime(t, timeZone).slice(0, 10) }));
  const slacks = preview.current?.slacks ?? [];
  const marks = slacks.map((s) => ({ at: indexOf(s.time), label: `slack ${siteTime(s.time, timeZone)}, ${num(s.speed, 2)} m/s, then ${s.turnsTo}` }));
  return (
    <div className="space-y-3">
      {preview.formFactor && (
        <p className="text-sm">
          Tide type of the {preview.formFactor.of}: {preview.formFactor.type} (form factor {num(preview.formFactor.value, 2)}).
        </p>
      )}
      {preview.current && (
        <LineChart
          title={`Depth-mean current, ${siteTime(preview.start, timeZone)} to ${siteTime(preview.end, timeZone)}${preview.current.axisDeg !== null ? `; along the main axis, positive toward bearing ${bearingOf(preview.current.axisDeg)}° (flood)` : ''}`}
          yLabel="m/s"
          xTicks={dayTicks}
          zeroLine
          marks={marks}
          series={[
            { label: 'along the main axis (m/s)', values: preview.current.along, colour: 'var(--color-ramp-2)' },
            { label: 'speed (m/s)', values: preview.current.speed, colour: 'var(--color-ramp-5)', dashed: true },
          ]}
        />
      )}
      {preview.level && (
        <LineChart
          title="Water level above chart datum"
          yLabel="m above chart datum"
          xTicks={dayTicks}
          marks={marks}
          series={[{ label: 'level (m above chart datum)', values: preview.level.values, colour: 'var(--color-tide-700)' }]}
        />
      )}
      {slacks.length > 0 && (
        <details className="rounded-lg border border-line bg-white p-3 text-sm">
          <summary className="cursor-pointer font-semibold">Slack water times ({timeZone}), {slacks.length} in 7 days</summary>
          <ul className="mt-2 grid gap-1 sm:grid-cols-2 lg:grid-cols-3">
            {slacks.map((s) => (
              <li key={s.time}>
                <time dateTime={s.time}>{siteTime(s.time, timeZone)}</time>: {num(s.speed, 2)} m/s, then {s.turnsTo}
              </li>
            ))}
          </ul>
        </details>
      )}
      <p className="text-xs text-ink-soft">A slack window is not a dive plan. Predictions are astronomical tides only: wind, river flow and surges change real currents and levels.</p>
    </div>
  );
}
