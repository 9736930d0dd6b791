import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import {
  designFromRows,
  fitLeastSquares,
  groupPartialR2,
  INTERCEPT_NAME,
  partialR2FromT,
  residualSumOfSquares,
  subsetRegression,
  validateLeastSquares,
} from '../../src/core/linearModel';
import { expectClose } from '../support/expectClose';
import { readNumericCsv } from '../support/numericCsv';
import { readReferenceJson } from '../support/reference';
import { problemsOf } from '../support/thrownProblems';

const swissCovariates = ['Agriculture', 'Examination', 'Catholic', 'Infant.Mortality'];

describe('fitLeastSquares: NIST StRD Longley', () => {
  // NIST Statistical Reference Datasets, linear regression "Longley" (certified values), test/reference/longley.json
  const cert = readReferenceJson('longley.json').certified;
  const { names, rows } = readNumericCsv('longley.csv');
  const design = designFromRows(names, rows);
  const fit = fitLeastSquares(design, { response: 'y', predictors: [INTERCEPT_NAME, 'x1', 'x2', 'x3', 'x4', 'x5', 'x6'] });
  const keys = ['intercept', 'x1', 'x2', 'x3', 'x4', 'x5', 'x6'];
  it('reproduces the certified coefficients and standard errors to 10 significant digits', () => {
    keys.forEach((key, i) => {
      expectClose(fit.coefficients[i], cert.coefficients[key], { rel: 1e-10 }, `coefficient ${key}`);
      expectClose(fit.standardErrors[i], cert.standard_errors[key], { rel: 1e-10 }, `SE ${key}`);
    });
    expectClose(fit.residualSd, cert.residual_sd, { rel: 1e-10 }, 'residual SD');
    expectClose(fit.rSquared, cert.r_squared, { rel: 1e-12 }, 'R²');
    expect(fit.residualDf).toBe(cert.residual_df);
  });
  it('does not depend on the order of the predictors', () => {
    const shuffled = ['x6', 'x3', INTERCEPT_NAME, 'x1', 'x5', 'x2', 'x4'];
    const other = fitLeastSquares(design, { response: 'y', predictors: shuffled });
    shuffled.forEach((name, i) => {
      const key = name === INTERCEPT_NAME ? 'intercept' : name;
      expectClose(other.coefficients[i], cert.coefficients[key], { rel: 1e-9 }, key);
    });
  });
});

describe('fitLeastSquares: NIST StRD Wampler1 and Wampler2 (exact polynomials)', () => {
  // NIST StRD "Wampler1"/"Wampler2" (higher difficulty): x = 0…20, y an exact polynomial of degree 5, so the
  // certified coefficients are its coefficients and the certified residual SD is 0. Data and certified values
  // recalled from memory of the NIST pages (they follow from the data's definition).
  const xs = Array.from({ length: 21 }, (_, x) => x);
  const names = ['x', 'x2', 'x3', 'x4', 'x5', 'y'];
  const powers = (x: number) => [x, x ** 2, x ** 3, x ** 4, x ** 5];
  const predictors = [INTERCEPT_NAME, 'x', 'x2', 'x3', 'x4', 'x5'];

  it('Wampler1: y = 1 + x + x² + x³ + x⁴ + x⁵ gives coefficients 1 (9 digits) and an exact-fit warning', () => {
    const rows = xs.map((x) => [...powers(x), 1 + x + x ** 2 + x ** 3 + x ** 4 + x ** 5]);
    const fit = fitLeastSquares(designFromRows(names, rows), { response: 'y', predictors });
    fit.coefficients.forEach((b, i) => expectClose(b, 1, { rel: 1e-9 }, predictors[i]));
    expect(fit.warnings.length).toBe(1);
  });

  it('Wampler2: y = 1 + 0.1x + 0.01x² + … + 0.00001x⁵ gives its coefficients (9 digits)', () => {
    // y written with 5 decimals, as in the data file: exact integer arithmetic, then one rounding.
    const rows = xs.map((x) => [...powers(x), (1e5 + 1e4 * x + 1e3 * x ** 2 + 100 * x ** 3 + 10 * x ** 4 + x ** 5) / 1e5]);
    const fit = fitLeastSquares(designFromRows(names, rows), { response: 'y', predictors });
    [1, 0.1, 0.01, 0.001, 1e-4, 1e-5].forEach((b, i) => expectClose(fit.coefficients[i], b, { rel: 1e-9 }, predictors[i]));
    expectClose(fit.rSquared, 1, { rel: 1e-12 });
  });
});

