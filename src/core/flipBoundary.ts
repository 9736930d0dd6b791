import type { BiasDirection, ConfounderStrength } from './confounderAdjustment';
import { criticalF } from './robustnessValue';

/** What "the conclusion flips" means: the reported t and df, the fraction q, the level α and the direction. */
export interface FlipSetting {
  /** The treatment's t-statistic as reported. */
  readonly t: number;
  /** Residual degrees of freedom (> 1). */
  readonly df: number;
  /** The fraction of the estimate to explain away (1: down to zero); > 0. */
  readonly q: number;
  /** Two-sided significance level, in (0, 1). */
  readonly alpha: number;
  readonly direction: BiasDirection;
}

/** The set of R²yz values (for one R²dz) where the conclusion is overturned: [lower, upper], or empty. */
export interface R2Interval {
  readonly lower: number;
  readonly upper: number;
  readonly empty: boolean;
}

const EMPTY: R2Interval = Object.freeze({ lower: NaN, upper: NaN, empty: true });

/**
 * The R²yz at which the adjusted estimate reaches (1 − q) times the estimate, for a confounder with the given
 * R²dz: the exact "estimate" flip boundary.
 *
 * **Method.** The bias equals q·|β̂| when R²yz·R²dz/(1 − R²dz) = f_q², with f_q = q|t|/√df; so
 * R²yz = f_q²·(1 − R²dz)/R²dz. Confounders with a larger R²yz (at that R²dz) overturn the estimate. Only a
 * bias toward zero can do so; with `away-from-zero` there is no boundary.
 *
 * **References.** Cinelli C, Hazlett C (2020), JRSS-B 82(1):39–67, §4 (contours of the adjusted estimate and
 * the robustness value as the point where this curve crosses the diagonal).
 *
 * **Special cases.** Invalid setting or R²dz outside [0, 1] → NaN; `away-from-zero` → NaN; R²dz = 0 →
 * +Infinity; R²dz = 1 → 0. Values above 1 mean that no confounder with this R²dz can overturn the estimate.
 */
export function estimateBoundaryR2yz(setting: FlipSetting, r2dz: number): number {
  if (!validSetting(setting) || !(r2dz >= 0 && r2dz <= 1) || setting.direction !== 'toward-zero') return NaN;
  const fq2 = scaledPartialF(setting) ** 2;
  if (r2dz === 0) return fq2 === 0 ? 0 : Infinity;
  return (fq2 * (1 - r2dz)) / r2dz;
}

/**
 * The R²dz at which the adjusted estimate reaches (1 − q) times the estimate for a confounder with the given
 * R²yz (the inverse of {@link estimateBoundaryR2yz}): R²dz = f_q²/(R²yz + f_q²). Used for the extreme
 * scenarios R²yz = 1, 0.75, 0.5.
 *
 * **References.** Cinelli C, Hazlett C (2020), JRSS-B 82(1):39–67, §4–5 (extreme scenarios: the confounder
 * explains all, or a large share, of the outcome's residual variance).
 *
 * **Special cases.** Invalid setting, R²yz outside [0, 1], or `away-from-zero` → NaN. R²yz = 0 → 1 when
 * f_q > 0 (no R²dz below 1 suffices).
 */
export function estimateBoundaryR2dz(setting: FlipSetting, r2yz: number): number {
  if (!validSetting(setting) || !(r2yz >= 0 && r2yz <= 1) || setting.direction !== 'toward-zero') return NaN;
  const fq2 = scaledPartialF(setting) ** 2;
  if (fq2 === 0) return 0;
  return fq2 / (r2yz + fq2);
}

/**
 * For a confounder with the given R²dz, the R²yz values at which the adjusted t-test (null: (1 − q)·β̂,
 * df − 1 degrees of freedom, level α) no longer rejects in the estimate's direction: the exact
 * "significance" flip boundary, solved in closed form along the R²yz axis.
 *
 * **Method.** With f_q = q|t|/√df, f* = t*_{α/2, df−1}/√(df − 1), b = R²dz and R²yz = sin²θ (θ ∈ [0, π/2]), the
 * adjusted t is at most t* exactly when
 *  - toward zero: √b·sin θ + f*·cos θ ≥ f_q·√(1 − b), i.e. R·sin(θ + ψ) ≥ c with R = √(b + f*²),
 *    ψ = atan2(f*, √b), c = f_q√(1 − b): θ ∈ [asin(c/R) − ψ, π − asin(c/R) − ψ];
 *  - away from zero: f*·cos θ − √b·sin θ ≥ c, i.e. R·cos(θ + ψ') ≥ c with ψ' = atan2(√b, f*):
 *    θ ≤ acos(c/R) − ψ'.
 * (Divide the adjusted-t inequality by se·√df and multiply by √(1 − R²dz).) The interval is intersected with
 * [0, π/2] and mapped back by sin².
 *
 * **References.** Cinelli C, Hazlett C (2020), JRSS-B 82(1):39–67, §4 (adjusted t-statistic with df − 1 degrees
 * of freedom; contours of the adjusted t and RV_{q,α}).
 *
 * **Special cases.** Invalid setting or R²dz outside [0, 1) → empty. When the reported t is already not
 * significant the interval starts at 0.
 */
