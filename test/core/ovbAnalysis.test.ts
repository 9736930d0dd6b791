import { describe, expect, it } from 'vitest';
import { analyseOvb, validateOvbInput, type OvbInput } from '../../src/core/ovbAnalysis';
import { InputError } from '../../src/core/inputProblem';
import { expectClose } from '../support/expectClose';
import { fromFixtureNumber, readReferenceJson } from '../support/reference';

const ovb = readReferenceJson('ovb.json');
const swiss = ovb.swiss;

function swissInput(): OvbInput {
  return {
    estimate: swiss.estimate,
    se: swiss.se,
    df: swiss.df,
    benchmarks: Object.entries<any>(swiss.benchmarks).map(([covariate, b]) => ({
      covariate,
      outcomeT: b.t_in_main_model,
      treatmentT: b.t_in_D_model,
    })),
  };
}

describe('analyseOvb', () => {
  it('reproduces the published example from an estimate and standard error with t = 4.18, df = 783', () => {
    // Cinelli & Hazlett 2020, JRSS-B 82(1):39–67: 2.2%, 13.9%, 7.6% as printed
    const r = analyseOvb({ estimate: 0.0418, se: 0.01, df: 783 });
    expect((100 * r.partialR2).toFixed(1)).toBe('2.2');
    expect((100 * r.rv).toFixed(1)).toBe('13.9');
    expect((100 * r.rvAlpha).toFixed(1)).toBe('7.6');
    // R 4.2.2 (test/reference/ovb.json published_example)
    expectClose(r.rvAlpha, ovb.published_example['RV_1_0.05'], { rel: 1e-10 });
    expect(r.k).toEqual([1, 2, 3]);
    expect(r.scenario).toBeNull();
  });

  it('accepts n and the number of coefficients instead of df', () => {
    const r = analyseOvb({ estimate: 0.0418, se: 0.01, n: 790, parameters: 7 });
    expect(r.df).toBe(783);
  });

  it('reproduces the swiss analysis with benchmarks from t-statistics as a paper prints them', () => {
    // R 4.2.2 lm on datasets::swiss (test/reference/ovb.json swiss); bound formulas from memory, re-derived
    const r = analyseOvb(swissInput());
    expectClose(r.t, swiss.t, { rel: 1e-12 });
    expectClose(r.partialR2, swiss.R2yd, { rel: 1e-12 });
    expectClose(r.rv, swiss.RV_1, { rel: 1e-12 });
    expectClose(r.rvAlpha, swiss['RV_1_0.05'], { rel: 1e-10 });
    expect(r.benchmarks).toHaveLength(12);
    for (const row of r.benchmarks) {
      const b = swiss.benchmarks[row.covariate];
      const ref = b.bounds.find((x: any) => x.kd === row.k);
      const label = `${row.covariate} k=${row.k}`;
      expectClose(row.r2dxj, b.R2dxj, { rel: 1e-12 }, label);
      expectClose(row.r2yxj, b.R2yxj, { rel: 1e-12 }, label);
      if (!ref.valid) {
        expect(row.unavailable, label).toEqual(expect.any(String));
        expect(row.correctedEstimate).toBeNaN();
        continue;
      }
      expectClose(row.r2dz, ref.r2dz, { rel: 1e-12 }, label);
      expectClose(row.r2yz, ref.r2yz, { rel: 1e-12 }, label);
      expectClose(row.correctedEstimate, ref.adjusted_estimate_toward_zero, { rel: 1e-11 }, label);
      expectClose(row.correctedSe, ref.adjusted_se, { rel: 1e-11, abs: 1e-15 }, label);
      expectClose(row.correctedT, -fromFixtureNumber(ref.adjusted_t)!, { rel: 1e-9 }, label);
    }
  });

  it('reports the extreme scenarios and a chosen confounder', () => {
    const r = analyseOvb({ ...swissInput(), scenario: { r2dz: 0.1, r2yz: 0.2 } });
    expect(r.extremeScenarios.map((e) => e.r2yz)).toEqual([1, 0.75, 0.5]);
    // with R²yz = 1 the confounder must explain R²(Y~D|X) of the treatment (algebra: f²/(1 + f²))
    expectClose(r.extremeScenarios[0].r2dzToReach, swiss.R2yd, { rel: 1e-12 });
    expect(r.scenario!.r2dz).toBe(0.1);
    expect(r.scenario!.correctedDf).toBe(swiss.df - 1);
  });

  it('explains missing treatment associations and non-significant estimates', () => {
    const r = analyseOvb({ estimate: 1, se: 1, df: 30, benchmarks: [{ covariate: 'age', outcomeT: 2 }] });
    expect(r.rvAlpha).toBe(0);
    expect(r.benchmarks.every((b) => b.unavailable !== null)).toBe(true);
    expect(r.warnings.join(' ')).toMatch(/age/);
    expect(r.warnings.join(' ')).toMatch(/not statistically significant/);
    expect(analyseOvb({ estimate: 1, se: 1, df: 30, q: 0.5 }).warnings.join(' ')).toMatch(/0.5 times/);
  });

  it('keeps a huge t finite: partial R² 1 and robustness values below 1', () => {
    const r = analyseOvb({ estimate: 1e200, se: 1e-200, df: 10 });
    expect(r.partialR2).toBe(1);
    expect(r.rv).toBe(1);
    expect(r.rvAlpha).toBe(1);
  });

  it('handles an estimate of zero and the away-from-zero direction', () => {
    const zero = analyseOvb({ estimate: 0, se: 1, df: 30 });
    expect(zero.rv).toBe(0);
    expect(zero.rvAlpha).toBe(0);
    const away = analyseOvb({ estimate: 2, se: 0.5, df: 30, direction: 'away-from-zero', scenario: { r2dz: 0.1, r2yz: 0.1 } });
    expect(away.scenario!.correctedEstimate).toBeGreaterThan(2);
    expect(away.extremeScenarios[0].r2dzToReach).toBeNaN();
  });

  it('names every bad field with its rule', () => {
    const fields = (input: unknown) => validateOvbInput(input as OvbInput).map((p) => `${p.field}:${p.code}`);
    expect(fields({ estimate: 1, se: 1, df: 1 })).toEqual(['df:too-small']);
    expect(fields({ estimate: 1, se: 0, df: 10 })).toEqual(['se:not-positive']);
    expect(fields({ estimate: NaN, se: 1, df: 10 })).toEqual(['estimate:not-finite']);
    expect(fields({ estimate: 1, se: 1 })).toEqual(['df:missing']);
    expect(fields({ estimate: 1, se: 1, n: 10, parameters: 9 })).toEqual(['n:too-small']);
    expect(fields({ estimate: 1, se: 1, n: 10.5, parameters: 2 })).toEqual(['n:not-whole']);
    expect(fields({ estimate: 1, se: 1, n: 10 })).toEqual(['parameters:missing']);
    expect(fields({ estimate: 1, se: 1, df: 7, n: 10, parameters: 2 })).toEqual(['df:inconsistent']);
    expect(fields({ estimate: 1, se: 1, df: 10, q: 0 })).toEqual(['q:not-positive']);
    expect(fields({ estimate: 1, se: 1, df: 10, alpha: 1 })).toEqual(['alpha:outside-interval']);
    expect(fields({ estimate: 1, se: 1, df: 10, direction: 'up' })).toEqual(['direction:not-a-choice']);
    expect(fields({ estimate: 1, se: 1, df: 10, k: [1, -2] })).toEqual(['k[1]:not-positive']);
    expect(fields({ estimate: 1, se: 1, df: 10, scenario: { r2dz: 1, r2yz: -0.1 } })).toEqual([
      'scenario.r2dz:outside-interval',
      'scenario.r2yz:outside-interval',
    ]);
    expect(
      fields({
        estimate: 1,
        se: 1,
        df: 10,
        benchmarks: [
          { covariate: 'age', outcomeT: 1 },
          { covariate: 'age', outcomeT: 1 },
          { covariate: '', r2yxj: 1.2 },
          { covariate: 'x', outcomeT: 1, r2yxj: 0.1 },
          { covariate: 'y', outcomeT: 1, r2dxj: 0.1, treatmentT: 2 },
        ],
      }),
    ).toEqual([
      'benchmarks[1].covariate:duplicate',
      'benchmarks[2].covariate:missing',
      'benchmarks[2].r2yxj:outside-interval',
      'benchmarks[3].outcomeT:one-of',
      'benchmarks[4].treatmentT:one-of',
    ]);
    expect(() => analyseOvb({ estimate: 1, se: -1, df: 0 })).toThrow(InputError);
    try {
      analyseOvb({ estimate: 1, se: -1, df: 0 });
    } catch (error) {
      expect((error as InputError).problems.map((p) => p.field)).toEqual(['se', 'df']);
    }
  });

  it('does not modify its input and returns a frozen result', () => {
    const input = swissInput();
    const frozen = Object.freeze({ ...input, benchmarks: Object.freeze(input.benchmarks!.map((b) => Object.freeze(b))), k: Object.freeze([1, 2]) });
    const r = analyseOvb(frozen);
    expect(Object.isFrozen(r)).toBe(true);
    expect(Object.isFrozen(r.benchmarks[0])).toBe(true);
    expect(r.benchmarks).toHaveLength(8);
  });
});

