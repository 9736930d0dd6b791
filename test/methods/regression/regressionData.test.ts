import { Readable } from 'node:stream';
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { designFromRows, fitLeastSquares, INTERCEPT_NAME, type LeastSquaresFit } from '../../../src/core/linearModel';
import {
  accumulateRegressionFromStream,
  createRegressionAccumulator,
  parseNumericCell,
  regressionDataFromText,
  TYPE_SAMPLE_ROWS,
  type RegressionData,
  type RegressionDataSpec,
} from '../../../src/methods/regression/regressionData';
import { isMissingCell } from '../../../src/data/missingCell';
import { expectClose } from '../../support/expectClose';
import { readNumericCsv } from '../../support/numericCsv';
import { readReferenceJson, readReferenceText } from '../../support/reference';
import { problemsOf } from '../../support/thrownProblems';

const swissText = readReferenceText('swiss.csv');
const swissSpec: RegressionDataSpec = {
  outcome: 'Fertility',
  treatment: 'Education',
  covariates: ['Agriculture', 'Examination', 'Catholic', 'Infant.Mortality'],
};

function outcomeFit(data: RegressionData): LeastSquaresFit {
  return fitLeastSquares(data.design, { response: data.outcomeColumn, predictors: data.predictors });
}

function expectSameFit(actual: LeastSquaresFit, expected: LeastSquaresFit, rel = 1e-12): void {
  expect(actual.predictors).toEqual(expected.predictors);
  expect(actual.rowCount).toBe(expected.rowCount);
  expected.coefficients.forEach((b, i) => {
    expectClose(actual.coefficients[i], b, { rel, abs: 1e-12 }, `coefficient ${expected.predictors[i]}`);
    expectClose(actual.standardErrors[i], expected.standardErrors[i], { rel, abs: 1e-12 }, `SE ${expected.predictors[i]}`);
  });
}

/** Swiss as rows of numbers, with its header names. */
const swissRows = () => readNumericCsv('swiss.csv');

describe('regressionDataFromText on R\'s swiss data', () => {
  // R 4.2.2 base lm: test/reference/ovb.json "swiss"
  const ref = readReferenceJson('ovb.json').swiss;
  const data = regressionDataFromText(swissText, swissSpec);
  const fit = outcomeFit(data);

  it('matches lm: treatment estimate, SE, t, df, partial R² (1e-9 relative)', () => {
    const d = data.predictors.indexOf('Education');
    expectClose(fit.coefficients[d], ref.estimate, { rel: 1e-9 });
    expectClose(fit.standardErrors[d], ref.se, { rel: 1e-9 });
    expectClose(fit.tValues[d], ref.t, { rel: 1e-9 });
    expect(fit.residualDf).toBe(ref.df);
    expectClose(fit.partialR2[d], ref.R2yd, { rel: 1e-9 });
  });

  it('matches lm: covariate t values in the outcome and treatment models', () => {
    const treatmentFit = fitLeastSquares(data.design, { response: data.treatmentColumn, predictors: data.predictors.slice(0, -1) });
    for (const covariate of swissSpec.covariates!) {
      const b = ref.benchmarks[covariate];
      expectClose(fit.tValues[data.predictors.indexOf(covariate)], b.t_in_main_model, { rel: 1e-9 }, covariate);
      expectClose(treatmentFit.tValues[data.predictors.indexOf(covariate)], b.t_in_D_model, { rel: 1e-9 }, covariate);
    }
  });

  it('accounts for every row and describes the design', () => {
    expect(data.rowsRead).toBe(47);
    expect(data.rowsUsed).toBe(47);
    expect(data.rowsDropped).toBe(0);
    expect(data.design.columnNames).toEqual([INTERCEPT_NAME, 'Agriculture', 'Examination', 'Catholic', 'Infant.Mortality', 'Education', 'Fertility']);
    expect(data.predictors).toEqual([INTERCEPT_NAME, 'Agriculture', 'Examination', 'Catholic', 'Infant.Mortality', 'Education']);
    expect(data.covariateColumns.map((c) => c.designColumns)).toEqual([['Agriculture'], ['Examination'], ['Catholic'], ['Infant.Mortality']]);
    expect(data.dialect).toEqual({ delimiter: ',', decimalComma: false });
    expect(Object.isFrozen(data)).toBe(true);
  });

  it('covariates default to every other column', () => {
    const all = regressionDataFromText(swissText, { outcome: 'Fertility', treatment: 'Education' });
    expect(all.covariates).toEqual(['Agriculture', 'Examination', 'Catholic', 'Infant.Mortality']);
  });

  it('any split of the text into chunks gives the same fit (property)', () => {
    fc.assert(
      fc.property(fc.uniqueArray(fc.integer({ min: 1, max: swissText.length - 1 }), { maxLength: 30 }), (cuts) => {
        const sorted = [...cuts].sort((a, b) => a - b);
        const accumulator = createRegressionAccumulator(swissSpec);
        let from = 0;
        for (const cut of [...sorted, swissText.length]) {
          accumulator.push(swissText.slice(from, cut));
          from = cut;
        }
        expectSameFit(outcomeFit(accumulator.finish()), fit);
      }),
      { numRuns: 60 },
    );
  });
});

