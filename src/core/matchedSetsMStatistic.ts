import type { MatchedSetsLayout } from './matchedSetsGrouping';
import { upperNormalTail } from './upperNormalTail';

/** The m-statistic of a matched-sets study and the separable bounds on its null mean and variance under Γ. */
export interface MStatisticBounds {
  /** T: the sum over sets of the treated unit's score. */
  readonly statistic: number;
  /** Largest null expectation of T under bias at most Γ (the worst case for `greater`). */
  readonly upperExpectation: number;
  /** The variance that goes with it (largest among splits tied at the largest mean). */
  readonly upperVariance: number;
  /** Smallest null expectation of T under bias at most Γ (the best case). */
  readonly lowerExpectation: number;
  readonly lowerVariance: number;
}

/** An m-statistic evaluator for one study: T and its bounds for any shift of the treated outcomes and any Γ. */
export interface MatchedSetsMStatistic {
  /** σ, the fixed scale. */
  readonly scale: number;
  /** c, the trimming constant of ψ. */
  readonly trim: number;
  /**
   * T and its bounds with every treated outcome shifted by −`shift` (the hypothesis "the effect is `shift`")
   * under bias at most `gamma`. `sides` limits the work to one bound (the other's fields are then NaN).
   */
  at(shift: number, gamma: number, sides?: 'both' | 'upper' | 'lower'): MStatisticBounds;
}

/** Two means count as tied when they differ by less than this times c (rounding, not substance). */
const TIE_TOLERANCE = 1e-12;

/**
 * Huber's ψ: x clipped to [−c, c].
 *
 * **Method.** ψ(x) = max(−c, min(c, x)).
 *
 * **References.** Huber PJ (1964) Robust estimation of a location parameter. Ann Math Stat 35(1):73–101
 * (recalled from memory).
 *
 * **Special cases.** NaN → NaN; ±Infinity → ±c; odd: ψ(−x) = −ψ(x) exactly.
 *
 * @param x any real number
 * @param trim c > 0
 */
export function huberPsi(x: number, trim: number): number {
  if (Number.isNaN(x)) return NaN;
  return x > trim ? trim : x < -trim ? -trim : x;
}

/**
 * The scale of the m-statistic: the median of |treated − control| over all sets and all controls.
 *
 * **Method.** Every treated-minus-control absolute difference (one per control), sorted; the median (the mean
 * of the two middle values for an even count), as R's `median`.
 *
 * **References.** Rosenbaum PR (2007) Sensitivity analysis for m-estimates, tests, and confidence intervals in
 * matched observational studies. Biometrics 63(2):456–464 (the median absolute pair difference as scale;
 * recalled from memory).
 *
 * **Special cases.** No sets → NaN; 0 when more than half the differences are 0.
 *
 * @param layout the matched sets
 */
export function mStatisticScale(layout: MatchedSetsLayout): number {
  const { start, values } = layout;
  const differences = new Float64Array(values.length - layout.sets);
  let k = 0;
  for (let s = 0; s < layout.sets; s++) {
    const t = values[start[s]];
    for (let j = start[s] + 1; j < start[s + 1]; j++) differences[k++] = Math.abs(t - values[j]);
  }
  if (k === 0) return NaN;
  differences.sort();
  const mid = k >> 1;
  return k % 2 === 1 ? differences[mid] : (differences[mid - 1] + differences[mid]) / 2;
}

/**
 * The m-statistic for matched sets with one treated unit and one or more controls, with Rosenbaum's separable
 * bounds on its null expectation and variance under hidden bias at most Γ.
 *
 * **Method.** Each unit i of set s scores q_si = (1/(n_s − 1)) Σ_{k ≠ i} ψ((y_si − y_sk)/σ), ψ Huber's with
 * trim c and σ fixed (see `mStatisticScale`); T = Σ_s q_s,treated. With the treated outcomes shifted by −τ,
 * only the terms that involve the treated unit change; the control–control sums are computed once. Under bias
 * at most Γ each set's scores are sorted, and for each split a = 1 … n_s − 1 the a smallest get weight 1 and
 * the rest Γ; the set's upper mean is the largest weighted mean Σwq/Σw over a, with the largest weighted
 * variance Σw(q − mean)²/Σw (the same as Σwq²/Σw − mean², computed centred) among splits tied at that mean
 * (within 10⁻¹²·c). The lower mean is the same rule applied to −q, negated back (weight Γ to the a smallest,
 * smallest mean). Means and variances add over sets (the separable approximation); each set costs O(n_s²).
 *
 * **References.** Rosenbaum PR (2007) Sensitivity analysis for m-estimates, tests, and confidence intervals in
 * matched observational studies. Biometrics 63(2):456–464. Gastwirth JL, Krieger AM, Rosenbaum PR (2000)
 * Asymptotic separability in sensitivity analysis. JRSS-B 62(3):545–555. Both recalled from memory.
 *
 * **Special cases.** Γ = 1: both bounds are the plain mean (0 per set, since the scores of a set sum to 0)
 * and the permutation variance with equal weights. A set whose outcomes are all equal adds 0 to everything.
 *
 * @param layout the matched sets (treated first in each set)
 * @param scale σ > 0
 * @param trim c > 0
 */
