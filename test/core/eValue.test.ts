import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { boundingFactor, eValue, intervalEValue } from '../../src/core';
import { expectClose } from '../support/expectClose';
import { readReferenceJson } from '../support/reference';

interface ReferenceCase {
  id: string;
  ratio_to_true_ge1: number;
  rr_scale_estimate: number;
  rr_scale_lower: number | null;
  rr_scale_upper: number | null;
  rr_scale_true: number;
  evalue_point: number;
  evalue_ci: number | null;
  ci_limit_used: string | null;
}
const reference = readReferenceJson<{ cases: ReferenceCase[] }>('evalues.json');

describe('eValue: published example', () => {
  it('RR 3.9 (95% CI 1.8 to 8.7) gives 7.26 for the estimate and 3.00 for the interval', () => {
    // VanderWeele & Ding 2017, Ann Intern Med 167:268–274, worked example: E-values 7.26 and 3.0 (printed to 2 decimals).
    expectClose(eValue(3.9), 7.26, { abs: 0.005 });
    expectClose(intervalEValue(3.9, 1.8, 8.7).eValue, 3.0, { abs: 0.005 });
    expect(intervalEValue(3.9, 1.8, 8.7).limitUsed).toBe('lower');
  });
});

describe('eValue: reference values (test/reference/evalues.json, R 4.2.2 closed form)', () => {
  for (const c of reference.cases) {
    it(`${c.id}: E-value of the estimate and of the interval`, () => {
      // R 4.2.2: r + sqrt(r*(r-1)) with r = RR/RR_true inverted if < 1 (evalues.json, case ${c.id})
      expectClose(eValue(c.ratio_to_true_ge1), c.evalue_point, { rel: 1e-14 }, 'from the folded ratio');
      expectClose(eValue(c.rr_scale_estimate, c.rr_scale_true), c.evalue_point, { rel: 1e-13 }, 'from estimate and target');
      if (c.rr_scale_lower !== null && c.rr_scale_upper !== null) {
        const interval = intervalEValue(c.rr_scale_estimate, c.rr_scale_lower, c.rr_scale_upper, c.rr_scale_true);
        expectClose(interval.eValue, c.evalue_ci as number, { rel: 1e-13 }, 'interval');
        expect(interval.limitUsed).toBe(c.ci_limit_used?.startsWith('none') ? 'none' : c.ci_limit_used);
      }
    });
  }
});

describe('eValue: hand computations and special values', () => {
  it('eValue(2) equals 2 + √2', () => {
    // hand computation: 2 + sqrt(2·1)
    expectClose(eValue(2), 2 + Math.SQRT2, { rel: 1e-15 });
  });

  it('eValue(RR, target) equals eValue(RR/target)', () => {
    // hand computation: r = 3.9/1.5 = 2.6; E = 2.6 + sqrt(2.6·1.6) = 2.6 + sqrt(4.16)
    expectClose(eValue(3.9, 1.5), 2.6 + Math.sqrt(4.16), { rel: 1e-14 });
  });

  it('eValue is 1 at the null and at the target', () => {
    expect(eValue(1)).toBe(1);
    expect(eValue(0.7, 0.7)).toBe(1);
  });

  it('eValue keeps its digits just above and below 1', () => {
    // hand computation: E(1 + δ) = 1 + δ + sqrt((1 + δ)δ) ≈ 1 + sqrt(δ) + δ for small δ
    const delta = 2 ** -40;
    expectClose(eValue(1 + delta), 1 + (delta + Math.sqrt((1 + delta) * delta)), { rel: 2e-16 });
    // E(1 − δ) = (1 + sqrt(δ))/(1 − δ)
    expectClose(eValue(1 - delta), (1 + Math.sqrt(delta)) / (1 - delta), { rel: 2e-16 });
  });

  it('eValue of huge and tiny ratios neither overflows early nor loses digits', () => {
    // hand computation: E(r) = r(1 + sqrt(1 − 1/r)) → 2r − 1/2 for large r
    expectClose(eValue(1e200), 2e200, { rel: 1e-15 });
    expectClose(eValue(1e-200), 2e200, { rel: 1e-15 });
    expectClose(eValue(1e154), 2e154, { rel: 1e-15 });
    expect(eValue(Number.MAX_VALUE)).toBe(Infinity); // the true value, 2·MAX_VALUE, is beyond the doubles
    expect(eValue(Number.MIN_VALUE)).toBe(Infinity);
  });

  it('eValue of 0 and +Infinity is +Infinity; NaN and negative ratios give NaN; −0 counts as 0', () => {
    expect(eValue(Infinity)).toBe(Infinity);
    expect(eValue(0)).toBe(Infinity);
    expect(eValue(-0)).toBe(Infinity);
    expect(eValue(NaN)).toBeNaN();
    expect(eValue(-2)).toBeNaN();
    expect(eValue(2, 0)).toBeNaN();
    expect(eValue(2, -1)).toBeNaN();
    expect(eValue(2, Infinity)).toBeNaN();
    expect(eValue(2, NaN)).toBeNaN();
  });

  it('intervalEValue counts a limit equal to the target as containing it', () => {
    // test/reference/README.md convention: a limit equal to the null counts as containing it
    expect(intervalEValue(1.5, 1, 2.25)).toEqual({ eValue: 1, limitUsed: 'none' });
    expect(intervalEValue(0.5, 0.25, 1)).toEqual({ eValue: 1, limitUsed: 'none' });
    expect(intervalEValue(1, 0.8, 1.25)).toEqual({ eValue: 1, limitUsed: 'none' });
  });

  it('intervalEValue uses the upper limit for an estimate below the target', () => {
    // hand computation: 1/0.91 = 1.0989…, E = r + sqrt(r(r − 1))
    const r = 1 / 0.91;
    const result = intervalEValue(0.8, 0.71, 0.91);
    expect(result.limitUsed).toBe('upper');
    expectClose(result.eValue, r + Math.sqrt(r * (r - 1)), { rel: 1e-14 });
  });

  it('intervalEValue accepts unbounded far limits and rejects limits that do not enclose the estimate', () => {
    expectClose(intervalEValue(3, 2, Infinity).eValue, eValue(2), { rel: 1e-15 });
    expectClose(intervalEValue(0.3, 0, 0.5).eValue, eValue(0.5), { rel: 1e-15 });
    expect(intervalEValue(3, 4, 5).eValue).toBeNaN();
    expect(intervalEValue(3, 1, 2).eValue).toBeNaN();
    expect(intervalEValue(3, NaN, 5).eValue).toBeNaN();
    expect(intervalEValue(3, -1, 5).eValue).toBeNaN();
    expect(intervalEValue(3, 1, 5, 0).eValue).toBeNaN();
  });
});