describe('fitLeastSquares: R lm on swiss', () => {
  // R 4.2.2 base lm: test/reference/ovb.json "swiss"
  const ref = readReferenceJson('ovb.json').swiss;
  const { names, rows } = readNumericCsv('swiss.csv');
  const design = designFromRows(names, rows);
  const main = fitLeastSquares(design, { response: 'Fertility', predictors: [INTERCEPT_NAME, 'Education', ...swissCovariates] });

  it('treatment estimate, SE, t, df and partial R² match lm to 1e-9', () => {
    expectClose(main.coefficients[1], ref.estimate, { rel: 1e-9 }, 'estimate');
    expectClose(main.standardErrors[1], ref.se, { rel: 1e-9 }, 'se');
    expectClose(main.tValues[1], ref.t, { rel: 1e-9 }, 't');
    expect(main.residualDf).toBe(ref.df);
    expectClose(main.partialR2[1], ref.R2yd, { rel: 1e-9 }, 'R2yd');
    expect(main.rowCount).toBe(ref.n);
  });

  it('covariate t values and partial R² in the outcome model and in the treatment model (sub-regression) match lm', () => {
    const treatmentModel = subsetRegression(design, 'Education', [INTERCEPT_NAME, ...swissCovariates]);
    swissCovariates.forEach((covariate, i) => {
      const b = ref.benchmarks[covariate];
      expectClose(main.tValues[2 + i], b.t_in_main_model, { rel: 1e-9 }, `${covariate} t in outcome model`);
      expectClose(main.partialR2[2 + i], b.R2yxj, { rel: 1e-9 }, `${covariate} R2yxj`);
      expectClose(treatmentModel.tValues[1 + i], b.t_in_D_model, { rel: 1e-9 }, `${covariate} t in treatment model`);
      expectClose(treatmentModel.partialR2[1 + i], b.R2dxj, { rel: 1e-9 }, `${covariate} R2dxj`);
      expect(treatmentModel.residualDf).toBe(b.df_D_model);
    });
  });

  it('the partial R² of a one-column group equals t²/(t² + df)', () => {
    const spec = { response: 'Fertility', predictors: [INTERCEPT_NAME, 'Education', ...swissCovariates] };
    // R 4.2.2 lm via ovb.json: R2yd of Education
    expectClose(groupPartialR2(design, { ...spec, group: ['Education'] }), ref.R2yd, { rel: 1e-9 });
  });

  it('the partial R² of a group is (RSS without it − RSS with it)/RSS without it', () => {
    const spec = { response: 'Fertility', predictors: [INTERCEPT_NAME, 'Education', ...swissCovariates] };
    const group = ['Agriculture', 'Catholic'];
    const rssFull = residualSumOfSquares(design, 'Fertility', spec.predictors);
    const rssReduced = residualSumOfSquares(design, 'Fertility', [INTERCEPT_NAME, 'Education', 'Examination', 'Infant.Mortality']);
    expectClose(groupPartialR2(design, { ...spec, group }), (rssReduced - rssFull) / rssReduced, { rel: 1e-12 });
  });
});

