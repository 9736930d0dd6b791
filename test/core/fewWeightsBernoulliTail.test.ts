import { describe, expect, test } from 'vitest';
import fc from 'fast-check';
import { fewWeightsUpperTail } from '../../src/core/fewWeightsBernoulliTail';
import { sortedLowerTail } from '../../src/core/weightedBernoulliSumTail';
import { exactBernoulliTail } from '../support/exactBernoulliTail';
import { expectClose } from '../support/expectClose';

const expand = (values: number[], counts: number[]) => values.flatMap((v, j) => new Array<number>(counts[j]).fill(v));
const relativeError = (a: number, b: number) => Math.abs(a - b) / b;

describe('reference values', () => {
  test('equals exact rational (BigInt) arithmetic for one to four distinct weights, down to tails of 1e-60', () => {
    // Independent route: the generating function expanded in BigInt (test/support/exactBernoulliTail.ts).
    const cases: [number[], number[]][] = [
      [[7], [90]],
      [[3, 8], [60, 45]],
      [[3, 8, 13], [40, 30, 50]],
      [[2, 5, 9, 11], [12, 9, 15, 8]],
    ];
    for (const [values, counts] of cases) {
      const weights = expand(values, counts);
      const total = weights.reduce((a, b) => a + b, 0);
      for (const [a, m] of [[1n, 1n], [5n, 3n], [13n, 4n]] as [bigint, bigint][]) {
        const p = Number(a) / 2 ** Number(m);
        for (const where of [0.2, 0.5, 0.7, 0.85, 0.97]) {
          const t = Math.round(where * total);
          const expected = exactBernoulliTail(weights, t, a, m);
          const value = fewWeightsUpperTail(values, counts, t, p, 1 - p);
          if (expected < 1e-280) {
            expect(value).toBeNull();
            continue;
          }
          expect(value, `${values}, p ${p}, t ${t}`).not.toBeNull();
          expect(relativeError(value!, expected), `${values}, p ${p}, t ${t}: ${value} vs ${expected}`).toBeLessThan(1e-13);
        }
      }
    }
  });
});

describe('special values', () => {
  test('thresholds beyond the support are exact; a single weight is a binomial tail', () => {
    expect(fewWeightsUpperTail([2, 5], [3, 4], 0, 0.6, 0.4)).toBe(1);
    expect(fewWeightsUpperTail([2, 5], [3, 4], 27, 0.6, 0.4)).toBe(0);
    expectClose(fewWeightsUpperTail([2, 5], [3, 4], 26, 0.6, 0.4)!, 0.6 ** 7, { rel: 1e-14 });
    // P(K ≥ 2), K ~ Binomial(3, ½) = 4/8, on the lattice 5·K: P(5K ≥ 6) = P(K ≥ 2)
    expectClose(fewWeightsUpperTail([5], [3], 6, 0.5, 0.5)!, 0.5, { rel: 1e-15 });
  });

  test('declines (null) when the combinations would exceed the work allowed, or p is 0 or 1', () => {
    expect(fewWeightsUpperTail([1, 2, 3, 4, 5, 6], [200, 200, 200, 200, 200, 200], 3000, 0.6, 0.4, 1e5)).toBeNull();
    expect(fewWeightsUpperTail([1, 2], [3, 3], 4, 0, 1)).toBeNull();
  });
});

describe('invariants', () => {
  test('agrees with the dynamic program for heavy ties (300–900 weights on 2–3 sizes)', () => {
    fc.assert(
      fc.property(
        fc.array(fc.integer({ min: 1, max: 100 }), { minLength: 2, maxLength: 3 }),
        fc.array(fc.integer({ min: 100, max: 300 }), { minLength: 3, maxLength: 3 }),
        fc.double({ min: 0.4, max: 0.8, noNaN: true }),
        fc.double({ min: 0.5, max: 0.95, noNaN: true }),
        (rawValues, rawCounts, where, p) => {
          const values = [...new Set(rawValues)].sort((a, b) => a - b);
          const counts = rawCounts.slice(0, values.length);
          const weights = expand(values, counts);
          const total = weights.reduce((a, b) => a + b, 0);
          const t = Math.round(where * total);
          const value = fewWeightsUpperTail(values, counts, t, p, 1 - p);
          // The dynamic program itself (sortedLowerTail), on the side where its tail is the smaller one.
          const sorted = Float64Array.from(weights).sort();
          const direct = sortedLowerTail(sorted, total - t, 1 - p, p);
          const reference = direct < 0.5 ? direct : 1 - sortedLowerTail(sorted, t - 1, p, 1 - p);
          if (value === null) return true;
          return reference === 0 ? value < 1e-280 : relativeError(value, reference) < 1e-11;
        },
      ),
      { numRuns: 15, seed: 20261202 },
    );
  });
});
