import type { TailMethod } from './signedRankBound';
import { biasProbabilities, boundingLowerTailTable } from './signedRankBound';
import { decimalFraction } from './decimalFraction';
import { criticalValueByInversion, prepareBernoulliSum, upperTailByInversion, type PreparedBernoulliSum } from './bernoulliSumInversion';
import { upperNormalQuantile } from './upperNormalTail';
import { walshMean, type WalshAverages } from './walshAverages';

/** The additive effect under hidden bias at most Γ: the range of point estimates and the sensitivity interval. */
export interface EffectUnderBias {
  readonly gamma: number;
  /** The smallest and largest Hodges–Lehmann estimates a bias of at most Γ allows (equal at Γ = 1). */
  readonly estimateLow: number;
  readonly estimateHigh: number;
  /**
   * The two-sided 1 − α sensitivity interval: the union of the confidence intervals over all biases of at
   * most Γ. −Infinity/Infinity when no limit exists (too few pairs for this α and Γ).
   */
  readonly intervalLow: number;
  readonly intervalHigh: number;
  /** The critical value c of the bounding signed-rank distribution: P(Σ i·Bᵢ ≥ c) ≤ α/2 (over n ranks 1…n). */
  readonly criticalValue: number;
  readonly method: TailMethod;
}

/**
 * Hodges–Lehmann estimates and confidence intervals for an additive treatment effect τ in matched pairs,
 * under hidden bias at most Γ.
 *
 * **Method.** For a candidate τ the signed-rank statistic of the adjusted differences dᵢ − τ is
 * T(τ) = #{Walsh averages > τ} (Tukey's identity), a non-increasing step function. Under bias at most Γ its
 * expectation lies between μ⁻ = N/(1 + Γ) and μ⁺ = N·Γ/(1 + Γ), N = n(n + 1)/2. The estimate range is
 * [τ̂(μ⁺), τ̂(μ⁻)] with τ̂(μ) = ½(sup{τ: T(τ) > μ} + inf{τ: T(τ) < μ}), i.e. the average of the ⌈μ⌉-th and
 * (⌊μ⌋ + 1)-th largest Walsh averages; at Γ = 1 this is the median of the Walsh averages. Whether μ is a
 * whole number decides between one Walsh average and the mean of two, so ⌊μ⌋ and ⌈μ⌉ are decided exactly
 * ({@link biasedExpectationParts}: Γ taken as the decimal it prints as, integer arithmetic), never from a
 * floating-point μ such as 820/2.05 = 400.00000000000006. The sensitivity
 * interval keeps every τ that neither one-sided bounding test rejects at level α/2: with c the smallest
 * integer such that P(Σᵢ i·Bᵢ ≥ c) ≤ α/2, Bᵢ ~ Bernoulli(Γ/(1 + Γ)), the interval runs from the c-th largest
 * to the c-th smallest Walsh average. c comes from the exact bounding distribution (one dynamic program per
 * Γ) or from its normal approximation, c = ⌈μ⁺ + z_{α/2}·sd⌉ (plus ½ with a continuity correction).
 *
 * **References.** Rosenbaum PR (1993) Hodges–Lehmann point estimates of treatment effect in observational
 * studies. JASA 88(424):1250–1253. Rosenbaum PR (2002) Observational Studies, 2nd ed., Springer,
 * §4.3.4–4.3.5. Hodges JL, Lehmann EL (1963) Ann Math Stat 34:598–611. At Γ = 1 the interval is the one of
 * R's `wilcox.test(conf.int = TRUE)` (exact case): Bauer DF (1972) JASA 67:687–690.
 *
 * **Special cases.** All n pairs count, including zero differences (dᵢ − τ ≠ 0 for τ between averages).
 * When even the most extreme statistic cannot reach level α/2 the interval is (−Infinity, Infinity).
 * NaN Γ or α → NaN limits.
 *
 * @param walsh from `walshAverages(differences)`
 * @param pairs n, the number of pairs (so that walsh.count = n(n + 1)/2)
 * @param gamma Γ ≥ 1 (finite)
 * @param alpha the two-sided interval has level 1 − α, α in (0, 1)
 */
