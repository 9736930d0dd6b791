import { confidenceZ } from './confidenceZ';
import { eValue, intervalEValue } from './eValue';
import type { IntervalLimitUsed } from './eValue';
import type { InputProblem } from './inputProblem';
import { inputProblem, throwIfProblems } from './inputProblem';
import { conventionList, type AnalysisConvention } from './analysisConvention';
import {
  EFFECT_MEASURES,
  EFFECT_MEASURE_NAMES,
  OUTCOME_PREVALENCES,
  SMD_LOG_RISK_RATIO_SLOPE,
  isRatioMeasure,
  nullValue,
  riskRatioConversion,
  smdIntervalMultiplier,
  toRiskRatioScale,
} from './riskRatioScale';
import type { EffectMeasure, OutcomePrevalence, RiskRatioConversion } from './riskRatioScale';
import { twoByTwoRatio, validateTwoByTwoCounts } from './twoByTwo';
import type { TwoByTwoCounts, TwoByTwoEstimate, TwoByTwoMeasure } from './twoByTwo';

/**
 * A reported effect estimate, as it appears in a paper. Optional fields may be left out or set to null.
 * Give either both interval limits or the standard error (or neither).
 */
export interface EValueInput {
  readonly measure: EffectMeasure;
  /** The estimate on the measure's own scale (a ratio, or d, or a mean difference). */
  readonly estimate: number;
  /** The lower confidence limit, on the measure's own scale. */
  readonly lower?: number | null;
  /** The upper confidence limit, on the measure's own scale. */
  readonly upper?: number | null;
  /** The standard error: of the log ratio for rr/or/hr, of d for smd, of the difference for md. */
  readonly se?: number | null;
  /** The confidence level of the interval, in (0, 1); default 0.95. */
  readonly level?: number | null;
  /** Required for odds and hazard ratios: whether the outcome is rare (under about 15%) or common. */
  readonly outcomePrevalence?: OutcomePrevalence | null;
  /** The outcome's standard deviation, required for a mean difference (md). */
  readonly sd?: number | null;
  /** The value to shift the estimate to, on the measure's own scale; default the null (1 for ratios, 0 for differences). */
  readonly target?: number | null;
}

/** The estimate, interval and target on the risk-ratio scale that the E-values are computed from. */
export interface RiskRatioScaleValues {
  readonly estimate: number;
  readonly lower: number | null;
  readonly upper: number | null;
  readonly target: number;
}

/** The E-value analysis of one estimate: frozen, self-describing. */
export interface EValueResult {
  readonly method: string;
  readonly references: readonly string[];
  /** The input as given (a frozen copy). */
  readonly input: EValueInput;
  readonly measure: EffectMeasure;
  readonly level: number;
  /** The interval on the measure's own scale (from the limits, or estimate and SE), or null. */
  readonly interval: { readonly lower: number; readonly upper: number; readonly source: 'limits' | 'standard-error' } | null;
  /** The target on the measure's own scale (the null unless one was named). */
  readonly target: number;
  readonly targetIsNull: boolean;
  readonly riskRatioScale: RiskRatioScaleValues;
  readonly conversion: { readonly kind: RiskRatioConversion; readonly note: string };
  /** The E-value for the estimate. */
  readonly eValueEstimate: number;
  /** The E-value for the interval limit nearer the target (1 when the interval contains it), or null. */
  readonly eValueInterval: number | null;
  readonly intervalLimitUsed: IntervalLimitUsed | null;
  /** Whether the estimate lies above, below or at the target on the risk-ratio scale. */
  readonly direction: 'above-target' | 'below-target' | 'at-target';
  /** The risk-ratio-scale estimate over the target, inverted when below 1: what a confounder must explain. */
  readonly ratioToTarget: number;
  /** The same for the interval limit used (1 when the interval contains the target), or null. */
  readonly intervalRatioToTarget: number | null;
  /**
   * Where the target lies as seen from the estimate: `toward-null` when moving the estimate to the target
   * brings it toward (or past) the null, so the E-values refer to confounding that pushed the estimate away
   * from the null (the usual case, including target = null); `away-from-null` when the target lies beyond the
   * estimate, farther from the null, so the E-values refer to confounding that pushed the estimate toward the
   * null (hiding a larger effect); null when the estimate is at the target.
   */
  readonly targetDirection: 'toward-null' | 'away-from-null' | null;
  /** Every convention this analysis follows, in plain words. */
  readonly conventions: readonly AnalysisConvention[];
  readonly warnings: readonly string[];
}

