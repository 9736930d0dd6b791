import { describe, expect, test } from 'vitest';
import fc from 'fast-check';
import { signedRanks } from '../../src/core/signedRanks';
import { signedRankBound } from '../../src/core/signedRankBound';
import { weightedBernoulliSumUpperTail } from '../../src/core/weightedBernoulliSumTail';
import { expectClose } from '../support/expectClose';
import { readReferenceJson, readReferenceText } from '../support/reference';

const reference = readReferenceJson('rosenbaum.json');
const datasets = Object.entries<any>(reference.datasets);

/** P(Σ wᵢBᵢ ≥ t) by listing all 2ⁿ sign patterns: an independent check for small n (with ties too). */
function enumerateTail(weights: number[], t: number, p: number): number {
  let total = 0;
  for (let mask = 0; mask < 1 << weights.length; mask++) {
    let sum = 0;
    let prob = 1;
    for (let i = 0; i < weights.length; i++) {
      if (mask & (1 << i)) {
        sum += weights[i];
        prob *= p;
      } else prob *= 1 - p;
    }
    if (sum >= t - 1e-9) total += prob;
  }
  return total;
}

describe('signed-rank statistic', () => {
  test.each(datasets)('%s: T, Σ R and Σ R² equal the reference', (_name, ds) => {
    // R 4.2.2: wilcox.test(d)$statistic (V) and the rank sums, test/reference/rosenbaum.json
    const ranks = signedRanks(ds.differences);
    expect(ranks.statistic).toBe(ds.wilcoxon_T);
    expect(ranks.statistic).toBe(ds.checks_gamma1.wilcox_test_statistic_V);
    expect(ranks.sumRanks).toBe(ds.wilcoxon_sum_ranks);
    expect(ranks.sumSquaredRanks).toBe(ds.wilcoxon_sum_ranks_sq);
    expect(ranks.nonZero).toBe(ds.n_nonzero);
    expect(ranks.zeros).toBe(ds.n_zero);
    expect(ranks.positive).toBe(ds.sign_S);
    expect(ranks.tiedMagnitudes).toBe(ds.has_ties_in_abs);
  });

  test('the CSV fixtures hold the same differences as the JSON', () => {
    // test/reference/rosenbaum_small_n15.csv and rosenbaum_n40.csv (same R generation, see README)
    for (const [file, name] of [
      ['rosenbaum_small_n15.csv', 'small_n15'],
      ['rosenbaum_n40.csv', 'n40'],
    ]) {
      const values = readReferenceText(file).trim().split(/\r?\n/).slice(1).map(Number);
      expect(values).toEqual(reference.datasets[name].differences);
    }
  });

  test('zeros are dropped and tied magnitudes share average ranks', () => {
    // Mid-rank convention (Lehmann 1975, Nonparametrics §3.2): |d| = 1,1,2 → ranks 1.5,1.5,3
    const ranks = signedRanks([0, 1, -1, 2, 0]);
    expect(ranks.zeros).toBe(2);
    expect([...ranks.ranks]).toEqual([1.5, 1.5, 3]);
    expect(ranks.statistic).toBe(4.5);
    expect(ranks.sumSquaredRanks).toBe(1.5 * 1.5 * 2 + 9);
    expect(ranks.tiedMagnitudes).toBe(true);
  });
});

