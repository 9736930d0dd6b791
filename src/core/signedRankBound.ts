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
 * exact bounding distribution (`weightedBernoulliSumUpperTail`, by inversion at these sizes; at 5,000 pairs it
 * reproduced the figures the dynamic program gave to every printed digit). The error comes from the skewness of
 * Σ i·Bᵢ when Γ > 1 and shrinks roughly as 1/√n; the approximation overstates the upper bound (errs on the
 * cautious side) except at Γ = 1, where it is tiny. A continuity correction of ½ changes these figures by
 * less than 1e-4. `atAlpha05` / `atAlpha005`: the largest |relative error| in the table at p ≈ 0.05 / 0.005.
 * Measured with Lurk's own kernels (no outside source).
 */
export const NORMAL_APPROXIMATION_MEASURED_ERROR = Object.freeze({
  atAlpha05: 0.00701,
  atAlpha005: 0.0339,
  /** The smallest number of pairs measured: the approximation is used above `EXACT_PAIRS_LIMIT` (pairsAnalysis.ts). */
  fromPairs: 6000,
  nearAlpha05: Object.freeze<NormalErrorPoint[]>([
    { pairs: 6000, gamma: 1, exact: 0.049997, relativeError: -3.27e-05 },
    { pairs: 6000, gamma: 1.2, exact: 0.049907, relativeError: 0.00177 },
    { pairs: 6000, gamma: 1.5, exact: 0.049795, relativeError: 0.00401 },
    { pairs: 6000, gamma: 2, exact: 0.049647, relativeError: 0.00701 },
    { pairs: 10000, gamma: 1, exact: 0.049996, relativeError: -1.86e-05 },
    { pairs: 10000, gamma: 1.2, exact: 0.049926, relativeError: 0.00138 },
    { pairs: 10000, gamma: 1.5, exact: 0.04984, relativeError: 0.00311 },
    { pairs: 10000, gamma: 2, exact: 0.049726, relativeError: 0.00542 },
    { pairs: 20000, gamma: 1, exact: 0.049996, relativeError: -8.75e-06 },
    { pairs: 20000, gamma: 1.2, exact: 0.049946, relativeError: 0.000976 },
    { pairs: 20000, gamma: 1.5, exact: 0.049886, relativeError: 0.0022 },
    { pairs: 20000, gamma: 2, exact: 0.049805, relativeError: 0.00383 },
  ]),
  nearAlpha005: Object.freeze<NormalErrorPoint[]>([
    { pairs: 6000, gamma: 1, exact: 0.0049971, relativeError: 0.000667 },
    { pairs: 6000, gamma: 1.2, exact: 0.0049555, relativeError: 0.00906 },
    { pairs: 6000, gamma: 1.5, exact: 0.0049042, relativeError: 0.0196 },
    { pairs: 6000, gamma: 2, exact: 0.0048363, relativeError: 0.0339 },
    { pairs: 10000, gamma: 1, exact: 0.0049984, relativeError: 0.000401 },
    { pairs: 10000, gamma: 1.2, exact: 0.0049662, relativeError: 0.00689 },
    { pairs: 10000, gamma: 1.5, exact: 0.0049264, relativeError: 0.015 },
    { pairs: 10000, gamma: 2, exact: 0.0048739, relativeError: 0.026 },
    { pairs: 20000, gamma: 1, exact: 0.0049994, relativeError: 0.000201 },
    { pairs: 20000, gamma: 1.2, exact: 0.0049767, relativeError: 0.00478 },
    { pairs: 20000, gamma: 1.5, exact: 0.0049485, relativeError: 0.0105 },
    { pairs: 20000, gamma: 2, exact: 0.0049113, relativeError: 0.0181 },
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