describe('analyseOvb: separate multiples for the treatment and the outcome side', () => {
  it('without kOutcome the rows are the single-k rows of before (k_Y = k_D)', () => {
    // R 4.2.2 swiss bounds with kd = ky (ovb.json), formulas from memory, re-derived
    const r = analyseOvb(swissInput());
    expect(r.kOutcome).toEqual([1, 2, 3]);
    for (const row of r.benchmarks) {
      expect(row.kTreatment).toBe(row.k);
      expect(row.kOutcome).toBe(row.k);
      const ref = swiss.benchmarks[row.covariate].bounds.find((x: any) => x.kd === row.k);
      if (ref.valid) expectClose(row.r2yz, ref.r2yz, { rel: 1e-12 }, `${row.covariate} k=${row.k}`);
    }
    const explicit = analyseOvb({ ...swissInput(), kOutcome: [1, 2, 3] });
    expect(explicit.benchmarks).toEqual(r.benchmarks);
  });

  it('with k_D ≠ k_Y the bound matches a confounder constructed in R and refitted with lm', () => {
    // R 4.2.2 lm on datasets::swiss with Z built orthogonal to the covariates at the chosen k_D and k_Y
    // (ovb.json swiss.check_benchmark_algebra): R²dz is exact; R²yz is an upper bound, attained for
    // Examination and Infant.Mortality (formulas recalled from memory and re-derived).
    for (const [covariate, c] of Object.entries<any>(swiss.check_benchmark_algebra)) {
      const input = swissInput();
      const r = analyseOvb({ ...input, benchmarks: input.benchmarks!.filter((b) => b.covariate === covariate), k: [c.kd], kOutcome: [c.ky] });
      const [row] = r.benchmarks;
      expect(row.kTreatment).toBe(c.kd);
      expect(row.kOutcome).toBe(c.ky);
      expectClose(row.r2dz, c.actual_r2dz, { rel: 1e-10 }, covariate);
      expectClose(row.r2yz, c.formula_r2yz_upper_bound, { rel: 1e-10 }, covariate);
      expect(row.r2yz * (1 + 1e-12)).toBeGreaterThanOrEqual(c.actual_r2yz);
      if (covariate === 'Examination' || covariate === 'Infant.Mortality') expectClose(row.r2yz, c.actual_r2yz, { rel: 1e-10 }, `${covariate} attained`);
      expect(r.conventions.find((x) => x.id === 'benchmark-multiples')!.text).toMatch(/k_D times .* k_Y times/);
    }
  });

  it('kOutcome must match k in length and be positive', () => {
    const fields = (input: Partial<OvbInput>) => validateOvbInput({ estimate: 1, se: 0.2, df: 50, ...input } as OvbInput).map((p) => [p.field, p.code]);
    expect(fields({ k: [1, 2], kOutcome: [1] })).toEqual([['kOutcome', 'unequal-length']]);
    expect(fields({ kOutcome: [1, 0, 2] })).toEqual([['kOutcome[1]', 'not-positive']]);
    expect(fields({ kOutcome: [1, 2, 3] })).toEqual([]);
  });
});