describe('exact bounds agree with the reference', () => {
  for (const [name, ds] of datasets) {
    const ranks = signedRanks(ds.differences);
    test.each(ds.by_gamma as any[])(`${name}: Γ = $gamma exact upper and lower tails`, (row) => {
      // R 4.2.2 reference (DP cross-checked by enumeration; at Γ = 1 equal to psignrank), rosenbaum.json
      const bound = signedRankBound(ranks, row.gamma, { method: 'exact' });
      expectClose(bound.pUpper, row.wilcoxon_upper_exact, { rel: 1e-12 }, 'upper');
      expectClose(bound.pLower, row.wilcoxon_lower_exact, { rel: 1e-12 }, 'lower');
      expectClose(bound.meanUpper, row.wilcoxon_mean_upper, { rel: 1e-14 }, 'mean');
      expectClose(bound.varianceUpper, row.wilcoxon_var_upper, { rel: 1e-14 }, 'variance');
    });
    test.each(ds.by_gamma as any[])(`${name}: Γ = $gamma normal approximation with and without continuity correction`, (row) => {
      // R 4.2.2 reference: 1 − pnorm((T − cc − mean)/sd), rosenbaum.json
      const plain = signedRankBound(ranks, row.gamma, { method: 'normal' });
      const corrected = signedRankBound(ranks, row.gamma, { method: 'normal', continuityCorrection: true });
      expectClose(plain.pUpper, row.wilcoxon_upper_normal, { rel: 1e-12 }, 'upper');
      expectClose(plain.pLower, row.wilcoxon_lower_normal, { rel: 1e-11 }, 'lower');
      expectClose(corrected.pUpper, row.wilcoxon_upper_normal_cc, { rel: 1e-12 }, 'upper cc');
    });
  }

  test.each(datasets)('%s: at Γ = 1 both bounds equal psignrank and wilcox.test', (_name, ds) => {
    // R 4.2.2: psignrank(T − 1, n, lower.tail = FALSE); wilcox.test(exact = TRUE / correct = TRUE / FALSE)
    const ranks = signedRanks(ds.differences);
    const exact = signedRankBound(ranks, 1, { method: 'exact' });
    expectClose(exact.pUpper, ds.checks_gamma1.psignrank_upper_lowertailFALSE, { rel: 1e-13 });
    expectClose(exact.pLower, ds.checks_gamma1.wilcox_test_exact, { rel: 1e-13 });
    expectClose(signedRankBound(ranks, 1, { method: 'normal' }).pUpper, ds.checks_gamma1.wilcox_test_normal_nocc, { rel: 1e-13 });
    expectClose(
      signedRankBound(ranks, 1, { method: 'normal', continuityCorrection: true }).pUpper,
      ds.checks_gamma1.wilcox_test_normal_cc,
      { rel: 1e-13 },
    );
  });
});

describe('special values', () => {
  const ranks = signedRanks([1.5, -0.2, 2.5, 3, 0.7]);
  test('Γ = Infinity: the upper bound is 1; NaN gives NaN', () => {
    // limits of p⁺ → 1, p⁻ → 0 (Rosenbaum 2002 §4.3.3)
    const bound = signedRankBound(ranks, Infinity, { method: 'exact' });
    expect(bound.pUpper).toBe(1);
    expect(bound.pLower).toBe(0);
    expect(Number.isNaN(signedRankBound(ranks, NaN, { method: 'exact' }).pUpper)).toBe(true);
    expect(Number.isNaN(signedRankBound(ranks, NaN, { method: 'normal' }).pLower)).toBe(true);
  });

  test('all differences positive: the exact upper tail is p⁺ⁿ (all signs positive)', () => {
    // the only sign pattern reaching T = n(n+1)/2 (Rosenbaum 2002 §4.3.3)
    const n = 1000;
    const all = signedRanks(Array.from({ length: n }, (_, i) => i + 1));
    const gamma = 3;
    const bound = signedRankBound(all, gamma, { method: 'exact' });
    expectClose(bound.pUpper, Math.exp(n * Math.log(gamma / (1 + gamma))), { rel: 1e-12 });
    expectClose(bound.pLower, Math.exp(-n * Math.log1p(gamma)), { rel: 1e-12 }); // 4^-1000: far below 1e-300
  });

  test('the DP kernel handles thresholds outside the support and degenerate probabilities', () => {
    const w = [1, 2, 3];
    expect(weightedBernoulliSumUpperTail(w, 0, 0.3)).toBe(1);
    expect(weightedBernoulliSumUpperTail(w, -4, 0.3)).toBe(1);
    expect(weightedBernoulliSumUpperTail(w, 7, 0.3)).toBe(0);
    expect(weightedBernoulliSumUpperTail(w, 6, 1, 0)).toBe(1);
    expect(weightedBernoulliSumUpperTail(w, 1, 0, 1)).toBe(0);
    expect(Number.isNaN(weightedBernoulliSumUpperTail(w, NaN, 0.3))).toBe(true);
    expectClose(weightedBernoulliSumUpperTail(w, 6, 0.3), 0.3 ** 3, { rel: 1e-14 });
  });
});

