// Wide headers through every reader: 100,000 columns, repeated names, control characters in names.
// Correctness only; the time taken is measured in bench/readers.bench.ts.
import { Readable } from 'node:stream';
import { describe, expect, it } from 'vitest';
import { INTERCEPT_NAME } from '../../src/core/linearModel';
import { readCsvText } from '../../src/data/csv';
import { readCsvRows } from '../../src/data/csvStream';
import { MAX_CSV_COLUMNS } from '../../src/data/csvLimits';
import { MAX_REGRESSION_COLUMNS, regressionDataFromText, validateRegressionDataSpec } from '../../src/methods/regression/regressionData';
import { problemsOf } from '../support/thrownProblems';

/** Invented data: columns y, t, x and `extra` filler columns c0…, some names repeated. */
function wideText(extra: number, repeatEvery = 0): string {
  const names = ['y', 't', 'x', ...Array.from({ length: extra }, (_, i) => (repeatEvery > 0 && i % repeatEvery === 1 ? `c${i - 1}` : `c${i}`))];
  const rows = [
    [1, 0, 2],
    [2, 1, 1],
    [3, 0, 5],
    [5, 1, 3],
    [4, 1, 4],
    [7, 0, 8],
  ].map((r) => [...r, ...new Array(extra).fill(0)].join(','));
  return [names.join(','), ...rows].join('\n');
}

// Generous time limits: these read megabytes of header on a shared machine (not a speed check).
describe('a 100,000-column header', { timeout: 120_000 }, () => {
  const text = wideText(MAX_CSV_COLUMNS - 3, 1000);

  it('the regression reader takes the chosen columns and reports repeated names once each', () => {
    const data = regressionDataFromText(text, { outcome: 'y', treatment: 't', covariates: ['x', 'c0'] });
    expect(data.rowsUsed).toBe(6);
    expect(data.design.columnNames).toEqual([INTERCEPT_NAME, 'x', 'c0', 't', 'y']);
    const warning = data.warnings.find((w) => w.startsWith('The header repeats'))!;
    expect(warning).toMatch(/^The header repeats "c0", "c1000", .* and 80 more; the first column of each name is used\.$/);
  });

  it(`choosing every column as a covariate is refused at the header: more than ${MAX_REGRESSION_COLUMNS} regression columns`, () => {
    const problems = problemsOf(() => regressionDataFromText(text, { outcome: 'y', treatment: 't' }));
    expect(problems).toHaveLength(1);
    expect(problems[0]).toMatchObject({ field: 'covariates', code: 'too-many-columns' });
    expect(problems[0].message).toBe(
      '99,900 columns would enter the regression (every column of the file is a covariate unless covariates are chosen); at most 2,000 are accepted. Choose the covariates.',
    );
    const atLimit = wideText(MAX_REGRESSION_COLUMNS - 3);
    const covariates = ['x', ...Array.from({ length: MAX_REGRESSION_COLUMNS - 3 }, (_, i) => `c${i}`)];
    expect(() => regressionDataFromText(atLimit, { outcome: 'y', treatment: 't', covariates: covariates.slice(0, 3) })).not.toThrow();
    expect(validateRegressionDataSpec({ outcome: 'y', treatment: 't', covariates }, atLimit.slice(0, atLimit.indexOf('\n')).split(','))).toEqual([]);
  });

  it('an unknown column is named with a short list of the columns there are', () => {
    const header = text.slice(0, text.indexOf('\n')).split(',');
    const problems = validateRegressionDataSpec({ outcome: 'y', treatment: 't', covariates: ['nope'] }, header);
    expect(problems).toHaveLength(1);
    expect(problems[0].message).toMatch(/^there is no column named "nope" \(columns: "y", "t", "x", .* and 99,980 more\)\.$/);
  });

  it('readCsvText and the streaming row reader read it, renaming the repeats the same way', async () => {
    const table = readCsvText(text);
    expect(table.columns).toHaveLength(MAX_CSV_COLUMNS);
    expect(new Set(table.columns).size).toBe(MAX_CSV_COLUMNS);
    let columns: readonly string[] = [];
    await readCsvRows(Readable.from([text]), (_row, _n, names) => (columns = names));
    expect(columns).toEqual(table.columns);
  });
});

describe('repeated header names', () => {
  it('with the default covariates, each name enters once (its first column) and a warning says so', () => {
    const text = 'y,t,x,x\n1,0,2,9\n2,1,1,9\n3,0,5,9\n5,1,3,9\n4,1,4,9\n';
    const data = regressionDataFromText(text, { outcome: 'y', treatment: 't' });
    expect(data.covariates).toEqual(['x']);
    expect(data.warnings).toContain('The header repeats "x"; the first column of each name is used.');
  });
});

describe('control characters in a header', () => {
  it('are escaped in the regression reader\'s messages about repeated or unknown names', () => {
    const text = 'y,t,\u001b[31mx,\u001b[31mx\n1,0,2,2\n2,1,1,1\n3,0,5,5\n5,1,3,3\n';
    const data = regressionDataFromText(text, { outcome: 'y', treatment: 't', covariates: ['\u001b[31mx'] });
    expect(data.warnings[0]).toBe('The header repeats "\\x1b[31mx"; the first column of each name is used.');
    const problems = problemsOf(() => regressionDataFromText(text, { outcome: 'y', treatment: 't', covariates: ['\u0007'] }));
    expect(problems[0].message).toBe('there is no column named "\\x07" (columns: "y", "t", "\\x1b[31mx", "\\x1b[31mx").');
  });
});
