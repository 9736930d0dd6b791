import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import {
  estimateBoundaryR2dz,
  estimateBoundaryR2yz,
  scaledPartialF,
  overturnsEstimate,
  significanceBoundaryR2yz,
  significanceRegionStart,
  type FlipSetting,
} from '../../src/core/flipBoundary';
import { adjustForConfounder } from '../../src/core/confounderAdjustment';
import { criticalF, robustnessValue, robustnessValueAtLevel } from '../../src/core/robustnessValue';
import { expectClose } from '../support/expectClose';
import { readReferenceJson } from '../support/reference';

const ovb = readReferenceJson('ovb.json');

/** The adjusted t for the null (1 − q)·estimate, in the estimate's direction, computed directly. */
function adjustedTAgainstThreshold(s: FlipSetting, r2dz: number, r2yz: number): number {
  const est = s.t; // se = 1
  const a = adjustForConfounder({ estimate: est, se: 1, df: s.df }, { r2dz, r2yz }, s.direction);
  return (Math.sign(est) * (a.estimate - (1 - s.q) * est)) / a.se;
}

describe('flip boundaries', () => {
  it('cross the diagonal at RV_q and at RV_{q,α} for every reference case', () => {
    // R 4.2.2 robustness values (test/reference/ovb.json rv_cases): the boundaries are where they are defined
    for (const c of ovb.rv_cases) {
      const s: FlipSetting = { t: c.t, df: c.df, q: c.q, alpha: c.alpha, direction: 'toward-zero' };
      const label = `t ${c.t} df ${c.df} q ${c.q} α ${c.alpha}`;
      if (c.RV_q > 0 && c.RV_q < 1) expectClose(estimateBoundaryR2yz(s, c.RV_q), c.RV_q, { rel: 1e-9 }, label);
      if (c.branch === 'equal') {
        expectClose(significanceBoundaryR2yz(s, c.RV_q_alpha).lower, c.RV_q_alpha, { rel: 1e-8 }, label);
      }
      if (c.branch === 'alternative') {
        // the region starts (a single point) at R²dz = RV_{q,α}, below the diagonal
        const start = significanceRegionStart(scaledPartialF(s), criticalF(c.df, c.alpha), 'toward-zero');
        expectClose(start, c.RV_q_alpha, { rel: 1e-10 }, label);
        const at = significanceBoundaryR2yz(s, Math.min(start * (1 + 1e-9), 1 - 1e-12));
        expect(at.empty, label).toBe(false);
        expect(at.lower, label).toBeLessThanOrEqual(start);
      }
      if (c.branch === 'fq<=fcrit') expect(significanceBoundaryR2yz(s, 0).lower, label).toBe(0);
    }
  });

  it('give the extreme-scenario R²dz: the estimate reaches the threshold there', () => {
    const s: FlipSetting = { t: 4.18, df: 783, q: 1, alpha: 0.05, direction: 'toward-zero' };
    for (const r2yz of [1, 0.75, 0.5]) {
      const b = estimateBoundaryR2dz(s, r2yz);
      const a = adjustForConfounder({ estimate: 4.18, se: 1, df: 783 }, { r2dz: b, r2yz });
      expectClose(a.estimate, 0, { abs: 1e-12 });
      expectClose(estimateBoundaryR2yz(s, b), r2yz, { rel: 1e-12 });
    }
    // published example: with R²yz = 1 the estimate vanishes at R²dz = f²/(1 + f²) = R²(Y~D|X) (algebra)
    expectClose(estimateBoundaryR2dz(s, 1), ovb.published_example.R2yd, { rel: 1e-12 });
  });

  it('has no estimate boundary away from zero, and handles special values', () => {
    const away: FlipSetting = { t: 3, df: 50, q: 1, alpha: 0.05, direction: 'away-from-zero' };
    expect(estimateBoundaryR2yz(away, 0.3)).toBeNaN();
    expect(estimateBoundaryR2dz(away, 0.3)).toBeNaN();
    expect(overturnsEstimate(away, { r2dz: 0.9, r2yz: 0.9 })).toBe(false);
    const s: FlipSetting = { ...away, direction: 'toward-zero' };
    expect(estimateBoundaryR2yz(s, 0)).toBe(Infinity);
    expect(estimateBoundaryR2yz(s, 1)).toBe(0);
    expect(estimateBoundaryR2yz({ ...s, df: 1 }, 0.3)).toBeNaN();
    expect(significanceBoundaryR2yz({ ...s, alpha: 0 }, 0.3).empty).toBe(true);
    expect(significanceBoundaryR2yz(s, 1).empty).toBe(true);
  });

  it('separate overturned from robust confounders exactly, in both directions (fast-check)', () => {
    fc.assert(
      fc.property(
        fc.double({ min: -30, max: 30, noNaN: true }),
        fc.integer({ min: 3, max: 2000 }),
        fc.double({ min: 0.1, max: 1.5, noNaN: true }),
        fc.constantFrom(0.01, 0.05, 0.1),
        fc.constantFrom('toward-zero' as const, 'away-from-zero' as const),
        fc.double({ min: 0, max: 0.99, noNaN: true }),
        fc.double({ min: 0, max: 0.99, noNaN: true }),
        (t, df, q, alpha, direction, r2dz, r2yz) => {
          const s: FlipSetting = { t, df, q, alpha, direction };
          const tCritical = criticalF(df, alpha) * Math.sqrt(df - 1);
          const tAdj = adjustedTAgainstThreshold(s, r2dz, r2yz);
          fc.pre(Math.abs(tAdj - tCritical) > 1e-6 * Math.max(1, tCritical));
          const interval = significanceBoundaryR2yz(s, r2dz);
          const inside = !interval.empty && r2yz >= interval.lower && r2yz <= interval.upper;
          expect(inside).toBe(tAdj <= tCritical);
          // (an estimate of exactly 0 is at its threshold already, whatever the confounder)
          if (direction === 'toward-zero' && Math.abs(t) > 1e-6) {
            const boundary = estimateBoundaryR2yz(s, r2dz);
            fc.pre(Math.abs(r2yz - boundary) > 1e-9);
            const a = adjustForConfounder({ estimate: t, se: 1, df }, { r2dz, r2yz });
            expect(r2yz > boundary).toBe(Math.sign(t || 1) * (a.estimate - (1 - q) * t) < 0);
            expect(overturnsEstimate(s, { r2dz, r2yz })).toBe(r2yz > boundary);
          }
        },
      ),
      { numRuns: 500 },
    );
  });

  it('the equal-strength point of the boundaries is the robustness value (fast-check)', () => {
    fc.assert(
      fc.property(fc.double({ min: 0.5, max: 20, noNaN: true }), fc.integer({ min: 5, max: 5000 }), (t, df) => {
        const s: FlipSetting = { t, df, q: 1, alpha: 0.05, direction: 'toward-zero' };
        const rv = robustnessValue(t, df);
        expectClose(estimateBoundaryR2yz(s, rv), rv, { rel: 1e-9 });
        const rva = robustnessValueAtLevel(t, df);
        fc.pre(rva > 0 && scaledPartialF(s) * criticalF(df, 0.05) < 1);
        expectClose(significanceBoundaryR2yz(s, rva).lower, rva, { rel: 1e-7, abs: 1e-12 });
      }),
    );
  });
});