describe('analyseOvb: bounds that are not informative', () => {
  it('a bound capped at 100% of the outcome’s residual variance is flagged, with a reason and a warning', () => {
    // R 4.2.2 swiss (ovb.json): Catholic at k = 3 has r2yz_capped_at_1
    const r = analyseOvb(swissInput());
    const row = r.benchmarks.find((b) => b.covariate === 'Catholic' && b.k === 3)!;
    expect(row.capped).toBe(true);
    expect(row.informative).toBe(false);
    expect(row.reason).toMatch(/100% of the outcome’s residual variance/);
    expect(r.warnings.join(' ')).toMatch(/Catholic the bound .* not informative/);
    const fine = r.benchmarks.find((b) => b.covariate === 'Catholic' && b.k === 1)!;
    expect(fine.informative).toBe(true);
    expect(fine.reason).toBeNull();
    const missing = r.benchmarks.find((b) => b.covariate === 'Examination' && b.k === 2)!;
    expect(missing.informative).toBe(false);
    expect(missing.reason).toBe(missing.unavailable);
  });
});

describe('analyseOvb: the strongest measured covariate', () => {
  it('is the benchmark whose k = 1 bound gives the largest bias (swiss: Catholic)', () => {
    // R 4.2.2 swiss (ovb.json): bias_abs at kd = ky = 1 is largest for Catholic (0.4427)
    const biggest = Object.entries<any>(swiss.benchmarks)
      .map(([name, b]) => [name, b.bounds.find((x: any) => x.kd === 1).bias_abs] as const)
      .sort((a, b) => b[1] - a[1])[0][0];
    const r = analyseOvb({ ...swissInput(), k: [2, 3] });
    expect(r.strongestCovariate).toBe(biggest);
    expect(biggest).toBe('Catholic');
    expect(r.conventions.find((c) => c.id === 'strongest-covariate')!.text).toMatch(/largest bias; ties are broken by name/);
  });

  it('breaks ties by name and is null without usable benchmarks', () => {
    const same = { r2yxj: 0.1, r2dxj: 0.05 };
    const r = analyseOvb({ estimate: 1, se: 0.2, df: 50, benchmarks: [{ covariate: 'b', ...same }, { covariate: 'a', ...same }] });
    expect(r.strongestCovariate).toBe('a');
    expect(analyseOvb({ estimate: 1, se: 0.2, df: 50 }).strongestCovariate).toBeNull();
    expect(analyseOvb({ estimate: 1, se: 0.2, df: 50, benchmarks: [{ covariate: 'x', r2yxj: 0.1 }] }).strongestCovariate).toBeNull();
  });
});

