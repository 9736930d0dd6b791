import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { columnIndex, columnLevels, isNumericColumn, numericColumn, readCsvText } from '../../src/data/csv';
import { InputError } from '../../src/core/inputProblem';
import { readReferenceText } from '../support/reference';

function problemOf(fn: () => unknown) {
  try {
    fn();
  } catch (error) {
    expect(error).toBeInstanceOf(InputError);
    return (error as InputError).problems[0];
  }
  throw new Error('expected an InputError');
}

describe('readCsvText', () => {
  it('reads the open swiss data set (R datasets::swiss) with quoted headers', () => {
    const table = readCsvText(readReferenceText('swiss.csv'));
    expect(table.columns).toEqual(['Fertility', 'Agriculture', 'Examination', 'Education', 'Catholic', 'Infant.Mortality']);
    // R: nrow(swiss) is 47
    expect(table.rows.length).toBe(47);
    expect(numericColumn(table, 'Fertility', 'outcome').values[0]).toBe(80.2);
  });

  it('strips a byte-order mark and reads CRLF line ends', () => {
    const table = readCsvText('\uFEFFa,b\r\n1,2\r\n3,4\r\n');
    expect(table.columns).toEqual(['a', 'b']);
    expect(table.rows).toEqual([
      ['1', '2'],
      ['3', '4'],
    ]);
  });

  it('finds semicolon separators with decimal commas', () => {
    const table = readCsvText('x;y\n1,5;2,25\n-0,75;3\n');
    expect(table.delimiter).toBe(';');
    expect(table.decimalComma).toBe(true);
    expect([...numericColumn(table, 'x', 'x').values]).toEqual([1.5, -0.75]);
    expect([...numericColumn(table, 'y', 'y').values]).toEqual([2.25, 3]);
  });

  it('reads tab-separated files', () => {
    const table = readCsvText('a\tb\n1.5\t2\n');
    expect(table.delimiter).toBe('\t');
    expect(table.decimalComma).toBe(false);
  });

  it('keeps separators, quotes and newlines inside quoted fields and headers', () => {
    const table = readCsvText('"group, label","note"\n"a, b","line one\nline two"\n"c ""quoted""",x\n');
    expect(table.columns).toEqual(['group, label', 'note']);
    expect(table.rows[0]).toEqual(['a, b', 'line one\nline two']);
    expect(table.rows[1][0]).toBe('c "quoted"');
  });

  it('treats empty cells, NA, N/A, NaN, NULL and "." as missing', () => {
    const table = readCsvText('v\n1\n\nNA\nN/A\nnan\nNULL\n.\n2\n,\n');
    const { values, missing } = numericColumn(readCsvText('v,w\n1,0\n,0\nNA,0\nN/A,0\nnan,0\nNULL,0\n.,0\n2,0\n'), 'v', 'v');
    expect(missing).toBe(6);
    expect(values[0]).toBe(1);
    expect(values[7]).toBe(2);
    expect(table.rows.length).toBeGreaterThan(0);
  });

  it('pads short rows with missing values and says so', () => {
    const table = readCsvText('a,b,c\n1,2,3\n4,5\n');
    expect(table.rows[1]).toEqual(['4', '5', null]);
    expect(table.warnings.join(' ')).toMatch(/row 2 had fewer cells/);
  });

  it('refuses a row longer than the header, naming the row', () => {
    const problem = problemOf(() => readCsvText('a,b\n1,2\n3,4,5\n'));
    expect(problem.field).toBe('file');
    expect(problem.code).toBe('ragged-row');
    expect(problem.message).toMatch(/row 2 has 3 cells/);
  });

  it('accepts a trailing separator (an empty extra cell)', () => {
    expect(readCsvText('a,b\n1,2,\n').rows[0]).toEqual(['1', '2']);
  });

  it('refuses an empty file and a header without rows', () => {
    expect(problemOf(() => readCsvText('')).code).toBe('empty-file');
    expect(problemOf(() => readCsvText('\uFEFF  \n')).code).toBe('empty-file');
    expect(problemOf(() => readCsvText('a,b\n')).code).toBe('no-rows');
  });

  it('names blank and repeated headers', () => {
    const table = readCsvText('a,,a\n1,2,3\n');
    expect(table.columns).toEqual(['a', 'column 2', 'a (2)']);
    expect(table.warnings.length).toBe(2);
  });

  it('reads huge and tiny magnitudes exactly', () => {
    const table = readCsvText('x\n1e300\n-1.5e-300\n1.7976931348623157e308\n');
    expect([...numericColumn(table, 'x', 'x').values]).toEqual([1e300, -1.5e-300, Number.MAX_VALUE]);
  });
});