// Ratios spread evenly on the log scale, from about 1e-13 to 1e13.
const logRatio = fc.double({ min: -30, max: 30, noNaN: true });

describe('eValue: invariants', () => {
  it('eValue(RR) equals eValue(1/RR)', () => {
    fc.assert(
      fc.property(logRatio, (u) => {
        const rr = Math.exp(u);
        // 1/RR rounds, and E is steep near 1 (E − 1 ≈ √δ): allow the rounding's effect there.
        expectClose(eValue(1 / rr), eValue(rr), { rel: 1e-12, abs: 1e-7 });
      }),
    );
  });

  it('eValue(RR, T) equals eValue(T, RR) and eValue(RR/T)', () => {
    fc.assert(
      fc.property(logRatio, logRatio, (u, v) => {
        const rr = Math.exp(u);
        const target = Math.exp(v);
        expectClose(eValue(rr, target), eValue(target, rr), { rel: 1e-12, abs: 1e-7 });
        expectClose(eValue(rr, target), eValue(rr / target), { rel: 1e-12, abs: 1e-7 });
      }),
    );
  });

  it('eValue grows with the distance from the null, on either side', () => {
    fc.assert(
      fc.property(logRatio, logRatio, (u, v) => {
        const [near, far] = Math.abs(u) <= Math.abs(v) ? [u, v] : [v, u];
        const sign = far >= 0 ? 1 : -1;
        // Put both on the same side of the null: |log near| ≤ |log far|.
        expect(eValue(Math.exp(sign * Math.abs(near)))).toBeLessThanOrEqual(eValue(Math.exp(far)));
      }),
    );
  });

  it('eValue is at least the ratio and at most twice it (folded at 1)', () => {
    fc.assert(
      fc.property(logRatio, (u) => {
        const folded = Math.exp(Math.abs(u));
        const e = eValue(Math.exp(u));
        expect(e).toBeGreaterThanOrEqual(folded * (1 - 1e-15));
        expect(e).toBeLessThanOrEqual(2 * folded * (1 + 1e-15));
      }),
    );
  });

  it('B(E, E) equals the risk ratio it was computed from', () => {
    fc.assert(
      fc.property(fc.double({ min: 0, max: 30, noNaN: true }), (u) => {
        const rr = Math.exp(u);
        const e = eValue(rr);
        expectClose(boundingFactor(e, e), rr, { rel: 1e-13 });
      }),
    );
  });

  it('the interval E-value never exceeds the estimate E-value', () => {
    fc.assert(
      fc.property(logRatio, fc.double({ min: 0, max: 10, noNaN: true }), fc.double({ min: 0, max: 10, noNaN: true }), logRatio, (u, down, up, v) => {
        const estimate = Math.exp(u);
        const lower = Math.exp(u - down);
        const upper = Math.exp(u + up);
        const target = Math.exp(v / 3);
        const interval = intervalEValue(estimate, lower, upper, target);
        expect(interval.eValue).toBeGreaterThanOrEqual(1);
        expect(interval.eValue).toBeLessThanOrEqual(eValue(estimate, target));
      }),
    );
  });
});