export function effectUnderBias(
  walsh: WalshAverages,
  pairs: number,
  gamma: number,
  alpha: number,
  options: {
    method: TailMethod;
    continuityCorrection?: boolean;
    /** The critical value when already known (from `exactCriticalValueAndTail` for this Γ, n and α/2). */
    criticalValue?: number;
  },
): EffectUnderBias {
  const N = walsh.count;
  const { plus, minus } = biasProbabilities(gamma);
  const nan = Object.freeze({
    gamma,
    estimateLow: NaN,
    estimateHigh: NaN,
    intervalLow: NaN,
    intervalHigh: NaN,
    criticalValue: NaN,
    method: options.method,
  });
  if (Number.isNaN(gamma) || !(alpha > 0 && alpha < 1) || N === 0) return nan;

  const kthLargest = (k: number) => walsh.smallest(N - k + 1);
  const estimateAt = (mu: WholePart) => {
    const a = kthLargest(mu.ceil);
    const b = mu.floor + 1 > N ? -Infinity : kthLargest(mu.floor + 1);
    return walshMean(a, b);
  };
  const expectations = biasedExpectationParts(N, gamma);
  const estimateLow = estimateAt(expectations.plus);
  const estimateHigh = estimateAt(expectations.minus);

  const c =
    options.criticalValue ??
    (options.method === 'exact'
      ? exactCriticalValue(pairs, plus, minus, alpha / 2)
      : normalCriticalValue(pairs, plus, minus, alpha / 2, options.continuityCorrection ?? false));
  const bounded = c <= N;
  return Object.freeze({
    gamma,
    estimateLow,
    estimateHigh,
    intervalLow: bounded ? kthLargest(c) : -Infinity,
    intervalHigh: bounded ? walsh.smallest(c) : Infinity,
    criticalValue: c,
    method: options.method,
  });
}

/**
 * Smallest integer c with P(Σᵢ i·Bᵢ ≥ c) ≤ level, i = 1…n, Bᵢ ~ Bernoulli(p); n(n + 1)/2 + 1 when none.
 * Exact: P(Σ i·Bᵢ ≥ c) = P(Σ i·(1 − Bᵢ) ≤ N − c), so c = N − s* with s* the largest s whose lower tail
 * (probability q) is ≤ level; one table of the lower tail suffices.
 */
export function exactCriticalValue(n: number, p: number, q: number, level: number): number {
  return exactCriticalValueAndTail(n, p, q, level).critical;
}

/**
 * `exactCriticalValue`, and from the same table the upper tail P(Σᵢ i·Bᵢ ≥ t) at one more point t — the
 * upper p-value bound of a signed-rank statistic t when the ranks are exactly 1…n (no ties, no zeros), which
 * saves a second dynamic program. `tail` is null when t lies outside the table or the tail is too small for
 * the table's absolute accuracy (below 1e-12); compute it directly then.
 */
export function exactCriticalValueAndTail(n: number, p: number, q: number, level: number, t?: number): { critical: number; tail: number | null } {
  const N = (n * (n + 1)) / 2;
  // Many pairs: the certified inversion (one circle of nodes serves every candidate c); the table otherwise.
  if (n > INVERSION_PAIRS && p > 0 && q > 0) {
    const prepared = ranksOneToN(n);
    // Worth it only while cheaper than the table, whose cost is about n times the region it spans.
    const critical = prepared ? criticalValueByInversion(prepared, p, q, level, (n * Math.max(16, q * N)) / 20) : null;
    if (critical !== null) {
      const tail = t === undefined || !prepared ? null : upperTailByInversion(prepared, t, p, q);
      return { critical, tail };
    }
  }
  const weights = Float64Array.from({ length: n }, (_, i) => i + 1);
  const sd = Math.sqrt(p * q * ((n * (n + 1) * (2 * n + 1)) / 6));
  const z = upperNormalQuantile(level);
  const negligible = 1e-30 * Math.min(1, level);
  const tailFrom = (table: Float64Array, m: number): number | null => {
    if (t === undefined) return null;
    const s = N - Math.ceil(t);
    if (s < 0) return 0;
    if (s > m) return null;
    return table[s] >= 1e-12 ? table[s] : null;
  };
  // Start a little past the normal approximation's answer; widen only if the exact answer lies beyond.
  let m = Math.min(N, Math.max(16, Math.ceil(q * N - z * sd + 2 * sd + 16)));
  for (;;) {
    const table = boundingLowerTailTable(weights, m, q, p, negligible);
    if (table[0] > level) return { critical: N + 1, tail: tailFrom(table, m) };
    if (table[m] > level || m === N) {
      let s = m;
      while (s > 0 && table[s] > level) s--;
      return { critical: N - s, tail: tailFrom(table, m) };
    }
    m = Math.min(N, m + Math.max(64, Math.ceil(4 * sd)));
  }
}

