import { confidenceZ } from './confidenceZ';

/** The effect measures an E-value can start from. */
export type EffectMeasure = 'rr' | 'or' | 'hr' | 'smd' | 'md';

/** All effect measures, in the order they are offered. */
export const EFFECT_MEASURES: readonly EffectMeasure[] = Object.freeze(['rr', 'or', 'hr', 'smd', 'md']);

/** Each measure's name in prose (lower case). */
export const EFFECT_MEASURE_NAMES: Readonly<Record<EffectMeasure, string>> = Object.freeze({
  rr: 'risk ratio',
  or: 'odds ratio',
  hr: 'hazard ratio',
  smd: 'standardized mean difference',
  md: 'mean difference',
});

/** Whether the outcome is rare (under about 15% in every exposure group) or common. */
export type OutcomePrevalence = 'rare' | 'common';

export const OUTCOME_PREVALENCES: readonly OutcomePrevalence[] = Object.freeze(['rare', 'common']);

/** The measures stated as ratios (positive, null 1); the others are differences (null 0). */
export function isRatioMeasure(measure: EffectMeasure): boolean {
  return measure === 'rr' || measure === 'or' || measure === 'hr';
}

/** The value of no effect on the measure's own scale: 1 for ratios, 0 for differences. */
export function nullValue(measure: EffectMeasure): number {
  return isRatioMeasure(measure) ? 1 : 0;
}

/**
 * An odds ratio on the risk-ratio scale.
 *
 * **Method.** Rare outcome: the odds ratio approximates the risk ratio and is used as it is. Common outcome:
 * RR ≈ √OR, the square-root transform.
 *
 * **References.** VanderWeele TJ (2017). On a square-root transformation of the odds ratio for a common
 * outcome. Epidemiology 28(6):e58–e60 (recalled from memory). VanderWeele TJ, Ding P (2017). Sensitivity analysis in observational
 * research: introducing the E-value. Annals of Internal Medicine 167(4):268–274, Table 2.
 *
 * **Special cases.** NaN or a negative ratio → NaN; 0 → 0; +Infinity → +Infinity.
 *
 * @param oddsRatio the odds ratio, in [0, +Infinity]
 * @param prevalence whether the outcome is rare or common
 */
export function oddsRatioToRiskRatio(oddsRatio: number, prevalence: OutcomePrevalence): number {
  if (!(oddsRatio >= 0)) return NaN;
  return prevalence === 'rare' ? oddsRatio : Math.sqrt(oddsRatio);
}

/**
 * A hazard ratio on the risk-ratio scale.
 *
 * **Method.** Rare outcome: the hazard ratio approximates the risk ratio and is used as it is. Common outcome:
 * RR ≈ (1 − 0.5^√HR)/(1 − 0.5^√(1/HR)), evaluated as expm1(−ln2·√HR)/expm1(−ln2/√HR) so that neither the
 * numerator nor the denominator loses digits to cancellation (HR near 1, or huge and tiny ratios).
 *
 * **References.** VanderWeele TJ (2020). Optimal approximate conversions of odds ratios and hazard ratios to
 * risk ratios. Biometrics 76(3):746–752.
 *
 * **Special cases.** NaN or a negative ratio → NaN; 1 → 1; 0 → 0; +Infinity → +Infinity. The conversion is
 * increasing, and maps HR to 1/RR(1/HR) exactly (it is symmetric on the log scale).
 *
 * @param hazardRatio the hazard ratio, in [0, +Infinity]
 * @param prevalence whether the outcome is rare or common
 */
export function hazardRatioToRiskRatio(hazardRatio: number, prevalence: OutcomePrevalence): number {
  if (!(hazardRatio >= 0)) return NaN;
  if (prevalence === 'rare') return hazardRatio;
  if (hazardRatio === 1) return 1;
  if (hazardRatio === 0) return 0;
  if (hazardRatio === Infinity) return Infinity;
  const root = Math.sqrt(hazardRatio);
  return Math.expm1(-Math.LN2 * root) / Math.expm1(-Math.LN2 / root);
}

/** The slope linking a standardized mean difference to the log risk ratio: log RR ≈ 0.91·d. */
export const SMD_LOG_RISK_RATIO_SLOPE = 0.91;

/**
 * A standardized mean difference on the risk-ratio scale.
 *
 * **Method.** RR ≈ exp(0.91·d), from the relation between a standardized mean difference and the log odds
 * ratio of a dichotomised outcome (log OR ≈ 1.81·d) followed by the square-root transform for a common
 * outcome.
 *
 * **References.** VanderWeele TJ, Ding P (2017). Sensitivity analysis in observational research: introducing
 * the E-value. Annals of Internal Medicine 167(4):268–274, Table 2 (continuous outcomes).
 * Hasselblad V, Hedges LV (1995). Meta-analysis of screening and diagnostic tests. Psychological Bulletin
 * 117(1):167–178 (the logistic approximation behind the slope).
 *
 * **Special cases.** NaN → NaN; ±Infinity → +Infinity / 0; results beyond the double range overflow to
 * +Infinity or underflow to 0 (|d| above about 780).
 *
 * @param d the standardized mean difference, in [−Infinity, +Infinity]
 */
