import { describe, expect, test } from 'vitest';
import fc from 'fast-check';
import { poissonBinomialUpperTail } from '../../src/core/matchedSetsPoissonBinomialTail';
import { binomialUpperTail } from '../../src/core/binomialUpperTail';
import { expectClose } from '../support/expectClose';
import { readReferenceJson } from '../support/reference';

const reference = readReferenceJson('matched_sets.json');

/** The whole distribution by direct convolution (as the R generator does), then the tail summed. */
function naiveTail(p: number[], t: number): number {
  let pmf = [1];
  for (const pi of p) {
    const next = new Array(pmf.length + 1).fill(0);
    pmf.forEach((v, j) => {
      next[j] += v * (1 - pi);
      next[j + 1] += v * pi;
    });
    pmf = next;
  }
  return pmf.slice(Math.max(0, t)).reduce((a, b) => a + b, 0);
}

describe('reference values', () => {
  test('the fixture’s 1:1 binary pairs: the tail with equal probabilities is R’s pbinom', () => {
    // R 4.2.2: pbinom(T − 1, D, Γ/(1 + Γ), lower.tail = FALSE), matched_sets.json fictional_binary_pairs
    const ds = reference.binary.find((d: any) => d.name === 'fictional_binary_pairs');
    for (const row of ds.pbinom_check) {
      const p = new Array(ds.informative_sets).fill(row.gamma / (1 + row.gamma));
      expectClose(poissonBinomialUpperTail(p, ds.statistic), row.pbinom_upper, { rel: 1e-13 });
    }
  });

  test('equal probabilities agree with the project’s binomial tail, far into both tails and on both branches', () => {
    // binomialUpperTail is itself checked against R's pbinom (test/core/signTestBound.test.ts)
    for (const [n, p] of [[50, 0.3], [200, 0.9], [1000, 0.5], [400, 0.01]] as const) {
      for (const t of [0, 1, Math.round(n * p), Math.round(n * p) + 5, n - 3, n]) {
        const probs = new Float64Array(n).fill(p);
        // below about 1e-280 the documented absolute error K·1e-300 (partial sums under 1e-300 dropped) takes over
        expectClose(poissonBinomialUpperTail(probs, t), binomialUpperTail(t, n, p), { rel: 1e-11, abs: n * 1e-300 }, `n=${n} p=${p} t=${t}`);
      }
    }
  });
});

describe('special values', () => {
  test('t ≤ 0 → 1, t > K → 0, an empty sum → 1 at t = 0', () => {
    expect(poissonBinomialUpperTail([0.2, 0.7], 0)).toBe(1);
    expect(poissonBinomialUpperTail([0.2, 0.7], -3)).toBe(1);
    expect(poissonBinomialUpperTail([0.2, 0.7], 3)).toBe(0);
    expect(poissonBinomialUpperTail([], 0)).toBe(1);
  });
  test('probabilities 0 and 1 are exact', () => {
    expect(poissonBinomialUpperTail([1, 1, 0], 2)).toBe(1);
    expect(poissonBinomialUpperTail([1, 1, 0], 3)).toBe(0);
  });
  test('NaN in t or any probability → NaN', () => {
    expect(poissonBinomialUpperTail([0.5, NaN], 1)).toBeNaN();
    expect(poissonBinomialUpperTail([0.5, 0.5], NaN)).toBeNaN();
  });
  test('a tiny upper tail keeps its relative accuracy (no subtraction from 1)', () => {
    // P(all 40 succeed) = Π p exactly
    const p = Array.from({ length: 40 }, (_, i) => 0.01 + i * 0.001);
    expectClose(poissonBinomialUpperTail(p, 40), p.reduce((a, b) => a * b, 1), { rel: 1e-13 });
  });
  test('complements passed separately keep precision when p is within 1e-17 of 1', () => {
    // P(sum ≥ 2) for two Bernoullis = 1 − P(0) − P(1); with q = 1e-20 each, P(sum ≤ 1) ≈ 2e-20; the tail is ~1
    // but the lower tail of failures must come out right: P(sum ≥ 1) with p = 1e-20 and q given
    expectClose(poissonBinomialUpperTail([1e-20, 1e-20], 1, [1, 1]), 2e-20, { rel: 1e-12 });
    expectClose(poissonBinomialUpperTail([1, 1], 2, [1e-20, 1e-20]), 1, { rel: 1e-15 });
  });
  test('a fractional t is rounded up', () => {
    expect(poissonBinomialUpperTail([0.3, 0.6, 0.2], 1.2)).toBe(poissonBinomialUpperTail([0.3, 0.6, 0.2], 2));
  });
});

describe('invariants', () => {
  test('agrees with full convolution for any probabilities and threshold', () => {
    fc.assert(
      fc.property(fc.array(fc.double({ min: 0, max: 1, noNaN: true }), { minLength: 1, maxLength: 30 }), fc.nat(32), (p, t) => {
        expectClose(poissonBinomialUpperTail(p, t), naiveTail(p, t), { rel: 1e-11, abs: 1e-300 });
      }),
    );
  });
  test('falls as t grows and does not depend on the order of the probabilities', () => {
    fc.assert(
      fc.property(fc.array(fc.double({ min: 0, max: 1, noNaN: true }), { minLength: 2, maxLength: 25 }), (p) => {
        let last = 1;
        for (let t = 0; t <= p.length + 1; t++) {
          const v = poissonBinomialUpperTail(p, t);
          expect(v).toBeLessThanOrEqual(last * (1 + 1e-14));
          expectClose(poissonBinomialUpperTail([...p].reverse(), t), v, { rel: 1e-12, abs: 1e-300 });
          last = v;
        }
      }),
    );
  });
});

describe('non-mutation', () => {
  test('frozen probabilities are accepted and unchanged', () => {
    const p = Object.freeze([0.1, 0.5, 0.9]);
    poissonBinomialUpperTail(p, 2);
    expect(p).toEqual([0.1, 0.5, 0.9]);
  });
});
