import { describe, expect, it } from 'vitest';
import { fitLeastSquares } from '../../src/core/linearModel';
import { regressionDataFromText } from '../../src/io/regressionData';
import { expectClose } from '../support/expectClose';
import { readReferenceJson, readReferenceText } from '../support/reference';

describe('regressionDataFromText on R\'s swiss data', () => {
  // R 4.2.2 base lm: test/reference/ovb.json "swiss" (Fertility ~ Education + Agriculture + Examination + Catholic + Infant.Mortality)
  const ref = readReferenceJson('ovb.json').swiss;
  const data = regressionDataFromText(readReferenceText('swiss.csv'), {
    outcome: 'Fertility',
    treatment: 'Education',
    covariates: ['Agriculture', 'Examination', 'Catholic', 'Infant.Mortality'],
  });
  it('matches lm for the treatment coefficient', () => {
    const fit = fitLeastSquares(data.design, { response: data.outcomeColumn, predictors: data.predictors });
    const d = data.predictors.indexOf('Education');
    expectClose(fit.coefficients[d], ref.estimate, { rel: 1e-9 });
    expectClose(fit.standardErrors[d], ref.se, { rel: 1e-9 });
    expectClose(fit.tValues[d], ref.t, { rel: 1e-9 });
    expect(fit.residualDf).toBe(ref.df);
    expectClose(fit.partialR2[d], ref.R2yd, { rel: 1e-9 });
    expect(data.rowsUsed).toBe(47);
  });
});
