/** Where a finding stops being significant as the allowed hidden bias Γ grows. */
export interface TippingGamma {
  /**
   * The largest Γ at which the upper bound on the p-value is still ≤ α (the sensitivity value), or null when
   * there is none in the searched range (see `status`).
   */
  readonly gamma: number | null;
  /**
   * `found`: the value above; `not-significant`: already p > α at Γ = 1 (no bias needed); `beyond-range`:
   * still p ≤ α at the largest Γ searched (`searchedUpTo`), so the value is at least that large.
   */
  readonly status: 'found' | 'not-significant' | 'beyond-range';
  /** The upper p-value bound at Γ = 1 (the ordinary randomization p-value). */
  readonly pAtOne: number;
  readonly searchedUpTo: number;
  /** How many times the p-value bound was evaluated. */
  readonly evaluations: number;
}

export interface TippingOptions {
  /** A starting guess (e.g. from the normal approximation); saves evaluations of an expensive exact bound. */
  guess?: number;
  /** The largest Γ searched. Default 1e6. */
  maxGamma?: number;
  /** Relative precision in Γ. Default 1e-10. */
  tolerance?: number;
  /**
   * A cheap approximation of the same bound (e.g. its normal approximation). When given, the first step from
   * the guess goes to where the approximation, rescaled to agree with the bound at the guess, reaches α —
   * usually within a hair of the answer, so an expensive exact bound is evaluated only a few times.
   */
  model?: (gamma: number) => number;
}

/**
 * The sensitivity value: the largest Γ with pUpper(Γ) ≤ α, for any upper p-value bound that rises with Γ.
 *
 * **Method.** Root of F(x) = log pUpper(eˣ) − log α in x = log Γ, which is close to linear. A bracket is
 * found by stepping out geometrically from the guess, then narrowed by the Illinois variant of regula falsi
 * (superlinear, and the bracket always holds the root). The lower end of the final bracket is returned,
 * so the reported Γ never has p above α; it is within `tolerance` (relative) of the exact crossing.
 *
 * **References.** Rosenbaum PR (2002) Observational Studies, 2nd ed., Springer, §4.4 (the Γ at which the
 * upper bound reaches α); Zhao Q (2019) On sensitivity value of pair-matched observational studies, JASA
 * 114(526):713–722 (the term sensitivity value for this Γ; citation recalled from memory). Dowell M, Jarratt P (1971) A modified regula falsi
 * method for computing the root of an equation. BIT 11:168–174 (the Illinois method).
 *
 * **Special cases.** pUpper(1) > α → status `not-significant`, gamma null; still ≤ α at maxGamma →
 * `beyond-range`, gamma null; α not in (0, 1) or NaN p-values → gamma null with status `not-significant`.
 *
 * @param pUpper the upper p-value bound as a function of Γ (non-decreasing)
 * @param alpha the significance level, in (0, 1)
 */
