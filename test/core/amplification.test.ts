import { describe, expect, test } from 'vitest';
import fc from 'fast-check';
import {
  amplificationDelta,
  amplifiedGamma,
  amplificationSymmetricPoint,
  amplificationCurve,
  readableAmplifications,
} from '../../src/core/amplification';
import { expectClose } from '../support/expectClose';

describe('published relation', () => {
  test('Γ = 1.25 corresponds to (Λ, Δ) = (2, 2) and Γ = 2 to (3, 5)', () => {
    // Rosenbaum & Silber 2009, JASA 104:1398–1405, §2: Γ = (ΛΔ + 1)/(Λ + Δ); (2·2 + 1)/(2 + 2) = 1.25
    expectClose(amplifiedGamma(2, 2), 1.25, { rel: 1e-15 });
    expectClose(amplificationDelta(1.25, 2), 2, { rel: 1e-15 });
    // (3·5 + 1)/(3 + 5) = 2
    expectClose(amplificationDelta(2, 3), 5, { rel: 1e-15 });
    expectClose(amplificationSymmetricPoint(1.25), 2, { rel: 1e-15 });
  });
});

describe('special values', () => {
  test('Λ ≤ Γ has no Δ; Λ = ∞ gives Δ = Γ; Γ = 1 gives Δ = 1; NaN', () => {
    expect(amplificationDelta(2, 2)).toBe(Infinity);
    expect(amplificationDelta(2, 1.5)).toBe(Infinity);
    expect(amplificationDelta(2, Infinity)).toBe(2);
    expect(amplificationDelta(1, 7)).toBe(1);
    expect(Number.isNaN(amplificationDelta(NaN, 3))).toBe(true);
    expect(Number.isNaN(amplificationSymmetricPoint(0.5))).toBe(true);
    expect(amplificationCurve(2, [1, 2, 3])).toEqual([{ lambda: 3, delta: 5 }]);
    expect(readableAmplifications(1)).toEqual([]);
    expect(readableAmplifications(NaN)).toEqual([]);
  });
});

describe('invariants', () => {
  test('every curve point maps back to Γ; the curve is symmetric and decreasing', () => {
    fc.assert(
      fc.property(fc.double({ min: 1.001, max: 50, noNaN: true }), fc.double({ min: 1.0001, max: 100, noNaN: true }), (gamma, factor) => {
        const lambda = gamma * factor;
        const delta = amplificationDelta(gamma, lambda);
        expectClose(amplifiedGamma(lambda, delta), gamma, { rel: 1e-9 });
        expectClose(amplificationDelta(gamma, delta), lambda, { rel: 1e-6 });
        expect(amplificationDelta(gamma, lambda * 1.1)).toBeLessThan(delta);
        expect(delta).toBeGreaterThan(gamma);
      }),
    );
  });
  test('readable pairs are round Λ above Γ with matching Δ', () => {
    fc.assert(
      fc.property(fc.double({ min: 1.01, max: 1000, noNaN: true }), (gamma) => {
        const pairs = readableAmplifications(gamma);
        expect(pairs.length).toBeGreaterThanOrEqual(2);
        for (const { lambda, delta } of pairs) {
          expect(lambda).toBeGreaterThan(gamma);
          expectClose(amplifiedGamma(lambda, delta), gamma, { rel: 1e-9 });
        }
      }),
    );
  });
});