/**
 * How the 2×2 table was sampled. `cohort` (or a trial, or a cross-sectional sample): exposure groups followed
 * up, so the table gives risks and the risk ratio directly. `case-control`: sampled by outcome, so only the
 * odds ratio is meaningful.
 */
export type StudyDesign = 'cohort' | 'case-control';

export const STUDY_DESIGNS: readonly StudyDesign[] = Object.freeze(['cohort', 'case-control']);

/** A 2×2 table of counts as the source of the estimate. */
export interface EValueCountsInput {
  readonly counts: TwoByTwoCounts;
  readonly measure: TwoByTwoMeasure;
  /**
   * How the table was sampled; default `cohort`. A cohort table with a common outcome analysed on the
   * odds-ratio scale uses the table's own risk ratio (no √OR approximation); a case-control table allows only
   * the odds ratio.
   */
  readonly design?: StudyDesign | null;
  readonly level?: number | null;
  /** Required for an odds ratio. */
  readonly outcomePrevalence?: OutcomePrevalence | null;
  readonly target?: number | null;
}

/** The analysis of a 2×2 table: the E-value result plus the table's ratio and interval. */
export interface EValueCountsResult extends EValueResult {
  /** The ratio actually analysed, with its interval (the risk ratio for a cohort table with a common outcome). */
  readonly table: TwoByTwoEstimate;
  /** The design as given (default `cohort`). */
  readonly design: StudyDesign;
  /** The measure asked for in the input (may differ from `measure` when a cohort table's risk ratio was used). */
  readonly requestedMeasure: TwoByTwoMeasure;
}

const DEFAULT_LEVEL = 0.95;

export const E_VALUE_REFERENCES: readonly string[] = Object.freeze([
  'VanderWeele TJ, Ding P (2017). Sensitivity analysis in observational research: introducing the E-value. Annals of Internal Medicine 167(4):268–274.',
  'Ding P, VanderWeele TJ (2016). Sensitivity analysis without assumptions. Epidemiology 27(3):368–377.',
]);

export const CONVERSION_REFERENCES: Partial<Record<RiskRatioConversion, string>> = {
  'odds-ratio-square-root':
    'VanderWeele TJ (2017). On a square-root transformation of the odds ratio for a common outcome. Epidemiology 28(6):e58–e60 (recalled from memory).',
  'hazard-ratio-common-outcome':
    'VanderWeele TJ (2020). Optimal approximate conversions of odds ratios and hazard ratios to risk ratios. Biometrics 76(3):746–752.',
  'standardized-mean-difference':
    'Hasselblad V, Hedges LV (1995). Meta-analysis of screening and diagnostic tests. Psychological Bulletin 117(1):167–178 (the logistic approximation behind 0.91·d; recalled from memory).',
  'mean-difference-via-sd':
    'Hasselblad V, Hedges LV (1995). Meta-analysis of screening and diagnostic tests. Psychological Bulletin 117(1):167–178 (the logistic approximation behind 0.91·d; recalled from memory).',
};

const MEASURE_NAMES = EFFECT_MEASURE_NAMES;

const isGiven = (value: unknown): boolean => value !== undefined && value !== null;

