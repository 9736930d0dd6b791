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
  /** Average ranks of |d| over the non-zero differences, in ascending order. */
  readonly ranks: Float64Array;
  /** T: the sum of the ranks of |d| over pairs with d > 0. */
  readonly statistic: number;
  /** Σ Rᵢ = nonZero·(nonZero + 1)/2. */
  readonly sumRanks: number;
  /** Σ Rᵢ² (smaller than n(n+1)(2n+1)/6 when |d| has ties). */
  readonly sumSquaredRanks: number;
  /** Whether some non-zero |d| are tied (then ranks are averages, possibly half-integers). */
  readonly tiedMagnitudes: boolean;
}

/**
 * Wilcoxon's signed-rank statistic T = Σ Rᵢ·[dᵢ > 0], where Rᵢ is the rank of |dᵢ| among the non-zero differences.
 *
 * **Method.** Zero differences are dropped; tied |d| share the average of the ranks they span (the "mid-rank"
 * convention); T sums the ranks of the positive differences. Sorting typed arrays keeps this O(n log n) for
 * millions of pairs: the magnitudes are sorted once, and each positive magnitude finds its tie group by
 * binary search.
 *
 * **References.** Wilcoxon F (1945) Individual comparisons by ranking methods. Biometrics Bull 1(6):80–83.
 * Pratt JW (1959) JASA 54:655–667 and Lehmann EL (1975) Nonparametrics, ch. 3 (zeros and mid-ranks).
 * Rosenbaum PR (2002) Observational Studies, 2nd ed., Springer, §4.3.3 (the statistic in matched pairs).
 *
 * **Special cases.** Non-finite differences are not allowed (the caller validates); −0 counts as zero.
 *
 * @param differences treated-minus-control differences, one per pair
 */
export function signedRanks(differences: ArrayLike<number>): SignedRanks {
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

  // Average ranks, tie group by tie group.
  const ranks = new Float64Array(nonZero);
  let tied = false;
  let sumSquaredRanks = 0;
  for (let start = 0; start < nonZero; ) {
    let end = start + 1;
    while (end < nonZero && magnitudes[end] === magnitudes[start]) end++;
    if (end - start > 1) tied = true;
    const rank = (start + 1 + end) / 2;
    for (let k = start; k < end; k++) ranks[k] = rank;
    sumSquaredRanks += (end - start) * rank * rank;
    start = end;
  }

  // Each positive magnitude takes its tie group's rank; both arrays are sorted, so one merge pass suffices.
  let statistic = 0;
  for (let p = 0, k = 0; p < positive; p++) {
    while (magnitudes[k] < positiveMagnitudes[p]) k++;
    statistic += ranks[k];
  }
  return Object.freeze({
    pairs: n,
    zeros: n - nonZero,
    nonZero,
    positive,
    ranks,
    statistic,
    sumRanks: (nonZero * (nonZero + 1)) / 2,
    sumSquaredRanks,
    tiedMagnitudes: tied,
  });
}
