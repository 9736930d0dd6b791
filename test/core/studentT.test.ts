import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { studentTDensity, studentTQuantile, studentTUpperTail } from '../../src/core/studentT';
import { expectClose } from '../support/expectClose';
import { readReferenceJson } from '../support/reference';

const ovb = readReferenceJson('ovb.json');

describe('studentTQuantile', () => {
  it('matches R qt(1 − α/2, df − 1) behind every robustness-value case', () => {
    // R 4.2.2: fcrit = qt(1 - alpha/2, df - 1)/sqrt(df - 1), test/reference/ovb.json rv_cases
    for (const c of ovb.rv_cases) {
      const t = studentTQuantile(1 - c.alpha / 2, c.df - 1);
      expectClose(t / Math.sqrt(c.df - 1), c.fcrit, { rel: 1e-13 }, `df ${c.df} α ${c.alpha}`);
    }
  });

  it('matches 40-digit values for small and large df', () => {
    // mpmath 1.3.0 (general-purpose arbitrary precision), dps = 40: root of betainc(df/2, 1/2, 0, df/(df+t²))/2 = 0.025
    expectClose(studentTQuantile(0.975, 3), 3.1824463052837095927, { rel: 1e-14 });
    expectClose(studentTQuantile(0.975, 1000), 1.962339080826408485, { rel: 1e-13 });
    expectClose(studentTQuantile(0.975, 123456.5), 1.9599832001673623057, { rel: 1e-12 });
    expectClose(studentTQuantile(0.975, 3e6), 1.9599647752974446128, { rel: 1e-13 });
    expectClose(studentTQuantile(0.025, 1000), -1.962339080826408485, { rel: 1e-13 });
  });

  it('has the closed forms for df = 1 and df = 2', () => {
    // Cauchy quantile tan(π(p − ½)); df = 2: (2p − 1)/√(2p(1 − p)) (Abramowitz & Stegun 26.7)
    expectClose(studentTQuantile(0.975, 1), Math.tan(Math.PI * 0.475), { rel: 1e-14 });
    expectClose(studentTQuantile(0.9, 2), 0.8 / Math.sqrt(2 * 0.9 * 0.1), { rel: 1e-14 });
  });

  it('handles its special values', () => {
    expect(studentTQuantile(0, 5)).toBe(-Infinity);
    expect(studentTQuantile(1, 5)).toBe(Infinity);
    expect(studentTQuantile(0.5, 5)).toBe(0);
    expect(studentTQuantile(NaN, 5)).toBeNaN();
    expect(studentTQuantile(0.5, 0)).toBeNaN();
    expect(studentTQuantile(1.2, 3)).toBeNaN();
    expect(studentTUpperTail(Infinity, 3)).toBe(0);
    expect(studentTUpperTail(-Infinity, 3)).toBe(1);
    expect(studentTUpperTail(0, 3)).toBe(0.5);
    expect(studentTDensity(Infinity, 3)).toBe(0);
  });

  it('inverts the upper tail for any df and p (fast-check)', () => {
    fc.assert(
      fc.property(fc.double({ min: 0.51, max: 1 - 1e-9, noNaN: true }), fc.double({ min: 0.5, max: 1e9, noNaN: true }), (p, df) => {
        // 1 − p is exact for p in [½, 1], so the check sees only the quantile's own error.
        const t = studentTQuantile(p, df);
        // Near x = (a + 1)/(a + b + 2) the continued fraction keeps about 11 digits for df ~ 1e5.
        expectClose(studentTUpperTail(t, df), 1 - p, { rel: 1e-10 });
      }),
      { numRuns: Number(process.env.LURK_RUNS ?? 100) },
    );
  });

  it('approaches the normal quantile for huge df', () => {
    // z(0.975) = 1.959963984540054 (standard value, recalled from memory)
    expectClose(studentTQuantile(0.975, 1e12), 1.959963984540054, { rel: 1e-9 });
  });
});
