import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { adjustForConfounder, adjustedGrid, omittedVariableBias } from '../../src/core/confounderAdjustment';
import { expectClose } from '../support/expectClose';
import { fromFixtureNumber, readReferenceJson } from '../support/reference';

const swiss = readReferenceJson('ovb.json').swiss;
const reported = Object.freeze({ estimate: swiss.estimate, se: swiss.se, df: swiss.df });

describe('adjustForConfounder', () => {
  it('matches a refit with a constructed confounder on the swiss data', () => {
    // R 4.2.2: lm(Fertility ~ Education + X + Z) with Z constructed (test/reference/ovb.json swiss.check_constructed_Z)
    const z = swiss.check_constructed_Z;
    const a = adjustForConfounder(reported, { r2dz: z.r2dz, r2yz: z.r2yz });
    expectClose(a.bias, z.actual_abs_change, { rel: 1e-10 });
    expectClose(a.se, z.actual_long_se, { rel: 1e-10 });
    expect(a.df).toBe(swiss.df - 1);
  });

  it('matches the swiss benchmark rows (bias, adjusted estimate, se and t)', () => {
    // R 4.2.2 evaluation of the bias and adjusted-se formulas: test/reference/ovb.json swiss.benchmarks[*].bounds
    for (const [name, b] of Object.entries<any>(swiss.benchmarks)) {
      for (const row of b.bounds) {
        if (!row.valid) continue;
        const a = adjustForConfounder(reported, { r2dz: row.r2dz, r2yz: row.r2yz });
        const label = `${name} k=${row.kd}`;
        expectClose(a.bias, row.bias_abs, { rel: 1e-12 }, label);
        expectClose(a.estimate, row.adjusted_estimate_toward_zero, { rel: 1e-12 }, label);
        expectClose(a.se, row.adjusted_se, { rel: 1e-12 }, label);
        // the fixture's t is on the |estimate| scale; ours carries the estimate's sign (negative here)
        expectClose(a.t, -fromFixtureNumber(row.adjusted_t)!, { rel: 1e-9 }, label);
      }
    }
  });

  it('moves the estimate away from zero when asked', () => {
    const a = adjustForConfounder(reported, { r2dz: 0.1, r2yz: 0.1 }, 'away-from-zero');
    const b = adjustForConfounder(reported, { r2dz: 0.1, r2yz: 0.1 }, 'toward-zero');
    expectClose(a.estimate, reported.estimate - b.bias, { rel: 1e-14 });
    expect(a.se).toBe(b.se);
  });

  it('handles special values', () => {
    expect(omittedVariableBias(1, 10, { r2dz: 0, r2yz: 0.5 })).toBe(0);
    expect(omittedVariableBias(1, 10, { r2dz: 0.5, r2yz: 0 })).toBe(0);
    expect(omittedVariableBias(1, 10, { r2dz: 1, r2yz: 0.5 })).toBe(Infinity);
    expect(omittedVariableBias(1, 10, { r2dz: 1.1, r2yz: 0.5 })).toBeNaN();
    expect(omittedVariableBias(-1, 10, { r2dz: 0.1, r2yz: 0.5 })).toBeNaN();
    const none = adjustForConfounder(reported, { r2dz: 0, r2yz: 0 });
    expect(none.estimate).toBe(reported.estimate);
    expectClose(none.se, reported.se * Math.sqrt(swiss.df / (swiss.df - 1)), { rel: 1e-15 });
    const full = adjustForConfounder(reported, { r2dz: 0.2, r2yz: 1 });
    expect(full.se).toBe(0);
    expect(Math.abs(full.t)).toBe(Infinity);
    // a confounder explaining all of the outcome's residual variance: the adjusted t is flagged not available
    expect(full.tAvailable).toBe(false);
    expect(none.tAvailable).toBe(true);
    expect(adjustForConfounder({ estimate: NaN, se: 1, df: 9 }, { r2dz: 0.1, r2yz: 0.1 }).tAvailable).toBe(false);
    expect(adjustForConfounder({ estimate: 1, se: 1, df: 1 }, { r2dz: 0.1, r2yz: 0.1 }).estimate).toBeNaN();
    expect(adjustForConfounder({ estimate: NaN, se: 1, df: 9 }, { r2dz: 0.1, r2yz: 0.1 }).t).toBeNaN();
  });

  it('the adjusted estimate is monotone in each partial R² (fast-check)', () => {
    const r2 = fc.double({ min: 0, max: 0.999, noNaN: true });
    fc.assert(
      fc.property(
        fc.double({ min: -100, max: 100, noNaN: true }),
        fc.double({ min: 1e-3, max: 10, noNaN: true }),
        fc.integer({ min: 2, max: 10000 }),
        r2,
        r2,
        r2,
        fc.constantFrom('toward-zero' as const, 'away-from-zero' as const),
        (estimate, se, df, a, b, c, direction) => {
          const [lo, hi] = b <= c ? [b, c] : [c, b];
          const sign = (estimate < 0 ? -1 : 1) * (direction === 'toward-zero' ? -1 : 1);
          // larger R²dz (R²yz fixed) moves the estimate further in the bias direction
          const d1 = adjustForConfounder({ estimate, se, df }, { r2dz: lo, r2yz: a }, direction).estimate;
          const d2 = adjustForConfounder({ estimate, se, df }, { r2dz: hi, r2yz: a }, direction).estimate;
          expect(sign * (d2 - d1)).toBeGreaterThanOrEqual(-1e-12 * Math.abs(estimate));
          const y1 = adjustForConfounder({ estimate, se, df }, { r2dz: a, r2yz: lo }, direction).estimate;
          const y2 = adjustForConfounder({ estimate, se, df }, { r2dz: a, r2yz: hi }, direction).estimate;
          expect(sign * (y2 - y1)).toBeGreaterThanOrEqual(-1e-12 * Math.abs(estimate));
        },
      ),
    );
  });

  it('the grid form agrees with the one-point form everywhere, including 0 and 1 (fast-check)', () => {
    fc.assert(
      fc.property(
        fc.double({ min: -100, max: 100, noNaN: true }),
        fc.double({ min: 1e-3, max: 10, noNaN: true }),
        fc.integer({ min: 2, max: 10000 }),
        fc.array(fc.oneof(fc.constantFrom(0, 1), fc.double({ min: 0, max: 1, noNaN: true })), { minLength: 1, maxLength: 5 }),
        fc.array(fc.oneof(fc.constantFrom(0, 1), fc.double({ min: 0, max: 1, noNaN: true })), { minLength: 1, maxLength: 5 }),
        fc.constantFrom('toward-zero' as const, 'away-from-zero' as const),
        fc.double({ min: -5, max: 5, noNaN: true }),
        (estimate, se, df, bs, as, direction, nullValue) => {
          const est = adjustedGrid({ estimate, se, df }, direction, bs, as, 'estimate');
          const t = adjustedGrid({ estimate, se, df }, direction, bs, as, 't', nullValue);
          as.forEach((a, j) =>
            bs.forEach((b, i) => {
              const one = adjustForConfounder({ estimate, se, df }, { r2dz: b, r2yz: a }, direction);
              const same = (x: number, y: number) => (Number.isNaN(y) ? Number.isNaN(x) : !Number.isFinite(y) ? x === y : Math.abs(x - y) <= 1e-12 * Math.max(1, Math.abs(y)));
              expect(same(est[j * bs.length + i], one.estimate)).toBe(true);
              expect(same(t[j * bs.length + i], (one.estimate - nullValue) / one.se)).toBe(true);
            }),
          );
        },
      ),
    );
  });

  it('does not modify its inputs', () => {
    const strength = Object.freeze({ r2dz: 0.1, r2yz: 0.2 });
    expect(() => adjustForConfounder(reported, strength)).not.toThrow();
  });
});
