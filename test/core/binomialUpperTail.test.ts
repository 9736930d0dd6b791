import { describe, expect, test } from 'vitest';
import fc from 'fast-check';
import { binomialUpperTail } from '../../src/core/binomialUpperTail';
import { expectClose } from '../support/expectClose';
import { readReferenceJson } from '../support/reference';

const reference = readReferenceJson('binomial_tails.json');

describe('reference values', () => {
  test.each(reference.tails as any[])('P(X ≥ $k), X ~ Binomial($n, $p), equals R', (row) => {
    // R 4.2.2: pbinom(k − 1, n, p, lower.tail = FALSE), test/reference/binomial_tails.json
    // (generator test/reference/generators/binomial_tails.R). Tolerance: a few ulps of the exponent of tails
    // down to 1e-130 (|log P| ≤ 300 → ~1e-13 relative).
    const actual = binomialUpperTail(row.k, row.n, row.p);
    if (row.upper === 0) expect(actual).toBe(0);
    else expectClose(actual, row.upper, { rel: 2e-13 });
  });

  test('textbook values', () => {
    // Exact sums: P(Bin(10, ½) ≥ 9) = 11/1024; P(Bin(5, 0.2) ≥ 5) = 0.2⁵; P(Bin(10, ½) ≥ 2) = 1 − 11/1024
    expectClose(binomialUpperTail(9, 10, 0.5), 11 / 1024, { rel: 1e-14 });
    expectClose(binomialUpperTail(5, 5, 0.2), 0.2 ** 5, { rel: 1e-14 });
    expectClose(binomialUpperTail(2, 10, 0.5), 1 - 11 / 1024, { rel: 1e-14 });
    // P(Bin(n, p) ≥ 1) = 1 − (1 − p)ⁿ = −expm1(n·log1p(−p)), small when np is small
    expectClose(binomialUpperTail(1, 10, 1e-10), -Math.expm1(10 * Math.log1p(-1e-10)), { rel: 1e-14 });
  });
});

describe('special values', () => {
  test('thresholds outside 1…n, degenerate p, NaN, fractional k', () => {
    expect(binomialUpperTail(11, 10, 0.5)).toBe(0);
    expect(binomialUpperTail(0, 10, 0.5)).toBe(1);
    expect(binomialUpperTail(-1, 10, 0.5)).toBe(1);
    expect(binomialUpperTail(3, 10, 0)).toBe(0);
    expect(binomialUpperTail(3, 10, 1, 0)).toBe(1);
    expect(binomialUpperTail(1, 0, 0.5)).toBe(0);
    expect(Number.isNaN(binomialUpperTail(NaN, 10, 0.5))).toBe(true);
    expect(Number.isNaN(binomialUpperTail(3, 10, NaN))).toBe(true);
    expect(binomialUpperTail(8.2, 10, 0.5)).toBe(binomialUpperTail(9, 10, 0.5));
  });

  test('k = n gives pⁿ, tiny tails keep relative accuracy, and only results beyond the double range are 0', () => {
    // P(X = n) = pⁿ exactly
    expectClose(binomialUpperTail(2000, 2000, 0.7), Math.exp(2000 * Math.log(0.7)), { rel: 1e-13 });
    expect(binomialUpperTail(2000, 2000, 0.25)).toBe(0); // ¼²⁰⁰⁰ ≈ 1e-1204
    // P(Bin(1074, ½) ≥ 1074) = 2⁻¹⁰⁷⁴: the smallest subnormal, 5e-324
    expect(binomialUpperTail(1074, 1074, 0.5)).toBe(2 ** -1074);
    expectClose(binomialUpperTail(1000, 1000, 0.5), 2 ** -1000, { rel: 1e-13 });
  });

  test('a complement passed separately is honoured: p = 1 − q with q tiny', () => {
    // P(X ≥ n) = (1 − q)ⁿ = exp(n·log1p(−q)); p = 1 − 1e-20 rounds to 1 but q carries it
    expectClose(binomialUpperTail(1e6, 1e6, 1, 1e-20), Math.exp(1e6 * Math.log1p(-1e-20)), { rel: 1e-15 });
    expectClose(binomialUpperTail(1e6, 1e6, 1 - 1e-12, 1e-12), Math.exp(1e6 * Math.log1p(-1e-12)), { rel: 1e-14 });
  });
});

describe('invariants', () => {
  test('equals a direct sum of point probabilities for n ≤ 80 (both tails, any p)', () => {
    fc.assert(
      fc.property(
        fc.integer({ min: 1, max: 80 }),
        fc.double({ min: 0, max: 1, noNaN: true }),
        fc.double({ min: 0.001, max: 0.999, noNaN: true }),
        (n, where, p) => {
          const k = Math.round(where * n);
          // direct summation of C(n, j)pʲqⁿ⁻ʲ in log space over j ≥ k (an independent, slower route)
          let sum = 0;
          for (let j = Math.max(k, 0); j <= n; j++) {
            let logC = 0;
            for (let i = 1; i <= Math.min(j, n - j); i++) logC += Math.log((n - Math.min(j, n - j) + i) / i);
            sum += Math.exp(logC + j * Math.log(p) + (n - j) * Math.log1p(-p));
          }
          expectClose(binomialUpperTail(k, n, p), Math.min(1, sum), { rel: 1e-12, abs: 1e-300 });
        },
      ),
      { numRuns: 400 },
    );
  });

  test('falls as k rises and rises with p, at sizes up to 10¹²', () => {
    fc.assert(
      fc.property(
        fc.integer({ min: 2, max: 12 }),
        fc.double({ min: -6, max: 6, noNaN: true }),
        fc.double({ min: 0.05, max: 0.95, noNaN: true }),
        (digits, z, p) => {
          const n = 10 ** digits;
          const k = Math.round(n * p + z * Math.sqrt(n * p * (1 - p)));
          if (k < 1 || k >= n) return;
          const at = binomialUpperTail(k, n, p);
          expect(binomialUpperTail(k + 1, n, p)).toBeLessThanOrEqual(at * (1 + 1e-13));
          expect(binomialUpperTail(k, n, Math.min(0.99, p * 1.001))).toBeGreaterThanOrEqual(at * (1 - 1e-13));
          // P(X ≥ k) + P(X ≤ k − 1) = 1, the second as an upper tail of n − X
          expectClose(at + binomialUpperTail(n - k + 1, n, 1 - p, p), 1, { rel: 1e-13 });
        },
      ),
      { numRuns: 300 },
    );
  });
});

describe('non-mutation', () => {
  test('a pure function of its numbers', () => {
    expect(binomialUpperTail(60, 100, 0.5)).toBe(binomialUpperTail(60, 100, 0.5));
  });
});