/**
 * Checks a reported estimate for the E-value analysis and returns every problem at once (empty when usable).
 * Each problem names the input field: a non-number, a non-positive ratio, one limit without the other,
 * reversed limits, an estimate outside its interval, limits together with an SE, a level outside (0, 1),
 * a missing outcome prevalence (odds and hazard ratios), a missing SD (mean difference), or a value too
 * extreme to put on the risk-ratio scale.
 */
export function validateEValueInput(input: EValueInput): InputProblem[] {
  if (input === null || typeof input !== 'object') {
    return [inputProblem('input', 'required', 'needs an object with measure and estimate', input)];
  }
  if (!EFFECT_MEASURES.includes(input.measure)) {
    return [inputProblem('measure', 'unknown-choice', `must be one of ${EFFECT_MEASURES.join(', ')}`, input.measure)];
  }
  const ratio = isRatioMeasure(input.measure);
  const problems: InputProblem[] = [];
  const checkNumber = (field: keyof EValueInput, value: unknown, positive: boolean, required: boolean): boolean => {
    if (!isGiven(value)) {
      if (required) problems.push(inputProblem(field, 'required', 'is required'));
      return false;
    }
    if (typeof value !== 'number' || Number.isNaN(value)) {
      problems.push(inputProblem(field, 'not-a-number', 'must be a number', value));
      return false;
    }
    if (!Number.isFinite(value)) {
      problems.push(inputProblem(field, 'not-finite', 'must be a finite number', value));
      return false;
    }
    if (positive && value <= 0) {
      problems.push(inputProblem(field, 'not-positive', `must be greater than 0${ratio && field !== 'se' && field !== 'sd' ? ' (a ratio is never 0 or negative)' : ''}`, value));
      return false;
    }
    return true;
  };

  const estimateOk = checkNumber('estimate', input.estimate, ratio, true);
  const lowerOk = checkNumber('lower', input.lower, ratio, false);
  const upperOk = checkNumber('upper', input.upper, ratio, false);
  const seOk = checkNumber('se', input.se, true, false);
  checkNumber('target', input.target, ratio, false);
  if (isGiven(input.level) && checkNumber('level', input.level, false, false)) {
    const level = input.level as number;
    if (!(level > 0 && level < 1)) {
      problems.push(inputProblem('level', 'outside-range', 'must be between 0 and 1 (for example 0.95 for a 95% interval)', level));
    }
  }

  if (isGiven(input.lower) !== isGiven(input.upper)) {
    const missing = isGiven(input.lower) ? 'upper' : 'lower';
    problems.push(inputProblem(missing, 'required', 'is needed too: an interval has both a lower and an upper limit'));
  }
  if (lowerOk && upperOk) {
    const lower = input.lower as number;
    const upper = input.upper as number;
    if (lower > upper) {
      problems.push(inputProblem('lower', 'reversed-limits', 'must not exceed the upper limit (are the limits swapped?)', lower));
    } else if (estimateOk && (input.estimate < lower || input.estimate > upper)) {
      problems.push(inputProblem('estimate', 'outside-interval', `must lie within its interval (${lower} to ${upper})`, input.estimate));
    }
  }
  if (isGiven(input.se) && (isGiven(input.lower) || isGiven(input.upper))) {
    problems.push(inputProblem('se', 'interval-and-se', 'give either the interval limits or the standard error, not both', input.se));
  }

  if (input.measure === 'or' || input.measure === 'hr') {
    if (!isGiven(input.outcomePrevalence)) {
      problems.push(
        inputProblem(
          'outcomePrevalence',
          'required',
          `is required for ${MEASURE_NAMES[input.measure]}s: say whether the outcome is rare (under about 15%) or common`,
        ),
      );
    } else if (!OUTCOME_PREVALENCES.includes(input.outcomePrevalence as OutcomePrevalence)) {
      problems.push(inputProblem('outcomePrevalence', 'unknown-choice', 'must be rare or common', input.outcomePrevalence));
    }
  }
  checkNumber('sd', input.sd, true, input.measure === 'md');

  if (problems.length > 0) return problems;

  // Everything is well formed: check that the values survive the conversion to the risk-ratio scale.
  const settings = { measure: input.measure, outcomePrevalence: input.outcomePrevalence, sd: input.sd };
  const usable = (x: number) => x > 0 && x < Infinity;
  if (!usable(toRiskRatioScale(input.estimate, settings))) {
    problems.push(inputProblem('estimate', 'too-extreme', 'is too extreme to put on the risk-ratio scale', input.estimate));
  }
  if (isGiven(input.target) && !usable(toRiskRatioScale(input.target as number, settings))) {
    problems.push(inputProblem('target', 'too-extreme', 'is too extreme to put on the risk-ratio scale', input.target));
  }
  if (problems.length === 0) {
    const rr = riskRatioScaleInterval(input, input.level ?? DEFAULT_LEVEL);
    if (rr && !(usable(rr.lower) && usable(rr.upper))) {
      const field = isGiven(input.se) ? 'se' : !usable(rr.lower) ? 'lower' : 'upper';
      problems.push(inputProblem(field, 'too-extreme', 'gives an interval too wide to put on the risk-ratio scale', input[field]));
    }
  }
  return problems;
}

