import type { EValueResult } from '../../core/eValueAnalysis';
import type { ReferenceConfounderAssessment } from '../../core/referenceConfounder';
import { EFFECT_MEASURE_NAMES } from '../../core/riskRatioScale';
import type { EffectMeasure } from '../../core/riskRatioScale';
import { echoTyped, formatNumber, formatRatio } from '../../format/formatNumber';
import { exposureLabel, outcomeLabel } from '../../format/studyLabels';
import type { StudyLabels } from '../../format/studyLabels';

/** The caution shown beside every E-value. */
export const E_VALUE_CAUTION =
  'An E-value bounds how strong hidden confounding would have to be; it does not prove causation, and it says ' +
  'nothing about other biases such as selection or measurement error. Decisions about health or safety defer to ' +
  'domain experts, local guidance and licensed practice.';

/** Each measure's name in prose (the core's names). */
export const MEASURE_LABELS = EFFECT_MEASURE_NAMES;

/** A number with 3 significant digits and no trailing zeros after the point (4 rather than 4.00). */
export function formatPlain(value: number | null | undefined): string {
  const text = formatNumber(value, { significant: 3 });
  return /^-?\d+\.\d+$/.test(text) ? text.replace(/\.?0+$/, '') : text;
}

/** A confidence level as a percentage without float noise: 0.95 → "95%", 0.9995 → "99.95%". */
export function formatLevel(level: number): string {
  return Number.isFinite(level) ? `${Number((level * 100).toPrecision(6))}%` : formatNumber(level);
}

/** A value on a measure's own scale: ratios and d with 3 significant digits, a mean difference with its units. */
export function formatMeasureValue(value: number | null | undefined, measure: EffectMeasure, units = ''): string {
  const text = formatPlain(value);
  return measure === 'md' && units && value !== null && value !== undefined && Number.isFinite(value) ? `${text} ${units}` : text;
}

/** An E-value for people: two decimals (7.26), as they are usually reported. */
export function formatEValue(value: number | null | undefined): string {
  return formatRatio(value, 2);
}

/** The plain-language readings of an E-value result. */
export interface EValueReading {
  /** What it takes to explain away the estimate. */
  readonly estimate: string;
  /** What it takes to move the interval to include the target, or null without an interval. */
  readonly interval: string | null;
  /**
   * The sentences in the order a reader needs them: when the interval already includes the target, that comes
   * first, in plain words; a target beyond the estimate says which direction of confounding the E-values concern.
   */
  readonly sentences: readonly string[];
  readonly caution: string;
}

/** Which confounding the E-values refer to, in words, when the target lies beyond the estimate; else null. */
export function targetDirectionSentence(result: Pick<EValueResult, 'targetDirection' | 'targetIsNull'>): string | null {
  if (result.targetDirection !== 'away-from-null') return null;
  return 'The target lies beyond the estimate, farther from the null: these E-values concern confounding that pushed the estimate toward the null (hiding a larger effect), not confounding that inflated it.';
}

/**
 * Plain sentences for an E-value result, using the study's labels where given: what a hidden confounder
 * would need to explain away the estimate (or move it to the named target), and the interval. When the interval
 * already includes the target that is said first, and nothing is claimed about what could not explain it away.
 */
