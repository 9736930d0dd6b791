import { describe, expect, it } from 'vitest';
import { InputError, analyseEValueFromCounts } from '../../../src/core';
import { readCsvText } from '../../../src/data/csv';
import { guessYesValues, twoByTwoFromCsv } from '../../../src/methods/evalue/twoByTwoFromCsv';

function problemsOf(run: () => unknown): [string, string][] {
  try {
    run();
  } catch (error) {
    if (error instanceof InputError) return error.problems.map((p) => [p.field, p.code]);
    throw error;
  }
  return [];
}

describe('twoByTwoFromCsv', () => {
  it('counts a 0/1 exposure and a yes/no outcome without being told which value means yes', () => {
    const csv = 'id,smoker,cancer\n1,1,yes\n2,1,no\n3,0,yes\n4,0,no\n5,0,no\n6,1,yes\n';
    const result = twoByTwoFromCsv(readCsvText(csv), { exposureColumn: 'smoker', outcomeColumn: 'cancer' });
    expect(result.counts).toEqual({ a: 2, b: 1, c: 1, d: 2 });
    expect(result.exposure).toMatchObject({ yesValues: ['1'], noValues: ['0'], guessed: true });
    expect(result.outcome).toMatchObject({ yesValues: ['yes'], noValues: ['no'], guessed: true });
    expect(result.rowsUsed).toBe(6);
  });

  it('uses the values named, and counts every other value as no', () => {
    const csv = 'group,status\ntreated,dead\ntreated,alive\ncontrol,dead\nplacebo,alive\ncontrol,lost\n';
    const result = twoByTwoFromCsv(readCsvText(csv), {
      exposureColumn: 'group',
      outcomeColumn: 'status',
      exposedValues: ['treated'],
      outcomeValues: ['dead'],
    });
    expect(result.counts).toEqual({ a: 1, b: 1, c: 1, d: 2 });
    expect(result.exposure.noValues).toEqual(['control', 'placebo']);
    expect(result.outcome.guessed).toBe(false);
  });

  it('leaves out rows with a missing cell and says how many', () => {
    const csv = 'e,o\n1,1\nNA,0\n0,\n0,0\n1,0\n.,1\n';
    const result = twoByTwoFromCsv(readCsvText(csv), { exposureColumn: 'e', outcomeColumn: 'o' });
    expect(result.counts).toEqual({ a: 1, b: 1, c: 0, d: 1 });
    expect(result.rowsMissing).toBe(3);
    expect(result.warnings.join(' ')).toMatch(/3 rows were left out/);
  });

  it('reads a file with a byte-order mark, CRLF line ends, semicolons and quoted headers', () => {
    const csv = '\ufeff"Exposed; yes or no";"Outcome"\r\nYes;True\r\nno;false\r\nYes;false\r\nno;TRUE\r\n';
    const table = readCsvText(csv);
    // "TRUE" and "True" are different cells: with three outcome values the mapping cannot be guessed…
    expect(problemsOf(() => twoByTwoFromCsv(table, { exposureColumn: 'Exposed; yes or no', outcomeColumn: 'outcome' }))).toEqual([
      ['outcomeValues', 'required'],
    ]);
    // …and "true" names both spellings.
    const result = twoByTwoFromCsv(table, { exposureColumn: 'Exposed; yes or no', outcomeColumn: 'outcome', outcomeValues: ['true'] });
    expect(result.outcome.yesValues).toEqual(['True', 'TRUE']);
    expect(result.exposure.yesValues).toEqual(['Yes']);
    expect(result.counts).toEqual({ a: 1, b: 1, c: 1, d: 1 });
  });

  it('matches given values case-insensitively when no exact match exists, and reads 1.0/0.0 as 1/0', () => {
    const csv = 'e,o\n1.0,Yes\n0.0,No\n1.0,No\n';
    const result = twoByTwoFromCsv(readCsvText(csv), { exposureColumn: 'e', outcomeColumn: 'o', outcomeValues: ['yes'] });
    expect(result.exposure.yesValues).toEqual(['1.0']);
    expect(result.outcome.yesValues).toEqual(['Yes']);
    expect(result.counts).toEqual({ a: 1, b: 1, c: 0, d: 1 });
  });

  it('feeds the E-value analysis', () => {
    // hand computation: (2/3)/(1/3) = 2
    const csv = 'smoker,cancer\n1,1\n1,1\n1,0\n0,1\n0,0\n0,0\n';
    const { counts } = twoByTwoFromCsv(readCsvText(csv), { exposureColumn: 'smoker', outcomeColumn: 'cancer' });
    expect(analyseEValueFromCounts({ counts, measure: 'rr' }).riskRatioScale.estimate).toBeCloseTo(2, 14);
  });
});

