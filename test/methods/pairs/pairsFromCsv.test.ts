import { describe, expect, test } from 'vitest';
import fc from 'fast-check';
import { Readable } from 'node:stream';
import { pairsFromCsvText, pairsFromCsvStream, validatePairsColumns } from '../../../src/methods/pairs/pairsFromCsv';
import { pairsFromPastedText, discordantFromText } from '../../../src/methods/pairs/pairsFromText';
import { InputError } from '../../../src/core/inputProblem';
import { readReferenceJson, readReferenceText } from '../../support/reference';

const problemOf = (fn: () => unknown) => {
  try {
    fn();
  } catch (error) {
    if (error instanceof InputError) return error.problems[0];
    throw error;
  }
  throw new Error('expected an InputError');
};

describe('reference files', () => {
  test('the reference CSVs read back to the published differences', () => {
    // test/reference/rosenbaum_n40.csv, generated in R 4.2.2 (see README)
    const read = pairsFromCsvText(readReferenceText('rosenbaum_n40.csv'), { difference: 'd' });
    expect(read.data.kind).toBe('differences');
    expect([...(read.data as any).differences]).toEqual(readReferenceJson('rosenbaum.json').datasets.n40.differences);
    expect(read.pairs).toBe(40);
  });
});

describe('adversarial CSV files', () => {
  test('BOM, CRLF, semicolons and decimal commas', () => {
    const read = pairsFromCsvText('\ufeffid;treated;control\r\n1;5,5;4,25\r\n2;6;5,5\r\n3;-1,5;2\r\n', { treated: 'treated', control: 'control' });
    expect(read.data).toEqual({ kind: 'outcomes', treated: Float64Array.from([5.5, 6, -1.5]), control: Float64Array.from([4.25, 5.5, 2]) });
  });
  test('quoted headers with a separator and a newline inside; loose header matching', () => {
    const csv = '"pair, id","treated\noutcome","Control Outcome"\n1,3,2\n2,5,1\n3,2,2\n';
    const read = pairsFromCsvText(csv, { treated: 'treated\noutcome', control: 'control outcome' });
    expect((read.data as any).treated).toEqual(Float64Array.from([3, 5, 2]));
    expect(read.columns).toEqual(['pair, id', 'treated\noutcome', 'Control Outcome']);
  });
  test('empty cells, NA, ".", short rows: dropped and counted', () => {
    const csv = 't,c,other\n1,2,x\n,3,x\nNA,1,x\n4,.,x\n5,1\n6\n7,3,x\n';
    const read = pairsFromCsvText(csv, { treated: 't', control: 'c' });
    expect(read.rowsRead).toBe(7);
    expect(read.droppedRows).toBe(4);
    expect(read.pairs).toBe(3);
    expect(read.warnings[0]).toMatch(/4 of 7 rows were left out because a value was missing/);
  });
  test('a row longer than the header is an error naming the row', () => {
    const problem = problemOf(() => pairsFromCsvText('t,c\n1,2\n3,4,5\n', { treated: 't', control: 'c' }));
    expect(problem.field).toBe('file');
    expect(problem.message).toBe('row 2 has 3 cells but the header names 2 columns');
  });
  test('a non-numeric cell names the column, row and text', () => {
    const problem = problemOf(() => pairsFromCsvText('t,c\n1,2\n3,abc\n', { treated: 't', control: 'c' }));
    expect(problem.field).toBe('control');
    expect(problem.message).toBe('column "c" has "abc" in row 2, which is not a number');
  });
  test('huge and tiny magnitudes are kept exactly', () => {
    const read = pairsFromCsvText('d\n1e300\n-2.5e-300\n1.7976931348623157e308\n', { difference: 'd' });
    expect([...(read.data as any).differences]).toEqual([1e300, -2.5e-300, 1.7976931348623157e308]);
    expect(problemOf(() => pairsFromCsvText('d\n1e400\n', { difference: 'd' })).code).toBe('not-a-number');
  });
  test('two 0/1 columns become discordant counts; numeric forces differences', () => {
    const csv = 't,c\n1,0\n1,0\n0,1\n1,1\n0,0\n1,0\n';
    const read = pairsFromCsvText(csv, { treated: 't', control: 'c' });
    expect(read.binary).toBe(true);
    expect(read.data).toEqual({ kind: 'discordant', treatedOnly: 3, controlOnly: 1, concordant: 2 });
    expect(pairsFromCsvText(csv, { treated: 't', control: 'c', outcome: 'numeric' }).data.kind).toBe('outcomes');
    expect(problemOf(() => pairsFromCsvText('t,c\n1,2\n', { treated: 't', control: 'c', outcome: 'binary' })).code).toBe('not-binary');
  });
  test('empty file, header only, unknown column, bad column choice', () => {
    expect(problemOf(() => pairsFromCsvText('', { difference: 'd' })).code).toBe('empty-file');
    expect(problemOf(() => pairsFromCsvText('\ufeff \n', { difference: 'd' })).code).toBe('empty-file');
    expect(problemOf(() => pairsFromCsvText('d\n', { difference: 'd' })).code).toBe('no-rows');
    const unknown = problemOf(() => pairsFromCsvText('a,b\n1,2\n', { difference: 'd' }));
    expect(unknown.message).toBe('no column named "d" (columns: a, b)');
    expect(validatePairsColumns({ treated: 'a' }).map((p) => p.field)).toEqual(['control']);
    expect(validatePairsColumns({ treated: 'a', control: 'a' }).map((p) => p.code)).toEqual(['same-column']);
    expect(validatePairsColumns({ difference: 'd', treated: 'a' }).map((p) => p.code)).toEqual(['conflicting-columns']);
    expect(validatePairsColumns({}).map((p) => p.field)).toEqual(['treated']);
  });
  test('streaming in arbitrary chunks gives the same pairs as reading the whole text', async () => {
    await fc.assert(
      fc.asyncProperty(
        fc.array(fc.tuple(fc.double({ min: -1e6, max: 1e6, noNaN: true }), fc.double({ min: -1e6, max: 1e6, noNaN: true })), { minLength: 1, maxLength: 40 }),
        fc.integer({ min: 1, max: 17 }),
        async (rows, size) => {
          const text = 'treated,control\r\n' + rows.map(([a, b]) => `${a},${b}`).join('\r\n') + '\r\n';
          const chunks: Buffer[] = [];
          const bytes = Buffer.from(text, 'utf8');
          for (let i = 0; i < bytes.length; i += size) chunks.push(bytes.subarray(i, i + size));
          const streamed = await pairsFromCsvStream(Readable.from(chunks), { treated: 'treated', control: 'control', outcome: 'numeric' });
          const whole = pairsFromCsvText(text, { treated: 'treated', control: 'control', outcome: 'numeric' });
          expect(streamed.data).toEqual(whole.data);
          expect(streamed.pairs).toBe(rows.length);
        },
      ),
      { numRuns: 50 },
    );
  });
  test('a cancelled stream stops with an AbortError', async () => {
    const controller = new AbortController();
    controller.abort();
    await expect(pairsFromCsvStream(Readable.from([Buffer.from('d\n1\n')]), { difference: 'd' }, { signal: controller.signal })).rejects.toThrow(/abort/i);
  });
});

