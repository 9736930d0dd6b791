import { describe, expect, test } from 'vitest';
import fc from 'fast-check';
import { walshAverages, countWalshAtMost } from '../../src/core/walshAverages';
import { biasedExpectationParts, effectUnderBias, exactCriticalValue, normalCriticalValue } from '../../src/core/hodgesLehmannRange';
import { defaultGammaGrid } from '../../src/core/pairsAnalysis';
import { signedRanks } from '../../src/core/signedRanks';
import { signedRankUpperP } from '../../src/core/signedRankBound';
import { expectClose } from '../support/expectClose';
import { readReferenceJson } from '../support/reference';

const reference = readReferenceJson('rosenbaum.json');
const datasets = Object.entries<any>(reference.datasets);

function bruteWalsh(d: readonly number[]): number[] {
  const all: number[] = [];
  for (let i = 0; i < d.length; i++) for (let j = i; j < d.length; j++) all.push((d[i] + d[j]) / 2);
  return all.sort((a, b) => a - b);
}
function median(sorted: number[]): number {
  const m = sorted.length;
  return m % 2 ? sorted[(m - 1) / 2] : (sorted[m / 2 - 1] + sorted[m / 2]) / 2;
}
/** The signed-rank statistic of d − τ computed from ranks (not from Walsh averages). */
function statisticAt(d: readonly number[], tau: number) {
  return signedRanks(d.map((x) => x - tau));
}

describe('Hodges–Lehmann estimate at Γ = 1', () => {
  test.each(datasets)('%s: equals the median of the Walsh averages', (_name, ds) => {
    // Hodges & Lehmann 1963; R's wilcox.test(conf.int = TRUE) estimate is the median of the Walsh averages
    const walsh = walshAverages(ds.differences);
    const effect = effectUnderBias(walsh, ds.differences.length, 1, 0.05, { method: 'exact' });
    const expected = median(bruteWalsh(ds.differences));
    expect(effect.estimateLow).toBe(expected);
    expect(effect.estimateHigh).toBe(expected);
  });

  test('the exact Γ = 1 interval uses R’s convention: the (qsignrank(α/2) )-th smallest Walsh averages', () => {
    // R 4.2.2 wilcox.test exact CI: qu = qsignrank(α/2, n); [diffs[qu], diffs[N − qu + 1]] (Bauer 1972).
    // qsignrank for n = 15, α/2 = 0.025 is 26 (tables of the signed-rank distribution, e.g. Hollander & Wolfe
    // 1999, Table A.4: P(T ≤ 25) = 0.024 ≤ 0.025 < P(T ≤ 26); value recalled from memory and confirmed by our
    // psignrank-validated exact tail below)
    const ds = reference.datasets.small_n15;
    const walsh = walshAverages(ds.differences);
    const sorted = bruteWalsh(ds.differences);
    const effect = effectUnderBias(walsh, 15, 1, 0.05, { method: 'exact' });
    expect(effect.criticalValue).toBe(120 - 26 + 1);
    expect(effect.intervalLow).toBe(sorted[26 - 1]);
    expect(effect.intervalHigh).toBe(sorted[120 - 26]);
  });
});

