import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { criticalF, robustnessValue, robustnessValueAtLevel } from '../../src/core/robustnessValue';
import { adjustForConfounder } from '../../src/core/confounderAdjustment';
import { partialR2FromT } from '../../src/core/linearModel';
import { expectClose } from '../support/expectClose';
import { readReferenceJson } from '../support/reference';

const ovb = readReferenceJson('ovb.json');

describe('robustness values', () => {
  it('reproduce the published example (t = 4.18, df = 783)', () => {
    // Cinelli & Hazlett 2020, JRSS-B 82(1):39–67, printed values: R²(Y~D|X) = 2.2%, RV = 13.9%, RV at α = 0.05 = 7.6%
    expect((100 * partialR2FromT(4.18, 783)).toFixed(1)).toBe('2.2');
    expect((100 * robustnessValue(4.18, 783)).toFixed(1)).toBe('13.9');
    expect((100 * robustnessValueAtLevel(4.18, 783, 1, 0.05)).toFixed(1)).toBe('7.6');
    // R 4.2.2 evaluation of the same closed forms (test/reference/ovb.json published_example)
    const p = ovb.published_example;
    expectClose(partialR2FromT(p.t, p.df), p.R2yd, { rel: 1e-12 });
    expectClose(robustnessValue(p.t, p.df), p.RV_1, { rel: 1e-12 });
    expectClose(robustnessValueAtLevel(p.t, p.df, 1, 0.05), p['RV_1_0.05'], { rel: 1e-10 });
  });

  it('agree with all 90 reference cases to 1e-10, in both branches of RV_{q,α}', () => {
    // R 4.2.2 (qt with df − 1), branch checked by direct numerical minimisation: test/reference/ovb.json rv_cases
    const branches = new Set<string>();
    for (const c of ovb.rv_cases) {
      const label = `t ${c.t} df ${c.df} q ${c.q} α ${c.alpha}`;
      expectClose(partialR2FromT(c.t, c.df), c.R2yd, { rel: 1e-10, abs: 1e-10 }, label);
      expectClose(robustnessValue(c.t, c.df, c.q), c.RV_q, { rel: 1e-10, abs: 1e-10 }, label);
      expectClose(robustnessValueAtLevel(c.t, c.df, c.q, c.alpha), c.RV_q_alpha, { rel: 1e-10, abs: 1e-10 }, label);
      expectClose(robustnessValueAtLevel(c.t, c.df, c.q, c.alpha), c.RV_q_alpha_numeric_check, { rel: 1e-9, abs: 1e-10 }, label);
      expectClose(criticalF(c.df, c.alpha), c.fcrit, { rel: 1e-12 }, label);
      branches.add(c.branch);
    }
    expect([...branches].sort()).toEqual(['alternative', 'equal', 'fq<=fcrit']);
  });

  it('reproduce the swiss analysis (treatment Education)', () => {
    // R 4.2.2 lm on datasets::swiss: test/reference/ovb.json swiss
    const s = ovb.swiss;
    expectClose(robustnessValue(s.t, s.df), s.RV_1, { rel: 1e-12 });
    expectClose(robustnessValueAtLevel(s.t, s.df, 1, 0.05), s['RV_1_0.05'], { rel: 1e-10 });
    expectClose(robustnessValue(s.t, s.df, 0.5), s['RV_0.5'], { rel: 1e-12 });
    expectClose(robustnessValueAtLevel(s.t, s.df, 0.5, 0.05), s['RV_0.5_0.05'], { rel: 1e-10 });
  });

  it('handle special values', () => {
    expect(robustnessValue(0, 10)).toBe(0);
    expect(robustnessValue(3, 10, 0)).toBe(0);
    expect(robustnessValue(Infinity, 10)).toBe(1);
    expect(robustnessValue(NaN, 10)).toBeNaN();
    expect(robustnessValue(2, 0)).toBeNaN();
    expect(robustnessValue(2, 10, -1)).toBeNaN();
    expect(robustnessValue(-2, 10)).toBe(robustnessValue(2, 10));
    expect(robustnessValue(-0, 10)).toBe(0);
    // tiny |t|: RV ≈ f − f²/2 (x²/(1 − x) = f²), kept to full precision: f = 1e-10/√10
    const f = 1e-10 / Math.sqrt(10);
    expectClose(robustnessValue(1e-10, 10), f - (f * f) / 2, { rel: 1e-14 });
    expect(robustnessValue(1e200, 10)).toBe(1);
    expect(robustnessValueAtLevel(1, 1)).toBeNaN();
    expect(robustnessValueAtLevel(3, 10, 1, 0)).toBeNaN();
    expect(robustnessValueAtLevel(3, 10, 1, 1)).toBeNaN();
    expect(robustnessValueAtLevel(0.5, 10)).toBe(0);
    expect(robustnessValueAtLevel(Infinity, 10)).toBe(1);
    expect(robustnessValueAtLevel(1e300, 10)).toBe(1);
    expect(robustnessValueAtLevel(-4.18, 783)).toBe(robustnessValueAtLevel(4.18, 783));
  });

  it('the adjusted estimate at the RV point equals (1 − q)·estimate (fast-check)', () => {
    fc.assert(
      fc.property(
        fc.double({ min: -1e3, max: 1e3, noNaN: true }).filter((x) => Math.abs(x) > 1e-6),
        fc.double({ min: 1e-3, max: 1e3, noNaN: true }),
        fc.integer({ min: 2, max: 100000 }),
        fc.double({ min: 0.01, max: 1, noNaN: true }),
        (estimate, se, df, q) => {
          const rv = robustnessValue(estimate / se, df, q);
          fc.pre(rv < 1 - 1e-9);
          const adjusted = adjustForConfounder({ estimate, se, df }, { r2dz: rv, r2yz: rv });
          // The bias's condition number grows like 1/(1 − R²dz): allow rounding of that size.
          expectClose(adjusted.estimate, (1 - q) * estimate, { abs: (1e-13 * Math.abs(estimate)) / (1 - rv) });
        },
      ),
    );
  });

  it('0 ≤ RV_{q,α} ≤ RV_q ≤ 1 (fast-check)', () => {
    fc.assert(
      fc.property(
        fc.double({ min: -1e6, max: 1e6, noNaN: true }),
        fc.double({ min: 1.0001, max: 1e7, noNaN: true }),
        fc.double({ min: 1e-3, max: 3, noNaN: true }),
        fc.double({ min: 1e-6, max: 0.999, noNaN: true }),
        (t, df, q, alpha) => {
          const rv = robustnessValue(t, df, q);
          const rva = robustnessValueAtLevel(t, df, q, alpha);
          expect(rva).toBeGreaterThanOrEqual(0);
          expect(rva).toBeLessThanOrEqual(rv * (1 + 1e-12));
          expect(rv).toBeLessThanOrEqual(1);
        },
      ),
    );
  });

  it('the adjusted t at the RV_{q,α} point equals the critical value when it is on the diagonal (fast-check)', () => {
    fc.assert(
      fc.property(fc.double({ min: 2.5, max: 40, noNaN: true }), fc.integer({ min: 20, max: 5000 }), (t, df) => {
        const f = t / Math.sqrt(df);
        const fc0 = criticalF(df, 0.05);
        fc.pre(f * fc0 < 1);
        const rva = robustnessValueAtLevel(t, df, 1, 0.05);
        const a = adjustForConfounder({ estimate: t, se: 1, df }, { r2dz: rva, r2yz: rva });
        expectClose(a.t, fc0 * Math.sqrt(df - 1), { rel: 1e-9 });
      }),
    );
  });
});
