import { describe, expect, it } from 'vitest';
import { designFromRows, fitLeastSquares, INTERCEPT_NAME } from '../../src/core/linearModel';
import { expectClose } from '../support/expectClose';
import { readReferenceJson, readReferenceText } from '../support/reference';

function readNumericCsv(name: string): { names: string[]; rows: number[][] } {
  const lines = readReferenceText(name).trim().split(/\r?\n/);
  const names = lines[0].split(',').map((h) => h.replace(/^"|"$/g, ''));
  return { names, rows: lines.slice(1).map((line) => line.split(',').map(Number)) };
}

describe('fitLeastSquares: NIST StRD Longley', () => {
  // NIST Statistical Reference Datasets, linear regression "Longley" (certified values), test/reference/longley.json
  const cert = readReferenceJson('longley.json').certified;
  const { names, rows } = readNumericCsv('longley.csv');
  const design = designFromRows(names, rows);
  const fit = fitLeastSquares(design, { response: 'y', predictors: [INTERCEPT_NAME, 'x1', 'x2', 'x3', 'x4', 'x5', 'x6'] });
  const keys = ['intercept', 'x1', 'x2', 'x3', 'x4', 'x5', 'x6'];
  it('reproduces the certified coefficients and standard errors', () => {
    keys.forEach((key, i) => {
      expectClose(fit.coefficients[i], cert.coefficients[key], { rel: 1e-10 }, `coefficient ${key}`);
      expectClose(fit.standardErrors[i], cert.standard_errors[key], { rel: 1e-10 }, `SE ${key}`);
    });
    expectClose(fit.residualSd, cert.residual_sd, { rel: 1e-10 }, 'residual SD');
    expectClose(fit.rSquared, cert.r_squared, { rel: 1e-12 }, 'R²');
    expect(fit.residualDf).toBe(cert.residual_df);
  });
});