export function significanceBoundaryR2yz(setting: FlipSetting, r2dz: number): R2Interval {
  if (!validSetting(setting) || !(r2dz >= 0 && r2dz < 1)) return EMPTY;
  const fCritical = criticalF(setting.df, setting.alpha);
  return significanceInterval(scaledPartialF(setting), fCritical, r2dz, setting.direction);
}

/** {@link significanceBoundaryR2yz} with f_q and f* already computed (for plots that sweep R²dz). */
export function significanceInterval(fqValue: number, fCritical: number, r2dz: number, direction: BiasDirection): R2Interval {
  if (!(r2dz >= 0 && r2dz < 1) || !(fqValue >= 0) || !(fCritical > 0)) return EMPTY;
  const sb = Math.sqrt(r2dz);
  const c = fqValue * Math.sqrt(1 - r2dz);
  const radius = Math.hypot(sb, fCritical);
  const half = Math.PI / 2;
  if (direction === 'toward-zero') {
    if (c > radius) return EMPTY;
    const psi = Math.atan2(fCritical, sb);
    const s = Math.asin(c / radius);
    const lowAngle = s - psi;
    const highAngle = Math.PI - s - psi;
    if (lowAngle > half || highAngle < 0) return EMPTY;
    return {
      lower: lowAngle <= 0 ? 0 : Math.sin(lowAngle) ** 2,
      upper: highAngle >= half ? 1 : Math.sin(highAngle) ** 2,
      empty: false,
    };
  }
  if (c > fCritical) return EMPTY;
  const psi = Math.atan2(sb, fCritical);
  const highAngle = Math.acos(Math.min(1, c / radius)) - psi;
  if (highAngle < 0) return EMPTY;
  return { lower: 0, upper: highAngle >= half ? 1 : Math.sin(highAngle) ** 2, empty: false };
}

/**
 * The smallest R²dz at which the significance flip region is not empty (its tip): toward zero
 * (f_q² − f*²)/(1 + f_q²) (0 when f_q ≤ f*); away from zero 1 − f*²/f_q² (0 when f_q ≤ f*). Plots add this
 * R²dz to their sweep so the boundary's turning point is drawn exactly.
 */
export function significanceRegionStart(fqValue: number, fCritical: number, direction: BiasDirection): number {
  if (!(fqValue > fCritical)) return 0;
  if (direction === 'toward-zero') return ((fqValue - fCritical) * (fqValue + fCritical)) / (1 + fqValue * fqValue);
  return 1 - (fCritical / fqValue) ** 2;
}

/** Whether a confounder of this strength brings the estimate to (1 − q)·β̂ or beyond (toward zero only). */
export function overturnsEstimate(setting: FlipSetting, strength: ConfounderStrength): boolean {
  if (!validSetting(setting) || setting.direction !== 'toward-zero') return false;
  const { r2dz, r2yz } = strength;
  if (!(r2dz >= 0 && r2dz <= 1 && r2yz >= 0 && r2yz <= 1)) return false;
  if (r2dz === 1) return r2yz > 0 || scaledPartialF(setting) === 0;
  return (r2yz * r2dz) / (1 - r2dz) >= scaledPartialF(setting) ** 2;
}

/**
 * f_q = q·|t|/√df: q times the partial Cohen's f of the treatment with the outcome (Cinelli & Hazlett 2020, §4),
 * the scale on which the robustness values and flip boundaries are written.
 */
export function scaledPartialF(setting: Pick<FlipSetting, 't' | 'df' | 'q'>): number {
  return (setting.q * Math.abs(setting.t)) / Math.sqrt(setting.df);
}

function validSetting(s: FlipSetting): boolean {
  return (
    Number.isFinite(s.t) &&
    s.df > 1 &&
    Number.isFinite(s.df) &&
    s.q > 0 &&
    Number.isFinite(s.q) &&
    s.alpha > 0 &&
    s.alpha < 1 &&
    (s.direction === 'toward-zero' || s.direction === 'away-from-zero')
  );
}
