import { describe, expect, it } from 'vitest';
import { ovbRegressionSummary, validateOvbRegressionSpec } from '../../src/core/ovbRegression';
import { analyseOvb } from '../../src/core/ovbAnalysis';
import { InputError } from '../../src/core/inputProblem';
import { regressionDataFromText } from '../../src/methods/regression/regressionData';
import { ovbSpecFromRegressionData, parseBenchmarkList } from '../../src/methods/regression/ovbRegressionData';
import { expectClose } from '../support/expectClose';
import { readReferenceJson, readReferenceText } from '../support/reference';

const swiss = readReferenceJson('ovb.json').swiss;
const swissCsv = readReferenceText('swiss.csv');

function swissSummary(benchmarks?: string) {
  const data = regressionDataFromText(swissCsv, { outcome: 'Fertility', treatment: 'Education' });
  return ovbRegressionSummary(data.design, ovbSpecFromRegressionData(data, parseBenchmarkList(benchmarks)));
}

function problemsOf(f: () => unknown): string[] {
  try {
    f();
  } catch (error) {
    if (error instanceof InputError) return error.problems.map((p) => `${p.field}:${p.code}`);
    throw error;
  }
  return [];
}

describe('ovbRegressionSummary', () => {
  it('matches R lm on the swiss data: estimate, se, df and both partial R²s of every covariate', () => {
    // R 4.2.2: lm(Fertility ~ Education + .) and lm(Education ~ . - Fertility) on datasets::swiss (ovb.json swiss)
    const s = swissSummary();
    expectClose(s.estimate, swiss.estimate, { rel: 1e-9 });
    expectClose(s.se, swiss.se, { rel: 1e-9 });
    expect(s.df).toBe(swiss.df);
    expect(s.n).toBe(swiss.n);
    expect(s.benchmarks.map((b) => b.covariate)).toEqual(['Agriculture', 'Examination', 'Catholic', 'Infant.Mortality']);
    for (const b of s.benchmarks) {
      const ref = swiss.benchmarks[b.covariate];
      expectClose(b.r2yxj!, ref.R2yxj, { rel: 1e-9 }, b.covariate);
      expectClose(b.r2dxj!, ref.R2dxj, { rel: 1e-9 }, b.covariate);
    }
    const r = analyseOvb({ estimate: s.estimate, se: s.se, df: s.df, benchmarks: s.benchmarks });
    expectClose(r.rv, swiss.RV_1, { rel: 1e-9 });
    const agri2 = r.benchmarks.find((b) => b.covariate === 'Agriculture' && b.k === 2)!;
    expectClose(agri2.correctedEstimate, swiss.benchmarks.Agriculture.bounds[1].adjusted_estimate_toward_zero, { rel: 1e-9 });
  });

  it('benchmarks a group by its joint partial R² (a single-member group equals the covariate)', () => {
    const s = swissSummary('Agriculture, Catholic+Examination');
    expect(s.benchmarks.map((b) => b.covariate)).toEqual(['Agriculture', 'Catholic + Examination']);
    expectClose(s.benchmarks[0].r2dxj!, swiss.benchmarks.Agriculture.R2dxj, { rel: 1e-9 });
    // a group explains at least as much as either member (extra sum of squares, Draper & Smith §6.3)
    expect(s.benchmarks[1].r2yxj!).toBeGreaterThanOrEqual(swiss.benchmarks.Catholic.R2yxj - 1e-12);
    expect(s.benchmarks[1].r2dxj!).toBeGreaterThanOrEqual(swiss.benchmarks.Examination.R2dxj - 1e-12);
  });

  it('names the treatment when it is constant, and collinear covariates by column', () => {
    const constant = 'y,d,x\n1,2,3\n2,2,1\n4,2,7\n3,2,2\n5,2,9\n';
    const data = regressionDataFromText(constant, { outcome: 'y', treatment: 'd' });
    const problems = problemsOf(() => ovbRegressionSummary(data.design, ovbSpecFromRegressionData(data)));
    expect(problems[0]).toBe('treatment:constant');
    const collinear = 'y,d,x,z\n1,2,3,6\n2,1,1,2\n4,3,7,14\n3,5,2,4\n5,2,9,18\n6,1,1,2\n';
    const data2 = regressionDataFromText(collinear, { outcome: 'y', treatment: 'd' });
    let message = '';
    try {
      ovbRegressionSummary(data2.design, ovbSpecFromRegressionData(data2));
    } catch (error) {
      message = (error as InputError).problems[0].message;
      expect((error as InputError).problems[0].field).toBe('covariates[1]');
    }
    expect(message).toMatch(/"z".*"x"/);
  });

  it('rejects a column chosen twice and unknown benchmark names', () => {
    const spec = {
      outcome: 'y',
      treatment: 'd',
      intercept: '(intercept)',
      covariates: [
        { name: 'x', designColumns: ['x'] },
        { name: 'd', designColumns: ['d'] },
        { name: 'x', designColumns: ['x'] },
      ],
      benchmarks: [{ name: 'w', covariates: ['w'] }],
    };
    expect(validateOvbRegressionSpec(spec).map((p) => `${p.field}:${p.code}`)).toEqual([
      'covariates[1]:chosen-twice',
      'covariates[2]:chosen-twice',
      'benchmarks[0]:not-a-covariate',
    ]);
    expect(validateOvbRegressionSpec({ ...spec, covariates: [], benchmarks: [], treatment: 'y' })[0].field).toBe('treatment');
  });
});
