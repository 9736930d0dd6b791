import { describe, expect, test } from 'vitest';
import fc from 'fast-check';
import { analyseMatchedSets } from '../../../src/core/matchedSetsAnalysis';
import { InputError } from '../../../src/core/inputProblem';
import { emptySetsForm, guessSetsColumns, normaliseSetsForm, readSetsSettings, setsInputFromForm, type SetsFormInputs } from '../../../src/methods/sets/request';
import { analyseSetsForm, planSets } from '../../../src/methods/sets/runner';
import { setsFromCsvStream, setsFromCsvText } from '../../../src/methods/sets/setsFromCsv';
import { expectClose } from '../../support/expectClose';
import { matchedSetsCsv } from '../../support/matchedSetsCsv';
import { fromFixtureNumber, readReferenceJson } from '../../support/reference';

const reference = readReferenceJson('matched_sets.json');
const byName = (name: string) => [...reference.continuous, ...reference.binary].find((d: { name: string }) => d.name === name);
const form = (change: Partial<SetsFormInputs> = {}): SetsFormInputs => ({
  ...emptySetsForm(),
  fileName: 'sets.csv',
  setColumn: 'set',
  treatedColumn: 'treated',
  outcomeColumn: 'outcome',
  gammas: reference.gammas.join(', '),
  ...change,
});

async function* chunks(text: string, size: number): AsyncGenerator<Uint8Array> {
  const bytes = new TextEncoder().encode(text);
  for (let i = 0; i < bytes.length; i += size) yield bytes.subarray(i, i + size);
}

describe('reference values: a CSV of matched sets gives the R base reference numbers', () => {
  // test/reference/matched_sets.json, made by test/reference/generators/matched_sets.R (R 4.2.2, base only), fictional data
  for (const name of ['fictional_a', 'fictional_b_missing', 'fictional_d_large_effect']) {
    test(`${name}: σ, T, the m-estimate and every row`, () => {
      const ds = byName(name);
      const read = setsFromCsvText(matchedSetsCsv(ds), { set: 'set', treated: 'treated', outcome: 'outcome' });
      const outcome = analyseSetsForm(form({ alternative: ds.alternative }), read);
      expect(outcome.problems).toEqual([]);
      const r = outcome.result!;
      expect(r.counts.setsUsed).toBe(ds.sets_used);
      expectClose(r.scale!, ds.sigma, { rel: 1e-15 }, 'σ');
      expectClose(r.statistic, ds.statistic, { rel: 1e-12 }, 'T');
      expectClose(r.estimate!, ds.estimate, { rel: 1e-6, abs: 1e-9 }, 'estimate');
      ds.rows.forEach((row: Record<string, number>, i: number) => {
        expectClose(r.rows[i].pUpper, row.p_upper, { rel: 1e-8 }, `pUpper Γ = ${row.gamma}`);
        expectClose(r.rows[i].pLower, row.p_lower, { rel: 1e-8 }, `pLower Γ = ${row.gamma}`);
        const low = fromFixtureNumber(row.interval_low);
        if (low === null || !Number.isFinite(low)) expect(r.rows[i].intervalLow).toBeNull();
        else expectClose(r.rows[i].intervalLow!, low, { rel: 1e-6, abs: 1e-9 }, `intervalLow Γ = ${row.gamma}`);
      });
      if (ds.sensitivity_value !== null) expectClose(r.sensitivityValue!, ds.sensitivity_value, { rel: 1e-6 }, 'Γ*');
    });
  }

  test('fictional_binary_mixed: 0/1 outcomes are read as binary, exact tails', () => {
    const ds = byName('fictional_binary_mixed');
    const read = setsFromCsvText(matchedSetsCsv(ds), { set: 'set', treated: 'treated', outcome: 'outcome' });
    const r = analyseSetsForm(form(), read).result!;
    expect(r.outcomeKind).toBe('binary');
    expect(r.tail).toBe('exact');
    ds.rows.forEach((row: Record<string, number>, i: number) => expectClose(r.rows[i].pUpper, row.p_upper_exact, { rel: 1e-8 }, `Γ = ${row.gamma}`));
    expectClose(r.sensitivityValue!, ds.sensitivity_value_exact, { rel: 1e-6 });
  });

  test('the same numbers as analyseMatchedSets on the arrays themselves', () => {
    const ds = byName('fictional_d_large_effect');
    const read = setsFromCsvText(matchedSetsCsv(ds), { set: 'set', treated: 'treated', outcome: 'outcome' });
    const viaForm = analyseSetsForm(form(), read).result!;
    const direct = analyseMatchedSets({ setIds: ds.setIds, treated: ds.treated, outcomes: ds.outcomes, gammas: reference.gammas });
    expect(viaForm).toEqual(direct);
  });
});

