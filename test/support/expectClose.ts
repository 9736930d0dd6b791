import { expect } from 'vitest';

export interface Tolerance {
  /** Relative tolerance, |a − e| ≤ rel·|e|. */
  rel?: number;
  /** Absolute tolerance, |a − e| ≤ abs. */
  abs?: number;
}

/**
 * Asserts that `actual` is within the tolerance of `expected` (either bound suffices) and, on failure,
 * reports the difference and the tolerance. Infinite and NaN expectations must match exactly.
 */
export function expectClose(actual: number, expected: number, tol: Tolerance = { rel: 1e-12 }, label = ''): void {
  if (!Number.isFinite(expected)) {
    expect(actual, label).toBe(expected);
    return;
  }
  const diff = Math.abs(actual - expected);
  const relLimit = tol.rel === undefined ? 0 : tol.rel * Math.abs(expected);
  const absLimit = tol.abs ?? 0;
  const ok = Number.isFinite(actual) && (diff <= relLimit || diff <= absLimit);
  expect(
    ok,
    `${label ? label + ': ' : ''}actual ${actual} vs expected ${expected}; Δ = ${diff.toExponential(3)}, ` +
      `tolerance rel ${tol.rel ?? '—'} (${relLimit.toExponential(3)}), abs ${tol.abs ?? '—'}`,
  ).toBe(true);
}
