import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { benchmarkBound } from '../../src/core/benchmarkBounds';
import { expectClose } from '../support/expectClose';
import { readReferenceJson } from '../support/reference';

const swiss = readReferenceJson('ovb.json').swiss;

describe('benchmarkBound', () => {
  // The bound formulas of Cinelli & Hazlett 2020 §6 as written in test/reference/README.md: from memory,
  // re-derived algebraically; the values below are their R 4.2.2 evaluation on datasets::swiss.
  it('matches the swiss bounds for k = 1, 2, 3, including unavailable ones', () => {
    for (const [name, b] of Object.entries<any>(swiss.benchmarks)) {
      for (const row of b.bounds) {
        const bound = benchmarkBound(b.R2dxj, b.R2yxj, row.kd, row.ky);
        const label = `${name} k=${row.kd}`;
        expectClose(bound.r2zxj, row.r2zxj_given_xd, { rel: 1e-12 }, label);
        if (row.valid) {
          expect(bound.unavailable, label).toBeNull();
          expectClose(bound.r2dz, row.r2dz, { rel: 1e-12 }, label);
          expectClose(bound.r2yz, row.r2yz, { rel: 1e-12 }, label);
          expect(bound.capped).toBe(row.r2yz_capped_at_1);
        } else {
          expect(bound.unavailable, label).toEqual(expect.any(String));
          expect(bound.r2dz).toBeNaN();
          expect(bound.r2yz).toBeNaN();
        }
      }
    }
  });

  it('with different k for treatment and outcome matches a constructed confounder on the swiss data', () => {
    // R 4.2.2: Z built orthogonal to the covariates with chosen strengths (ovb.json swiss.check_benchmark_algebra);
    // R²dz and R²zxj are exact, R²yz is an upper bound (attained for Examination and Infant.Mortality)
    for (const [name, c] of Object.entries<any>(swiss.check_benchmark_algebra)) {
      const b = swiss.benchmarks[name];
      const bound = benchmarkBound(b.R2dxj, b.R2yxj, c.kd, c.ky);
      expectClose(bound.r2dz, c.actual_r2dz, { rel: 1e-10 }, name);
      expectClose(bound.r2zxj, c.actual_r2zxj_given_xd, { rel: 1e-10 }, name);
      expectClose(bound.r2yz, c.formula_r2yz_upper_bound, { rel: 1e-12 }, name);
      expect(bound.r2yz * (1 + 1e-12)).toBeGreaterThanOrEqual(c.actual_r2yz);
    }
  });

  it('handles special values', () => {
    expect(benchmarkBound(0, 0.1, 1).r2dz).toBe(0);
    expectClose(benchmarkBound(0, 0.1, 2).r2yz, (2 * 0.1) / 0.9, { rel: 1e-15 });
    expect(benchmarkBound(0.2, 0, 1).r2yz).toBe(0);
    expect(benchmarkBound(0.5, 0.1, 1).unavailable).not.toBeNull(); // R²dz = 1
    expect(benchmarkBound(0.4, 0.1, 3).unavailable).not.toBeNull(); // k·R²dxj ≥ 1
    expect(benchmarkBound(1, 0.1, 1).r2dz).toBeNaN();
    expect(benchmarkBound(0.1, NaN, 1).r2dz).toBeNaN();
    expect(benchmarkBound(0.1, 0.1, -1).unavailable).not.toBeNull();
    const capped = benchmarkBound(0.1, 0.6, 3);
    expect(capped.r2yz).toBe(1);
    expect(capped.capped).toBe(true);
  });

  it('a bound capped at 100% of the outcome’s residual variance is flagged not informative, with the reason', () => {
    // R 4.2.2 swiss (ovb.json): Catholic at k = 3 reaches R²yz = 1 (r2yz_capped_at_1)
    const b = swiss.benchmarks.Catholic;
    const capped = benchmarkBound(b.R2dxj, b.R2yxj, 3, 3);
    expect(b.bounds.find((x: any) => x.kd === 3).r2yz_capped_at_1).toBe(true);
    expect(capped.informative).toBe(false);
    expect(capped.reason).toMatch(/100% of the outcome’s residual variance.*no adjusted standard error or t/);
    const fine = benchmarkBound(b.R2dxj, b.R2yxj, 1, 1);
    expect(fine.informative).toBe(true);
    expect(fine.reason).toBeNull();
    const unavailable = benchmarkBound(0.5, 0.1, 1);
    expect(unavailable.informative).toBe(false);
    expect(unavailable.reason).toBe(unavailable.unavailable);
  });

  it('grows with k (fast-check)', () => {
    fc.assert(
      fc.property(
        fc.double({ min: 0, max: 0.3, noNaN: true }),
        fc.double({ min: 0, max: 0.3, noNaN: true }),
        fc.double({ min: 0.1, max: 2, noNaN: true }),
        (r2dxj, r2yxj, k) => {
          const a = benchmarkBound(r2dxj, r2yxj, k);
          const b = benchmarkBound(r2dxj, r2yxj, k * 1.5);
          fc.pre(a.unavailable === null && b.unavailable === null);
          expect(b.r2dz).toBeGreaterThanOrEqual(a.r2dz);
          expect(b.r2yz).toBeGreaterThanOrEqual(a.r2yz);
        },
      ),
    );
  });
});
