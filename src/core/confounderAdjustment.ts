/**
 * Which way an omitted confounder is assumed to move the estimate: `toward-zero` (the bias has the estimate's
 * sign, so removing it shrinks the estimate's magnitude; the usual, conservative choice) or `away-from-zero`
 * (removing the bias grows the magnitude).
 */
export type BiasDirection = 'toward-zero' | 'away-from-zero';

/** The reported numbers of a regression coefficient. */
export interface RegressionEstimate {
  /** The treatment's coefficient. */
  readonly estimate: number;
  /** Its standard error. */
  readonly se: number;
  /** Residual degrees of freedom of the regression, n − (number of coefficients). */
  readonly df: number;
}

/** The strength of a hypothetical confounder Z, as two partial R². */
export interface ConfounderStrength {
  /** R²(D~Z|X): share of the treatment's residual variance (after the covariates) that Z explains. */
  readonly r2dz: number;
  /** R²(Y~Z|D,X): share of the outcome's residual variance (after treatment and covariates) that Z explains. */
  readonly r2yz: number;
}

/** The estimate as it would be after also adjusting for the confounder. */
export interface AdjustedEstimate {
  /** The size of the omitted-variable bias, |β̂ − β̂_adjusted| ≥ 0. */
  readonly bias: number;
  readonly estimate: number;
  readonly se: number;
  /** estimate/se (the t-statistic for the null value 0). */
  readonly t: number;
  /** df − 1: the regression that includes Z has one more coefficient. */
  readonly df: number;
  /**
   * Whether the adjusted t is a finite number. False when R²yz = 1 (the confounder explains all of the
   * outcome's residual variance: adjusted se 0) or R²dz = 1, or for invalid input: say in words that the
   * adjusted t is not available rather than showing it.
   */
  readonly tAvailable: boolean;
}

/**
 * The size of the omitted-variable bias of a regression coefficient caused by a confounder with the given
 * partial R²s.
 *
 * **Method.** |bias| = √(R²yz·R²dz/(1 − R²dz))·sd(Y⊥D,X)/sd(D⊥X), the bias formula written with partial
 * R²s; the ratio of residual standard deviations equals se·√df, so only reported numbers are needed.
 *
 * **References.** Cinelli C, Hazlett C (2020). Making sense of sensitivity: extending omitted variable bias.
 * Journal of the Royal Statistical Society, Series B 82(1):39–67, §3 (the bias in terms of partial R²s and the
 * standard error; section recalled, equation number not checked against the print). Verified by refitting
 * with a constructed confounder (test/reference/ovb.json, swiss.check_constructed_Z).
 *
 * **Special cases.** NaN, se < 0, df ≤ 0, or a partial R² outside [0, 1] → NaN. R²dz = 1 with R²yz > 0 →
 * Infinity; R²yz = 0 or R²dz = 0 → 0.
 *
 * @param se the standard error of the estimate, in [0, +Infinity)
 * @param df residual degrees of freedom, in (0, +Infinity)
 * @param strength R²dz in [0, 1] and R²yz in [0, 1]
 */
export function omittedVariableBias(se: number, df: number, strength: ConfounderStrength): number {
  const { r2dz, r2yz } = strength;
  if (!(se >= 0) || !(df > 0) || !inUnit(r2dz) || !inUnit(r2yz)) return NaN;
  if (r2dz === 0 || r2yz === 0) return 0;
  if (r2dz === 1) return Infinity;
  return se * Math.sqrt(df) * Math.sqrt((r2yz * r2dz) / (1 - r2dz));
}

/**
 * The estimate, standard error and t-statistic the regression would show if the confounder had been
 * included.
 *
 * **Method.** adjusted estimate = sign(β̂)·(|β̂| ∓ bias) (minus for `toward-zero`, plus for
 * `away-from-zero`; the sign of 0 is taken as +); adjusted se = se·√((1 − R²yz)/(1 − R²dz))·√(df/(df − 1));
 * adjusted t = adjusted estimate / adjusted se, with df − 1 degrees of freedom.
 *
 * **References.** Cinelli C, Hazlett C (2020), JRSS-B 82(1):39–67, §3–4 (bias and the standard error of the
 * adjusted estimate, in partial R²s). Checked against a refit with a constructed confounder in
 * test/reference/ovb.json.
 *
 * **Special cases.** Any NaN, se < 0, df ≤ 1, or partial R² outside [0, 1] → every field NaN. R²dz = 1 →
 * infinite bias (estimate ∓Infinity, se Infinity·0 → NaN when R²yz = 1). R²yz = 1 (and R²dz < 1) → se 0 and
 * t = ±Infinity (NaN if the adjusted estimate is exactly 0); `tAvailable` is false in all these cases.
 *
 * @param reported the estimate, its se and df (df > 1)
 * @param strength the confounder's R²dz and R²yz, each in [0, 1]
 * @param direction `toward-zero` (default) or `away-from-zero`
 */