describe('regressionDataFromText: adversarial CSV text', () => {
  const plain = regressionDataFromText(swissText, swissSpec);
  const plainFit = outcomeFit(plain);

  it('a byte-order mark and CRLF line ends', () => {
    const text = '\ufeff' + swissText.replace(/\n/g, '\r\n');
    expectSameFit(outcomeFit(regressionDataFromText(text, swissSpec)), plainFit);
  });

  it('`;` separators with decimal commas', () => {
    const text = swissText.replace(/,/g, ';').replace(/(\d)\.(\d)/g, '$1,$2');
    const data = regressionDataFromText(text, swissSpec);
    expect(data.dialect).toEqual({ delimiter: ';', decimalComma: true });
    expectSameFit(outcomeFit(data), plainFit);
  });

  it('tab separators', () => {
    const data = regressionDataFromText(swissText.replace(/,/g, '\t'), swissSpec);
    expect(data.dialect.delimiter).toBe('\t');
    expectSameFit(outcomeFit(data), plainFit);
  });

  it('quoted headers with line breaks, quotes and delimiters inside, and quoted cells', () => {
    const lines = swissText.trim().split('\n');
    const header = '"Fer""til""ity\nrate","Agri, culture","Examination","Education","Catholic","Infant.Mortality"';
    const body = lines.slice(1).map((l) => l.split(',').map((c, i) => (i % 2 === 0 ? `"${c}"` : c)).join(','));
    const text = [header, ...body].join('\n');
    const data = regressionDataFromText(text, { ...swissSpec, outcome: 'Fer"til"ity\nrate', covariates: ['Agri, culture', 'Examination', 'Catholic', 'Infant.Mortality'] });
    const fit = outcomeFit(data);
    expectClose(fit.coefficients[5], plainFit.coefficients[5], { rel: 1e-12 });
  });

  it('blank lines and a missing final line break are harmless', () => {
    const text = swissText.replace('\n', '\n\n\n').trimEnd();
    expectSameFit(outcomeFit(regressionDataFromText(text, swissSpec)), plainFit);
  });

  it('empty, NA, N/A, NaN, "." and NULL cells drop their rows and are counted per column', () => {
    const lines = swissText.trim().split('\n');
    const marks = ['', 'NA', ' N/A ', 'NaN', '.', 'null'];
    const dropped = new Set<number>();
    marks.forEach((mark, k) => {
      const row = 3 + 5 * k;
      const cells = lines[row].split(',');
      cells[k % 2 === 0 ? 1 : 3] = mark; // Agriculture or Education
      lines[row] = cells.join(',');
      dropped.add(row);
    });
    // A missing value in a column not chosen does not drop the row.
    const unchosen = lines[40].split(',');
    lines[40] = [...unchosen.slice(0, 4), 'NA', ...unchosen.slice(5)].join(',');
    const data = regressionDataFromText(lines.join('\n'), { ...swissSpec, covariates: ['Agriculture', 'Examination', 'Infant.Mortality'] });
    expect(data.rowsRead).toBe(47);
    expect(data.rowsDropped).toBe(6);
    expect(data.rowsUsed).toBe(41);
    expect(data.missingByColumn).toEqual({ Agriculture: 3, Examination: 0, 'Infant.Mortality': 0, Education: 3, Fertility: 0 });
    expect(data.warnings.join(' ')).toContain('6 of 47 rows were dropped');
    const { names, rows } = swissRows();
    const kept = rows.filter((_, i) => !dropped.has(i + 1));
    const direct = fitLeastSquares(designFromRows(names, kept), {
      response: 'Fertility',
      predictors: [INTERCEPT_NAME, 'Agriculture', 'Examination', 'Infant.Mortality', 'Education'],
    });
    expectSameFit(outcomeFit(data), direct);
  });

  it('huge (1e150) and tiny (1e-150) magnitudes', () => {
    const { names, rows } = swissRows();
    const scaled = rows.map((r) => r.map((v, j) => (j === 0 ? v * 1e150 : j === 3 ? v * 1e-150 : v)));
    const text = [names.join(','), ...scaled.map((r) => r.map((v) => v.toExponential(17)).join(','))].join('\n');
    const fit = outcomeFit(regressionDataFromText(text, swissSpec));
    const d = fit.predictors.indexOf('Education');
    // Fertility × 1e150 and Education × 1e-150: the coefficient scales by 1e300, t does not change.
    expectClose(fit.coefficients[d] / 1e300, plainFit.coefficients[d], { rel: 1e-9 });
    expectClose(fit.tValues[d], plainFit.tValues[d], { rel: 1e-9 });
  });

  it('a ragged row is named', () => {
    const lines = swissText.trim().split('\n');
    lines[5] += ',99';
    const problems = problemsOf(() => regressionDataFromText(lines.join('\n'), swissSpec));
    expect(problems[0]).toMatchObject({ field: 'file', code: 'ragged-row' });
    expect(problems[0].message).toMatch(/row 5 .*7 fields but the header has 6/);
  });

  it('a non-numeric cell in a numeric column is named with its row and value', () => {
    const lines = swissText.trim().split('\n');
    const cells = lines[12].split(',');
    cells[3] = 'twelve';
    lines[12] = cells.join(',');
    // Within the typing sample: the column is numbers with one text cell, named with its row.
    const early = problemsOf(() => regressionDataFromText(lines.join('\n'), swissSpec))[0];
    expect(early).toMatchObject({ field: 'treatment', code: 'not-a-number', value: 'twelve' });
    expect(early.message).toContain('column "Education", row 12: "twelve" is not a number, while other rows hold numbers');
    // After the typing sample, a non-number is an error naming column, row and value.
    const long = [lines[0], ...Array.from({ length: TYPE_SAMPLE_ROWS + 10 }, (_, i) => swissText.trim().split('\n')[1 + (i % 47)])];
    const bad = long[TYPE_SAMPLE_ROWS + 5].split(',');
    bad[3] = '1O';
    long[TYPE_SAMPLE_ROWS + 5] = bad.join(',');
    const problems = problemsOf(() => regressionDataFromText(long.join('\n'), swissSpec));
    expect(problems[0]).toMatchObject({ field: 'treatment', code: 'not-a-number', value: '1O' });
    expect(problems[0].message).toContain(`column "Education", row ${TYPE_SAMPLE_ROWS + 5}: "1O" is not a number`);
  });

  it('a covariate of numbers with a text cell is named (not silently made a category)', () => {
    const lines = swissText.trim().split('\n');
    const cells = lines[7].split(',');
    cells[1] = '4O.5';
    lines[7] = cells.join(',');
    const problems = problemsOf(() => regressionDataFromText(lines.join('\n'), swissSpec));
    expect(problems).toHaveLength(1);
    expect(problems[0]).toMatchObject({ field: 'covariates[0]', code: 'not-a-number', value: '4O.5' });
  });

  it('constant and collinear columns are named by the fit', () => {
    const { names, rows } = swissRows();
    const text = [[...names, 'same', 'AgEx'].join(','), ...rows.map((r) => [...r, 5, r[1] - 2 * r[2]].join(','))].join('\n');
    const data = regressionDataFromText(text, { ...swissSpec, covariates: ['Agriculture', 'Examination', 'same', 'AgEx'] });
    const problems = problemsOf(() => outcomeFit(data));
    expect(problems.map((p) => p.code)).toEqual(['constant', 'collinear']);
    expect(problems[1].message).toContain('"AgEx" is a linear combination of "Agriculture" and "Examination"');
  });

  it('unknown and repeated columns are named together', () => {
    const problems = problemsOf(() =>
      regressionDataFromText(swissText, { outcome: 'Fertility', treatment: 'Fertility', covariates: ['Age', 'Catholic', 'Catholic', 'Fertility'] }),
    );
    expect(problems.map((p) => `${p.field}:${p.code}`)).toEqual(['treatment:chosen-twice', 'covariates[0]:unknown-column', 'covariates[2]:chosen-twice', 'covariates[3]:chosen-twice']);
    expect(problems[1].message).toContain('there is no column named "Age" (columns: "Fertility", "Agriculture"');
  });

  it('an empty file, and a file with no complete row', () => {
    expect(problemsOf(() => regressionDataFromText('', swissSpec))[0]).toMatchObject({ field: 'file', code: 'empty' });
    expect(problemsOf(() => regressionDataFromText('\ufeff\r\n', swissSpec))[0]).toMatchObject({ field: 'file', code: 'empty' });
    const headerOnly = swissText.split('\n')[0];
    expect(problemsOf(() => regressionDataFromText(headerOnly, swissSpec))[0]).toMatchObject({ field: 'file', code: 'no-complete-rows' });
  });
});