describe('invariants', () => {
  const differences = fc.array(
    fc.oneof(fc.integer({ min: -6, max: 6 }), fc.double({ min: -5, max: 5, noNaN: true })),
    { minLength: 2, maxLength: 11 },
  );

  test('the exact tail equals full enumeration of sign patterns, with ties, zeros and any Γ', () => {
    fc.assert(
      fc.property(differences, fc.double({ min: 1, max: 20, noNaN: true }), (d, gamma) => {
        const ranks = signedRanks(d);
        const weights = [...ranks.ranks];
        const bound = signedRankBound(ranks, gamma, { method: 'exact' });
        const upper = enumerateTail(weights, ranks.statistic, gamma / (1 + gamma));
        const lower = enumerateTail(weights, ranks.statistic, 1 / (1 + gamma));
        expectClose(bound.pUpper, upper, { rel: 1e-10, abs: 1e-300 });
        expectClose(bound.pLower, lower, { rel: 1e-10, abs: 1e-300 });
      }),
      { numRuns: 200 },
    );
  });

  test('the pruned, rescaled DP equals a plain full-distribution DP for up to 150 weights (ties, any threshold)', () => {
    // The plain DP keeps every probability (no pruning, no rescaling): an independent check of the fast kernel.
    const plainTail = (weights: number[], t: number, p: number) => {
      const total = weights.reduce((a, b) => a + b, 0);
      let f = new Float64Array(total + 1);
      f[0] = 1;
      for (const w of weights) {
        const next = new Float64Array(total + 1);
        for (let s = 0; s <= total; s++) {
          if (f[s] === 0) continue;
          next[s] += (1 - p) * f[s];
          next[s + w] += p * f[s];
        }
        f = next;
      }
      let tail = 0;
      for (let s = Math.max(0, Math.ceil(t)); s <= total; s++) tail += f[s];
      return tail;
    };
    fc.assert(
      fc.property(
        fc.array(fc.integer({ min: 1, max: 60 }), { minLength: 20, maxLength: 150 }),
        fc.double({ min: 0, max: 1, noNaN: true }),
        fc.double({ min: 0.02, max: 0.98, noNaN: true }),
        (weights, where, p) => {
          const total = weights.reduce((a, b) => a + b, 0);
          const t = Math.round(where * total);
          const expected = plainTail(weights, t, p);
          const actual = weightedBernoulliSumUpperTail(weights, t, p, 1 - p);
          if (expected > 1e-200) expectClose(actual, expected, { rel: 1e-9 });
          else expect(actual).toBeLessThan(1e-190);
        },
      ),
      { numRuns: 150 },
    );
  });

  test('pUpper rises and pLower falls with Γ; pLower ≤ p(Γ = 1) ≤ pUpper', () => {
    fc.assert(
      fc.property(
        differences,
        fc.double({ min: 1, max: 10, noNaN: true }),
        fc.double({ min: 0, max: 10, noNaN: true }),
        fc.constantFrom('exact' as const, 'normal' as const),
        (d, g1, extra, method) => {
          const ranks = signedRanks(d);
          const a = signedRankBound(ranks, g1, { method });
          const b = signedRankBound(ranks, g1 + extra, { method });
          const one = signedRankBound(ranks, 1, { method });
          const slack = 1e-12;
          expect(b.pUpper).toBeGreaterThanOrEqual(a.pUpper - slack);
          expect(b.pLower).toBeLessThanOrEqual(a.pLower + slack);
          expect(a.pLower).toBeLessThanOrEqual(one.pUpper + slack);
          expect(one.pUpper).toBeLessThanOrEqual(a.pUpper + slack);
        },
      ),
      { numRuns: 300 },
    );
  });
});

describe('exact and normal agree at n = 500', () => {
  test('within 0.01 at every Γ of the reference grid', () => {
    // Lurk accepts the normal approximation when it is this close at n = 500 (common practice, no source)
    let seed = 12345;
    const random = () => ((seed = (seed * 1103515245 + 12345) % 2147483648) / 2147483648);
    const d = Array.from({ length: 500 }, () => random() - 0.42);
    const ranks = signedRanks(d);
    for (const gamma of reference.gammas as number[]) {
      const exact = signedRankBound(ranks, gamma, { method: 'exact' });
      const normal = signedRankBound(ranks, gamma, { method: 'normal' });
      expect(Math.abs(exact.pUpper - normal.pUpper)).toBeLessThan(0.01);
      expect(Math.abs(exact.pLower - normal.pLower)).toBeLessThan(0.01);
    }
  });
});

describe('non-mutation', () => {
  test('inputs are not changed', () => {
    const d = Object.freeze([3, -1, 2, 2, -0.5]);
    const ranks = signedRanks(d);
    signedRankBound(ranks, 2, { method: 'exact' });
    expect(d).toEqual([3, -1, 2, 2, -0.5]);
  });
});
