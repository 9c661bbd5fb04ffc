import Papa from 'papaparse';
import { describe, expect, it } from 'vitest';
import { csvCell, csvLine } from '../../shared/csv.ts';

describe('CSV cells', () => {
  it('round-trips commas, quotes and line breaks through a general-purpose CSV parser (papaparse, RFC 4180)', () => {
    const cells = ['plain', 'a, b', 'say "hi"', 'two\nlines', 12.5];
    const parsed = Papa.parse<string[]>(csvLine(cells), { skipEmptyLines: true });
    expect(parsed.errors).toEqual([]);
    expect(parsed.data[0]).toEqual(['plain', 'a, b', 'say "hi"', 'two\nlines', '12.5']);
  });

  it('neutralises text a spreadsheet would run as a formula (OWASP CSV injection guidance)', () => {
    expect(csvCell('=HYPERLINK("http://x")')).toBe(`"'=HYPERLINK(""http://x"")"`);
    expect(csvCell('+A1+B1')).toBe("'+A1+B1");
    expect(csvCell('@SUM(A1)')).toBe("'@SUM(A1)");
    expect(csvCell(-3)).toBe('-3');
    expect(csvCell('-5.731')).toBe('-5.731');
  });
});
