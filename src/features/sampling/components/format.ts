import { DateTime } from 'luxon';
import type { PlannedSample } from '../../../../shared/schemas/sampling.schema.ts';

const m = (x: number) => Number(x.toFixed(2)).toLocaleString('en-GB');

/** "Bottle at 12.5 m below surface" / "Hose 0–10 m below surface". */
export const depthLabel = (s: Pick<PlannedSample, 'method' | 'depthM' | 'topM' | 'bottomM'>) =>
  s.method === 'bottle' ? `Bottle at ${m(s.depthM ?? 0)} m below surface` : `Hose ${m(s.topM ?? 0)}–${m(s.bottomM ?? 0)} m below surface`;

/** Site-local clock time with the zone's abbreviation (daylight saving shows). */
export const localClock = (iso: string, zone: string) => DateTime.fromISO(iso, { zone: 'utc' }).setZone(zone).setLocale('en-GB').toFormat('HH:mm ZZZZ');
export const localDay = (iso: string, zone: string) => DateTime.fromISO(iso, { zone: 'utc' }).setZone(zone).toISODate() ?? '';
export const dayTitle = (isoDate: string) => DateTime.fromISO(isoDate).setLocale('en-GB').toFormat('cccc d LLLL yyyy');