describe('the interval and the estimate range invert the bounding tests (any Γ)', () => {
  for (const [name, ds] of datasets) {
    test.each([1, 1.5, 2, 3])(`${name}: Γ = %s`, (gamma) => {
      const d: number[] = ds.differences;
      const walsh = walshAverages(d);
      const alpha = 0.05;
      const effect = effectUnderBias(walsh, d.length, gamma, alpha, { method: 'exact' });
      const eps = 1e-9;
      // Lower limit: just below it the upper-bound test of "effect > τ" rejects at α/2, at it it does not.
      const below = signedRankUpperP(statisticAt(d, effect.intervalLow - eps), gamma, { method: 'exact' });
      const at = signedRankUpperP(statisticAt(d, effect.intervalLow + eps), gamma, { method: 'exact' });
      expect(below).toBeLessThanOrEqual(alpha / 2);
      expect(at).toBeGreaterThan(alpha / 2);
      // Upper limit: the mirror test on −(d − τ).
      const neg = d.map((x) => -x);
      const above = signedRankUpperP(statisticAt(neg, -(effect.intervalHigh + eps)), gamma, { method: 'exact' });
      const inside = signedRankUpperP(statisticAt(neg, -(effect.intervalHigh - eps)), gamma, { method: 'exact' });
      expect(above).toBeLessThanOrEqual(alpha / 2);
      expect(inside).toBeGreaterThan(alpha / 2);
      // Estimate range: T(τ) crosses its largest expectation at the low end and its smallest at the high end.
      const N = (d.length * (d.length + 1)) / 2;
      const muPlus = (gamma / (1 + gamma)) * N;
      const muMinus = N / (1 + gamma);
      expect(statisticAt(d, effect.estimateLow - eps).statistic).toBeGreaterThanOrEqual(muPlus);
      expect(statisticAt(d, effect.estimateLow + eps).statistic).toBeLessThanOrEqual(muPlus);
      expect(statisticAt(d, effect.estimateHigh - eps).statistic).toBeGreaterThanOrEqual(muMinus);
      expect(statisticAt(d, effect.estimateHigh + eps).statistic).toBeLessThanOrEqual(muMinus);
    });
  }
});

/** Every Γ the default grids can hold: the grid for tipping values from 1.001 to 1e6, and the fallback grid. */
function defaultGridGammas(): number[] {
  const all = new Set<number>(defaultGammaGrid({ gamma: null, status: 'not-significant', searchedUpTo: 1e6 }));
  for (const g of defaultGammaGrid({ gamma: null, status: 'beyond-range', searchedUpTo: 1e6 })) all.add(g);
  for (let e = -3; e <= 6; e += 0.01) {
    for (const g of defaultGammaGrid({ gamma: 1 + 10 ** e, status: 'found', searchedUpTo: 1e6 })) all.add(g);
  }
  return [...all].sort((a, b) => a - b);
}

/**
 * Γ as a fraction p/q with small integers, found independently of the code under test: every default-grid Γ
 * is a multiple of 0.05 or a whole number, so p = Γ·20 rounded, q = 20, and the double must read back exactly.
 */
function gridFraction(gamma: number): { p: number; q: number } {
  const p = Math.round(gamma * 20);
  expect(p / 20).toBe(gamma);
  return { p, q: 20 };
}

/** Brute force: the largest whole k with (p + q)·k ≤ numerator·N, stepping k up one at a time (exact integers). */
function bruteFloor(N: number, numerator: number, p: number, q: number, start = 0): number {
  if (!Number.isSafeInteger(numerator * N) || !Number.isSafeInteger((p + q) * (N + 1))) throw new Error('not exact');
  let k = start;
  if ((p + q) * k > numerator * N) throw new Error('start too high');
  while ((p + q) * (k + 1) <= numerator * N) k++;
  return k;
}