describe('fitLeastSquares: conventions and special cases', () => {
  const rows = [
    [1, 2, 3.1],
    [2, 1, 4.9],
    [3, 5, 9.2],
    [4, 3, 9.8],
    [5, 8, 15.1],
  ];
  it('without an intercept, R² is about zero (Σy²), as R\'s lm reports', () => {
    const design = designFromRows(['a', 'b', 'y'], rows, { intercept: false });
    const fit = fitLeastSquares(design, { response: 'y', predictors: ['a', 'b'] });
    const sumY2 = rows.reduce((s, r) => s + r[2] ** 2, 0);
    expectClose(fit.totalSumOfSquares, sumY2, { rel: 1e-13 });
    expectClose(fit.rSquared, 1 - fit.residualSumOfSquares / sumY2, { rel: 1e-13 });
    expect(fit.hasIntercept).toBe(false);
  });

  it('with an intercept, R² is about the mean', () => {
    const design = designFromRows(['a', 'b', 'y'], rows);
    const fit = fitLeastSquares(design, { response: 'y', predictors: [INTERCEPT_NAME, 'a'] });
    const mean = rows.reduce((s, r) => s + r[2], 0) / rows.length;
    expectClose(fit.totalSumOfSquares, rows.reduce((s, r) => s + (r[2] - mean) ** 2, 0), { rel: 1e-13 });
  });

  it('an exact fit gives rounding-level standard errors, partial R² 1 and a warning', () => {
    const design = designFromRows(['a', 'y'], [
      [1, 3],
      [2, 5],
      [3, 7],
    ]);
    const fit = fitLeastSquares(design, { response: 'y', predictors: [INTERCEPT_NAME, 'a'] });
    expectClose(fit.coefficients[1], 2, { rel: 1e-13 });
    expect(fit.standardErrors[1]).toBeLessThan(1e-12);
    expectClose(fit.partialR2[1], 1, { rel: 1e-12 });
    expect(fit.warnings.length).toBe(1);
  });

  it('partialR2FromT handles limits and NaN', () => {
    expect(partialR2FromT(Infinity, 5)).toBe(1);
    expect(partialR2FromT(-Infinity, 5)).toBe(1);
    expect(partialR2FromT(0, 5)).toBe(0);
    expect(partialR2FromT(NaN, 5)).toBeNaN();
  });
});

describe('fitLeastSquares: invariants', () => {
  it('partial R² lies in [0, 1] and equals the group partial R² of that predictor (property)', () => {
    fc.assert(
      fc.property(
        fc.array(fc.array(fc.double({ min: -100, max: 100, noNaN: true }), { minLength: 3, maxLength: 3 }), { minLength: 8, maxLength: 30 }),
        (rows) => {
          const design = designFromRows(['a', 'b', 'y'], rows);
          const spec = { response: 'y', predictors: [INTERCEPT_NAME, 'a', 'b'] };
          if (validateLeastSquares(design, spec).length > 0) return;
          const fit = fitLeastSquares(design, spec);
          // An exact fit (possible with subnormal data) has SE 0 and t = 0/0 for a zero coefficient, as in R.
          if (fit.warnings.length > 0) return;
          for (const r2 of fit.partialR2) {
            expect(r2).toBeGreaterThanOrEqual(0);
            expect(r2).toBeLessThanOrEqual(1);
          }
          // Near-exact fits leave a residual at rounding level, where RSS has few correct digits.
          if (fit.rSquared < 1 - 1e-6) {
            expectClose(groupPartialR2(design, { ...spec, group: ['a'] }), fit.partialR2[1], { rel: 1e-6, abs: 1e-9 });
          }
        },
      ),
      { numRuns: 200 },
    );
  });
});