export function smdToRiskRatio(d: number): number {
  return Math.exp(SMD_LOG_RISK_RATIO_SLOPE * d);
}

/**
 * The multiplier of the SE of d printed for a 95% interval on the log-risk-ratio scale: 0.91 × 1.96 = 1.7836,
 * rounded to 1.78 in print. Kept for reference only: {@link smdIntervalMultiplier} uses 0.91·z at every level
 * (1.78 at exactly 95% would make the interval E-value jump between the levels 0.95 and 0.9500001).
 */
export const SMD_PUBLISHED_95_MULTIPLIER = 1.78;

/**
 * The multiplier m of SE(d) in the interval exp(0.91·d ± m·SE(d)) for a standardized mean difference.
 *
 * **Method.** On the log-risk-ratio scale the interval d ± z·SE becomes 0.91·d ± 0.91·z·SE, so m = 0.91·z with
 * z the two-sided normal critical value for the level, at every level (continuous in the level). At 95% this
 * is 1.7836; the published table prints it rounded as 1.78 (0.91 × 1.96), which agrees to the printed
 * precision.
 *
 * **References.** VanderWeele TJ, Ding P (2017). Sensitivity analysis in observational research: introducing
 * the E-value. Annals of Internal Medicine 167(4):268–274, Table 2 (1.78 = 0.91 × 1.96 rounded).
 *
 * **Special cases.** A level outside (0, 1) or NaN → NaN.
 *
 * @param level the confidence level, in (0, 1)
 */
export function smdIntervalMultiplier(level: number): number {
  return SMD_LOG_RISK_RATIO_SLOPE * confidenceZ(level);
}

/** How a value reaches the risk-ratio scale. */
export type RiskRatioConversion =
  | 'none'
  | 'odds-ratio-rare-outcome'
  | 'odds-ratio-square-root'
  | 'hazard-ratio-rare-outcome'
  | 'hazard-ratio-common-outcome'
  | 'standardized-mean-difference'
  | 'mean-difference-via-sd';

/** The settings that decide the conversion of a measure to the risk-ratio scale. */
export interface RiskRatioScaleSettings {
  readonly measure: EffectMeasure;
  /** Required for odds and hazard ratios. */
  readonly outcomePrevalence?: OutcomePrevalence | null;
  /** The outcome's standard deviation, required for a mean difference. */
  readonly sd?: number | null;
}

/** Names the conversion used for a measure (for the result's description). */
export function riskRatioConversion(settings: RiskRatioScaleSettings): RiskRatioConversion {
  switch (settings.measure) {
    case 'rr':
      return 'none';
    case 'or':
      return settings.outcomePrevalence === 'common' ? 'odds-ratio-square-root' : 'odds-ratio-rare-outcome';
    case 'hr':
      return settings.outcomePrevalence === 'common' ? 'hazard-ratio-common-outcome' : 'hazard-ratio-rare-outcome';
    case 'smd':
      return 'standardized-mean-difference';
    case 'md':
      return 'mean-difference-via-sd';
  }
}

/**
 * One value of a measure (an estimate, a limit or a target) on the risk-ratio scale, by the measure's
 * approximation: the same conversion for the estimate, its limits and the target, so that they stay comparable.
 *
 * **Method.** rr: unchanged; or/hr: {@link oddsRatioToRiskRatio} / {@link hazardRatioToRiskRatio}; smd:
 * {@link smdToRiskRatio}; md: d = MD/SD first, then as smd.
 *
 * **References.** As for each conversion.
 *
 * **Special cases.** NaN in → NaN out; a missing prevalence (or/hr) or SD (md) → NaN.
 *
 * @param value the value on the measure's own scale
 * @param settings the measure, and the outcome prevalence or SD where the measure needs one
 */
export function toRiskRatioScale(value: number, settings: RiskRatioScaleSettings): number {
  const { measure, outcomePrevalence, sd } = settings;
  switch (measure) {
    case 'rr':
      return value >= 0 ? value : NaN;
    case 'or':
      return outcomePrevalence ? oddsRatioToRiskRatio(value, outcomePrevalence) : NaN;
    case 'hr':
      return outcomePrevalence ? hazardRatioToRiskRatio(value, outcomePrevalence) : NaN;
    case 'smd':
      return smdToRiskRatio(value);
    case 'md':
      return typeof sd === 'number' && sd > 0 ? smdToRiskRatio(value / sd) : NaN;
  }
}