describe('the estimate range decides whole-number expectations exactly', () => {
  test('40 pairs at Γ = 1.05: the high estimate is the mean of the 400th and 401st largest Walsh averages', () => {
    // N = 820, μ⁻ = 820/2.05 = 400 exactly (in floating point 400.00000000000006). Rosenbaum 1993, JASA
    // 88:1250–1253: at a whole-number μ the estimate is the average of the μ-th and (μ + 1)-th largest averages.
    const d: number[] = reference.datasets.n40.differences;
    const sorted = bruteWalsh(d);
    const largest = (k: number) => sorted[sorted.length - k];
    const effect = effectUnderBias(walshAverages(d), 40, 1.05, 0.05, { method: 'exact' });
    expect(effect.estimateHigh).toBe((largest(400) + largest(401)) / 2);
    // μ⁺ = 820·1.05/2.05 = 420 exactly too.
    expect(effect.estimateLow).toBe((largest(420) + largest(421)) / 2);
  });

  const gammas = defaultGridGammas();
  test('the default grids hold the Γ values the check below needs', () => {
    expect(gammas).toContain(1.05);
    expect(gammas).toContain(1.25);
    expect(gammas.length).toBeGreaterThan(50);
  });

  test('every default-grid Γ and every Walsh count N ≤ 1,000: ⌊μ⌋ and ⌈μ⌉ equal a brute-force rational count', () => {
    // Reference: exact integer arithmetic on Γ = p/q (no floating-point μ): ⌊μ⁺⌋ is the largest k with
    // (p + q)·k ≤ p·N, ⌊μ⁻⌋ the largest with (p + q)·k ≤ q·N; ⌈μ⌉ = ⌊μ⌋ + [not equal].
    for (const gamma of gammas) {
      const { p, q } = gridFraction(gamma);
      for (let N = 0; N <= 1000; N++) {
        const parts = biasedExpectationParts(N, gamma);
        for (const [part, numerator] of [
          [parts.plus, p],
          [parts.minus, q],
        ] as const) {
          const floor = bruteFloor(N, numerator, p, q);
          const ceil = (p + q) * floor === numerator * N ? floor : floor + 1;
          if (part.floor !== floor || part.ceil !== ceil) expect({ gamma, N, ...part }).toEqual({ gamma, N, floor, ceil });
        }
      }
    }
  }, 60_000);

  test('every default-grid Γ and every number of pairs n ≤ 1,000 (N = n(n + 1)/2): the same exact parts', () => {
    for (const gamma of gammas) {
      const { p, q } = gridFraction(gamma);
      for (let n = 1; n <= 1000; n++) {
        const N = (n * (n + 1)) / 2;
        const parts = biasedExpectationParts(N, gamma);
        for (const [part, numerator] of [
          [parts.plus, p],
          [parts.minus, q],
        ] as const) {
          // Brute force from a start safely below the answer (a rough floating-point guess minus 2).
          const floor = bruteFloor(N, numerator, p, q, Math.max(0, Math.floor((numerator * N) / (p + q)) - 2));
          const ceil = (p + q) * floor === numerator * N ? floor : floor + 1;
          if (part.floor !== floor || part.ceil !== ceil) expect({ gamma, n, ...part }).toEqual({ gamma, n, floor, ceil });
        }
      }
    }
  }, 60_000);

  test('Γ = Infinity and invalid arguments', () => {
    expect(biasedExpectationParts(10, Infinity)).toEqual({ plus: { floor: 10, ceil: 10 }, minus: { floor: 0, ceil: 0 } });
    expect(Number.isNaN(biasedExpectationParts(10, NaN).plus.floor)).toBe(true);
    expect(Number.isNaN(biasedExpectationParts(10.5, 2).minus.ceil)).toBe(true);
  });
});

describe('critical values', () => {
  test('exact and normal critical values are close for n = 300 and agree with the tail', () => {
    for (const gamma of [1, 2, 4]) {
      const p = gamma / (1 + gamma);
      const q = 1 / (1 + gamma);
      const c = exactCriticalValue(300, p, q, 0.025);
      const ranks = signedRanks(Array.from({ length: 300 }, (_, i) => i + 1));
      const tail = (t: number) => {
        // P(Σ i·Bᵢ ≥ t) through the validated signed-rank bound: statistic t on ranks 1…n
        return signedRankUpperP({ ...ranks, statistic: t }, gamma, { method: 'exact' });
      };
      expect(tail(c)).toBeLessThanOrEqual(0.025);
      expect(tail(c - 1)).toBeGreaterThan(0.025);
      expect(Math.abs(normalCriticalValue(300, p, q, 0.025, false) - c)).toBeLessThan(0.002 * c);
    }
  });
  test('too few pairs for the level → an unbounded interval', () => {
    // n = 4: the smallest one-sided exact p-value is 1/16 > 0.025 (Wilcoxon 1945)
    const effect = effectUnderBias(walshAverages([1, 2, 3, 4]), 4, 1, 0.05, { method: 'exact' });
    expect(effect.intervalLow).toBe(-Infinity);
    expect(effect.intervalHigh).toBe(Infinity);
    expect(effect.estimateLow).toBe(2.5);
  });
  test('NaN Γ or α outside (0, 1) → NaN', () => {
    const walsh = walshAverages([1, 2, 3, 4, 5, 6]);
    expect(Number.isNaN(effectUnderBias(walsh, 6, NaN, 0.05, { method: 'exact' }).estimateLow)).toBe(true);
    expect(Number.isNaN(effectUnderBias(walsh, 6, 2, 1, { method: 'exact' }).intervalLow)).toBe(true);
  });
});

