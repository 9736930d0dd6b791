/**
 * The bounding factor: the largest factor by which a hidden confounder U with the given strengths can move
 * an observed risk ratio between exposure E and outcome D.
 *
 * **Method.** B = RR_EU·RR_UD/(RR_EU + RR_UD − 1), where RR_EU is the largest risk ratio relating the
 * exposure to any level of U and RR_UD the largest risk ratio relating U to the outcome within an exposure
 * stratum. It is evaluated as 1/(1/s + (1 − 1/s)/l) with s the smaller and l the larger strength, the same
 * quotient divided through by RR_EU·RR_UD: both terms of the denominator are non-negative, nothing overflows,
 * the infinite limits come out right, and the order of the arguments cannot change the last bit.
 *
 * **References.** Ding P, VanderWeele TJ (2016). Sensitivity analysis without assumptions. Epidemiology
 * 27(3):368–377, Theorem 2A (the bounding factor).
 *
 * **Special cases.** NaN, or a strength below 1 → NaN (strengths are stated as ratios ≥ 1; invert a protective
 * association first). Either strength 1 → 1. One strength +Infinity → the other. Both +Infinity → +Infinity.
 * The factor is symmetric in its arguments and never exceeds the smaller one.
 *
 * @param rrExposureConfounder RR_EU, in [1, +Infinity]
 * @param rrConfounderOutcome RR_UD, in [1, +Infinity]
 * @returns B, in [1, min(RR_EU, RR_UD)], or NaN outside the domain
 */
export function boundingFactor(rrExposureConfounder: number, rrConfounderOutcome: number): number {
  const a = rrExposureConfounder;
  const b = rrConfounderOutcome;
  if (!(a >= 1) || !(b >= 1)) return NaN;
  // The smaller strength first, so that B(a, b) = B(b, a) holds exactly in floating point too.
  const lo = Math.min(a, b);
  const hi = Math.max(a, b);
  return 1 / (1 / lo + (1 - 1 / lo) / hi);
}

/**
 * The partner strength on the joint-strength curve: given one strength of a hidden confounder, the other
 * strength it would need for the bounding factor to reach `riskRatio` (to "just explain away" it).
 *
 * **Method.** Solving B(RR_EU, RR_UD) = RR for RR_UD gives RR_UD = RR·(RR_EU − 1)/(RR_EU − RR), which is
 * finite only when RR_EU > RR. The formula is symmetric: swapping the roles of the two strengths gives the
 * same curve.
 *
 * **References.** Ding P, VanderWeele TJ (2016). Sensitivity analysis without assumptions. Epidemiology
 * 27(3):368–377, Section "Sensitivity analysis" (the curve of (RR_EU, RR_UD) pairs with B = RR).
 *
 * **Special cases.** NaN, a risk ratio below 1 or a strength below 1 → NaN. RR = 1 → 1 (no confounding is
 * needed). Strength ≤ RR (with RR > 1) → +Infinity (no partner suffices). Strength +Infinity → RR.
 *
 * @param riskRatio the risk ratio to explain away, stated as ≥ 1 (invert one below 1), in [1, +Infinity)
 * @param strength one of the two strengths (RR_EU or RR_UD), in [1, +Infinity]
 * @returns the other strength needed, in [RR, +Infinity], or NaN outside the domain
 */
export function boundingFactorPartner(riskRatio: number, strength: number): number {
  if (!(riskRatio >= 1) || riskRatio === Infinity || !(strength >= 1)) return NaN;
  if (riskRatio === 1) return 1;
  if (strength <= riskRatio) return Infinity;
  if (strength === Infinity) return riskRatio;
  return (riskRatio * (strength - 1)) / (strength - riskRatio);
}