describe('regressionDataFromText: dummy coding against numpy', () => {
  // numpy 2.4.6 linalg.lstsq on swiss sorted by Catholic with a derived 3-level column and two NA cells:
  // test/reference/swiss_regions.json, generated by test/reference/generators/swiss_regions.py
  const ref = readReferenceJson('swiss_regions.json');
  it('levels first seen part-way through, reference = alphabetically first, NA rows dropped: same fit as numpy', () => {
    const data = regressionDataFromText(readReferenceText('swiss_regions.csv'), {
      outcome: 'Fertility',
      treatment: 'Education',
      covariates: ['Agriculture', 'region'],
    });
    expect(data.rowsRead).toBe(ref.rows_read);
    expect(data.rowsUsed).toBe(ref.rows_used);
    expect(data.categorical[0].levels).toEqual(ref.levels);
    expect(data.categorical[0].reference).toBe(ref.reference);
    expect(data.predictors).toEqual(ref.predictors);
    const fit = outcomeFit(data);
    expect(fit.residualDf).toBe(ref.residual_df);
    ref.predictors.forEach((name: string, i: number) => {
      expectClose(fit.coefficients[i], ref.coefficients[i], { rel: 1e-9 }, name);
      expectClose(fit.standardErrors[i], ref.standard_errors[i], { rel: 1e-9 }, `SE ${name}`);
    });
  });
});

