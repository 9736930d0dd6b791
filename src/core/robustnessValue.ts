import { studentTQuantile } from './studentT';

/**
 * The robustness value RV_q: the partial R² that an omitted confounder would need with both the treatment and
 * the outcome (the same value for each) to reduce the estimate's magnitude by the fraction q (q = 1: to zero).
 *
 * **Method.** With f_q = q·|t|/√df (q times the partial Cohen's f of the treatment with the outcome),
 * RV_q = ½(√(f_q⁴ + 4f_q²) − f_q²), evaluated in the equal but cancellation-free form 2/(1 + √(1 + 4/f_q²)).
 * It solves R²·R²/(1 − R²) = f_q², where the bias |est|·√(R²yz·R²dz/(1 − R²dz))/f equals q·|est|.
 *
 * **References.** Cinelli C, Hazlett C (2020). Making sense of sensitivity: extending omitted variable bias.
 * Journal of the Royal Statistical Society, Series B 82(1):39–67, §4 (the robustness value RV_q; section
 * recalled, equation number not checked against the print).
 *
 * **Special cases.** NaN, df ≤ 0, df = Infinity or q < 0 → NaN. t = 0 or q = 0 → 0. |t| = Infinity → 1.
 *
 * @param t the treatment's t-statistic in the outcome regression, any real number
 * @param df the residual degrees of freedom of that regression, in (0, +Infinity)
 * @param q the fraction of the estimate to be explained away, in [0, +Infinity); default 1
 */
export function robustnessValue(t: number, df: number, q = 1): number {
  if (Number.isNaN(t) || !(df > 0) || df === Infinity || !(q >= 0) || q === Infinity) return NaN;
  const f = (q * Math.abs(t)) / Math.sqrt(df);
  return rootOfEqualStrength(f);
}

/**
 * The robustness value RV_{q,α}: the partial R² that an omitted confounder would need with both the treatment
 * and the outcome so that a t-test of the null "the effect is (1 − q) times the estimate" would no longer reject
 * at level α (two-sided). With q = 1: the strength that makes the adjusted estimate lose significance.
 *
 * **Method.** With f_q = q|t|/√df and f* = t* / √(df − 1), where t* is the 1 − α/2 quantile of Student's t with
 * df − 1 degrees of freedom (the confounder adds one regressor):
 *  - RV_{q,α} = 0 when f_q ≤ f* (already not significant);
 *  - RV_{q,α} = (f_q² − f*²)/(1 + f_q²) when f_q ≥ 1/f*: then the cheapest such confounder lies off the
 *    diagonal, with R²dz = RV_{q,α} and R²yz = RV_{q,α}/(RV_{q,α} + f*²) < RV_{q,α};
 *  - otherwise RV_{q,α} = ½(√(f_a⁴ + 4f_a²) − f_a²) with f_a = f_q − f* (the diagonal point, evaluated as
 *    2/(1 + √(1 + 4/f_a²))).
 * The two non-zero branches agree at f_q = 1/f*.
 *
 * **References.** Cinelli C, Hazlett C (2020). Making sense of sensitivity: extending omitted variable bias.
 * JRSS-B 82(1):39–67, §4 (the robustness value RV_{q,α} and its case f_q > 1/f*). The branch rule was
 * re-derived from the definition (the smallest max(R²yz, R²dz) that brings the adjusted t to t*) and checked
 * against direct numerical minimisation in test/reference/ovb.json.
 *
 * **Special cases.** NaN, df ≤ 1, df = Infinity, q < 0 or α outside (0, 1) → NaN. t = 0 or q = 0 → 0.
 *
 * @param t the treatment's t-statistic in the outcome regression, any real number
 * @param df the residual degrees of freedom of that regression, in (1, +Infinity)
 * @param q the fraction of the estimate to be explained away, in [0, +Infinity); default 1
 * @param alpha the two-sided significance level, in (0, 1); default 0.05
 */
export function robustnessValueAtLevel(t: number, df: number, q = 1, alpha = 0.05): number {
  if (Number.isNaN(t) || !(df > 1) || df === Infinity || !(q >= 0) || q === Infinity) return NaN;
  if (!(alpha > 0 && alpha < 1)) return NaN;
  const fq = (q * Math.abs(t)) / Math.sqrt(df);
  const fCritical = criticalF(df, alpha);
  if (!(fq > fCritical)) return 0;
  if (fq === Infinity) return 1;
  if (fq * fCritical >= 1) {
    // (f_q² − f*²)/(1 + f_q²), divided through by f_q² so that a huge f_q cannot overflow.
    const ratio = fCritical / fq;
    return ((1 - ratio) * (1 + ratio)) / (1 + 1 / (fq * fq));
  }
  return rootOfEqualStrength(fq - fCritical);
}

/**
 * f* = t* / √(df − 1): the critical value of the adjusted t-test on the partial-f scale, with t* the 1 − α/2
 * quantile of Student's t with df − 1 degrees of freedom (Cinelli & Hazlett 2020, §4: the regression that
 * includes the confounder has one degree of freedom fewer).
 */
export function criticalF(df: number, alpha: number): number {
  return studentTQuantile(1 - alpha / 2, df - 1) / Math.sqrt(df - 1);
}

/** The x in [0, 1) with x²/(1 − x) = f², i.e. ½(√(f⁴ + 4f²) − f²), written without cancellation. */
function rootOfEqualStrength(f: number): number {
  if (f === 0) return 0;
  if (f === Infinity) return 1;
  return 2 / (1 + Math.sqrt(1 + 4 / (f * f)));
}