export function tippingGamma(pUpper: (gamma: number) => number, alpha: number, options: TippingOptions = {}): TippingGamma {
  const maxGamma = options.maxGamma ?? 1e6;
  const tolerance = options.tolerance ?? 1e-10;
  let evaluations = 0;
  const F = (x: number): number => {
    evaluations++;
    const p = pUpper(Math.exp(x));
    return p > 0 ? Math.log(p) - Math.log(alpha) : -Infinity;
  };
  const pAtOne = pUpper(1);
  evaluations++;
  const result = (gamma: number | null, status: TippingGamma['status']): TippingGamma =>
    Object.freeze({ gamma, status, pAtOne, searchedUpTo: maxGamma, evaluations });
  if (!(alpha > 0 && alpha < 1) || !(pAtOne <= alpha)) return result(null, 'not-significant');

  const xMax = Math.log(maxGamma);
  let lo = 0;
  let flo = pAtOne > 0 ? Math.log(pAtOne) - Math.log(alpha) : -Infinity;
  let hi = xMax;
  let fhi = NaN;
  // Step out from the guess until the root is bracketed.
  const guess = options.guess !== undefined && options.guess > 1 && Number.isFinite(options.guess) ? options.guess : 2;
  let x = Math.min(Math.log(guess), xMax);
  let step = Math.max(0.01 * x, 1e-3);
  const f0 = F(x);
  if (options.model && Number.isFinite(f0)) {
    // The model, scaled to match the bound at the guess, predicts the crossing; aim just past it.
    const ratio = Math.exp(f0) * alpha / options.model(Math.exp(x));
    const target = alpha / ratio;
    if (ratio > 0 && Number.isFinite(ratio) && target > 0 && target < 1) {
      const predicted = tippingGamma(options.model, target, { maxGamma, tolerance: 1e-12 }).gamma;
      if (predicted !== null) {
        const distance = Math.abs(Math.log(predicted) - x);
        step = Math.max(distance * 1.05, tolerance * 4);
      }
    }
  }
  if (f0 <= 0) {
    lo = x;
    flo = f0;
    for (;;) {
      if (lo >= xMax) return result(null, 'beyond-range');
      x = Math.min(lo + step, xMax);
      const f = F(x);
      if (f > 0) {
        hi = x;
        fhi = f;
        break;
      }
      lo = x;
      flo = f;
      step *= 2;
    }
  } else {
    hi = x;
    fhi = f0;
    for (;;) {
      x = hi - step;
      if (x <= 0) break; // Γ = 1 is the known lower end
      const f = F(x);
      if (f <= 0) {
        lo = x;
        flo = f;
        break;
      }
      hi = x;
      fhi = f;
      step *= 2;
    }
  }

  // Illinois iterations on [lo, hi] with F(lo) ≤ 0 < F(hi). With a model, a step instead goes to where the
  // model crosses α after correcting it by the log-ratio bound/model interpolated linearly between the two
  // ends (the bound's own values at both ends are matched exactly, so the root stays bracketed); near the
  // root that correction is almost exact. Once a prediction lies within the tolerance of an end, the step
  // goes just past it so that the bracket closes.
  const logModel = (x: number) => Math.log(options.model!(Math.exp(x)));
  const predict = (): number => {
    if (!options.model || !Number.isFinite(trueLo) || !Number.isFinite(trueHi)) return NaN;
    const rLo = trueLo - logModel(lo);
    const rHi = trueHi - logModel(hi);
    if (!Number.isFinite(rLo) || !Number.isFinite(rHi)) return NaN;
    const G = (x: number) => logModel(x) + rLo + ((rHi - rLo) * (x - lo)) / (hi - lo);
    let a = lo;
    let b = hi;
    for (let k = 0; k < 80 && b - a > tolerance / 64; k++) {
      const mid = (a + b) / 2;
      if (G(mid) <= 0) a = mid;
      else b = mid;
    }
    return (a + b) / 2;
  };
  let trueLo = flo;
  let trueHi = fhi;
  let side = 0;
  for (let i = 0; i < 200 && hi - lo > tolerance; i++) {
    let next = i < 8 ? predict() : NaN;
    if (Number.isFinite(next)) {
      if (next - lo < tolerance / 2) next = lo + tolerance * 0.75;
      else if (hi - next < tolerance / 2) next = hi - tolerance * 0.75;
    }
    if (!(next > lo && next < hi)) next = Number.isFinite(flo) ? hi - (fhi * (hi - lo)) / (fhi - flo) : (lo + hi) / 2;
    if (!(next > lo && next < hi)) next = (lo + hi) / 2;
    const f = F(next);
    if (f <= 0) {
      lo = next;
      flo = trueLo = f;
      if (side === -1) fhi /= 2;
      side = -1;
    } else {
      hi = next;
      fhi = trueHi = f;
      if (side === 1 && Number.isFinite(flo)) flo /= 2;
      side = 1;
    }
  }
  return result(Math.exp(lo), 'found');
}
