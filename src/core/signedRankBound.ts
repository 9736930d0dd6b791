import type { SignedRanks } from './signedRanks';
import { lowerRegionExpansion, sortedLowerTail, weightedBernoulliSumUpperTail } from './weightedBernoulliSumTail';
import { upperNormalTail } from './upperNormalTail';

/** How a tail probability was computed. */
export type TailMethod = 'exact' | 'normal';

/** Bounds on the one-sided p-value of the signed-rank test under hidden bias at most Γ. */
export interface SignedRankBound {
  readonly gamma: number;
  /** The largest p-value any bias of at most Γ allows: P(Σ Rᵢ Bᵢ ≥ T), Bᵢ ~ Bernoulli(Γ/(1 + Γ)). */
  readonly pUpper: number;
  /** The smallest: the same with Bᵢ ~ Bernoulli(1/(1 + Γ)). */
  readonly pLower: number;
  /** Mean and variance of the upper bounding statistic (used by the normal approximation). */
  readonly meanUpper: number;
  readonly varianceUpper: number;
  readonly method: TailMethod;
}

export interface TailOptions {
  method: TailMethod;
  /** Normal approximation only: subtract ½ from T (R's `wilcox.test` convention). Default false. */
  continuityCorrection?: boolean;
}

/**
 * Sensitivity bounds for Wilcoxon's signed-rank test in matched pairs: the range of one-sided p-values
 * (alternative: treated − control > 0) possible when hidden bias may change the odds of treatment within a
 * pair by at most a factor Γ.
 *
 * **Method.** Under bias at most Γ, T = Σ Rᵢ·[dᵢ > 0] is stochastically bounded above by Σ Rᵢ·Bᵢ with
 * independent Bᵢ ~ Bernoulli(p⁺), p⁺ = Γ/(1 + Γ), and below by the same with p⁻ = 1/(1 + Γ). `exact` computes
 * these tails by dynamic programming over integer rank sums (mid-ranks from ties are half-integers, so ranks
 * and T are doubled first — exact, not rounded); `normal` uses mean p·ΣRᵢ and variance p(1 − p)·ΣRᵢ²,
 * z = (T − c − mean)/sd with c = ½ when a continuity correction is asked for, and p = 1 − Φ(z) computed
 * without subtraction.
 *
 * **References.** Rosenbaum PR (1987) Sensitivity analysis for certain permutation inferences in matched
 * observational studies. Biometrika 74(1):13–26. Rosenbaum PR (2002) Observational Studies, 2nd ed.,
 * Springer, §4.3.3 (bounding distributions, their moments and the normal approximation).
 *
 * **Special cases.** Γ = 1 gives the usual exact null distribution (both bounds equal R's `psignrank` tail);
 * Γ = Infinity gives pUpper = 1 and pLower = [T = 0]; NaN Γ → NaN bounds. No non-zero differences → p = 1.
 *
 * @param ranks from `signedRanks`
 * @param gamma Γ ≥ 1
 */
export function signedRankBound(ranks: SignedRanks, gamma: number, options: TailOptions): SignedRankBound {
  const { plus, minus } = biasProbabilities(gamma);
  const meanUpper = plus * ranks.sumRanks;
  const varianceUpper = plus * minus * ranks.sumSquaredRanks;
  let pUpper: number;
  let pLower: number;
  if (Number.isNaN(gamma)) {
    pUpper = pLower = NaN;
  } else if (options.method === 'exact') {
    const { weights, statistic } = integerRanks(ranks);
    pUpper = weightedBernoulliSumUpperTail(weights, statistic, plus, minus);
    pLower = weightedBernoulliSumUpperTail(weights, statistic, minus, plus);
  } else {
    const c = options.continuityCorrection ? 0.5 : 0;
    pUpper = normalUpperTail(ranks.statistic - c, plus, minus, ranks);
    pLower = normalUpperTail(ranks.statistic - c, minus, plus, ranks);
  }
  return Object.freeze({ gamma, pUpper, pLower, meanUpper, varianceUpper, method: options.method });
}

