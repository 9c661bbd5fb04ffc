import { DateTime } from 'luxon';
import type { DayAdvice } from '../../../../shared/forecast/advice.ts';

const clock = (ms: number, zone: string) => DateTime.fromMillis(ms, { zone }).setLocale('en-GB').toFormat('HH:mm ZZZZ');
const where = (s: { method: string; depthM?: number; topM?: number; bottomM?: number }) =>
  s.method === 'bottle' ? `bottle at ${Number((s.depthM ?? 0).toFixed(1))} m below surface` : `hose ${Number((s.topM ?? 0).toFixed(1))}–${Number((s.bottomM ?? 0).toFixed(1))} m below surface`;

/** The forecast's advice per site-local day: what to sample when, and why. */
export function AdviceList({ days, visibleDates }: { days: DayAdvice[]; visibleDates?: Set<string> }) {
  const shown = visibleDates ? days.filter((d) => visibleDates.has(d.date)) : days;
  return (
    <ol className="space-y-3">
      {shown.map((day) => (
        <li key={day.date} className="rounded-lg border border-line bg-white p-3 text-sm">
          <h3 className="font-semibold">
            {DateTime.fromISO(day.date).setLocale('en-GB').toFormat('cccc d LLLL')}
            {day.partial && <span className="ml-2 text-xs font-normal text-ink-soft">(part of the day)</span>}
          </h3>
          <ul className="mt-1 space-y-1">
            <li>
              <strong>Representative:</strong> {where(day.representative)} at {clock(day.representative.timeMs, day.timeZone)}. <span className="text-ink-soft">{day.representative.reason}</span>
            </li>
            {day.worstCase.map((w) => (
              <li key={`${w.kind}-${w.timeMs}`}>
                <strong>Worst case ({w.kind.replace('_', ' ')}):</strong> {where(w)} at {clock(w.timeMs, day.timeZone)}. <span className="text-ink-soft">{w.reason}</span>
              </li>
            ))}
            <li>
              <strong>Gear band:</strong> <span className="text-ink-soft">{day.exposure.reason}</span>
            </li>
            {day.officialSamples.map((o) => (
              <li key={o.timeMs} className={o.unrepresentative ? 'text-alarm-600' : ''}>
                <strong>Official sample:</strong> {o.reason}
              </li>
            ))}
          </ul>
        </li>
      ))}
    </ol>
  );
}
