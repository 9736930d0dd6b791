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

const studentT = readReferenceJson('student_t.json');

describe('accuracy against R base pt and qt (test/reference/student_t.json)', () => {
  it('upper tails: within 1e-12 relative everywhere, 1e-13 for df ≤ 1000 or df ≥ 9e5', () => {
    // R 4.2.2: pt(t, df, lower.tail = FALSE), checked in R against pbeta(t²/(df + t²), 1/2, df/2, lower.tail = FALSE)/2
    for (const c of studentT.tails) {
      const rel = c.df <= 1000 || c.df >= 9e5 ? 1e-13 : 1e-12;
      expectClose(studentTUpperTail(c.t, c.df), c.upper, { rel }, `t ${c.t} df ${c.df}`);
    }
  });

  it('beyond 1e6 degrees of freedom the tail keeps its relative accuracy far out (t = 8: was 2% off)', () => {
    // R 4.2.2: pt(8, 1000001, lower.tail = FALSE) = 6.2275317100…e-16 (student_t.json); the normal tail of the
    // deviate used to come from an erfc with only absolute accuracy
    const c = studentT.tails.find((x: any) => x.t === 8 && x.df === 1000001);
    expectClose(studentTUpperTail(8, 1000001), c.upper, { rel: 4e-14 });
  });

  it('quantiles: within 4e-14 relative (the small tail given as p)', () => {
    // R 4.2.2: qt(tail, df, lower.tail = FALSE)
    for (const c of studentT.quantiles) {
      expectClose(-studentTQuantile(c.tail, c.df), c.quantile, { rel: 4e-14 }, `tail ${c.tail} df ${c.df}`);
    }
  });

  it('near df = 1e6 the quantile is accurate to 1e-15, not 8.5e-12', () => {
    // R 4.2.2: qt(0.025, 999999, lower.tail = FALSE) (student_t.json)
    const c = studentT.quantiles.find((x: any) => x.tail === 0.025 && x.df === 999999);
    expectClose(studentTQuantile(0.975, 999999), c.quantile, { rel: 1e-15 });
  });
});
