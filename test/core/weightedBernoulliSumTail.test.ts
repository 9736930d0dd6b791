import { describe, expect, test } from 'vitest';
import fc from 'fast-check';
import { WEIGHTED_TAIL_MEASURED_ERROR, weightedBernoulliSumUpperTail } from '../../src/core/weightedBernoulliSumTail';
import { expectClose } from '../support/expectClose';
import { exactBernoulliTail as exactTail } from '../support/exactBernoulliTail';


const DYADIC: [bigint, bigint][] = [
  [1n, 1n], // ½ (Γ = 1)
  [5n, 3n], // 5/8
  [3n, 2n], // ¾ (Γ = 3)
  [11n, 4n], // 11/16
  [1n, 3n], // ⅛
  [231n, 8n], // 231/256
];

describe('reference values', () => {
  test('equals exact rational (BigInt) arithmetic for small cases', () => {
    // P(B₁ + 2B₂ + 3B₃ ≥ 3), p = ¾, by hand: the sign patterns (B₁B₂B₃) 001, 110, 101, 011, 111 have
    // probabilities 3/64, 9/64, 9/64, 9/64, 27/64, in all 57/64
    expectClose(weightedBernoulliSumUpperTail([1, 2, 3], 3, 0.75, 0.25), 57 / 64, { rel: 1e-15 });
    expectClose(exactTail([1, 2, 3], 3, 3n, 2n), 57 / 64, { rel: 1e-15 });
  });
});

describe('invariants', () => {
  test(`within the measured error (${WEIGHTED_TAIL_MEASURED_ERROR.max}) of exact rational arithmetic, with ties, up to 90 weights`, () => {
    fc.assert(
      fc.property(
        fc.array(fc.integer({ min: 1, max: 60 }), { minLength: 3, maxLength: 90 }),
        fc.double({ min: 0, max: 1, noNaN: true }),
        fc.constantFrom(...DYADIC),
        (weights, where, [a, m]) => {
          const total = weights.reduce((x, y) => x + y, 0);
          const t = Math.round(where * total);
          const p = Number(a) / Number(1n << m);
          const expected = exactTail(weights, t, a, m);
          const actual = weightedBernoulliSumUpperTail(weights, t, p, 1 - p);
          if (expected < 1e-300) expect(actual).toBeLessThan(1e-290);
          else expectClose(actual, expected, { rel: 2 * WEIGHTED_TAIL_MEASURED_ERROR.max });
        },
      ),
      { numRuns: 120 },
    );
  });
});