/**
 * The E-value analysis of a reported estimate: the E-value for the estimate, and for the interval limit
 * nearer the target (1 when the interval contains it), after converting the estimate, limits and target to
 * the risk-ratio scale by the measure's approximation.
 *
 * **Method.** Conversion: {@link toRiskRatioScale}; with an SE, the interval is estimate·exp(±z·SE) for ratio
 * measures (z from the level) and exp(0.91·d ± m·SE) for d, m = {@link smdIntervalMultiplier}(level) (a mean
 * difference is divided by the SD first, its SE too). E-values: {@link eValue} and {@link intervalEValue}.
 *
 * **References.** VanderWeele TJ, Ding P (2017). Sensitivity analysis in observational research: introducing
 * the E-value. Annals of Internal Medicine 167(4):268–274; and the conversion's own reference.
 *
 * **Special cases.** An estimate at the target gives 1 for both E-values. A limit equal to the target counts
 * as containing it (interval E-value 1). Without limits or SE the interval E-value is null.
 *
 * @param input the reported estimate (see {@link EValueInput})
 * @throws InputError carrying every problem found by {@link validateEValueInput}
 */
export function analyseEValue(input: EValueInput): EValueResult {
  throwIfProblems(validateEValueInput(input));
  return buildResult(input, []);
}

/**
 * Checks a 2×2-table input: the counts, the measure, the design (a case-control table cannot give a risk
 * ratio), the level, the prevalence (odds ratio) and the target.
 */
export function validateEValueCountsInput(input: EValueCountsInput): InputProblem[] {
  if (input === null || typeof input !== 'object') {
    return [inputProblem('input', 'required', 'needs an object with counts and measure', input)];
  }
  const problems = validateTwoByTwoCounts(input.counts, 'counts');
  if (input.measure !== 'rr' && input.measure !== 'or') {
    problems.push(inputProblem('measure', 'unknown-choice', 'must be rr or or for a table of counts', input.measure));
    return problems;
  }
  if (isGiven(input.design) && !STUDY_DESIGNS.includes(input.design as StudyDesign)) {
    problems.push(inputProblem('design', 'unknown-choice', 'must be cohort or case-control', input.design));
  } else if (input.design === 'case-control' && input.measure === 'rr') {
    problems.push(
      inputProblem(
        'design',
        'risk-ratio-case-control',
        'a case-control table is sampled by outcome, so its risk ratio means nothing: analyse its odds ratio (measure or) instead',
        input.design,
      ),
    );
  }
  // The remaining fields follow the rules of a reported estimate; the estimate itself comes from the table.
  const reportedProblems = validateEValueInput({
    measure: input.measure,
    estimate: 1,
    level: input.level,
    outcomePrevalence: input.outcomePrevalence,
    target: input.target,
  });
  return problems.concat(reportedProblems);
}

