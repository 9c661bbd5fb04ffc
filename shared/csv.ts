/**
 * One CSV cell (RFC 4180): quoted when it holds a comma, quote or line break, quotes doubled. Text
 * that a spreadsheet would run as a formula (starting with = + - @, tab or carriage return) gets a
 * leading apostrophe, as the OWASP guidance on CSV injection advises; numbers (also as text, e.g. "-5.7")
 * are written as they are.
 */
export function csvCell(value: string | number | null | undefined): string {
  if (value === null || value === undefined) return '';
  if (typeof value === 'number') return Number.isFinite(value) ? String(value) : '';
  const plainNumber = /^[+-]?\d+(\.\d+)?([eE][+-]?\d+)?$/.test(value);
  const safe = !plainNumber && /^[=+\-@\t\r]/.test(value) ? `'${value}` : value;
  return /[",\r\n]/.test(safe) ? `"${safe.replace(/"/g, '""')}"` : safe;
}

/** One CSV line (CRLF-terminated, RFC 4180). */
export const csvLine = (cells: (string | number | null | undefined)[]): string => `${cells.map(csvCell).join(',')}\r\n`;