describe('Walsh averages', () => {
  test('stored and counted selections equal brute force, with ties and zeros', () => {
    fc.assert(
      fc.property(
        fc.array(fc.oneof(fc.integer({ min: -5, max: 5 }), fc.double({ min: -1e3, max: 1e3, noNaN: true })), {
          minLength: 1,
          maxLength: 60,
        }),
        (d) => {
          const brute = bruteWalsh(d);
          const stored = walshAverages(d, { store: true });
          const counted = walshAverages(d, { store: false });
          for (const k of [1, Math.ceil(brute.length / 3), Math.ceil(brute.length / 2), brute.length]) {
            // + 0 turns −0 into 0: the two sorts may order 0 and −0 differently, and they are the same number
            expect(stored.smallest(k) + 0).toBe(brute[k - 1] + 0);
            expect(counted.smallest(k) + 0).toBe(brute[k - 1] + 0);
          }
          expect(Number.isNaN(stored.smallest(0))).toBe(true);
          expect(Number.isNaN(counted.smallest(brute.length + 1))).toBe(true);
        },
      ),
      { numRuns: 200 },
    );
  });
  test('values near the largest double: no overflow, stored and counted agree', () => {
    const d = [1.5e308, 1.6e308, -1e308, 1.7e308, 1.2e308, -1.79e308];
    const stored = walshAverages(d, { store: true });
    const counted = walshAverages(d, { store: false });
    for (let k = 1; k <= stored.count; k++) {
      expect(Number.isFinite(stored.smallest(k))).toBe(true);
      expect(counted.smallest(k)).toBe(stored.smallest(k));
    }
  });
  test('counting handles one big block of equal averages (all differences equal)', () => {
    const walsh = walshAverages(new Float64Array(5000).fill(0.25), { store: false });
    expect(walsh.smallest(1)).toBe(0.25);
    expect(walsh.smallest(6_000_000)).toBe(0.25);
    expect(walsh.smallest(walsh.count)).toBe(0.25);
  });
  test('counting works for n = 3000 (selection without storing 4.5 million averages)', () => {
    const d = Float64Array.from({ length: 3000 }, (_, i) => Math.sin(i * 7.1) * 10 + 0.3);
    const walsh = walshAverages(d);
    const sorted = Float64Array.from(d).sort();
    const k = 2_000_000;
    const value = walsh.smallest(k);
    expect(countWalshAtMost(sorted, value)).toBeGreaterThanOrEqual(k);
    expect(countWalshAtMost(sorted, value - 1e-12 * Math.max(1, Math.abs(value)))).toBeLessThan(k);
  });
});

describe('invariants', () => {
  test('the estimate range and the interval widen with Γ and contain the Γ = 1 estimate', () => {
    fc.assert(
      fc.property(
        fc.array(fc.double({ min: -10, max: 10, noNaN: true }), { minLength: 2, maxLength: 40 }),
        fc.double({ min: 1, max: 8, noNaN: true }),
        fc.double({ min: 0, max: 8, noNaN: true }),
        (d, gamma, extra) => {
          const walsh = walshAverages(d);
          const one = effectUnderBias(walsh, d.length, 1, 0.05, { method: 'exact' });
          const a = effectUnderBias(walsh, d.length, gamma, 0.05, { method: 'exact' });
          const b = effectUnderBias(walsh, d.length, gamma + extra, 0.05, { method: 'exact' });
          expect(a.estimateLow).toBeLessThanOrEqual(one.estimateLow);
          expect(a.estimateHigh).toBeGreaterThanOrEqual(one.estimateHigh);
          expect(b.estimateLow).toBeLessThanOrEqual(a.estimateLow);
          expect(b.estimateHigh).toBeGreaterThanOrEqual(a.estimateHigh);
          expect(b.intervalLow).toBeLessThanOrEqual(a.intervalLow);
          expect(b.intervalHigh).toBeGreaterThanOrEqual(a.intervalHigh);
          expect(a.intervalLow).toBeLessThanOrEqual(a.estimateLow);
          expect(a.intervalHigh).toBeGreaterThanOrEqual(a.estimateHigh);
        },
      ),
      { numRuns: 150 },
    );
  });
});