describe('reading the file', () => {
  const spec = { set: 'set', treated: 'treated', outcome: 'outcome' };

  test('missing outcomes are passed on as missing, counted by the reader and left out by the analysis', () => {
    const csv = 'set,treated,outcome\na,1,5\na,0,NA\na,0,3\nb,1,\nb,0,2\nc,1,7\nc,0,1\nd,1,4\nd,0,2\n';
    const read = setsFromCsvText(csv, spec);
    expect(read.missingOutcomes).toBe(2);
    const r = analyseSetsForm(form({ gammas: '' }), read).result!;
    expect(r.counts.missingOutcomes).toBe(2);
    expect(r.counts.setsDropped.map((d) => [d.code, d.ids])).toEqual([['missing-treated-outcome', ['b']]]);
    expect(r.warnings.join(' ')).toMatch(/set b/);
  });

  test('a semicolon file with decimal commas reads the same numbers', () => {
    const ds = byName('fictional_a');
    const comma = setsFromCsvText(matchedSetsCsv(ds), spec);
    const semicolon = setsFromCsvText(matchedSetsCsv(ds, { semicolon: true }), spec);
    expect(semicolon.data).toEqual(comma.data);
  });

  test('the streaming reader gives the same rows as the text reader, however the bytes are split', async () => {
    const text = matchedSetsCsv(byName('fictional_b_missing'));
    const whole = setsFromCsvText(text, spec);
    await fc.assert(
      fc.asyncProperty(fc.integer({ min: 1, max: 200 }), async (size) => {
        const streamed = await setsFromCsvStream(chunks(text, size), spec);
        expect(streamed.data).toEqual(whole.data);
        expect(streamed.missingOutcomes).toBe(whole.missingOutcomes);
      }),
      { numRuns: 20 },
    );
  });

  test('an outcome that is not a number is one problem naming the column, the rows and their text', () => {
    const csv = 'set,treated,outcome\na,1,5\na,0,abc\nb,1,4\nb,0,2 kg\n';
    try {
      setsFromCsvText(csv, spec);
      expect.unreachable();
    } catch (error) {
      expect((error as InputError).problems).toEqual([
        expect.objectContaining({ field: 'outcomeColumn', code: 'not-a-number', message: expect.stringMatching(/column "outcome" has 2 values that are not a number \(row 2 "abc", row 4 "2 kg"\)/) }),
      ]);
    }
  });

  test('an unknown column is named by its form field, listing the columns there are', () => {
    expect(() => setsFromCsvText('set,treated,y\na,1,2\n', spec)).toThrow(/no column named "outcome" \(columns: set, treated, y\)/);
    try {
      setsFromCsvText('set,treated,y\na,1,2\n', spec);
    } catch (error) {
      expect((error as InputError).problems.map((p) => p.field)).toEqual(['outcomeColumn']);
    }
  });

  test('columns not chosen, or chosen twice, are problems of their own fields', () => {
    expect(() => setsFromCsvText('a,b\n1,2\n', { set: '', treated: 'b', outcome: 'b' })).toThrow(InputError);
    try {
      setsFromCsvText('a,b\n1,2\n', { set: '', treated: 'b', outcome: 'b' });
    } catch (error) {
      expect((error as InputError).problems.map((p) => [p.field, p.code])).toEqual([
        ['setColumn', 'required'],
        ['outcomeColumn', 'same-column'],
      ]);
    }
  });
});