describe('regressionDataFromText: categorical columns (dummy coding, R\'s treatment contrasts)', () => {
  const { names, rows } = swissRows();
  const regionOf = (r: number[]): string => (r[4] > 90 ? 'south' : r[4] > 20 ? 'mid' : 'north');

  /** The same regression with the indicator columns written out by hand. */
  function manualFit(levels: string[], reference: string, data: number[][], regions: string[]): LeastSquaresFit {
    const dummies = levels.filter((l) => l !== reference);
    const design = designFromRows(
      ['Agriculture', ...dummies.map((l) => `region=${l}`), 'Education', 'Fertility'],
      data.map((r, i) => [r[1], ...dummies.map((l) => (regions[i] === l ? 1 : 0)), r[3], r[0]]),
    );
    return fitLeastSquares(design, { response: 'Fertility', predictors: [INTERCEPT_NAME, 'Agriculture', ...dummies.map((l) => `region=${l}`), 'Education'] });
  }

  function csv(data: number[][], regions: string[]): string {
    return ['Fertility,Agriculture,Education,region', ...data.map((r, i) => `${r[0]},${r[1]},${r[3]},${regions[i]}`)].join('\n');
  }
  const spec: RegressionDataSpec = { outcome: 'Fertility', treatment: 'Education', covariates: ['Agriculture', 'region'] };

  it('codes a text column with the alphabetically first level as reference', () => {
    const regions = rows.map(regionOf);
    const data = regressionDataFromText(csv(rows, regions), spec);
    expect(data.categorical).toEqual([{ column: 'region', reference: 'mid', levels: ['mid', 'north', 'south'], designColumns: ['region=north', 'region=south'] }]);
    expect(data.covariateColumns[1]).toEqual({ column: 'region', designColumns: ['region=north', 'region=south'] });
    expectSameFit(outcomeFit(data), manualFit(['mid', 'north', 'south'], 'mid', rows, regions), 1e-10);
  });

  it('levels first seen after the typing sample, and a new alphabetically first level late, give the same fit', () => {
    // Many rows of two levels, then new levels — one sorting before the others, so the reference changes.
    const many = Array.from({ length: TYPE_SAMPLE_ROWS + 300 }, (_, i) => rows[i % rows.length].map((v) => v + (i % 7) * 0.01));
    const regions = many.map((r, i) => (i < TYPE_SAMPLE_ROWS + 100 ? (r[4] > 50 ? 'north' : 'south') : i % 3 === 0 ? 'east' : i % 3 === 1 ? 'north' : 'west'));
    const data = regressionDataFromText(csv(many, regions), spec);
    expect(data.categorical[0].reference).toBe('east');
    expect(data.categorical[0].levels).toEqual(['east', 'north', 'south', 'west']);
    expectSameFit(outcomeFit(data), manualFit(['east', 'north', 'south', 'west'], 'east', many, regions), 1e-9);
  });

  it('any order of appearance of the levels gives the same fit as hand-written indicators (property)', () => {
    fc.assert(
      fc.property(fc.array(fc.constantFrom('b', 'a', 'd', 'c'), { minLength: rows.length, maxLength: rows.length }), (regions) => {
        const levels = [...new Set(regions)].sort();
        if (levels.length < 2) return;
        const data = regressionDataFromText(csv(rows, regions), spec);
        expect(data.categorical[0].reference).toBe(levels[0]);
        expectSameFit(outcomeFit(data), manualFit(levels, levels[0], rows, regions), 1e-9);
      }),
      { numRuns: 60 },
    );
  });

  it('a numeric-looking column listed as categorical is dummy-coded', () => {
    const regions = rows.map((r) => (r[4] > 50 ? '2' : '10'));
    const data = regressionDataFromText(csv(rows, regions), { ...spec, categorical: ['region'] });
    // Character order: "10" sorts before "2".
    expect(data.categorical[0].reference).toBe('10');
    expectSameFit(outcomeFit(data), manualFit(['10', '2'], '10', rows, regions), 1e-10);
  });

  it('a level that only occurs in dropped rows is not a level', () => {
    const regions: string[] = rows.map((r) => (r[4] > 50 ? 'north' : 'south'));
    regions[4] = 'atlantis';
    const text = csv(rows, regions).split('\n');
    text[5] = text[5].replace(/^[^,]*/, 'NA');
    const data = regressionDataFromText(text.join('\n'), spec);
    expect(data.categorical[0].levels).toEqual(['north', 'south']);
    expect(data.rowsDropped).toBe(1);
  });

  it('a two-level text treatment is coded 0/1; three levels are refused', () => {
    const regions = rows.map((r) => (r[4] > 50 ? 'yes' : 'no'));
    const two = regressionDataFromText(csv(rows, regions), { outcome: 'Fertility', treatment: 'region', covariates: ['Agriculture'] });
    expect(two.treatmentColumn).toBe('region=yes');
    expect(two.predictors).toEqual([INTERCEPT_NAME, 'Agriculture', 'region=yes']);
    const three = rows.map(regionOf);
    expect(problemsOf(() => regressionDataFromText(csv(rows, three), { outcome: 'Fertility', treatment: 'region', covariates: ['Agriculture'] }))[0]).toMatchObject({
      field: 'treatment',
      code: 'too-many-levels',
    });
  });

  it('a categorical covariate with one level is refused', () => {
    expect(problemsOf(() => regressionDataFromText(csv(rows, rows.map(() => 'same')), spec))[0]).toMatchObject({ field: 'covariates[1]', code: 'constant' });
  });

  it('without an intercept the first categorical covariate keeps every level (R\'s convention)', () => {
    const regions = rows.map(regionOf);
    const data = regressionDataFromText(csv(rows, regions), { ...spec, intercept: false });
    expect(data.categorical[0].reference).toBeNull();
    expect(data.predictors).toEqual(['Agriculture', 'region=mid', 'region=north', 'region=south', 'Education']);
    const withIntercept = outcomeFit(regressionDataFromText(csv(rows, regions), spec));
    const fit = outcomeFit(data);
    // The same model, reparametrised: the treatment coefficient is unchanged.
    expectClose(fit.coefficients[4], withIntercept.coefficients[4], { rel: 1e-10 });
  });
});