describe('analyseOvb: conventions and the kind of standard error', () => {
  it('lists the degrees-of-freedom, standard-error and benchmark conventions', () => {
    const r = analyseOvb(swissInput());
    expect(r.seKind).toBe('classical');
    expect(r.conventions.map((c) => c.id)).toEqual([
      'degrees-of-freedom',
      'classical-standard-error',
      'bias-direction',
      'outcome-t-df',
      'treatment-t-df',
      'benchmark-multiples',
      'capped-bounds',
      'strongest-covariate',
    ]);
    expect(r.conventions[0].text).toMatch(/df − 1/);
    expect(r.conventions.find((c) => c.id === 'treatment-t-df')!.text).toMatch(/df \+ 1/);
    expect(Object.isFrozen(r.conventions)).toBe(true);
    for (const c of r.conventions) expect(c.text).not.toMatch(/NaN|undefined|Infinity/);
    expect(r.warnings.join(' ')).not.toMatch(/classical OLS/);
  });

  it('a robust, clustered or unknown standard error gives a warning; other kinds are refused', () => {
    for (const seKind of ['robust', 'clustered', 'unknown'] as const) {
      const r = analyseOvb({ estimate: 1, se: 0.2, df: 50, seKind });
      expect(r.seKind).toBe(seKind);
      expect(r.warnings.join(' ')).toMatch(/assumes the classical OLS standard error/);
      expect(r.conventions.find((c) => c.id === 'classical-standard-error')!.text).toMatch(/not right for it/);
    }
    expect(validateOvbInput({ estimate: 1, se: 0.2, df: 50, seKind: 'sandwich' as never }).map((p) => [p.field, p.code])).toEqual([['seKind', 'not-a-choice']]);
  });
});
