import { describe, expect, test } from 'vitest';
import fc from 'fast-check';
import { upperNormalTail, upperNormalQuantile, normalDensity } from '../../src/core/upperNormalTail';
import { expectClose } from '../support/expectClose';
import { readReferenceJson } from '../support/reference';

describe('handbook values', () => {
  test('Q(z) at standard points', () => {
    // Abramowitz & Stegun 1964, Table 26.1 / R pnorm(z, lower.tail = FALSE); values recalled from memory
    expectClose(upperNormalTail(0), 0.5, { rel: 1e-15 });
    expectClose(upperNormalTail(1), 0.15865525393145707, { rel: 1e-14 });
    expectClose(upperNormalTail(1.959963984540054), 0.025, { rel: 1e-14 });
    expectClose(upperNormalTail(5), 2.866515718791939e-7, { rel: 1e-13 });
    expectClose(upperNormalTail(10), 7.619853024160527e-24, { rel: 1e-13 });
    expectClose(upperNormalTail(-1), 0.8413447460685429, { rel: 1e-15 });
  });
  test('the reference normal approximations (tails down to 3e-12) are reproduced', () => {
    // R 4.2.2: 1 − pnorm(z) values in rosenbaum.json (wilcoxon_lower_normal at Γ = 6 is 2.86e-12)
    const ref = readReferenceJson('rosenbaum.json').datasets.small_n15;
    const T = ref.wilcoxon_T;
    for (const row of ref.by_gamma) {
      const p = 1 / (1 + row.gamma);
      const z = (T - p * ref.wilcoxon_sum_ranks) / Math.sqrt(p * (1 - p) * ref.wilcoxon_sum_ranks_sq);
      expectClose(upperNormalTail(z), row.wilcoxon_lower_normal, { rel: 1e-11 });
    }
  });
  test('quantiles', () => {
    // qnorm(0.975) = 1.959963984540054, qnorm(0.95) = 1.6448536269514722 (R; recalled from memory)
    expectClose(upperNormalQuantile(0.025), 1.959963984540054, { rel: 1e-13 });
    expectClose(upperNormalQuantile(0.05), 1.6448536269514722, { rel: 1e-13 });
    expectClose(upperNormalQuantile(0.95), -1.6448536269514722, { rel: 1e-13 });
  });
});

describe('special values', () => {
  test('limits and NaN', () => {
    expect(upperNormalTail(Infinity)).toBe(0);
    expect(upperNormalTail(-Infinity)).toBe(1);
    expect(Number.isNaN(upperNormalTail(NaN))).toBe(true);
    expect(upperNormalTail(50)).toBe(0);
    expect(upperNormalQuantile(0)).toBe(Infinity);
    expect(upperNormalQuantile(1)).toBe(-Infinity);
    expect(upperNormalQuantile(0.5)).toBe(0);
    expect(Number.isNaN(upperNormalQuantile(1.5))).toBe(true);
  });
});

describe('invariants', () => {
  test('Q(z) + Q(−z) = 1, Q decreasing, the quantile inverts the tail', () => {
    fc.assert(
      fc.property(fc.double({ min: -8, max: 8, noNaN: true }), (z) => {
        expectClose(upperNormalTail(z) + upperNormalTail(-z), 1, { rel: 1e-14 });
        if (z > -5) expect(upperNormalTail(z + 0.01)).toBeLessThan(upperNormalTail(z)); // below −5, Q rounds to 1
        // Q near 1 carries no digits about z (inherent), so the inversion is checked where Q ≤ 0.98
        if (z > -2) expectClose(upperNormalQuantile(upperNormalTail(z)), z, { abs: 1e-9 });
      }),
    );
  });
  test('the series and the continued fraction meet smoothly at z = 2', () => {
    const left = upperNormalTail(2 - 1e-12);
    const right = upperNormalTail(2);
    expectClose(left, right + normalDensity(2) * 1e-12, { rel: 1e-13 });
  });
});
