import { describe, expect, it } from 'vitest';
import { designFromCrossProducts, validateCrossProducts, type CrossProductInput } from '../../src/core/crossProductFit';
import { fitLeastSquares, INTERCEPT_NAME } from '../../src/core/linearModel';
import { expectClose } from '../support/expectClose';
import { readNumericCsv } from '../support/numericCsv';
import { readReferenceJson } from '../support/reference';
import { problemsOf } from '../support/thrownProblems';

function rawInput(names: string[], rows: number[][]): CrossProductInput {
  const k = names.length;
  const sums = new Array<number>(k).fill(0);
  const crossProducts = names.map(() => new Array<number>(k).fill(0));
  for (const row of rows) {
    for (let i = 0; i < k; i++) {
      sums[i] += row[i];
      for (let j = 0; j < k; j++) crossProducts[i][j] += row[i] * row[j];
    }
  }
  return { kind: 'cross-products', columnNames: names, rowCount: rows.length, sums, crossProducts };
}

function covarianceInput(names: string[], rows: number[][]): CrossProductInput {
  const k = names.length;
  const n = rows.length;
  const means = names.map((_, j) => rows.reduce((s, r) => s + r[j], 0) / n);
  const covariance = names.map((_, i) => names.map((__, j) => rows.reduce((s, r) => s + (r[i] - means[i]) * (r[j] - means[j]), 0) / (n - 1)));
  return { kind: 'covariance', columnNames: names, rowCount: n, means, covariance };
}

describe('designFromCrossProducts', () => {
  // R 4.2.2 base lm: test/reference/ovb.json "swiss"
  const ref = readReferenceJson('ovb.json').swiss;
  const swiss = readNumericCsv('swiss.csv');
  const predictors = [INTERCEPT_NAME, 'Education', 'Agriculture', 'Examination', 'Catholic', 'Infant.Mortality'];

  for (const [label, input] of [
    ['raw sums and cross-products', rawInput(swiss.names, swiss.rows)],
    ['means and covariance', covarianceInput(swiss.names, swiss.rows)],
  ] as const) {
    it(`from ${label}: the swiss regression matches lm to 1e-9`, () => {
      const fit = fitLeastSquares(designFromCrossProducts(input), { response: 'Fertility', predictors });
      expectClose(fit.coefficients[1], ref.estimate, { rel: 1e-9 });
      expectClose(fit.standardErrors[1], ref.se, { rel: 1e-9 });
      expectClose(fit.tValues[1], ref.t, { rel: 1e-9 });
      expect(fit.residualDf).toBe(ref.df);
      for (const covariate of ['Agriculture', 'Examination', 'Catholic', 'Infant.Mortality']) {
        expectClose(fit.partialR2[predictors.indexOf(covariate)], ref.benchmarks[covariate].R2yxj, { rel: 1e-9 }, covariate);
      }
    });
  }

  it('from the covariance of NIST Longley: the certified coefficients to about 7 digits (the normal equations square its condition number)', () => {
    // NIST StRD "Longley" certified values (test/reference/longley.json). The QR path reaches 10+ digits.
    const cert = readReferenceJson('longley.json').certified;
    const { names, rows } = readNumericCsv('longley.csv');
    const fit = fitLeastSquares(designFromCrossProducts(covarianceInput(names, rows)), {
      response: 'y',
      predictors: [INTERCEPT_NAME, 'x1', 'x2', 'x3', 'x4', 'x5', 'x6'],
    });
    ['intercept', 'x1', 'x2', 'x3', 'x4', 'x5', 'x6'].forEach((key, i) => {
      expectClose(fit.coefficients[i], cert.coefficients[key], { rel: 1e-6 }, key);
    });
  });

  it('without an intercept: the same as the raw rows without one', () => {
    const input = { ...rawInput(swiss.names, swiss.rows), intercept: false };
    const design = designFromCrossProducts(input);
    expect(design.interceptColumn).toBeNull();
    const fit = fitLeastSquares(design, { response: 'Fertility', predictors: ['Education', 'Agriculture'] });
    const cov = designFromCrossProducts({ ...covarianceInput(swiss.names, swiss.rows), intercept: false });
    const other = fitLeastSquares(cov, { response: 'Fertility', predictors: ['Education', 'Agriculture'] });
    expectClose(fit.coefficients[0], other.coefficients[0], { rel: 1e-10 });
    expectClose(fit.rSquared, other.rSquared, { rel: 1e-10 });
  });

  it('a collinear or constant variable gives a zero row, and the fit names it', () => {
    const rows = swiss.rows.map((r) => [...r, r[1] + r[2], 4]);
    const names = [...swiss.names, 'AgEx', 'four'];
    const design = designFromCrossProducts(covarianceInput(names, rows));
    const problems = problemsOf(() => fitLeastSquares(design, { response: 'Fertility', predictors: [INTERCEPT_NAME, 'Agriculture', 'Examination', 'AgEx', 'four'] }));
    expect(problems.map((p) => p.code)).toEqual(['collinear', 'constant']);
    expect(problems[0].message).toContain('"AgEx" is a linear combination of "Agriculture" and "Examination"');
  });

  it('refuses a matrix no real data could give', () => {
    const input: CrossProductInput = { kind: 'covariance', columnNames: ['a', 'b'], rowCount: 10, means: [0, 0], covariance: [[1, 2], [2, 1]] };
    expect(problemsOf(() => designFromCrossProducts(input))[0]).toMatchObject({ field: 'covariance', code: 'not-positive-semidefinite' });
  });

  it('validates shape, symmetry, finiteness, names and n', () => {
    const bad: CrossProductInput = {
      kind: 'cross-products',
      columnNames: ['a', 'a'],
      rowCount: 1.5,
      sums: [1, NaN],
      crossProducts: [
        [1, 2],
        [3, -1],
      ],
    };
    const fields = validateCrossProducts(bad).map((p) => `${p.field}:${p.code}`);
    expect(fields).toEqual(['columnNames[1]:chosen-twice', 'rowCount:not-a-count', 'sums[1]:not-finite', 'crossProducts[0][1]:not-symmetric', 'crossProducts[1][1]:negative']);
    expect(validateCrossProducts({ ...bad, columnNames: ['a', 'b', 'c'], rowCount: 5, sums: [1, 2, 3] }).map((p) => p.code)).toEqual(['wrong-shape']);
  });
});
