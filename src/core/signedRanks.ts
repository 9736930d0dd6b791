/**
 * How pairs with a zero difference enter the ranking.
 * `wilcoxon`: they are dropped and the other |d| are ranked 1…n′ (Wilcoxon 1945).
 * `pratt`: every |d|, zeros included, is ranked together (mid-ranks); zeros score 0 and the other pairs keep
 * those ranks, so they start at (number of zeros) + 1 (Pratt 1959).
 */
export type ZeroRule = 'wilcoxon' | 'pratt';

/**
 * The relative tolerance within which two |d| count as tied when ranking paired differences of measured
 * outcomes: |a − b| ≤ 1e-10·max(a, b), i.e. they agree to about 10 significant digits. Binary floating point
 * turns equal differences of decimal numbers into unequal ones (1.3 − 1.2 = 0.10000000000000009 but
 * 2.3 − 2.2 = 0.09999999999999964; 100000.3 − 100000.2 = 0.10000000000582077); the tolerance absorbs this
 * rounding whenever the outcomes are at most about 10⁵ times larger than their difference, and is far finer
 * than the precision of any measured outcome.
 */
export const RANK_TIE_TOLERANCE = 1e-10;

/** Options of {@link signedRanks}. */
export interface SignedRankOptions {
  /** How zero differences are treated; default `wilcoxon`. */
  readonly zeroRule?: ZeroRule;
  /**
   * |d| within this relative tolerance of the smallest |d| of their tie group share its rank (≥ 0; default 0:
   * only equal numbers tie). Pass {@link RANK_TIE_TOLERANCE} for differences of measured outcomes.
   */
  readonly tieTolerance?: number;
}

/** The Wilcoxon signed-rank statistic of paired differences, with what its null distributions need. */
export interface SignedRanks {
  /** Pairs given. */
  readonly pairs: number;
  /** Pairs with a difference of exactly zero (dropped from the test). */
  readonly zeros: number;
  /** Pairs with a non-zero difference (the ranks below belong to these). */
  readonly nonZero: number;
  /** Pairs with a positive difference. */
  readonly positive: number;
  /**
   * Average ranks of |d| of the non-zero differences, in ascending order: ranked among the non-zero
   * differences (Wilcoxon's rule) or among all differences, zeros included (Pratt's rule).
   */
  readonly ranks: Float64Array;
  /** T: the sum of the ranks of |d| over pairs with d > 0. */
  readonly statistic: number;
  /** Σ Rᵢ over the non-zero differences: nonZero·(nonZero + 1)/2 under Wilcoxon's rule. */
  readonly sumRanks: number;
  /** Σ Rᵢ² (smaller than n(n+1)(2n+1)/6 when |d| has ties). */
  readonly sumSquaredRanks: number;
  /** Whether some non-zero |d| are tied (then ranks are averages, possibly half-integers). */
  /** The zero rule the ranks follow (absent on objects built before the rule existed: Wilcoxon's). */
  readonly zeroRule?: ZeroRule;
  /** The relative tolerance used for ties (absent: 0). */
  readonly tieTolerance?: number;
  readonly tiedMagnitudes: boolean;
}

/**
 * Wilcoxon's signed-rank statistic T = Σ Rᵢ·[dᵢ > 0], where Rᵢ is the rank of |dᵢ|.
 *
 * **Method.** Wilcoxon's rule (default): zero differences are dropped and the others ranked among
 * themselves. Pratt's rule: all |d|, zeros included, are ranked together; the zeros score 0 and the non-zero
 * pairs keep their ranks. Tied |d| share the average of the ranks they span (the "mid-rank" convention); with
 * a tie tolerance, a tie group holds every sorted |d| within tolerance·|d| of the group's smallest member
 * (so that differences equal on paper but not in binary floating point tie). T sums the ranks of the positive
 * differences. Sorting typed arrays keeps this O(n log n) for millions of pairs: the magnitudes are sorted
 * once, and each positive magnitude finds its tie group in one merge pass.
 *
 * **References.** Wilcoxon F (1945) Individual comparisons by ranking methods. Biometrics Bulletin
 * 1(6):80–83 (zeros dropped). Pratt JW (1959) Remarks on zeros and ties in the Wilcoxon signed rank
 * procedures. JASA 54(287):655–667 (zeros kept in the ranking with score 0; recalled from memory). Lehmann EL
 * (1975) Nonparametrics, ch. 3 (mid-ranks). Rosenbaum PR (2002) Observational Studies, 2nd ed., Springer,
 * §4.3.3 (the statistic in matched pairs).
 *
 * **Special cases.** Non-finite differences are not allowed (the caller validates); −0 counts as zero. Zeros
 * are exact zeros (a tolerance never merges a non-zero |d| with 0).
 *
 * @param differences treated-minus-control differences, one per pair
 * @param options `zeroRule` (`wilcoxon` or `pratt`, default `wilcoxon`); `tieTolerance` ≥ 0 (default 0)
 */
export function signedRanks(differences: ArrayLike<number>, options: SignedRankOptions = {}): SignedRanks {
  const zeroRule = options.zeroRule ?? 'wilcoxon';
  const tolerance = options.tieTolerance ?? 0;
  const n = differences.length;
  let nonZero = 0;
  let positive = 0;
  for (let i = 0; i < n; i++) {
    const d = differences[i];
    if (d !== 0) nonZero++;
    if (d > 0) positive++;
  }
  const magnitudes = new Float64Array(nonZero);
  const positiveMagnitudes = new Float64Array(positive);
  for (let i = 0, a = 0, p = 0; i < n; i++) {
    const d = differences[i];
    if (d === 0) continue;
    magnitudes[a++] = Math.abs(d);
    if (d > 0) positiveMagnitudes[p++] = d;
  }
  magnitudes.sort();
  positiveMagnitudes.sort();

  // Average ranks, tie group by tie group; under Pratt's rule the zeros occupy ranks 1…zeros first.
  const offset = zeroRule === 'pratt' ? n - nonZero : 0;
  const ranks = new Float64Array(nonZero);
  const groupEnd = new Int32Array(nonZero); // one past the last member of each magnitude's tie group
  let tied = false;
  let sumRanks = 0;
  let sumSquaredRanks = 0;
  for (let start = 0; start < nonZero; ) {
    let end = start + 1;
    while (end < nonZero && magnitudes[end] - magnitudes[start] <= tolerance * magnitudes[end]) end++;
    if (end - start > 1) tied = true;
    const rank = offset + (start + 1 + end) / 2;
    for (let k = start; k < end; k++) {
      ranks[k] = rank;
      groupEnd[k] = end;
    }
    sumRanks += (end - start) * rank;
    sumSquaredRanks += (end - start) * rank * rank;
    start = end;
  }

  // Each positive magnitude takes its tie group's rank; both arrays are sorted, so one merge pass suffices
  // (the pointer moves to the group whose range holds the magnitude).
  let statistic = 0;
  for (let p = 0, k = 0; p < positive; p++) {
    while (magnitudes[groupEnd[k] - 1] < positiveMagnitudes[p]) k = groupEnd[k];
    statistic += ranks[k];
  }
  return Object.freeze({
    pairs: n,
    zeros: n - nonZero,
    nonZero,
    positive,
    ranks,
    statistic,
    sumRanks,
    sumSquaredRanks,
    tiedMagnitudes: tied,
    zeroRule,
    tieTolerance: tolerance,
  });
}
