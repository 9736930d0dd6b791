import jStat from 'jstat';

/**
 * The two-sided standard-normal critical value for a confidence level: z with P(|Z| ≤ z) = level.
 *
 * **Method.** z = −Φ⁻¹((1 − level)/2), taking the quantile of the small tail so that levels near 1 keep their
 * digits (Φ⁻¹ from jStat: about 1e-15 relative for levels up to 0.9999, about 1e-9 at a tail of 1e-10).
 *
 * **References.** Any statistics text; e.g. Casella G, Berger RL (2002). Statistical Inference, 2nd ed.,
 * Duxbury, Section 9.2.1 (the normal interval estimate ± z·SE).
 *
 * **Special cases.** NaN, or a level outside (0, 1) → NaN. A level of 0.95 gives 1.959963984540054.
 *
 * @param level the confidence level, in (0, 1)
 * @returns z, in (0, +Infinity), or NaN outside the domain
 */
export function confidenceZ(level: number): number {
  if (!(level > 0 && level < 1)) return NaN;
  // Analyses of many estimates ask for the same level again and again: keep the last answer.
  if (level !== lastLevel) {
    lastLevel = level;
    lastZ = -jStat.normal.inv((1 - level) / 2, 0, 1);
  }
  return lastZ;
}

let lastLevel = NaN;
let lastZ = NaN;
