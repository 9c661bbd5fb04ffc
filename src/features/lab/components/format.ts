/** Cells/L for tables: whole numbers with thousands separators; small values with two significant digits. */
export const cells = (value: number | null) => (value === null ? '–' : value >= 100 ? Math.round(value).toLocaleString('en-GB') : value.toPrecision(2));

export const metric = (value: number | null, digits = 2) => (value === null ? '–' : value.toFixed(digits));

/** A UTC instant shown in a time zone, with the zone's abbreviation (daylight saving shows, e.g. BST). */
export const inZone = (iso: string, timeZone: string) =>
  new Intl.DateTimeFormat('en-GB', { timeZone, day: 'numeric', month: 'short', year: 'numeric', hour: '2-digit', minute: '2-digit', timeZoneName: 'short' }).format(new Date(iso));

export const depthLabel = (top: number, bottom: number) => (top === bottom ? `${top} m` : `${top}–${bottom} m`);
