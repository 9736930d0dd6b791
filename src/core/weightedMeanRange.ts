/**
 * Prefix sums that give, for any Λ ≥ 1, the smallest and largest normalised weighted mean Σwy/Σw of one group
 * when each person's weight may lie anywhere in a box [f + s_i/Λ, f + s_i·Λ] (s_i ≥ 0, f ≥ 0).
 * Build once with {@link weightedMeanRangeTable}; each Λ then costs O(log m) in {@link weightedMeanRange}.
 */
export interface WeightedMeanRangeTable {
  /** Number of people m (rows of the sorted outcome array). */
  readonly size: number;
  /** The constant the outcomes were centred at (the middle sorted outcome), for accuracy. */
  readonly centre: number;
  /** Outcomes minus the centre, ascending. */
  readonly centred: Float64Array;
  /** Prefix sums over the sorted order (length m + 1): Σc·f, Σc·f·y, Σc·s, Σc·s·y (y centred). */
  readonly fixedWeight: Float64Array;
  readonly fixedWeighted: Float64Array;
  readonly scaledWeight: Float64Array;
  readonly scaledWeighted: Float64Array;
}

/**
 * Builds the table behind {@link weightedMeanRange} for one group.
 *
 * **Method.** With the outcomes sorted ascending, the extreme means put the low weight on one side of a split
 * and the high weight on the other (see {@link weightedMeanRange}); every sum needed for any split and any Λ
 * is a combination of four Λ-free prefix sums: Σc·f, Σc·f·y, Σc·s and Σc·s·y (c the multiplicity). The
 * outcomes are centred at the middle sorted value first, so the sums do not lose digits to a large common
 * level. O(m) time and memory.
 *
 * **References.** Zhao Q, Small DS, Bhattacharya BB (2019) Sensitivity analysis for inverse probability
 * weighting estimators via the percentile bootstrap. JRSS-B 81(4):735–761, §4 (the extrema of the weighted
 * mean are attained by a threshold on the sorted outcomes, found in one pass) — recalled from memory.
 *
 * **Special cases.** m = 0: an empty table (its range is NaN). A multiplicity of 0 leaves a person out.
 *
 * @param sortedOutcomes outcomes, ascending, finite
 * @param counts multiplicities (whole numbers ≥ 0) in the same order, or null for 1 each
 * @param fixed the constant part f ≥ 0 of every weight
 * @param scaled the Λ-scaled part s_i ≥ 0 of each weight, in the same order
 * @param reuse a table of the same size whose arrays are overwritten (saves allocation in resampling loops)
 * @throws RangeError when the lengths disagree
 */
export function weightedMeanRangeTable(
  sortedOutcomes: ArrayLike<number>,
  counts: ArrayLike<number> | null,
  fixed: number,
  scaled: ArrayLike<number>,
  reuse?: WeightedMeanRangeTable,
): WeightedMeanRangeTable {
  const m = sortedOutcomes.length;
  if (scaled.length !== m || (counts !== null && counts.length !== m)) throw new RangeError('outcomes, counts and weights must have the same length');
  const ok = reuse !== undefined && reuse.size === m;
  const centred = ok ? reuse.centred : new Float64Array(m);
  const fixedWeight = ok ? reuse.fixedWeight : new Float64Array(m + 1);
  const fixedWeighted = ok ? reuse.fixedWeighted : new Float64Array(m + 1);
  const scaledWeight = ok ? reuse.scaledWeight : new Float64Array(m + 1);
  const scaledWeighted = ok ? reuse.scaledWeighted : new Float64Array(m + 1);
  const centre = m > 0 ? sortedOutcomes[m >> 1] : 0;
  let a = 0;
  let b = 0;
  let c = 0;
  let d = 0;
  fixedWeight[0] = fixedWeighted[0] = scaledWeight[0] = scaledWeighted[0] = 0;
  for (let i = 0; i < m; i++) {
    const y = sortedOutcomes[i] - centre;
    centred[i] = y;
    const k = counts === null ? 1 : counts[i];
    if (k !== 0) {
      const cf = k * fixed;
      const cs = k * scaled[i];
      a += cf;
      b += cf * y;
      c += cs;
      d += cs * y;
    }
    fixedWeight[i + 1] = a;
    fixedWeighted[i + 1] = b;
    scaledWeight[i + 1] = c;
    scaledWeighted[i + 1] = d;
  }
  return { size: m, centre, centred, fixedWeight, fixedWeighted, scaledWeight, scaledWeighted };
}