/**
 * The E-value analysis of a 2×2 table: the risk ratio or odds ratio with its log-scale Wald interval
 * ({@link twoByTwoRatio}, 0.5 added to every cell when one is zero, with a warning), then {@link analyseEValue}.
 *
 * **Method.** The design decides the measure. A cohort table gives risks, hence the risk ratio directly: asked
 * for its odds ratio with a common outcome, the analysis uses the table's own risk ratio instead of the √OR
 * approximation (said in a warning and in the conventions); with a rare outcome the odds ratio is used as a
 * risk ratio. A case-control table gives only the odds ratio (measure `rr` is refused): rare outcome → OR ≈ RR,
 * common → RR ≈ √OR.
 *
 * **References.** VanderWeele TJ, Ding P (2017), Ann Intern Med 167(4):268–274; VanderWeele TJ (2017), On a
 * square-root transformation of the odds ratio for a common outcome, Epidemiology 28(6):e58–e60 (recalled
 * from memory); Rothman KJ, Greenland S, Lash TL (2008) Modern Epidemiology, 3rd ed., ch. 14 (the table's
 * ratios and Wald intervals).
 *
 * **Special cases.** As {@link analyseEValue}; an unbounded interval (e.g. a single event) is refused on `counts`.
 *
 * @throws InputError carrying every problem found by {@link validateEValueCountsInput}
 */
export function analyseEValueFromCounts(input: EValueCountsInput): EValueCountsResult {
  throwIfProblems(validateEValueCountsInput(input));
  const level = input.level ?? DEFAULT_LEVEL;
  const design: StudyDesign = (input.design as StudyDesign | null | undefined) ?? 'cohort';
  const useCohortRiskRatio = design === 'cohort' && input.measure === 'or' && input.outcomePrevalence === 'common';
  const measure: TwoByTwoMeasure = useCohortRiskRatio ? 'rr' : input.measure;
  const table = twoByTwoRatio(input.counts, measure, level);
  const reported: EValueInput = {
    measure,
    estimate: table.estimate,
    lower: table.lower,
    upper: table.upper,
    level,
    outcomePrevalence: useCohortRiskRatio ? null : (input.outcomePrevalence ?? null),
    target: useCohortRiskRatio && isGiven(input.target) ? Math.sqrt(input.target as number) : (input.target ?? null),
  };
  // A table's interval can be unbounded (e.g. a single event); check it like a reported one.
  throwIfProblems(validateEValueInput(reported).map((p) => ({ ...p, field: 'counts' })));
  const extraWarnings = [...table.warnings];
  if (useCohortRiskRatio) {
    extraWarnings.push(
      'A cohort table gives the risk ratio directly, so with a common outcome its own risk ratio was used rather than converting its odds ratio by √OR (an approximation for when the risk ratio is not available).' +
        (isGiven(input.target) ? ' The target odds ratio was put on the risk-ratio scale by its square root.' : ''),
    );
  }
  const result = buildResult(reported, extraWarnings);
  const conventions = conventionList();
  for (const c of result.conventions) conventions.add(c.id, c.text);
  conventions.add(
    'study-design',
    design === 'cohort'
      ? useCohortRiskRatio
        ? 'The table is from a cohort (exposure groups followed up), so it gives risks: with a common outcome the table’s own risk ratio is used, not the √OR approximation.'
        : 'The table is from a cohort (exposure groups followed up), so it gives risks and the risk ratio directly.'
      : 'The table is from a case-control study (sampled by outcome), so only its odds ratio is meaningful; it is put on the risk-ratio scale as the outcome is rare (OR ≈ RR) or common (RR ≈ √OR).',
  );
  conventions.add('table-interval', 'The interval is the log-scale Wald interval of the table’s ratio; when a cell is zero, 0.5 is added to every cell.');
  return Object.freeze({
    ...result,
    method: `${MEASURE_NAMES[measure]} from a 2×2 table (${design}) with a log-scale Wald interval; then ${result.method}`,
    references: Object.freeze([...result.references, TWO_BY_TWO_REFERENCE]),
    table,
    design,
    requestedMeasure: input.measure,
    conventions: conventions.list(),
  });
}