export function adjustForConfounder(
  reported: RegressionEstimate,
  strength: ConfounderStrength,
  direction: BiasDirection = 'toward-zero',
): AdjustedEstimate {
  const { estimate, se, df } = reported;
  const { r2dz, r2yz } = strength;
  if (!Number.isFinite(estimate) || !(se >= 0) || !(df > 1) || !inUnit(r2dz) || !inUnit(r2yz)) {
    return { bias: NaN, estimate: NaN, se: NaN, t: NaN, df: NaN, tAvailable: false };
  }
  const bias = omittedVariableBias(se, df, strength);
  const sign = estimate < 0 ? -1 : 1;
  const magnitude = direction === 'toward-zero' ? Math.abs(estimate) - bias : Math.abs(estimate) + bias;
  const adjustedEstimate = sign * magnitude;
  const adjustedSe = se * Math.sqrt((1 - r2yz) / (1 - r2dz)) * Math.sqrt(df / (df - 1));
  const t = adjustedEstimate / adjustedSe;
  return { bias, estimate: adjustedEstimate, se: adjustedSe, t, df: df - 1, tAvailable: Number.isFinite(t) && adjustedSe > 0 };
}

function inUnit(x: number): boolean {
  return x >= 0 && x <= 1;
}

/**
 * The adjusted estimate (or adjusted t for a null value) on a grid of confounder strengths, for contour plots:
 * `values[j·nb + i]` is the value at R²dz = r2dzValues[i], R²yz = r2yzValues[j]. The same formulas as
 * {@link adjustForConfounder}, with the per-row and per-column factors computed once.
 *
 * **References.** Cinelli C, Hazlett C (2020), JRSS-B 82(1):39–67, §3–4.
 *
 * **Special cases.** As {@link adjustForConfounder}, cell by cell (NaN for invalid input).
 *
 * @param quantity `estimate` for the adjusted estimate; `t` for (adjusted estimate − nullValue)/adjusted se
 * @param nullValue the null value of the t-statistic (ignored for `estimate`)
 */
export function adjustedGrid(
  reported: RegressionEstimate,
  direction: BiasDirection,
  r2dzValues: ArrayLike<number>,
  r2yzValues: ArrayLike<number>,
  quantity: 'estimate' | 't',
  nullValue = 0,
): Float64Array {
  const nb = r2dzValues.length;
  const na = r2yzValues.length;
  const out = new Float64Array(nb * na);
  const { estimate, se, df } = reported;
  if (!Number.isFinite(estimate) || !(se >= 0) || !(df > 1)) return out.fill(NaN);
  const sign = estimate < 0 ? -1 : 1;
  const towards = direction === 'toward-zero' ? -1 : 1;
  const scale = se * Math.sqrt(df);
  const seFactor = se * Math.sqrt(df / (df - 1));
  const biasColumn = new Float64Array(nb);
  const seColumn = new Float64Array(nb);
  for (let i = 0; i < nb; i++) {
    const b = r2dzValues[i];
    const valid = b >= 0 && b <= 1;
    biasColumn[i] = !valid ? NaN : b === 0 ? 0 : b === 1 ? Infinity : scale * Math.sqrt(b / (1 - b));
    seColumn[i] = valid ? 1 / Math.sqrt(1 - b) : NaN;
  }
  for (let j = 0; j < na; j++) {
    const a = r2yzValues[j];
    const valid = a >= 0 && a <= 1;
    const rootA = valid ? Math.sqrt(a) : NaN;
    const rootOneMinusA = valid ? Math.sqrt(1 - a) : NaN;
    const row = j * nb;
    for (let i = 0; i < nb; i++) {
      const bias = a === 0 ? (Number.isNaN(biasColumn[i]) ? NaN : 0) : rootA * biasColumn[i];
      const adjusted = sign * (Math.abs(estimate) + towards * bias);
      out[row + i] = quantity === 'estimate' ? adjusted : (adjusted - nullValue) / (seFactor * rootOneMinusA * seColumn[i]);
    }
  }
  return out;
}