describe('columnIndex and numericColumn', () => {
  const table = readCsvText('Age,Group\n34,a\n51,b\nforty,a\n');

  it('finds a column ignoring case and surrounding space', () => {
    expect(columnIndex(table, ' age ', 'x')).toBe(0);
  });

  it('names the field and lists the columns when a column is unknown', () => {
    const problem = problemOf(() => columnIndex(table, 'weight', 'covariates'));
    expect(problem.field).toBe('covariates');
    expect(problem.message).toBe('no column named "weight" (columns: Age, Group)');
  });

  it('names the column, row and value of a non-numeric cell', () => {
    const problem = problemOf(() => numericColumn(table, 'Age', 'outcome'));
    expect(problem.code).toBe('not-a-number');
    expect(problem.message).toBe('column "Age" has "forty" in row 3, which is not a number');
  });

  it('tells numeric from text columns and lists levels with counts', () => {
    expect(isNumericColumn(table, 1)).toBe(false);
    expect(isNumericColumn(readCsvText('x\n1\nNA\n2\n'), 0)).toBe(true);
    expect(columnLevels(table, 'Group', 'g')).toEqual([
      { value: 'a', count: 2 },
      { value: 'b', count: 1 },
    ]);
  });
});

describe('readCsvText invariants', () => {
  it('round-trips any grid of finite numbers written with either separator convention', () => {
    fc.assert(
      fc.property(
        fc.array(fc.array(fc.double({ noNaN: true, noDefaultInfinity: true, min: -1e12, max: 1e12 }), { minLength: 2, maxLength: 2 }), {
          minLength: 1,
          maxLength: 20,
        }),
        fc.boolean(),
        (grid, european) => {
          const sep = european ? ';' : ',';
          const cell = (v: number) => (european ? String(v).replace('.', ',') : String(v));
          const text = `p${sep}q\n` + grid.map((r) => r.map(cell).join(sep)).join('\r\n');
          const table = readCsvText(text);
          const p = numericColumn(table, 'p', 'p').values;
          grid.forEach((r, i) => expect(p[i]).toBe(r[0] === 0 ? 0 : r[0]));
        },
      ),
    );
  });
});

// Generous time limit: one check reads a 16 MiB line on a shared machine (not a speed check).
describe('readCsvText: limits and file text in messages', { timeout: 120_000 }, () => {
  it('NUL bytes near the start: a binary file, not CSV', () => {
    const problem = problemOf(() => readCsvText('PK\u0003\u0004\u0000\u0000a,b\n1,2'));
    expect(problem).toMatchObject({ field: 'file', code: 'binary-file' });
    expect(problem.message).toMatch(/^looks like a binary file, not CSV/);
  });

  it('a line over 16 MiB is refused, naming the line and the limit', () => {
    const text = 'a,b\n1,2\n' + 'x'.repeat(16 * 1024 * 1024 + 1) + '\n3,4\n';
    const problem = problemOf(() => readCsvText(text));
    expect(problem).toMatchObject({ field: 'file', code: 'record-too-long' });
    expect(problem.message).toBe('line 3 is longer than 16 MiB (the longest row this reader accepts); is this a CSV file?');
  });

  it('more than 100,000 columns is refused', () => {
    const header = Array.from({ length: 100_001 }, (_, i) => `c${i}`).join(',');
    expect(problemOf(() => readCsvText(`${header}\n1`)).code).toBe('too-many-columns');
  });

  it('control characters in column names and cells are escaped in messages, long names cut', () => {
    const table = readCsvText('\u001b[2Jname,b\nx\u001b]0;owned\u0007,2\n');
    const unknown = problemOf(() => columnIndex(table, 'zz\u009b', 'outcome'));
    expect(unknown.message).toBe('no column named "zz\\x9b" (columns: \\x1b[2Jname, b)');
    const bad = problemOf(() => numericColumn(table, '\u001b[2Jname', 'outcome'));
    expect(bad.message).toBe('column "\\x1b[2Jname" has "x\\x1b]0;owned\\x07" in row 1, which is not a number');
    const long = readCsvText(`${'n'.repeat(500)},${'n'.repeat(500)}\n1,2`);
    expect(long.warnings[0].length).toBeLessThan(250);
    expect(long.warnings[0]).toContain('…');
  });

  it('a wide header lists only the first columns in a message', () => {
    const header = Array.from({ length: 5000 }, (_, i) => `c${i}`).join(',');
    const table = readCsvText(`${header}\n${'1,'.repeat(4999)}1`);
    const problem = problemOf(() => columnIndex(table, 'missing', 'outcome'));
    expect(problem.message).toContain(', c19 and 4,980 more)');
  });

  it('a repeat is never renamed onto a name the header already has', () => {
    const table = readCsvText('a,a,a (2),a\n1,2,3,4');
    expect(table.columns).toEqual(['a', 'a (3)', 'a (2)', 'a (4)']);
    expect(new Set(table.columns).size).toBe(4);
  });
});
