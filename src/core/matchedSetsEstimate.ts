import type { MatchedSetsLayout } from './matchedSetsGrouping';
import type { MatchedSetsMStatistic, MStatisticBounds } from './matchedSetsMStatistic';
import { upperNormalQuantile } from './upperNormalTail';

/** The m-estimate of the effect under bias at most Γ: its range and the sensitivity interval. */
export interface MEstimateUnderBias {
  readonly gamma: number;
  /** Smallest estimate a bias of at most Γ allows: solves T(τ) = E_upper(τ). */
  readonly estimateLow: number;
  /** Largest: solves T(τ) = E_lower(τ). */
  readonly estimateHigh: number;
  /** Lower end of the two-sided 1 − α sensitivity interval; null when unbounded below. */
  readonly intervalLow: number | null;
  /** Upper end; null when unbounded above. */
  readonly intervalHigh: number | null;
}

/**
 * The range of τ over which the statistic is not constant, widened a little: below it every treated outcome
 * shifted by −τ exceeds every control of its set by at least cσ (ψ saturated), above it the reverse; every
 * equation in τ here changes sign within it or not at all.
 */
export function mEstimateBracket(layout: MatchedSetsLayout, scale: number, trim: number): [number, number] {
  let lo = Infinity;
  let hi = -Infinity;
  const { start, values } = layout;
  for (let s = 0; s < layout.sets; s++) {
    const t = values[start[s]];
    for (let j = start[s] + 1; j < start[s + 1]; j++) {
      const d = t - values[j];
      if (d < lo) lo = d;
      if (d > hi) hi = d;
    }
  }
  const margin = trim * scale + 0.01 * (hi - lo + trim * scale);
  return [lo - margin, hi + margin];
}

/**
 * Rosenbaum's m-estimate of an additive effect τ at Γ = 1 (no hidden bias): the τ at which the m-statistic of
 * the treated outcomes shifted by −τ equals its null expectation.
 *
 * **Method.** T(τ) − E_{Γ=1}(τ) (see `matchedSetsMStatistic`, σ kept at its no-effect value) is continuous,
 * piecewise linear and non-increasing in τ, positive below and negative above the bracket of
 * `mEstimateBracket`; its root is found by Brent's method to about 10⁻¹³ of the bracket's width.
 *
 * **References.** Rosenbaum PR (2007) Sensitivity analysis for m-estimates, tests, and confidence intervals in
 * matched observational studies. Biometrics 63(2):456–464 (recalled from memory). Brent RP (1973) Algorithms
 * for Minimization without Derivatives, Prentice-Hall, ch. 4 (zeroin).
 *
 * **Special cases.** When the root is a whole interval (T flat at its expectation) a point of it is returned.
 *
 * @param statistic the evaluator from `matchedSetsMStatistic`
 * @param bracket from `mEstimateBracket`
 */
export function mEstimate(statistic: MatchedSetsMStatistic, bracket: readonly [number, number]): number {
  const root = brentRoot((tau) => {
    const b = statistic.at(tau, 1, 'upper');
    return b.statistic - b.upperExpectation;
  }, bracket[0], bracket[1]);
  return root ?? (bracket[0] + bracket[1]) / 2;
}

/**
 * The m-estimate's range and the two-sided sensitivity interval under bias at most Γ.
 *
 * **Method.** With T(τ) and its separable bounds E, V for the treated outcomes shifted by −τ (σ fixed): the
 * range is [τ_low, τ_high] with T(τ_low) = E_upper(τ_low) and T(τ_high) = E_lower(τ_high); the interval solves
 * T − E_upper = z√V_upper (low end) and T − E_lower = −z√V_lower (high end), z the upper α/2 normal quantile.
 * Each root by Brent's method on the bracket of `mEstimateBracket`; an interval end whose equation does not
 * change sign there (the test cannot reject however far τ goes) is null.
 *
 * **References.** Rosenbaum PR (2007) Biometrics 63(2):456–464 (recalled from memory); Brent RP (1973)
 * Algorithms for Minimization without Derivatives, ch. 4.
 *
 * **Special cases.** Γ = 1: low = high = the m-estimate.
 *
 * @param statistic the evaluator from `matchedSetsMStatistic`
 * @param bracket from `mEstimateBracket`
 * @param gamma Γ ≥ 1
 * @param alpha the interval's level is 1 − α, α in (0, 1)
 */
export function mEstimateUnderBias(
  statistic: MatchedSetsMStatistic,
  bracket: readonly [number, number],
  gamma: number,
  alpha: number,
): MEstimateUnderBias {
  const z = upperNormalQuantile(alpha / 2);
  const [a, b] = bracket;
  const solve = (side: 'upper' | 'lower', f: (x: MStatisticBounds) => number): number | null =>
    brentRoot((tau) => f(statistic.at(tau, gamma, side)), a, b);
  const estimateLow = solve('upper', (x) => x.statistic - x.upperExpectation);
  const estimateHigh = gamma === 1 ? estimateLow : solve('lower', (x) => x.statistic - x.lowerExpectation);
  const intervalLow = solve('upper', (x) => x.statistic - x.upperExpectation - z * Math.sqrt(x.upperVariance));
  const intervalHigh = solve('lower', (x) => x.statistic - x.lowerExpectation + z * Math.sqrt(x.lowerVariance));
  const mid = (a + b) / 2;
  return Object.freeze({ gamma, estimateLow: estimateLow ?? mid, estimateHigh: estimateHigh ?? mid, intervalLow, intervalHigh });
}

/**
 * A root of f in [a, b] by Brent's method (zeroin), or null unless f(a) > 0 > f(b) (the equations here are
 * decreasing through their roots). Stops when the bracket is narrower than 4ε|x| + 10⁻¹³(b − a).
 */
function brentRoot(f: (x: number) => number, a: number, b: number): number | null {
  let fa = f(a);
  let fb = f(b);
  if (!(fa > 0 && fb < 0)) return null;
  const xtol = 1e-13 * (b - a);
  let c = a;
  let fc = fa;
  let d = b - a;
  let e = d;
  for (let i = 0; i < 200; i++) {
    if ((fb > 0 && fc > 0) || (fb < 0 && fc < 0)) {
      c = a;
      fc = fa;
      d = e = b - a;
    }
    if (Math.abs(fc) < Math.abs(fb)) {
      a = b;
      b = c;
      c = a;
      fa = fb;
      fb = fc;
      fc = fa;
    }
    const tol = 2 * Number.EPSILON * Math.abs(b) + xtol / 2;
    const m = (c - b) / 2;
    if (Math.abs(m) <= tol || fb === 0) return b;
    if (Math.abs(e) >= tol && Math.abs(fa) > Math.abs(fb)) {
      // Inverse quadratic interpolation, or the secant step when only two points differ.
      let p: number;
      let q: number;
      const s = fb / fa;
      if (a === c) {
        p = 2 * m * s;
        q = 1 - s;
      } else {
        const r = fb / fc;
        const t = fa / fc;
        p = s * (2 * m * t * (t - r) - (b - a) * (r - 1));
        q = (t - 1) * (r - 1) * (s - 1);
      }
      if (p > 0) q = -q;
      else p = -p;
      if (2 * p < Math.min(3 * m * q - Math.abs(tol * q), Math.abs(e * q))) {
        e = d;
        d = p / q;
      } else {
        d = m;
        e = m;
      }
    } else {
      d = m;
      e = m;
    }
    a = b;
    fa = fb;
    b += Math.abs(d) > tol ? d : m > 0 ? tol : -tol;
    fb = f(b);
  }
  return b;
}
