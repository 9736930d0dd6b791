import { describe, expect, test } from 'vitest';
import fc from 'fast-check';
import { weightedMeanRange, weightedMeanRangeTable } from '../../src/core/weightedMeanRange';
import { expectClose } from '../support/expectClose';

/** Brute force: every split of the sorted outcomes, both directions, weights written out person by person. */
function bruteForce(y: number[], counts: number[] | null, f: number, s: number[], lambda: number) {
  const order = y.map((_, i) => i).sort((a, b) => y[a] - y[b]);
  let lower = Infinity;
  let upper = -Infinity;
  for (let k = 0; k <= y.length; k++) {
    for (const lowFirst of [true, false]) {
      let num = 0;
      let den = 0;
      order.forEach((i, rank) => {
        const belowSplit = rank < k;
        const factor = belowSplit === lowFirst ? 1 / lambda : lambda;
        const w = (counts ? counts[i] : 1) * (f + s[i] * factor);
        num += w * y[i];
        den += w;
      });
      if (den > 0) {
        lower = Math.min(lower, num / den);
        upper = Math.max(upper, num / den);
      }
    }
  }
  return { lower, upper };
}

function sortedTable(y: number[], counts: number[] | null, f: number, s: number[]) {
  const order = y.map((_, i) => i).sort((a, b) => y[a] - y[b]);
  return weightedMeanRangeTable(
    order.map((i) => y[i]),
    counts ? order.map((i) => counts[i]) : null,
    f,
    order.map((i) => s[i]),
  );
}

describe('reference values: brute force over every split', () => {
  test('a small worked case (fictional numbers) matches the enumeration', () => {
    // Fictional outcomes and inverse-odds weights; brute force over all 2·(m+1) splits, written in the test
    const y = [3, -1, 4, 1, 5, 9, 2, 6];
    const s = [0.5, 2, 1, 0.25, 3, 0.8, 1.5, 0.1];
    for (const lambda of [1, 1.3, 2, 5]) {
      const exact = bruteForce(y, null, 1, s, lambda);
      const got = weightedMeanRange(sortedTable(y, null, 1, s), lambda);
      expectClose(got.lower, exact.lower, { rel: 1e-12, abs: 1e-12 });
      expectClose(got.upper, exact.upper, { rel: 1e-12, abs: 1e-12 });
    }
  });
});

describe('special values', () => {
  test('Λ = 1 gives the weighted mean as both ends', () => {
    const r = weightedMeanRange(weightedMeanRangeTable([1, 2, 4], null, 1, [1, 0, 3]), 1);
    const mean = (2 * 1 + 1 * 2 + 4 * 4) / (2 + 1 + 4);
    expectClose(r.lower, mean);
    expectClose(r.upper, mean);
  });
  test('an empty group gives NaN ends', () => {
    const r = weightedMeanRange(weightedMeanRangeTable([], null, 1, []), 2);
    expect(r.lower).toBeNaN();
    expect(r.upper).toBeNaN();
  });
  test('fixed part 0 (weights s·Λ^±1) and a constant outcome give that constant', () => {
    const r = weightedMeanRange(weightedMeanRangeTable([7, 7, 7], null, 0, [1, 2, 3]), 3);
    expectClose(r.lower, 7);
    expectClose(r.upper, 7);
  });
  test('Λ and 1/Λ give the same range', () => {
    const t = weightedMeanRangeTable([1, 2, 5, 8], null, 1, [2, 1, 1, 0.5]);
    expect(weightedMeanRange(t, 0.5)).toEqual(weightedMeanRange(t, 2));
  });
});

describe('invariants', () => {
  const data = fc
    .integer({ min: 1, max: 12 })
    .chain((m) =>
      fc.record({
        y: fc.array(fc.double({ min: -100, max: 100, noNaN: true }), { minLength: m, maxLength: m }),
        s: fc.array(fc.double({ min: 0.01, max: 50, noNaN: true }), { minLength: m, maxLength: m }),
        counts: fc.option(fc.array(fc.integer({ min: 0, max: 3 }), { minLength: m, maxLength: m }), { nil: null }),
        f: fc.constantFrom(0, 1),
        lambda: fc.double({ min: 1, max: 20, noNaN: true }),
      }),
    );
  test('the bisection equals the brute-force scan of every split', () => {
    fc.assert(
      fc.property(data, ({ y, s, counts, f, lambda }) => {
        if (counts && counts.every((c) => c === 0)) return;
        const exact = bruteForce(y, counts, f, s, lambda);
        const got = weightedMeanRange(sortedTable(y, counts, f, s), lambda);
        const scale = Math.max(1, ...y.map(Math.abs));
        expectClose(got.lower, exact.lower, { abs: 1e-9 * scale });
        expectClose(got.upper, exact.upper, { abs: 1e-9 * scale });
      }),
      { numRuns: 500 },
    );
  });
  test('the range widens as Λ grows', () => {
    fc.assert(
      fc.property(data, fc.double({ min: 1, max: 3, noNaN: true }), ({ y, s, f, lambda }, factor) => {
        const t = sortedTable(y, null, f, s);
        const a = weightedMeanRange(t, lambda);
        const b = weightedMeanRange(t, lambda * factor);
        const eps = 1e-9 * Math.max(1, ...y.map(Math.abs));
        expect(b.lower).toBeLessThanOrEqual(a.lower + eps);
        expect(b.upper).toBeGreaterThanOrEqual(a.upper - eps);
      }),
    );
  });
});

describe('validation', () => {
  test('lengths that disagree are refused', () => {
    expect(() => weightedMeanRangeTable([1, 2], null, 1, [1])).toThrow(RangeError);
    expect(() => weightedMeanRangeTable([1, 2], [1], 1, [1, 1])).toThrow(RangeError);
  });
  test('Λ not positive or not finite gives NaN', () => {
    const t = weightedMeanRangeTable([1, 2], null, 1, [1, 1]);
    expect(weightedMeanRange(t, 0).lower).toBeNaN();
    expect(weightedMeanRange(t, Infinity).upper).toBeNaN();
  });
});

describe('non-mutation', () => {
  test('frozen inputs are read, not written', () => {
    const y = Object.freeze([1, 2, 3]);
    const s = Object.freeze([1, 2, 3]);
    expect(() => weightedMeanRange(weightedMeanRangeTable(y, null, 1, s), 2)).not.toThrow();
  });
});