const TWO_BY_TWO_REFERENCE =
  'Rothman KJ, Greenland S, Lash TL (2008). Modern Epidemiology, 3rd ed. Lippincott Williams & Wilkins, ch. 14.';

/** The interval on the risk-ratio scale implied by the limits or the SE, or null when neither was given. */
function riskRatioScaleInterval(input: EValueInput, level: number): { lower: number; upper: number } | null {
  const settings = { measure: input.measure, outcomePrevalence: input.outcomePrevalence, sd: input.sd };
  if (isGiven(input.lower) && isGiven(input.upper)) {
    return { lower: toRiskRatioScale(input.lower as number, settings), upper: toRiskRatioScale(input.upper as number, settings) };
  }
  if (!isGiven(input.se)) return null;
  const se = input.se as number;
  if (input.measure === 'smd' || input.measure === 'md') {
    const scale = input.measure === 'md' ? (input.sd as number) : 1;
    const d = input.estimate / scale;
    const halfWidth = smdIntervalMultiplier(level) * (se / scale);
    const centre = SMD_LOG_RISK_RATIO_SLOPE * d;
    return { lower: Math.exp(centre - halfWidth), upper: Math.exp(centre + halfWidth) };
  }
  const { lower, upper } = ownScaleInterval(input, level) as { lower: number; upper: number };
  return { lower: toRiskRatioScale(lower, settings), upper: toRiskRatioScale(upper, settings) };
}

/** The interval on the measure's own scale: the limits as given, or estimate ± z·SE (on the log scale for ratios). */
function ownScaleInterval(input: EValueInput, level: number): { lower: number; upper: number } | null {
  if (isGiven(input.lower) && isGiven(input.upper)) return { lower: input.lower as number, upper: input.upper as number };
  if (!isGiven(input.se)) return null;
  const halfWidth = confidenceZ(level) * (input.se as number);
  if (isRatioMeasure(input.measure)) {
    return { lower: input.estimate * Math.exp(-halfWidth), upper: input.estimate * Math.exp(halfWidth) };
  }
  return { lower: input.estimate - halfWidth, upper: input.estimate + halfWidth };
}