export function describeEValue(result: EValueResult, study?: Partial<StudyLabels>, typedTarget?: string): EValueReading {
  const exposure = exposureLabel(study);
  const outcome = outcomeLabel(study);
  const units = result.measure === 'md' ? (study?.units?.trim() ?? '') : '';
  const targetShown = echoTyped(result.target, typedTarget, formatPlain) + (units ? ` ${units}` : '');
  const goal = result.targetIsNull ? 'explain away the estimate' : `move the estimate to ${targetShown}`;
  const towards = result.targetIsNull ? 'the null' : `the target ${targetShown}`;
  const strength = (e: number) =>
    `a hidden confounder would need to be associated with both ${exposure} and ${outcome} by a risk ratio of at least ` +
    `${formatEValue(e)} each, beyond the measured covariates`;
  const intervalIncludes = result.eValueInterval !== null && result.intervalLimitUsed === 'none';

  let estimate: string;
  if (result.direction === 'at-target') {
    estimate = `The estimate already equals ${towards}: no hidden confounding is needed to ${result.targetIsNull ? 'explain it away' : 'reach it'}.`;
  } else if (intervalIncludes) {
    estimate = `To ${result.targetIsNull ? 'explain away the point estimate itself' : `move the point estimate itself to ${targetShown}`}, ${strength(result.eValueEstimate)}.`;
  } else {
    estimate =
      `To ${goal}, ${strength(result.eValueEstimate)}. ` +
      'Weaker confounding could not do it; a confounder weaker on one side would have to be stronger on the other.';
  }

  let interval: string | null = null;
  if (result.eValueInterval !== null) {
    const level = formatLevel(result.level);
    interval = intervalIncludes
      ? `The ${level} interval already includes ${towards}: even with no hidden confounding at all, the data are compatible with ${result.targetIsNull ? 'no effect' : 'that value'} (interval E-value 1).`
      : `To move the ${level} interval so that it includes ${towards}, ${strength(result.eValueInterval)}.`;
  }
  const direction = targetDirectionSentence(result);
  const sentences = intervalIncludes && interval ? [interval, estimate] : interval ? [estimate, interval] : [estimate];
  if (direction && result.direction !== 'at-target') sentences.push(direction);
  return Object.freeze({ estimate, interval, sentences: Object.freeze(sentences), caution: E_VALUE_CAUTION });
}

/**
 * One sentence on a reference confounder: would a hidden confounder as strong as it suffice to explain away
 * the estimate, and the interval?
 */
export function describeReferenceConfounder(
  assessment: ReferenceConfounderAssessment,
  result: Pick<EValueResult, 'ratioToTarget' | 'intervalRatioToTarget' | 'targetIsNull'>,
  study?: Partial<StudyLabels>,
): string {
  const name = assessment.name.trim() || 'this confounder';
  const inverted =
    assessment.inverted.exposure || assessment.inverted.outcome
      ? ' (protective associations are counted by their inverse)'
      : '';
  const strengths =
    `risk ratio ${formatPlain(assessment.strengthExposure)} with ${exposureLabel(study)} and ` +
    `${formatPlain(assessment.strengthOutcome)} with ${outcomeLabel(study)}${inverted}`;
  const factor = formatNumber(assessment.boundingFactor, { significant: 3 });
  const goal = result.targetIsNull ? 'explain away the estimate' : 'move the estimate to the target';
  const estimatePart = assessment.explainsEstimate
    ? `enough to ${goal} (that takes ${formatPlain(result.ratioToTarget)})`
    : `not enough to ${goal} (that takes ${formatPlain(result.ratioToTarget)})`;
  let intervalPart = '';
  if (assessment.explainsInterval !== null && result.intervalRatioToTarget !== null) {
    const where = result.targetIsNull ? 'the null' : 'the target';
    intervalPart =
      result.intervalRatioToTarget <= 1
        ? `; the interval already includes ${where}`
        : assessment.explainsInterval
          ? `, but enough to make the interval include ${where} (that takes ${formatPlain(result.intervalRatioToTarget)})`
          : `, nor to make the interval include ${where} (that takes ${formatPlain(result.intervalRatioToTarget)})`;
    if (assessment.explainsEstimate && result.intervalRatioToTarget > 1) {
      intervalPart = `, and so also to make the interval include ${where}`;
    }
  }
  return (
    `A hidden confounder as strong as ${name} (${strengths}) could shift the risk ratio by a factor of at most ${factor}: ` +
    `${estimatePart}${intervalPart}.`
  );
}

/**
 * A read-out for a point of the joint-strength plot: what a hidden confounder with these two strengths could
 * do to the estimate (for the pointer).
 */
export function describeStrengthPair(
  rrExposure: number,
  rrOutcome: number,
  factor: number,
  result: Pick<EValueResult, 'ratioToTarget' | 'targetIsNull'>,
): string {
  if (!(rrExposure >= 1 && rrOutcome >= 1 && Number.isFinite(factor))) return '';
  const verdict = factor >= result.ratioToTarget * (1 - 1e-12) ? 'enough' : 'not enough';
  return (
    `Risk ratios ${formatPlain(rrExposure)} with the exposure and ${formatPlain(rrOutcome)} with the outcome: a shift by a factor ` +
    `of at most ${formatPlain(factor)}, ${verdict} to ${result.targetIsNull ? 'explain away the estimate' : 'move the estimate to the target'}.`
  );
}