describe('pasted numbers', () => {
  test('one number per line: differences; header and blank lines skipped; NA dropped', () => {
    const read = pairsFromPastedText('difference\n1.5\n\n-0.5\nNA\n2\n');
    expect(read.data).toEqual({ kind: 'differences', differences: Float64Array.from([1.5, -0.5, 2]) });
    expect(read.droppedRows).toBe(1);
    expect(read.columns).toEqual(['difference']);
  });
  test('two per line, tab separated with decimal commas (spreadsheet paste)', () => {
    const read = pairsFromPastedText('5,5\t4,25\r\n6\t5,5\r\n');
    expect(read.data).toEqual({ kind: 'outcomes', treated: Float64Array.from([5.5, 6]), control: Float64Array.from([4.25, 5.5]) });
  });
  test('two per line, comma separated', () => {
    const read = pairsFromPastedText('5.5,4.25\n6,5.5\n');
    expect(read.data.kind).toBe('outcomes');
  });
  test('unequal columns, too many columns, words and nothing at all are errors naming the line', () => {
    expect(problemOf(() => pairsFromPastedText('1 2\n3\n')).message).toMatch(/^line 2 has 1 value but the first line has 2/);
    expect(problemOf(() => pairsFromPastedText('1 2 3\n')).code).toBe('too-many-columns');
    expect(problemOf(() => pairsFromPastedText('1\nabc\n')).message).toBe('line 2 has "abc", which is not a number');
    expect(problemOf(() => pairsFromPastedText('  \n')).code).toBe('empty');
  });
  test('discordant counts typed by a person', () => {
    expect(discordantFromText('12', ' 3 ')).toEqual({ kind: 'discordant', treatedOnly: 12, controlOnly: 3 });
    expect(problemOf(() => discordantFromText('2.5', '3')).field).toBe('treatedOnly');
    expect(problemOf(() => discordantFromText('2', '')).message).toMatch(/give a count/);
  });
});