/** Only one of the two bounds: the upper one (what the tipping-point search needs) unless `which` says lower. */
export function signedRankUpperP(ranks: SignedRanks, gamma: number, options: TailOptions, which: 'upper' | 'lower' = 'upper'): number {
  const probabilities = biasProbabilities(gamma);
  const plus = which === 'upper' ? probabilities.plus : probabilities.minus;
  const minus = which === 'upper' ? probabilities.minus : probabilities.plus;
  if (Number.isNaN(gamma)) return NaN;
  if (options.method === 'exact') {
    const { weights, statistic } = integerRanks(ranks);
    return weightedBernoulliSumUpperTail(weights, statistic, plus, minus);
  }
  return normalUpperTail(ranks.statistic - (options.continuityCorrection ? 0.5 : 0), plus, minus, ranks);
}

/** One measured point of the normal approximation's error (see `NORMAL_APPROXIMATION_MEASURED_ERROR`). */
export interface NormalErrorPoint {
  readonly pairs: number;
  readonly gamma: number;
  /** The exact upper bound P(Σ i·Bᵢ ≥ T) at the T used (T = the normal 95% or 99.5% point, rounded). */
  readonly exact: number;
  /** (normal − exact)/exact without continuity correction; positive: the approximation overstates the bound. */
  readonly relativeError: number;
}

/**
 * The measured relative error of the normal approximation to the upper p-value bound of the signed-rank test,
 * for untied ranks 1…n at T = round(mean + z·sd), z = 1.6449 (p ≈ 0.05) and 2.5758 (p ≈ 0.005), against the
 * exact bounding distribution (`weightedBernoulliSumUpperTail`). The error comes from the skewness of
 * Σ i·Bᵢ when Γ > 1 and shrinks roughly as 1/√n; the approximation overstates the upper bound (errs on the
 * cautious side) except at Γ = 1, where it is tiny. A continuity correction of ½ changes these figures by
 * less than 1e-4. `atAlpha05` / `atAlpha005`: the largest |relative error| in the table at p ≈ 0.05 / 0.005.
 * Measured with Lurk's own kernels (no outside source).
 */
export const NORMAL_APPROXIMATION_MEASURED_ERROR = Object.freeze({
  atAlpha05: 0.0141,
  atAlpha005: 0.0716,
  nearAlpha05: Object.freeze<NormalErrorPoint[]>([
    { pairs: 1500, gamma: 1, exact: 0.050001, relativeError: -1.6e-4 },
    { pairs: 1500, gamma: 1.2, exact: 0.049822, relativeError: 3.5e-3 },
    { pairs: 1500, gamma: 1.5, exact: 0.049599, relativeError: 8.0e-3 },
    { pairs: 1500, gamma: 2, exact: 0.049301, relativeError: 1.41e-2 },
    { pairs: 3000, gamma: 1, exact: 0.049999, relativeError: -7.2e-5 },
    { pairs: 3000, gamma: 1.2, exact: 0.049873, relativeError: 2.5e-3 },
    { pairs: 3000, gamma: 1.5, exact: 0.049714, relativeError: 5.7e-3 },
    { pairs: 3000, gamma: 2, exact: 0.049502, relativeError: 9.9e-3 },
    { pairs: 5000, gamma: 1, exact: 0.049997, relativeError: -4.0e-5 },
    { pairs: 5000, gamma: 1.2, exact: 0.049899, relativeError: 1.93e-3 },
    { pairs: 5000, gamma: 1.5, exact: 0.049776, relativeError: 4.39e-3 },
    { pairs: 5000, gamma: 2, exact: 0.049614, relativeError: 7.68e-3 },
  ]),
  nearAlpha005: Object.freeze<NormalErrorPoint[]>([
    { pairs: 1500, gamma: 1, exact: 0.0049874, relativeError: 2.6e-3 },
    { pairs: 1500, gamma: 1.2, exact: 0.0049038, relativeError: 1.96e-2 },
    { pairs: 1500, gamma: 1.5, exact: 0.0048015, relativeError: 4.14e-2 },
    { pairs: 1500, gamma: 2, exact: 0.0046666, relativeError: 7.16e-2 },
    { pairs: 3000, gamma: 1, exact: 0.0049939, relativeError: 1.33e-3 },
    { pairs: 3000, gamma: 1.2, exact: 0.0049350, relativeError: 1.33e-2 },
    { pairs: 3000, gamma: 1.5, exact: 0.0048626, relativeError: 2.84e-2 },
    { pairs: 3000, gamma: 2, exact: 0.0047667, relativeError: 4.90e-2 },
    { pairs: 5000, gamma: 1, exact: 0.0049964, relativeError: 8.0e-4 },
    { pairs: 5000, gamma: 1.2, exact: 0.0049508, relativeError: 1.00e-2 },
    { pairs: 5000, gamma: 1.5, exact: 0.0048946, relativeError: 2.16e-2 },
    { pairs: 5000, gamma: 2, exact: 0.0048203, relativeError: 3.74e-2 },
  ]),
});