describe('the form', () => {
  test('settings are read with the one field reader: "5%" is 0.05, choices without regard to case, Γ lists', () => {
    const s = readSetsSettings(form({ alpha: '5%', alternative: 'LESS', trim: '1,5', gammas: '1; 1,5; 2', outcomeKind: 'Binary', tail: 'normal' }));
    expect(s).toMatchObject({ alpha: 0.05, alternative: 'less', trim: 1.5, gammas: [1, 1.5, 2], outcomeKind: 'binary', tail: 'normal', problems: [] });
  });

  test('an empty tail is left to the analysis (exact for binary outcomes, no note for continuous ones)', () => {
    expect(readSetsSettings(emptySetsForm()).tail).toBeUndefined();
    const ds = byName('fictional_d_large_effect');
    const r = analyseSetsForm(form(), setsFromCsvText(matchedSetsCsv(ds), { set: 'set', treated: 'treated', outcome: 'outcome' })).result!;
    expect(r.warnings).toEqual([]);
  });

  test('normalise keeps text, takes numbers as text and replaces unknown choices by defaults', () => {
    expect(normaliseSetsForm({ alpha: 0.1, trim: 2, alternative: 'sideways', outcomeKind: 'BINARY', extra: 1, setColumn: 'stratum' })).toEqual({
      ...emptySetsForm(),
      alpha: '0.1',
      trim: '2',
      outcomeKind: 'binary',
      setColumn: 'stratum',
    });
    expect(normaliseSetsForm(null)).toEqual(emptySetsForm());
  });

  test('columns are guessed by name', () => {
    expect(guessSetsColumns(['matched_set', 'treated', 'outcome', 'scenario'])).toEqual({ setColumn: 'matched_set', treatedColumn: 'treated', outcomeColumn: 'outcome' });
    expect(guessSetsColumns(['stratum', 'exposure', 'weight_kg'])).toEqual({ setColumn: 'stratum', treatedColumn: 'exposure', outcomeColumn: 'weight_kg' });
    expect(guessSetsColumns(['a', 'b', 'c'])).toEqual({ setColumn: '', treatedColumn: '', outcomeColumn: '' });
  });
});

describe('validation: one problem per field, named by the form field, naming the sets', () => {
  const spec = { set: 'set', treated: 'treated', outcome: 'outcome' };

  test('sets without a control or with two treated units are named in the treated column’s problems', () => {
    const csv = 'set,treated,outcome\na,1,5\na,0,3\nb,1,4\nc,1,7\nc,0,1\nd,1,4\nd,1,2\nd,0,1\n';
    const outcome = analyseSetsForm(form(), setsFromCsvText(csv, spec));
    expect(outcome.result).toBeNull();
    const messages = outcome.problems.map((p) => `${p.field}: ${p.message}`);
    expect(messages).toEqual([
      expect.stringMatching(/^treatedColumn: 1 set has no control \(set b\)/),
      expect.stringMatching(/^treatedColumn: 1 set has more than one treated unit \(set d\)/),
    ]);
  });

  test('settings problems and data problems come together, each once', () => {
    const csv = 'set,treated,outcome\na,1,5\na,2,3\nb,1,4\nb,0,2\n';
    const { input, problems } = setsInputFromForm(form({ alpha: 'x', gammas: '1, 0.5' }), setsFromCsvText(csv, spec));
    expect(input).toBeNull();
    expect(problems.map((p) => p.field)).toEqual(['alpha', 'treatedColumn', 'gammas[1]']);
  });

  test('a page form without a file asks for one; a saved file name asks for that file again', () => {
    const plan = planSets(form({ fileName: '' }), { file: null, fileText: null }, true);
    expect(plan.kind === 'done' && plan.outcome.problems.map((p) => p.field)).toEqual(['file']);
    const again = planSets(form(), { file: null, fileText: null }, true);
    expect(again.kind === 'done' && again.outcome.problems[0].message).toBe('choose sets.csv again');
  });

  test('a file over 1 MiB is planned for the Web Worker', () => {
    const plan = planSets(form(), { file: new Blob(['x']), fileText: null }, true);
    expect(plan.kind).toBe('worker');
  });
});

describe('non-mutation', () => {
  test('reading and analysing leave the form and the rows as they were', () => {
    const f = Object.freeze(form());
    const read = setsFromCsvText(matchedSetsCsv(byName('fictional_a')), { set: 'set', treated: 'treated', outcome: 'outcome' });
    const before = JSON.stringify([f, read]);
    analyseSetsForm(f, read);
    expect(JSON.stringify([f, read])).toBe(before);
  });
});