/** Above this many pairs the critical value comes from the inversion (the table costs O(n³)). */
const INVERSION_PAIRS = 200;

let lastRanks: { n: number; prepared: PreparedBernoulliSum | null } | null = null;

/** The ranks 1…n, prepared for inversion (the last n kept: an analysis asks for many Γ at one n). */
function ranksOneToN(n: number): PreparedBernoulliSum | null {
  if (lastRanks?.n !== n) lastRanks = { n, prepared: prepareBernoulliSum(Float64Array.from({ length: n }, (_, i) => i + 1)) };
  return lastRanks.prepared;
}

/** c = ⌈μ + cc + z·sd⌉ from the normal approximation to Σ i·Bᵢ (capped at N + 1). */
export function normalCriticalValue(n: number, p: number, q: number, level: number, continuityCorrection: boolean): number {
  const N = (n * (n + 1)) / 2;
  const mean = p * N;
  const sd = Math.sqrt(p * q * ((n * (n + 1) * (2 * n + 1)) / 6));
  const c = Math.ceil(mean + (continuityCorrection ? 0.5 : 0) + upperNormalQuantile(level) * sd - 1e-9);
  return Math.min(Math.max(c, 0), N + 1);
}

/** ⌊μ⌋ and ⌈μ⌉ of an expectation μ. */
export interface WholePart {
  readonly floor: number;
  readonly ceil: number;
}

/**
 * ⌊μ⌋ and ⌈μ⌉ of μ⁺ = N·Γ/(1 + Γ) and μ⁻ = N/(1 + Γ), decided exactly.
 *
 * **Method.** Γ is taken as the decimal number it prints as ({@link decimalFraction}: Γ = p/q), so
 * μ⁺ = N·p/(p + q) and μ⁻ = N·q/(p + q); the floor is the BigInt quotient and the ceiling adds one when the
 * remainder is not 0. This is the same as finding the largest k with (1 + Γ)·k ≤ Γ·N (respectively ≤ N) in
 * exact rational arithmetic.
 *
 * **References.** Rosenbaum PR (1993) Hodges–Lehmann point estimates of treatment effect in observational
 * studies. JASA 88(424):1250–1253 (the estimate at the expectations μ⁺ and μ⁻).
 *
 * **Special cases.** Γ = Infinity → μ⁺ = N, μ⁻ = 0. NaN or Γ < 0 → NaN parts.
 *
 * @param count N, a whole number ≥ 0 (the number of Walsh averages, n(n + 1)/2)
 * @param gamma Γ ≥ 1
 */
export function biasedExpectationParts(count: number, gamma: number): { plus: WholePart; minus: WholePart } {
  const nan = { floor: NaN, ceil: NaN };
  if (gamma === Infinity) return { plus: { floor: count, ceil: count }, minus: { floor: 0, ceil: 0 } };
  const fraction = decimalFraction(gamma);
  if (!fraction || !Number.isInteger(count) || count < 0) return { plus: nan, minus: nan };
  const N = BigInt(count);
  const total = fraction.numerator + fraction.denominator;
  const parts = (numerator: bigint): WholePart => {
    const scaled = N * numerator;
    const floor = scaled / total;
    return { floor: Number(floor), ceil: Number(floor + (scaled % total === 0n ? 0n : 1n)) };
  };
  return { plus: parts(fraction.numerator), minus: parts(fraction.denominator) };
}
