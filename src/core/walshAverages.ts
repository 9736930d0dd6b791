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
 * monotone in the partner), τ is narrowed by interpolation on the count (regula falsi, Illinois variant,
 * with bisection steps as a safeguard) until at most about n averages remain between the brackets, and those
 * are gathered and sorted. Averages are computed as (a + b)/2 the same way everywhere, so the
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
  if (n > 0 && Math.max(Math.abs(sorted[0]), Math.abs(sorted[n - 1])) > 8e307) {
    // a + b could overflow: work with halved values (exact scaling by a power of two) and double the result.
    const halved = walshAverages(sorted.map((v) => v / 2), options);
    return Object.freeze({ count: halved.count, smallest: (k: number) => 2 * halved.smallest(k) });
  }
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
  const selector = new WalshSelector(sorted);
  return Object.freeze({ count, smallest: (k: number) => selector.smallest(k) });
}

/** (a + b)/2 without overflow for magnitudes near the largest double. */
export function walshMean(a: number, b: number): number {
  const sum = a + b;
  return Number.isFinite(sum) ? sum / 2 : a / 2 + b / 2;
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

/** Size of the sample of averages that gives each search its starting bracket. */
const SAMPLE_SIZE = 100_000;

/**
 * Selection of Walsh averages without storing them. Every count computed is remembered, so later searches
 * (several quantiles per Γ, several Γ) start from the tightest bracket known; a first bracket comes from a
 * sample of averages at deterministic pseudo-random (i, j).
 */
class WalshSelector {
  private readonly n: number;
  private readonly count: number;
  private readonly knownAt: number[] = [];
  private readonly knownCount: number[] = [];
  private sample: Float64Array | null = null;

  constructor(private readonly sorted: Float64Array) {
    this.n = sorted.length;
    this.count = (this.n * (this.n + 1)) / 2;
  }

  smallest(k: number): number {
    const { sorted, n, count } = this;
    if (!(k >= 1 && k <= count && Number.isInteger(k))) return NaN;
    // Invariant: countAtMost(lo) < k ≤ countAtMost(hi).
    let lo = sorted[0] - Math.max(1, Math.abs(sorted[0]));
    if (!Number.isFinite(lo) || lo === sorted[0]) lo = -Number.MAX_VALUE;
    let hi = sorted[n - 1];
    let countLo = 0;
    let countHi = count;
    for (let i = 0; i < this.knownAt.length; i++) {
      const c = this.knownCount[i];
      const at = this.knownAt[i];
      if (c < k && at > lo) {
        lo = at;
        countLo = c;
      } else if (c >= k && at < hi) {
        hi = at;
        countHi = c;
      }
    }
    // A bracket from the sample: its quantiles around k/N, about ±5 sampling standard errors apart.
    const sample = this.sampleOfAverages();
    const f = k / count;
    const margin = 5 * Math.sqrt((f * (1 - f)) / sample.length) + 2 / sample.length;
    for (const [fraction, below] of [
      [f - margin, true],
      [f + margin, false],
    ] as const) {
      if (fraction <= 0 || fraction >= 1) continue;
      const at = sample[Math.min(sample.length - 1, Math.floor(fraction * sample.length))];
      if (!(at > lo && at < hi)) continue;
      const c = this.countAt(at);
      if (c < k) {
        lo = at;
        countLo = c;
      } else {
        hi = at;
        countHi = c;
      }
      if (below !== c < k) break;
    }
    // Regula falsi on the count (smooth in aggregate for large n), Illinois-weighted so both ends move, with
    // a bisection step whenever an interpolated step fails to halve the number of averages in the bracket.
    let weightLo = k - countLo;
    let weightHi = countHi - k + 0.5;
    let side = 0;
    const gatherLimit = Math.max(n >> 3, 4096);
    let bisectNext = false;
    for (let iteration = 0; iteration < 3000 && countHi - countLo > gatherLimit; iteration++) {
      const span = countHi - countLo;
      let mid = bisectNext ? NaN : lo + ((hi - lo) * weightLo) / (weightLo + weightHi);
      if (!(mid > lo && mid < hi)) mid = lo / 2 + hi / 2;
      if (!(mid > lo && mid < hi)) return hi; // no double between: every average in (lo, hi] equals hi
      const c = this.countAt(mid);
      if (c >= k) {
        hi = mid;
        countHi = c;
        weightHi = c - k + 0.5;
        if (side === 1) weightLo /= 2;
        side = 1;
      } else {
        lo = mid;
        countLo = c;
        weightLo = k - c;
        if (side === -1) weightHi /= 2;
        side = -1;
      }
      bisectNext = !bisectNext && countHi - countLo > span / 2;
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

  private countAt(tau: number): number {
    const c = countWalshAtMost(this.sorted, tau);
    this.knownAt.push(tau);
    this.knownCount.push(c);
    return c;
  }

  /** Averages at pseudo-random pairs i ≤ j (a fixed linear congruential sequence, so results are reproducible). */
  private sampleOfAverages(): Float64Array {
    if (this.sample) return this.sample;
    const { sorted, n } = this;
    const sample = new Float64Array(SAMPLE_SIZE);
    let state = 0x2545f491;
    const next = () => {
      state = (Math.imul(state, 1103515245) + 12345) >>> 0;
      return state / 4294967296;
    };
    for (let s = 0; s < SAMPLE_SIZE; s++) {
      // Uniform over pairs i ≤ j: pick (i, j) uniformly and swap when i > j (the diagonal is slightly rare,
      // which only makes the bracket a little conservative).
      let i = Math.floor(next() * n);
      let j = Math.floor(next() * n);
      if (i > j) [i, j] = [j, i];
      sample[s] = (sorted[i] + sorted[j]) / 2;
    }
    this.sample = sample.sort();
    return this.sample;
  }
}