/** p⁺ = Γ/(1 + Γ) and p⁻ = 1/(1 + Γ), each computed directly so that neither loses digits. */
export function biasProbabilities(gamma: number): { plus: number; minus: number } {
  if (gamma === Infinity) return { plus: 1, minus: 0 };
  return { plus: gamma / (1 + gamma), minus: 1 / (1 + gamma) };
}

function normalUpperTail(t: number, p: number, q: number, ranks: SignedRanks): number {
  if (ranks.nonZero === 0) return 1;
  const mean = p * ranks.sumRanks;
  const sd = Math.sqrt(p * q * ranks.sumSquaredRanks);
  if (sd === 0) return t <= mean ? 1 : 0;
  return upperNormalTail((t - mean) / sd);
}

/**
 * Ranks and statistic on an integer scale: as they are, or doubled when mid-ranks are half-integers.
 * Cached per ranks object, since searches evaluate many Γ for the same data.
 */
export function integerRanks(ranks: SignedRanks): { weights: Float64Array; statistic: number; scale: number } {
  const cached = integerCache.get(ranks);
  if (cached) return cached;
  let half = false;
  for (let i = 0; i < ranks.ranks.length; i++) {
    if (ranks.ranks[i] !== Math.floor(ranks.ranks[i])) {
      half = true;
      break;
    }
  }
  const scale = half ? 2 : 1;
  const weights = half ? ranks.ranks.map((r) => 2 * r) : ranks.ranks;
  const result = { weights, statistic: Math.round(ranks.statistic * scale), scale };
  integerCache.set(ranks, result);
  return result;
}

const integerCache = new WeakMap<SignedRanks, { weights: Float64Array; statistic: number; scale: number }>();

/**
 * The whole lower-tail table of the bounding statistic Σ Rᵢ Bᵢ, Bᵢ ~ Bernoulli(p), up to m:
 * F(s) = P(Σ Rᵢ Bᵢ ≤ s) for s = 0…m (exact DP: the expansion `lowerRegionExpansion` behind `sortedLowerTail`, accumulated once).
 * Used to find critical values once per Γ. With `negligible` > 0 partial sums below that probability are
 * dropped from the bottom (each F(s) is then low by at most (m + 1)·negligible).
 */
export function boundingLowerTailTable(sortedWeights: Float64Array, m: number, p: number, q: number, negligible = 0): Float64Array {
  const table = new Float64Array(m + 1);
  if (m < 0) return table;
  if (q === 0 || p === 0) {
    for (let s = 0; s <= m; s++) table[s] = sortedLowerTail(sortedWeights, s, p, q);
    return table;
  }
  const { g, logScale } = lowerRegionExpansion(sortedWeights, m, p, q, negligible);
  let cumulative = 0;
  for (let s = 0; s <= m; s++) {
    cumulative += g[s];
    table[s] = cumulative > 0 ? Math.min(1, Math.exp(Math.log(cumulative) + logScale)) : 0;
  }
  return table;
}
