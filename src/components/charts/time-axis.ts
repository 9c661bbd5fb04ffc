import { DateTime } from 'luxon';

export interface TimeTick {
  ms: number;
  label: string;
  /** Local midnight (a day boundary). */
  major: boolean;
}

/** Ticks at the site's local midnights, with 06/12/18 between when each day has room. */
export function timeTicks(startMs: number, endMs: number, zone: string, plotWidth: number): TimeTick[] {
  const days = Math.max(1, (endMs - startMs) / 86_400_000);
  const perDay = plotWidth / days;
  const hours = perDay >= 240 ? [6, 12, 18] : perDay >= 110 ? [12] : [];
  const ticks: TimeTick[] = [];
  let day = DateTime.fromMillis(startMs, { zone }).startOf('day');
  while (day.toMillis() <= endMs) {
    const ms = day.toMillis();
    if (ms >= startMs) ticks.push({ ms, label: perDay >= 70 ? day.toFormat('ccc d LLL') : day.toFormat('d/L'), major: true });
    for (const h of hours) {
      const t = day.set({ hour: h }).toMillis();
      if (t >= startMs && t <= endMs) ticks.push({ ms: t, label: day.set({ hour: h }).toFormat('HH:mm'), major: false });
    }
    day = day.plus({ days: 1 }).startOf('day');
  }
  return ticks;
}

/** A time in the site's zone with its abbreviation and UTC offset, e.g. "Tue 2 Dec 14:20 GMT (UTC+00:00)". */
export function siteClock(ms: number, zone: string): string {
  const dt = DateTime.fromMillis(ms, { zone }).setLocale('en-GB');
  return `${dt.toFormat('ccc d LLL HH:mm ZZZZ')} (UTC${dt.toFormat('ZZ')})`;
}