function buildResult(input: EValueInput, extraWarnings: readonly string[]): EValueResult {
  const measure = input.measure;
  const level = input.level ?? DEFAULT_LEVEL;
  const settings = { measure, outcomePrevalence: input.outcomePrevalence, sd: input.sd };
  const target = input.target ?? nullValue(measure);
  const targetIsNull = target === nullValue(measure);

  const rrEstimate = toRiskRatioScale(input.estimate, settings);
  const rrTarget = toRiskRatioScale(target, settings);
  const rrInterval = riskRatioScaleInterval(input, level);
  const ownInterval = ownScaleInterval(input, level);

  const eValueEstimate = eValue(rrEstimate, rrTarget);
  const ratioToTarget = foldAtOne(rrEstimate / rrTarget);
  let eValueInterval: number | null = null;
  let intervalLimitUsed: IntervalLimitUsed | null = null;
  let intervalRatioToTarget: number | null = null;
  if (rrInterval) {
    const fromInterval = intervalEValue(rrEstimate, rrInterval.lower, rrInterval.upper, rrTarget);
    eValueInterval = fromInterval.eValue;
    intervalLimitUsed = fromInterval.limitUsed;
    intervalRatioToTarget =
      fromInterval.limitUsed === 'none' ? 1 : foldAtOne(rrInterval[fromInterval.limitUsed] / rrTarget);
  }

  const kind = riskRatioConversion(settings);
  const warnings = [...extraWarnings, ...ignoredFieldWarnings(input)];
  if (!(eValueEstimate < Infinity)) {
    warnings.push('The E-value is larger than the largest number this computer can represent.');
  }

  const references = [...E_VALUE_REFERENCES];
  const conversionReference = CONVERSION_REFERENCES[kind];
  if (conversionReference) references.push(conversionReference);
  const targetDirection = directionOfTarget(rrEstimate, rrTarget);

  return Object.freeze({
    method: `E-value for the ${MEASURE_NAMES[measure]}${kind === 'none' ? '' : ' converted to the risk-ratio scale'}, against ${targetIsNull ? 'the null' : 'a named target'}`,
    references: Object.freeze(references),
    input: Object.freeze({ ...input }),
    measure,
    level,
    interval: ownInterval
      ? Object.freeze({ ...ownInterval, source: isGiven(input.se) ? ('standard-error' as const) : ('limits' as const) })
      : null,
    target,
    targetIsNull,
    riskRatioScale: Object.freeze({
      estimate: rrEstimate,
      lower: rrInterval ? rrInterval.lower : null,
      upper: rrInterval ? rrInterval.upper : null,
      target: rrTarget,
    }),
    conversion: Object.freeze({ kind, note: conversionNote(kind, input, level) }),
    eValueEstimate,
    eValueInterval,
    intervalLimitUsed,
    direction: rrEstimate > rrTarget ? 'above-target' : rrEstimate < rrTarget ? 'below-target' : 'at-target',
    ratioToTarget,
    intervalRatioToTarget,
    targetDirection,
    conventions: eValueConventions(kind, targetDirection, targetIsNull, isGiven(input.se)),
    warnings: Object.freeze(warnings),
  });
}

/**
 * Where the target lies as seen from the estimate, on the log-risk-ratio scale (e = log estimate, t = log
 * target): `away-from-null` when t is on the same side of the null as e (or e is the null) and |t| > |e|;
 * `toward-null` otherwise (the target between the estimate and the null, at the null, or past it); null at
 * the target.
 */
function directionOfTarget(rrEstimate: number, rrTarget: number): 'toward-null' | 'away-from-null' | null {
  const e = Math.log(rrEstimate);
  const t = Math.log(rrTarget);
  if (e === t) return null;
  const sameSide = e === 0 || Math.sign(e) === Math.sign(t);
  return sameSide && Math.abs(t) > Math.abs(e) ? 'away-from-null' : 'toward-null';
}

/** The conventions of an E-value analysis, in plain words (frozen). */
function eValueConventions(
  kind: RiskRatioConversion,
  targetDirection: 'toward-null' | 'away-from-null' | null,
  targetIsNull: boolean,
  fromSe: boolean,
): readonly AnalysisConvention[] {
  const c = conventionList();
  c.add(
    'confounder-strength',
    'The E-value is the smallest strength of association, on the risk-ratio scale, that an unmeasured confounder would need with both the treatment and the outcome (beyond the measured covariates) to move the estimate to the target.',
  );
  c.add('interval-limit', 'The interval E-value uses the limit nearer the target; when the interval contains the target (a limit equal to it counts), it is 1.');
  if (targetDirection === 'away-from-null') {
    c.add(
      'target-direction',
      'The target lies beyond the estimate, farther from the null: the E-values refer to confounding that pushed the estimate toward the null (hiding a larger effect).',
    );
  } else if (targetDirection === 'toward-null') {
    c.add(
      'target-direction',
      targetIsNull
        ? 'The target is the null: the E-values refer to confounding that pushed the estimate away from the null.'
        : 'The target lies between the estimate and the null (or past the null): the E-values refer to confounding that pushed the estimate away from the null.',
    );
  }
  switch (kind) {
    case 'odds-ratio-rare-outcome':
      c.add('rare-outcome', 'With a rare outcome (under about 15%) the odds ratio is used as a risk ratio.');
      break;
    case 'odds-ratio-square-root':
      c.add('odds-ratio-square-root', 'With a common outcome the odds ratio is put on the risk-ratio scale by its square root, RR ≈ √OR (VanderWeele 2017), for the estimate, the limits and the target alike.');
      break;
    case 'hazard-ratio-rare-outcome':
      c.add('rare-outcome', 'With a rare outcome (under about 15%) the hazard ratio is used as a risk ratio.');
      break;
    case 'hazard-ratio-common-outcome':
      c.add('hazard-ratio-common-outcome', 'With a common outcome the hazard ratio is converted by RR ≈ (1 − 0.5^√HR)/(1 − 0.5^√(1/HR)) (VanderWeele 2020).');
      break;
    case 'standardized-mean-difference':
    case 'mean-difference-via-sd':
      c.add(
        'standardized-mean-difference',
        (kind === 'mean-difference-via-sd' ? 'The mean difference is divided by the outcome’s SD to give d; then ' : 'The standardized mean difference d is ') +
          (kind === 'mean-difference-via-sd' ? 'it is ' : '') +
          'put on the risk-ratio scale by RR ≈ exp(0.91·d) (VanderWeele & Ding 2017)' +
          (fromSe ? ', and its interval by exp(0.91·d ± 0.91·z·SE) at every level (0.91·1.96 ≈ 1.78 at 95%).' : '.'),
      );
      break;
    case 'none':
      break;
  }
  return c.list();
}

