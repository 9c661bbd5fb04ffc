import { DateTime } from 'luxon';

/** A time in the site's zone, with the zone's abbreviation so summer time shows (e.g. "Tue 3 Mar 14:20 GMT"). */
export const siteTime = (iso: string, zone: string) => DateTime.fromISO(iso, { zone: 'utc' }).setZone(zone).toFormat('ccc d LLL HH:mm ZZZZ');

export const siteDate = (iso: string, zone: string) => DateTime.fromISO(iso, { zone: 'utc' }).setZone(zone).toFormat('d LLL yyyy HH:mm ZZZZ');

export const num = (x: number, digits = 3) => x.toLocaleString('en-GB', { maximumFractionDigits: digits, minimumFractionDigits: Math.min(digits, 2) });

/** Compass bearing (clockwise from north) of a direction given anticlockwise from east. */
export const bearingOf = (axisDeg: number) => Math.round((((90 - axisDeg) % 360) + 360) % 360);

export const SOURCE_LABELS = { feed: 'Tide feed', upload: 'Uploaded table', analysis: 'Fitted to a record', manual: 'Typed in' } as const;
