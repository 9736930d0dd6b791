import { describe, expect, test } from 'vitest';
import fc from 'fast-check';
import { signTestBound } from '../../src/core/signTestBound';
import { binomialUpperTail } from '../../src/core/binomialUpperTail';
import { expectClose } from '../support/expectClose';
import { readReferenceJson } from '../support/reference';

const reference = readReferenceJson('rosenbaum.json');
const datasets = Object.entries<any>(reference.datasets);

describe('reference values', () => {
  for (const [name, ds] of datasets) {
    test.each(ds.by_gamma as any[])(`${name}: Γ = $gamma exact and normal sign-test bounds`, (row) => {
      // R 4.2.2: pbinom(S − 1, D, p, lower.tail = FALSE) and the normal approximation, rosenbaum.json
      const exact = signTestBound(ds.sign_S, ds.sign_D, row.gamma, { method: 'exact' });
      expectClose(exact.pUpper, row.sign_upper_exact, { rel: 1e-12 }, 'upper');
      expectClose(exact.pLower, row.sign_lower_exact, { rel: 1e-12 }, 'lower');
      const normal = signTestBound(ds.sign_S, ds.sign_D, row.gamma, { method: 'normal' });
      expectClose(normal.pUpper, row.sign_upper_normal, { rel: 1e-12 }, 'normal');
      const corrected = signTestBound(ds.sign_S, ds.sign_D, row.gamma, { method: 'normal', continuityCorrection: true });
      expectClose(corrected.pUpper, row.sign_upper_normal_cc, { rel: 1e-12 }, 'normal cc');
    });
  }
  const large = readReferenceJson('binomial_tails.json').signTest as any[];
  test.each(large)('S = $S of D = $D discordant pairs, Γ = $gamma: both bounds equal R at any size', (row) => {
    // R 4.2.2: pbinom(S − 1, D, Γ/(1 + Γ), lower.tail = FALSE) and pbinom(D − S, D, Γ/(1 + Γ)),
    // test/reference/binomial_tails.json (generator test/reference/generators/binomial_tails.R). R takes
    // 1 − p as the complement, so the kernel is given the same pair here.
    const upper = binomialUpperTail(row.S, row.D, row.p, 1 - row.p);
    const lower = binomialUpperTail(row.S, row.D, 1 - row.p, row.p);
    for (const [actual, expected] of [
      [upper, row.upper],
      [lower, row.lower],
    ]) {
      if (expected === 0) expect(actual).toBe(0);
      else expectClose(actual, expected, { rel: 2e-13 });
    }
    // signTestBound uses 1/(1 + Γ) for the complement; it differs from 1 − Γ/(1 + Γ) in the last place, which
    // moves the tail by about |S − Dp|·2⁻⁵³/p relative (the conditioning of the binomial tail in p).
    const bound = signTestBound(row.S, row.D, row.gamma, { method: 'exact' });
    const slack = (Math.abs(row.S - row.D * row.p) * 2 ** -52) / Math.min(row.p, 1 - row.p) + 2e-13;
    if (row.upper === 0) expect(bound.pUpper).toBe(0);
    else expectClose(bound.pUpper, row.upper, { rel: slack });
    if (row.lower < 1e-300) expect(bound.pLower).toBeLessThan(1e-290);
    else expectClose(bound.pLower, row.lower, { rel: slack });
  });
  test.each(datasets)('%s: at Γ = 1 the bound is binom.test', (_name, ds) => {
    // R 4.2.2: binom.test(S, D, alternative = "greater")$p.value
    expectClose(signTestBound(ds.sign_S, ds.sign_D, 1, { method: 'exact' }).pUpper, ds.checks_gamma1.binom_test_greater, { rel: 1e-13 });
  });
  test('binomial tails at textbook values', () => {
    // Exact sums: P(Bin(10, ½) ≥ 9) = 11/1024; P(Bin(20, 0.3) ≥ 0) = 1; P(Bin(5, 0.2) ≥ 5) = 0.2⁵
    expectClose(binomialUpperTail(9, 10, 0.5), 11 / 1024, { rel: 1e-14 });
    expect(binomialUpperTail(0, 20, 0.3)).toBe(1);
    expectClose(binomialUpperTail(5, 5, 0.2), 0.2 ** 5, { rel: 1e-14 });
    // Lower-side branch (k ≤ np): P(Bin(10, ½) ≥ 2) = 1 − 11/1024
    expectClose(binomialUpperTail(2, 10, 0.5), 1 - 11 / 1024, { rel: 1e-14 });
  });
});

describe('special values', () => {
  test('thresholds outside 1…n, degenerate p, NaN', () => {
    expect(binomialUpperTail(11, 10, 0.5)).toBe(0);
    expect(binomialUpperTail(-1, 10, 0.5)).toBe(1);
    expect(binomialUpperTail(3, 10, 0)).toBe(0);
    expect(binomialUpperTail(3, 10, 1, 0)).toBe(1);
    expect(Number.isNaN(binomialUpperTail(NaN, 10, 0.5))).toBe(true);
    expect(signTestBound(0, 0, 2, { method: 'exact' }).pUpper).toBe(1);
    expect(signTestBound(0, 0, 2, { method: 'normal' }).pUpper).toBe(1);
  });
  test('a far tail keeps relative accuracy: P(Bin(2000, ¼) ≥ 2000) = ¼²⁰⁰⁰ underflows, ≥ 1500 does not lose digits', () => {
    // P(X = n) = pⁿ exactly; the sum over k ≥ 1990 is dominated by its first terms
    expect(binomialUpperTail(2000, 2000, 0.25)).toBe(0);
    const direct = (() => {
      let logTerm = 0;
      for (let i = 1; i <= 10; i++) logTerm += Math.log((2000 - 10 + i) / i);
      return Math.exp(logTerm + 1990 * Math.log(0.75) + 10 * Math.log(0.25));
    })();
    expect(binomialUpperTail(1990, 2000, 0.75)).toBeGreaterThan(direct);
    expectClose(binomialUpperTail(1990, 2000, 0.75), direct, { rel: 0.05 });
  });
});

describe('invariants', () => {
  test('pUpper rises and pLower falls with Γ; the tail equals a direct sum of pmf terms', () => {
    fc.assert(
      fc.property(
        fc.integer({ min: 1, max: 60 }),
        fc.integer({ min: 0, max: 60 }),
        fc.double({ min: 1, max: 30, noNaN: true }),
        fc.double({ min: 0, max: 5, noNaN: true }),
        (d, sRaw, gamma, extra) => {
          const s = Math.min(sRaw, d);
          const a = signTestBound(s, d, gamma, { method: 'exact' });
          const b = signTestBound(s, d, gamma + extra, { method: 'exact' });
          expect(b.pUpper).toBeGreaterThanOrEqual(a.pUpper - 1e-12);
          expect(b.pLower).toBeLessThanOrEqual(a.pLower + 1e-12);
          const p = gamma / (1 + gamma);
          let sum = 0;
          let c = 1;
          for (let k = 0; k <= d; k++) {
            if (k > 0) c = (c * (d - k + 1)) / k;
            if (k >= s) sum += c * p ** k * (1 - p) ** (d - k);
          }
          expectClose(a.pUpper, sum, { rel: 1e-9, abs: 1e-250 });
        },
      ),
      { numRuns: 300 },
    );
  });
});
