import { describe, expect, test } from 'vitest';
import { columnList, emptyWeightingForm, formFieldOf, normaliseWeightingForm, readWeightingSettings } from '../../../src/methods/weighting/request';
import { readWeightingColumns, textSource } from '../../../src/methods/weighting/weightingData';
import { InputError, type InputProblem } from '../../../src/core/inputProblem';

async function thrownProblems(run: () => Promise<unknown>): Promise<InputProblem[]> {
  try {
    await run();
  } catch (error) {
    if (error instanceof InputError) return [...error.problems];
    throw error;
  }
  throw new Error('expected an InputError');
}

const form = (extra: Partial<ReturnType<typeof emptyWeightingForm>>) => ({ ...emptyWeightingForm(), treatment: 't', outcome: 'y', ...extra });

describe('reading the settings', () => {
  test('defaults: ATE, the core defaults for Λ, B 1000, seed 1, α 0.05, no trimming', () => {
    const s = readWeightingSettings(form({}));
    expect(s.problems).toEqual([]);
    expect(s).toMatchObject({ estimand: 'ate', lambdas: undefined, bootstrap: 1000, seed: 1, alpha: 0.05, trim: null });
    expect(s.columns).toEqual({ treatment: 't', outcome: 'y', covariates: [], categorical: [] });
  });
  test('numbers through the one reader: "5%" is 0.05, "1;1,5;2" a list with decimal commas, "1,000" resamples', () => {
    const s = readWeightingSettings(form({ alpha: '5%', lambdas: '1;1,5;2', bootstrap: '1,000', estimand: ' ATT ', trimBelow: '0.05', trimAbove: '95%' }));
    expect(s.problems).toEqual([]);
    expect(s).toMatchObject({ estimand: 'att', lambdas: [1, 1.5, 2], bootstrap: 1000, alpha: 0.05, trim: { below: 0.05, above: 0.95 } });
  });
  test('covariate and categorical lists: commas, blanks dropped, each once; the treatment and outcome left out', () => {
    expect(columnList(' a, b,,a ;c ')).toEqual(['a', 'b', 'c']);
    const s = readWeightingSettings(form({ covariates: 'age, y, site', categorical: 'site' }));
    expect(s.columns.covariates).toEqual(['age', 'site']);
    expect(s.columns.categorical).toEqual(['site']);
  });
});

describe('validation', () => {
  test('every problem at once, named by form field', () => {
    const s = readWeightingSettings({ ...emptyWeightingForm(), estimand: 'atc', bootstrap: '2.5', seed: 'x', alpha: '1,200', trimBelow: '0.1', categorical: 'z' });
    expect(s.problems.map((p) => p.field).sort()).toEqual(['alpha', 'bootstrap', 'estimand', 'outcome', 'seed', 'treatment', 'trimAbove'].sort());
  });
  test('the outcome must differ from the treatment; a categorical column must be a covariate', () => {
    expect(readWeightingSettings(form({ outcome: 't' })).problems.map((p) => p.code)).toContain('same-column');
    expect(readWeightingSettings(form({ covariates: 'a', categorical: 'b' })).problems).toMatchObject([{ field: 'categorical', code: 'not-a-covariate' }]);
  });
  test('analysis fields map to form fields', () => {
    expect(formFieldOf('covariates[3]')).toBe('covariates');
    expect(formFieldOf('covariates[0].values')).toBe('covariates');
    expect(formFieldOf('lambdas[1]')).toBe('lambdas');
    expect(formFieldOf('trim')).toBe('trimBelow');
    expect(formFieldOf('treatment')).toBe('treatment');
  });
});

describe('reading the columns of a file', () => {
  const csv = 'y;t;age;site;code\n1,5;1;40;a;7\n2;0;NA;b;8\n3,25;1;50;b;7\n;0;41;a;9\n';
  test('semicolon file with decimal commas: numbers read, missing cells NaN, text and declared columns dummy-coded', async () => {
    const read = await readWeightingColumns(textSource(csv), { treatment: 't', outcome: 'y', covariates: [], categorical: ['code'] });
    expect(read.data.treatment).toEqual([1, 0, 1, 0]);
    expect(read.data.outcome).toEqual([1.5, 2, 3.25, NaN]);
    expect(read.data.covariates.map((c) => c.name)).toEqual(['age', 'site=b', 'code=8', 'code=9']);
    expect(read.data.covariates[0].values).toEqual([40, NaN, 50, 41]);
    expect(read.summary).toMatchObject({ rowsRead: 4, covariates: ['age', 'site', 'code'] });
    expect(read.summary.coded).toEqual([
      { column: 'site', reference: 'a', levels: 2 },
      { column: 'code', reference: '7', levels: 3 },
    ]);
  });
  test('a treatment that is not 0/1 and a non-numeric outcome are refused by column, with the first row', async () => {
    const problems = await thrownProblems(() => readWeightingColumns(textSource('t,y\n1,2\nyes,x\n0,3\n'), { treatment: 't', outcome: 'y', covariates: [], categorical: [] }));
    expect(problems).toMatchObject([
      { field: 'treatment', code: 'not-binary', value: 1 },
      { field: 'outcome', code: 'not-numeric', value: 1 },
    ]);
    expect(problems[0].message).toContain('first at data row 2: "yes"');
  });
  test('a text covariate with more than 100 levels is refused as a likely identifier', async () => {
    const rows = Array.from({ length: 120 }, (_, i) => `${i % 2},${i},id${i}`).join('\n');
    const problems = await thrownProblems(() => readWeightingColumns(textSource(`t,y,name\n${rows}\n`), { treatment: 't', outcome: 'y', covariates: [], categorical: [] }));
    expect(problems).toMatchObject([{ field: 'covariates', code: 'too-many-levels', value: 'name' }]);
  });
  test('unknown columns are named', async () => {
    const problems = await thrownProblems(() => readWeightingColumns(textSource('t,y\n1,2\n'), { treatment: 'T', outcome: 'y', covariates: ['q'], categorical: [] }));
    expect(problems.map((p) => p.field)).toEqual(['treatment', 'covariates']);
  });
});

describe('saved forms', () => {
  test('normalise keeps text, takes numbers as text and drops unknown keys', () => {
    const f = normaliseWeightingForm({ treatment: 'am', bootstrap: 200, alpha: null, extra: 1 });
    expect(f.treatment).toBe('am');
    expect(f.bootstrap).toBe('200');
    expect(f.alpha).toBe('0.05');
    expect('extra' in f).toBe(false);
    expect(normaliseWeightingForm(null)).toEqual(emptyWeightingForm());
  });
});

describe('non-mutation', () => {
  test('reading the settings leaves the form unchanged', () => {
    const f = form({ lambdas: '1,2' });
    const copy = JSON.parse(JSON.stringify(f));
    readWeightingSettings(f);
    expect(f).toEqual(copy);
  });
});
