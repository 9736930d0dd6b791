/**
 * Order statistics of the Walsh averages (dᵢ + dⱼ)/2, i ≤ j, of n numbers — the n(n + 1)/2 values whose
 * median is the Hodges–Lehmann estimate and whose order statistics are the limits of the signed-rank
 * confidence interval.
 */
export interface WalshAverages {
  /** How many Walsh averages there are: n(n + 1)/2. */
  readonly count: number;
  /** The k-th smallest Walsh average, k = 1…count. */
  smallest(k: number): number;
}

/** Above this many values the averages are not stored but selected by counting (memory stays O(n)). */
const STORE_LIMIT = 2_100_000;

/**
 * Builds an order-statistic oracle for the Walsh averages of `values`.
 *
 * **Method.** When there are at most about two million averages they are formed and sorted once
 * (O(N log N), N = n(n + 1)/2). Beyond that, the k-th smallest is selected without storing them: the number
 * of averages ≤ τ is counted in O(n) with two pointers over the sorted values (the averages of a row are
 * monotone in the partner), τ is bisected until fewer than about 4n averages remain between the brackets,
 * and those are gathered and sorted. Averages are computed as (a + b)/2 the same way everywhere, so the
 * result is exactly one of the averages.
 *
 * **References.** Walsh JE (1949) Some significance tests for the median which are valid under very general
 * conditions. Ann Math Stat 20:64–81. Hodges JL, Lehmann EL (1963) Estimates of location based on rank
 * tests. Ann Math Stat 34:598–611. Tukey's identity: T = #{positive Walsh averages} (Lehmann 1975,
 * Nonparametrics, §3.2).
 *
 * **Special cases.** Values must be finite (the caller validates); k outside 1…count → NaN.
 *
 * @param values the paired differences
 * @param options `store`: force storing (true) or counting (false); default by size
 */
export function walshAverages(values: ArrayLike<number>, options: { store?: boolean } = {}): WalshAverages {
  const sorted = Float64Array.from(values).sort();
  const n = sorted.length;
  const count = (n * (n + 1)) / 2;
  if (options.store ?? count <= STORE_LIMIT) {
    const all = new Float64Array(count);
    let a = 0;
    for (let i = 0; i < n; i++) for (let j = i; j < n; j++) all[a++] = (sorted[i] + sorted[j]) / 2;
    all.sort();
    return Object.freeze({
      count,
      smallest: (k: number) => (k >= 1 && k <= count && Number.isInteger(k) ? all[k - 1] : NaN),
    });
  }
  return Object.freeze({ count, smallest: (k: number) => selectByCounting(sorted, k) });
}

/** #{(i ≤ j): (dᵢ + dⱼ)/2 ≤ τ} over sorted d, in O(n). */
export function countWalshAtMost(sorted: Float64Array, tau: number): number {
  const n = sorted.length;
  let count = 0;
  // For row i, the partners j ≥ i with average ≤ τ are i…hi−1; hi does not increase as i grows.
  let hi = n;
  for (let i = 0; i < n; i++) {
    while (hi > i && (sorted[i] + sorted[hi - 1]) / 2 > tau) hi--;
    if (hi <= i) break;
    count += hi - i;
  }
  return count;
}

function selectByCounting(sorted: Float64Array, k: number): number {
  const n = sorted.length;
  const count = (n * (n + 1)) / 2;
  if (!(k >= 1 && k <= count && Number.isInteger(k))) return NaN;
  // Invariant: countAtMost(lo) < k ≤ countAtMost(hi).
  let lo = sorted[0] - 1;
  let hi = sorted[n - 1];
  let countLo = 0;
  let countHi = count;
  if (lo === sorted[0]) lo = -Number.MAX_VALUE; // huge magnitudes: subtracting 1 changes nothing
  const gatherLimit = Math.max(4 * n, 1024);
  for (let iteration = 0; iteration < 2000 && countHi - countLo > gatherLimit; iteration++) {
    const mid = lo / 2 + hi / 2;
    if (mid <= lo || mid >= hi) break;
    const c = countWalshAtMost(sorted, mid);
    if (c >= k) {
      hi = mid;
      countHi = c;
    } else {
      lo = mid;
      countLo = c;
    }
  }
  // Gather the averages in (lo, hi] and pick the (k − countLo)-th smallest of them.
  const between = new Float64Array(countHi - countLo);
  let a = 0;
  let top = n; // partners j < top have average ≤ hi
  let bottom = n; // partners j < bottom have average ≤ lo
  for (let i = 0; i < n; i++) {
    while (top > i && (sorted[i] + sorted[top - 1]) / 2 > hi) top--;
    while (bottom > i && (sorted[i] + sorted[bottom - 1]) / 2 > lo) bottom--;
    for (let j = Math.max(i, bottom); j < top; j++) between[a++] = (sorted[i] + sorted[j]) / 2;
  }
  const window = between.subarray(0, a).sort();
  return window[k - countLo - 1];
}