/** A level as a percentage for prose: 0.95 → "95%", 0.9500001 → "95.00001%". */
function levelText(level: number): string {
  return `${Number((level * 100).toPrecision(12))}%`;
}

/** x, or 1/x when x < 1: the size of a ratio regardless of its direction. */
function foldAtOne(x: number): number {
  return x >= 1 ? x : 1 / x;
}

function ignoredFieldWarnings(input: EValueInput): string[] {
  const warnings: string[] = [];
  if (isGiven(input.outcomePrevalence) && input.measure !== 'or' && input.measure !== 'hr') {
    warnings.push(`The outcome prevalence applies only to odds and hazard ratios; it was not used for a ${MEASURE_NAMES[input.measure]}.`);
  }
  if (isGiven(input.sd) && input.measure !== 'md') {
    warnings.push(`The outcome's SD applies only to a mean difference; it was not used for a ${MEASURE_NAMES[input.measure]}.`);
  }
  return warnings;
}

function conversionNote(kind: RiskRatioConversion, input: EValueInput, level: number): string {
  const seMultiplier = (measureText: string) =>
    isGiven(input.se)
      ? ` The interval is exp(0.91·${measureText} ± 0.91·z·SE) with z = ${confidenceZ(level).toFixed(4)} for the ${levelText(level)} level${level === 0.95 ? ' (0.91·z = 1.7836, printed as 1.78 by VanderWeele & Ding 2017)' : ''}.`
      : '';
  switch (kind) {
    case 'none':
      return 'The risk ratio is used as it is.';
    case 'odds-ratio-rare-outcome':
      return 'The outcome was declared rare (under about 15%), so the odds ratio is used as a risk ratio.';
    case 'odds-ratio-square-root':
      return 'The outcome was declared common, so the odds ratio was converted with RR ≈ √OR (VanderWeele 2017).';
    case 'hazard-ratio-rare-outcome':
      return 'The outcome was declared rare (under about 15%), so the hazard ratio is used as a risk ratio.';
    case 'hazard-ratio-common-outcome':
      return 'The outcome was declared common, so the hazard ratio was converted with RR ≈ (1 − 0.5^√HR)/(1 − 0.5^√(1/HR)) (VanderWeele 2020).';
    case 'standardized-mean-difference':
      return 'The standardized mean difference d was converted with RR ≈ exp(0.91·d) (VanderWeele & Ding 2017).' + seMultiplier('d');
    case 'mean-difference-via-sd':
      return "The mean difference was divided by the outcome's SD to give d, then converted with RR ≈ exp(0.91·d) (VanderWeele & Ding 2017)." + seMultiplier('d');
  }
}
