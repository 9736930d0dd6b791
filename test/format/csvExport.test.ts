import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import Papa from 'papaparse';
import { neutraliseFormula, toSafeCsv } from '../../src/format/csvExport';

describe('toSafeCsv', () => {
  it('neutralises text that a spreadsheet would run as a formula (OWASP CSV injection advice)', () => {
    for (const bad of ['=1+1', '+cmd', '-2+3', '@SUM(A1)', '\tx', '\rx', '=HYPERLINK("http://x")']) {
      expect(neutraliseFormula(bad).startsWith("'")).toBe(true);
    }
  });

  it('leaves numbers and ordinary text alone', () => {
    expect(neutraliseFormula('-0.5')).toBe('-0.5');
    expect(neutraliseFormula('1e-3')).toBe('1e-3');
    expect(neutraliseFormula('Cohort A')).toBe('Cohort A');
  });

  it('quotes separators, quotes and newlines, writes numbers plainly and missing values as empty', () => {
    const csv = toSafeCsv(['label', 'value'], [
      ['a, "b"', 1.5],
      ['line\nbreak', null],
      ['=evil', NaN],
    ]);
    expect(csv).toBe('label,value\r\n"a, ""b""",1.5\r\n"line\nbreak",\r\n\'=evil,\r\n');
  });

  it('reads back (papaparse) to the same cells, apart from the neutralising apostrophe', () => {
    fc.assert(
      fc.property(fc.array(fc.tuple(fc.string(), fc.double({ noNaN: true, noDefaultInfinity: true })), { minLength: 1, maxLength: 10 }), (rows) => {
        const parsed = Papa.parse<string[]>(toSafeCsv(['t', 'n'], rows), { skipEmptyLines: false }).data;
        rows.forEach(([t, n], i) => {
          expect(parsed[i + 1][0]).toBe(neutraliseFormula(t));
          expect(Number(parsed[i + 1][1])).toBe(n === 0 ? 0 : n);
        });
      }),
    );
  });
});