describe('accumulateRegressionFromStream', () => {
  it('reads a Node stream in small byte chunks (splitting multi-byte characters) with progress', async () => {
    const text = swissText.replace('"Catholic"', '"Catholic ✝ é"');
    const bytes = Buffer.from(text, 'utf8');
    const chunks: Buffer[] = [];
    for (let i = 0; i < bytes.length; i += 7) chunks.push(bytes.subarray(i, i + 7));
    const progress: number[] = [];
    const data = await accumulateRegressionFromStream(Readable.from(chunks), { ...swissSpec, covariates: ['Agriculture', 'Catholic ✝ é'] }, {
      totalBytes: bytes.length,
      onProgress: (p) => progress.push(p.bytesRead),
    });
    expect(data.rowsUsed).toBe(47);
    expect(progress.at(-1)).toBe(bytes.length);
    expect(progress).toEqual([...progress].sort((a, b) => a - b));
  });

  it('stops when its signal aborts', async () => {
    const controller = new AbortController();
    async function* endless(): AsyncGenerator<string> {
      yield swissText;
      for (;;) {
        controller.abort();
        yield swissText.split('\n').slice(1).join('\n');
      }
    }
    await expect(accumulateRegressionFromStream(endless(), swissSpec, { signal: controller.signal })).rejects.toThrow(/abort/i);
  });
});

describe('cell readers', () => {
  it('isMissingCell', () => {
    for (const text of ['', ' ', 'NA', 'na', 'N/A', 'NaN', '.', 'NULL', ' NA ']) expect(isMissingCell(text), text).toBe(true);
    for (const text of ['0', 'N', 'NAN1', 'none', '-']) expect(isMissingCell(text), text).toBe(false);
  });
  it('parseNumericCell refuses hex, Infinity and words, accepts exponents and decimal commas', () => {
    expect(parseNumericCell('1e-3', false)).toBe(0.001);
    expect(parseNumericCell('-.5', false)).toBe(-0.5);
    expect(parseNumericCell(' 12 ', false)).toBe(12);
    expect(parseNumericCell('0x1A', false)).toBeNaN();
    expect(parseNumericCell('Infinity', false)).toBeNaN();
    expect(parseNumericCell('1e400', false)).toBeNaN();
    expect(parseNumericCell('12,5', true)).toBe(12.5);
    expect(parseNumericCell('1.234,5', true)).toBe(1234.5);
    expect(parseNumericCell('12,5', false)).toBeNaN();
  });
});