export function matchedSetsMStatistic(layout: MatchedSetsLayout, scale: number, trim: number): MatchedSetsMStatistic {
  const { start, values, sets } = layout;
  // Control–control part of each control's score (does not depend on the shift).
  const fixed = new Float64Array(values.length);
  let largest = 2;
  for (let s = 0; s < sets; s++) {
    const b = start[s];
    const e = start[s + 1];
    largest = Math.max(largest, e - b);
    for (let i = b + 1; i < e; i++) {
      let sum = 0;
      for (let k = b + 1; k < e; k++) if (k !== i) sum += huberPsi((values[i] - values[k]) / scale, trim);
      fixed[i] = sum;
    }
  }
  const q = new Float64Array(largest);
  const tie = TIE_TOLERANCE * trim;

  function at(shift: number, gamma: number, sides: 'both' | 'upper' | 'lower' = 'both'): MStatisticBounds {
    const wantUpper = sides !== 'lower';
    const wantLower = sides !== 'upper';
    let statistic = 0;
    let upperExpectation = 0;
    let upperVariance = 0;
    let lowerExpectation = 0;
    let lowerVariance = 0;
    for (let s = 0; s < sets; s++) {
      const b = start[s];
      const n = start[s + 1] - b;
      const treated = values[b] - shift;
      let treatedSum = 0;
      for (let j = 1; j < n; j++) {
        const p = huberPsi((values[b + j] - treated) / scale, trim);
        q[j] = (fixed[b + j] + p) / (n - 1);
        treatedSum -= p;
      }
      q[0] = treatedSum / (n - 1);
      statistic += q[0];
      // Insertion sort (sets are small).
      for (let i = 1; i < n; i++) {
        const v = q[i];
        let k = i - 1;
        while (k >= 0 && q[k] > v) {
          q[k + 1] = q[k];
          k--;
        }
        q[k + 1] = v;
      }
      let total = 0;
      for (let i = 0; i < n; i++) total += q[i];

      // Upper: weight 1 to the a smallest, Γ to the rest; largest mean, then largest variance.
      let bestMean = -Infinity;
      let bestVariance = 0;
      let prefix = 0;
      for (let a = 1; a < n && wantUpper; a++) {
        prefix += q[a - 1];
        const mean = (prefix + gamma * (total - prefix)) / (a + gamma * (n - a));
        if (mean < bestMean - tie) continue;
        const variance = weightedVariance(q, n, a, 1, gamma, mean);
        if (mean > bestMean + tie) {
          bestMean = mean;
          bestVariance = variance;
        } else if (variance > bestVariance) bestVariance = variance;
      }
      upperExpectation += bestMean;
      upperVariance += bestVariance;

      // Lower: weight Γ to the a smallest, 1 to the rest; smallest mean, then largest variance.
      bestMean = Infinity;
      bestVariance = 0;
      prefix = 0;
      for (let a = 1; a < n && wantLower; a++) {
        prefix += q[a - 1];
        const mean = (gamma * prefix + (total - prefix)) / (gamma * a + (n - a));
        if (mean > bestMean + tie) continue;
        const variance = weightedVariance(q, n, a, gamma, 1, mean);
        if (mean < bestMean - tie) {
          bestMean = mean;
          bestVariance = variance;
        } else if (variance > bestVariance) bestVariance = variance;
      }
      lowerExpectation += bestMean;
      lowerVariance += bestVariance;
    }
    return wantUpper && wantLower
      ? { statistic, upperExpectation, upperVariance, lowerExpectation, lowerVariance }
      : wantUpper
        ? { statistic, upperExpectation, upperVariance, lowerExpectation: NaN, lowerVariance: NaN }
        : { statistic, upperExpectation: NaN, upperVariance: NaN, lowerExpectation, lowerVariance };
  }
  return Object.freeze({ scale, trim, at });
}

/** Σ w (q − mean)² / Σ w with weight `low` on q[0…a−1] and `high` on q[a…n−1]. */
function weightedVariance(q: Float64Array, n: number, a: number, low: number, high: number, mean: number): number {
  let lowSum = 0;
  for (let i = 0; i < a; i++) lowSum += (q[i] - mean) * (q[i] - mean);
  let highSum = 0;
  for (let i = a; i < n; i++) highSum += (q[i] - mean) * (q[i] - mean);
  return (low * lowSum + high * highSum) / (low * a + high * (n - a));
}

/**
 * The separable upper bound on the one-sided p-value of the m-statistic: 1 − Φ((T − E)/√V) with the upper
 * bounds' E and V (worst case for the alternative that treatment raises the outcome); `lower` gives the best
 * case, 1 − Φ((T − E_low)/√V_low).
 *
 * **Method.** The normal approximation of the separable bound (Gastwirth, Krieger & Rosenbaum 2000), with the
 * tail from `upperNormalTail` (accurate far into the tail).
 *
 * **References.** Gastwirth JL, Krieger AM, Rosenbaum PR (2000) JRSS-B 62(3):545–555; Rosenbaum PR (2007)
 * Biometrics 63(2):456–464 (both recalled from memory).
 *
 * **Special cases.** V = 0 (every set constant) → 1 when T ≤ E, else 0; NaN → NaN.
 *
 * @param bounds T with its bounds, from `matchedSetsMStatistic(...).at(0, Γ)`
 * @param side `upper` (default) or `lower`
 */
export function mStatisticUpperP(bounds: MStatisticBounds, side: 'upper' | 'lower' = 'upper'): number {
  const expectation = side === 'upper' ? bounds.upperExpectation : bounds.lowerExpectation;
  const variance = side === 'upper' ? bounds.upperVariance : bounds.lowerVariance;
  if (Number.isNaN(bounds.statistic) || Number.isNaN(expectation) || Number.isNaN(variance)) return NaN;
  if (!(variance > 0)) return bounds.statistic <= expectation ? 1 : 0;
  return upperNormalTail((bounds.statistic - expectation) / Math.sqrt(variance));
}