/** The smallest and largest normalised weighted mean at one Λ. */
export interface WeightedMeanRange {
  readonly lower: number;
  readonly upper: number;
}

/**
 * The smallest and largest value of Σ c_i w_i y_i / Σ c_i w_i over all weights w_i ∈ [f + s_i/Λ, f + s_i·Λ].
 *
 * **Method.** Exact, by the threshold structure of the optimum. For the maximum, with the outcomes sorted
 * ascending, let M(k) be the mean when persons 0…k−1 get their low weight and persons k…m−1 their high weight.
 * Moving person k from high to low changes the mean by δ(M(k) − y_k)/(D − δ) (δ = the weight difference,
 * D = the current total weight), so M rises while y_k < M(k); and once y_k ≥ M(k), every later
 * y ≥ y_k ≥ M(k) ≥ M(k + 1), so it falls from then on. M is therefore unimodal in the split k, and its peak
 * is at the first k with y_k ≥ M(k), found by bisection over the n + 1 splits, each M(k) read from the
 * prefix sums in O(1). The minimum is the mirror image (high weights below the split). The peak and its
 * neighbours are evaluated and the best kept, to guard against rounding at ties. For the minimum, moving
 * person k from low to high weight changes the mean by δ(y_k − M(k))/(D + δ): again an improvement exactly
 * when y_k < M(k), and the same argument applies. Any weighting of the box is dominated by one of these
 * splits: at an optimum with value M*, a person with y > M* must have the high weight (else raising it
 * increases the mean) and one with y < M* the low weight.
 *
 * **References.** Zhao Q, Small DS, Bhattacharya BB (2019) Sensitivity analysis for inverse probability
 * weighting estimators via the percentile bootstrap. JRSS-B 81(4):735–761, §4 — recalled from memory.
 *
 * **Special cases.** Λ = 1 gives lower = upper = the weighted mean with weights f + s_i. An empty group or a
 * total weight of 0 gives NaN. Λ < 1 is read as 1/Λ (the box is the same).
 *
 * @param table built by {@link weightedMeanRangeTable}
 * @param lambda Λ ≥ 1 (finite)
 */
export function weightedMeanRange(table: WeightedMeanRangeTable, lambda: number): WeightedMeanRange {
  const m = table.size;
  if (m === 0 || !(lambda > 0) || !Number.isFinite(lambda)) return { lower: NaN, upper: NaN };
  const big = lambda >= 1 ? lambda : 1 / lambda;
  const small = 1 / big;
  return { lower: table.centre + extreme(table, big, small), upper: table.centre + extreme(table, small, big) };
}

/**
 * Mean when persons below split k get weight f + s·below and persons from k on get f + s·above.
 * For the maximum: below = 1/Λ, above = Λ; for the minimum: below = Λ, above = 1/Λ.
 */
function meanAtSplit(t: WeightedMeanRangeTable, k: number, below: number, above: number): number {
  const m = t.size;
  const fw = t.fixedWeight[m];
  const fy = t.fixedWeighted[m];
  const sw = t.scaledWeight[k];
  const sy = t.scaledWeighted[k];
  const num = fy + below * sy + above * (t.scaledWeighted[m] - sy);
  const den = fw + below * sw + above * (t.scaledWeight[m] - sw);
  return num / den;
}

/**
 * The extreme mean with weight factor `below` under the split and `above` from it on: the maximum when
 * above > below, the minimum when above < below. In both cases the optimum is at the first k with y_k ≥ M(k).
 */
function extreme(t: WeightedMeanRangeTable, below: number, above: number): number {
  const m = t.size;
  const maximise = above > below;
  // improves(k): moving person k to the "below" factor improves the objective. For the maximum that lowers
  // person k's weight, for the minimum it raises it; either way it helps exactly when y_k < M(k).
  const improves = (k: number): boolean => {
    const value = meanAtSplit(t, k, below, above);
    return t.centred[k] < value;
  };
  // improves(k) is true for k < k* and false from k* on (see the doc comment). Bisection for k*.
  let lo = 0;
  let hi = m; // the first k in [0, m] where improves(k) is false (k = m counts as false)
  while (lo < hi) {
    const mid = (lo + hi) >>> 1;
    if (improves(mid)) lo = mid + 1;
    else hi = mid;
  }
  let best = meanAtSplit(t, lo, below, above);
  for (const k of [lo - 1, lo + 1]) {
    if (k < 0 || k > m) continue;
    const v = meanAtSplit(t, k, below, above);
    if (maximise ? v > best : v < best) best = v;
  }
  return best;
}