describe('twoByTwoFromCsv: bad input', () => {
  const table = readCsvText('e,o,arm\n1,1,a\n0,0,b\n1,0,c\n');

  it('an unknown column is named, with the columns there are', () => {
    try {
      twoByTwoFromCsv(table, { exposureColumn: 'exposure', outcomeColumn: 'o' });
      expect.unreachable();
    } catch (error) {
      expect((error as InputError).problems[0]).toMatchObject({ field: 'exposure', code: 'unknown-column' });
      expect((error as InputError).problems[0].message).toMatch(/columns: e, o, arm/);
    }
  });

  it('both columns unknown or missing are reported together', () => {
    expect(problemsOf(() => twoByTwoFromCsv(table, { exposureColumn: 'x', outcomeColumn: '' }))).toEqual([
      ['exposure', 'unknown-column'],
      ['outcome', 'required'],
    ]);
  });

  it('a column with more than two values needs the yes values named', () => {
    expect(problemsOf(() => twoByTwoFromCsv(table, { exposureColumn: 'arm', outcomeColumn: 'o' }))).toEqual([['exposedValues', 'required']]);
  });

  it('a named value that does not occur is refused', () => {
    expect(problemsOf(() => twoByTwoFromCsv(table, { exposureColumn: 'arm', outcomeColumn: 'o', exposedValues: ['z'] }))).toEqual([
      ['exposedValues', 'unknown-value'],
    ]);
  });

  it('a column with no values at all is refused', () => {
    const empty = readCsvText('e,o\n1,\n0,\n');
    expect(problemsOf(() => twoByTwoFromCsv(empty, { exposureColumn: 'e', outcomeColumn: 'o' }))).toEqual([['outcome', 'empty-column']]);
  });

  it('an empty CSV is refused by the reader, naming the file', () => {
    expect(problemsOf(() => readCsvText(''))).toEqual([['file', 'empty-file']]);
  });
});

describe('guessYesValues', () => {
  it('recognises plain two-valued columns and nothing else', () => {
    expect(guessYesValues(['0', '1'])).toEqual(['1']);
    expect(guessYesValues(['No', 'Yes'])).toEqual(['Yes']);
    expect(guessYesValues(['TRUE', 'FALSE'])).toEqual(['TRUE']);
    expect(guessYesValues(['n', 'y'])).toEqual(['y']);
    expect(guessYesValues(['a', 'b'])).toBeNull();
    expect(guessYesValues(['1', '2'])).toBeNull();
    expect(guessYesValues(['1'])).toBeNull();
  });
});

describe('twoByTwoFromStream', () => {
  it('counts the same table as the whole-text reader, whatever the chunk size (BOM, CRLF, quotes, NA)', async () => {
    const { twoByTwoFromStream } = await import('../../../src/methods/evalue/twoByTwoFromCsv');
    const { readCsvText } = await import('../../../src/data/csv');
    const lines = ['\ufeff"smoker","lung cancer"'];
    for (let i = 0; i < 500; i++) lines.push(`${i % 7 === 0 ? 'NA' : i % 3 === 0 ? 'yes' : 'no'},"${i % 5 < 2 ? 'yes' : 'no'}"`);
    const text = lines.join('\r\n') + '\r\n';
    const columns = { exposureColumn: 'smoker', outcomeColumn: 'lung cancer' };
    const whole = twoByTwoFromCsv(readCsvText(text, 'file'), columns);
    for (const size of [1, 7, 64, 100_000]) {
      const bytes = new TextEncoder().encode(text);
      const chunks = (async function* () {
        for (let i = 0; i < bytes.length; i += size) yield bytes.slice(i, i + size);
      })();
      const streamed = await twoByTwoFromStream(chunks, columns);
      expect(streamed.counts).toEqual(whole.counts);
      expect(streamed.rowsMissing).toBe(whole.rowsMissing);
      expect(streamed.exposure).toEqual(whole.exposure);
    }
  });
});
