/**
 * The E-value of a risk ratio: the smallest strength of association, on the risk-ratio scale, that a hidden
 * confounder would need with both the exposure and the outcome to move the observed risk ratio to the target
 * (by default to the null, 1), beyond the measured covariates.
 *
 * **Method.** With r = RR/target, inverted when below 1 so that r ≥ 1, E = r + √(r(r − 1)), the solution of
 * B(E, E) = r where B is the bounding factor of Ding & VanderWeele (2016). It is evaluated as
 * E = r + √r·√(r − 1), which never forms r² (no overflow for huge ratios) and keeps every digit near 1
 * (r − 1 is exact there). For r < 1 the same value is computed as (1 + √(1 − r))/r, which avoids rounding 1/r
 * first.
 *
 * **References.** VanderWeele TJ, Ding P (2017). Sensitivity analysis in observational research: introducing
 * the E-value. Annals of Internal Medicine 167(4):268–274, equation in the section "The E-value".
 * Ding P, VanderWeele TJ (2016). Sensitivity analysis without assumptions. Epidemiology 27(3):368–377.
 *
 * **Special cases.** NaN, a negative ratio or a non-positive/NaN target → NaN. r = 1 → 1. A ratio of +Infinity
 * or 0 (or one whose E-value exceeds the largest double) → +Infinity. −0 is treated as 0.
 *
 * @param riskRatio the risk ratio (or a quantity converted to that scale), in [0, +Infinity]
 * @param target the value on the risk-ratio scale to shift the estimate to instead of the null, in (0, +Infinity)
 * @returns the E-value, in [1, +Infinity], or NaN outside the domain
 */
export function eValue(riskRatio: number, target = 1): number {
  if (!(riskRatio >= 0) || !(target > 0) || target === Infinity) return NaN;
  // r = RR/target, computed from whichever side of 1 keeps the quotient exact when target = 1.
  const r = target === 1 ? riskRatio : riskRatio / target;
  if (r === 1) return 1;
  if (r === 0) return Infinity; // also for −0, which would give −Infinity below
  if (r > 1) return r + Math.sqrt(r) * Math.sqrt(r - 1);
  return (1 + Math.sqrt(1 - r)) / r;
}

/** Which interval limit the interval E-value was taken from: `none` when the interval contains the target. */
export type IntervalLimitUsed = 'lower' | 'upper' | 'none';

/** The E-value for a confidence interval, and the limit it used. */
export interface IntervalEValue {
  readonly eValue: number;
  readonly limitUsed: IntervalLimitUsed;
}

/**
 * The E-value for a confidence interval: the E-value of the limit nearer the target, or exactly 1 when the
 * interval contains the target (a limit equal to the target counts as containing it).
 *
 * **Method.** With the estimate above the target, the lower limit is the nearer one; below the target, the
 * upper limit. An estimate equal to the target gives 1. All values are on the risk-ratio scale.
 *
 * **References.** VanderWeele TJ, Ding P (2017). Sensitivity analysis in observational research: introducing
 * the E-value. Annals of Internal Medicine 167(4):268–274, section "E-value for the confidence interval".
 *
 * **Special cases.** Any NaN argument, a negative limit, or limits that do not enclose the estimate → NaN
 * with limit `none`. A limit of 0 or +Infinity on the far side is allowed.
 *
 * @param estimate the risk-ratio-scale estimate, in [0, +Infinity]
 * @param lower the lower limit, in [0, estimate]
 * @param upper the upper limit, in [estimate, +Infinity]
 * @param target the risk-ratio-scale target, in (0, +Infinity)
 */
export function intervalEValue(estimate: number, lower: number, upper: number, target = 1): IntervalEValue {
  if (!(lower >= 0) || !(lower <= estimate) || !(estimate <= upper) || !(target > 0) || target === Infinity) {
    return { eValue: NaN, limitUsed: 'none' };
  }
  if (estimate > target) {
    return lower <= target ? { eValue: 1, limitUsed: 'none' } : { eValue: eValue(lower, target), limitUsed: 'lower' };
  }
  if (estimate < target) {
    return upper >= target ? { eValue: 1, limitUsed: 'none' } : { eValue: eValue(upper, target), limitUsed: 'upper' };
  }
  return { eValue: 1, limitUsed: 'none' };
}
