/** Formatting shared by the profile screens. */

export const siteTime = (ms: number, timeZone: string) =>
  new Intl.DateTimeFormat('en-GB', { timeZone, weekday: 'short', day: 'numeric', month: 'short', hour: '2-digit', minute: '2-digit' }).format(new Date(ms));

export const shortDate = (iso: string) => new Intl.DateTimeFormat('en-GB', { day: 'numeric', month: 'short', year: 'numeric', hour: '2-digit', minute: '2-digit' }).format(new Date(iso));

/** A number with a few significant digits and thousands separators. */
export const figure = (value: number, digits = 3) => {
  if (!Number.isFinite(value)) return '—';
  if (value !== 0 && (Math.abs(value) >= 1e7 || Math.abs(value) < 1e-3)) return value.toExponential(2);
  return Number(value.toPrecision(digits)).toLocaleString('en-GB', { maximumFractionDigits: 6 });
};

export const WINDOW_LABELS = { slack: 'Slack', slump: 'Slump near the bed', mixed: 'Mixed column', subsurface_peak: 'Subsurface peak' } as const;