describe('fitLeastSquares: bad input', () => {
  const base = [
    [1, 2, 0, 1],
    [2, 1, 0, 3],
    [3, 5, 0, 2],
    [4, 3, 0, 5],
    [5, 8, 0, 4],
    [6, 1, 0, 7],
  ];
  const rows = base.map(([a, b, , y]) => [a, b, a + 2 * b, 7, 0, y]);
  const design = designFromRows(['a', 'b', 'sum', 'seven', 'zero', 'y'], rows);

  it('names a column that is a linear combination of others', () => {
    const problems = problemsOf(() => fitLeastSquares(design, { response: 'y', predictors: [INTERCEPT_NAME, 'a', 'b', 'sum'] }));
    expect(problems).toHaveLength(1);
    expect(problems[0]).toMatchObject({ field: 'predictors[3]', code: 'collinear' });
    expect(problems[0].message).toContain('"sum" is a linear combination of "a" and "b"');
  });

  it('names a constant column and a zero column', () => {
    const problems = problemsOf(() => fitLeastSquares(design, { response: 'y', predictors: [INTERCEPT_NAME, 'a', 'seven', 'zero'] }));
    expect(problems.map((p) => p.code)).toEqual(['constant', 'zero-column']);
    expect(problems[0].message).toContain('"seven" is constant');
    expect(problems[1].message).toContain('"zero" is zero in every row');
  });

  it('judges constancy after the intercept on the centred scale: 1e9 + x (x varies by ±3) and x·1e-300 are kept', () => {
    // Invented data. Least squares is invariant to adding a constant to a predictor (with an intercept) and to
    // scaling it: the slope of y on x is the same. R's lm (uncentred norm, tol 1e-7) would drop the 1e9 column.
    const x = [2, 1, 5, 3, 4, 8, 2, 7];
    const y = [1, 2, 3, 5, 4, 7, 6, 2];
    const fitOf = (f: (v: number) => number) =>
      fitLeastSquares(designFromRows(['x', 'y'], x.map((v, i) => [f(v), y[i]])), { response: 'y', predictors: [INTERCEPT_NAME, 'x'] });
    const plain = fitOf((v) => v);
    expectClose(fitOf((v) => 1e9 + v).coefficients[1], plain.coefficients[1], { rel: 1e-6 });
    expectClose(fitOf((v) => v * 1e-300).coefficients[1] * 1e-300, plain.coefficients[1], { rel: 1e-12 });
    // A truly constant column is still called constant, however large its value.
    const constant = problemsOf(() =>
      fitLeastSquares(designFromRows(['x', 'big', 'y'], x.map((v, i) => [v, 1e9 + 0.5, y[i]])), { response: 'y', predictors: [INTERCEPT_NAME, 'x', 'big'] }),
    );
    expect(constant.map((p) => p.code)).toEqual(['constant']);
  });

  it('refuses a constant response', () => {
    const problems = problemsOf(() => fitLeastSquares(design, { response: 'seven', predictors: [INTERCEPT_NAME, 'a'] }));
    expect(problems[0]).toMatchObject({ field: 'response', code: 'constant' });
  });

  it('names unknown columns, repeated columns and the response used as a predictor', () => {
    const problems = problemsOf(() => fitLeastSquares(design, { response: 'nope', predictors: ['a', 'a', 'y2'] }));
    expect(problems.map((p) => p.code)).toEqual(['unknown-column', 'chosen-twice', 'unknown-column']);
    const self = problemsOf(() => fitLeastSquares(design, { response: 'y', predictors: ['a', 'y'] }));
    expect(self[0]).toMatchObject({ field: 'predictors[1]', code: 'response-as-predictor' });
  });

  it('needs more rows than coefficients', () => {
    const small = designFromRows(['a', 'y'], [
      [1, 2],
      [2, 3],
    ]);
    const problems = problemsOf(() => fitLeastSquares(small, { response: 'y', predictors: [INTERCEPT_NAME, 'a'] }));
    expect(problems[0]).toMatchObject({ field: 'rowCount', code: 'too-few-rows' });
  });

  it('refuses an empty or foreign group', () => {
    const spec = { response: 'y', predictors: [INTERCEPT_NAME, 'a', 'b'] };
    expect(problemsOf(() => groupPartialR2(design, { ...spec, group: [] }))[0].code).toBe('empty');
    expect(problemsOf(() => groupPartialR2(design, { ...spec, group: ['sum'] }))[0]).toMatchObject({ field: 'group[0]', code: 'not-a-predictor' });
  });

  it('does not modify its input, and returns a frozen result', () => {
    const frozen = Object.freeze({ ...design, columnNames: Object.freeze([...design.columnNames]) });
    const before = [...frozen.r];
    const fit = fitLeastSquares(frozen, Object.freeze({ response: 'y', predictors: Object.freeze([INTERCEPT_NAME, 'a', 'b']) }));
    expect([...frozen.r]).toEqual(before);
    expect(Object.isFrozen(fit)).toBe(true);
    expect(Object.isFrozen(fit.coefficients)).toBe(true);
  });
});
