import { boundingFactor } from './boundingFactor';
import type { InputProblem } from './inputProblem';
import { inputProblem } from './inputProblem';

/**
 * A confounder of known strength to compare a hidden one with, e.g. a measured covariate: its risk ratio with
 * the exposure (RR_EU) and with the outcome (RR_UD).
 */
export interface ReferenceConfounder {
  readonly name: string;
  /** The risk ratio relating the confounder to the exposure; a value below 1 is read as its inverse. */
  readonly rrExposure: number;
  /** The risk ratio relating the confounder to the outcome; a value below 1 is read as its inverse. */
  readonly rrOutcome: number;
}

/** What a hidden confounder as strong as a reference one could do to the estimate and its interval. */
export interface ReferenceConfounderAssessment {
  readonly name: string;
  /** RR_EU stated as ≥ 1. */
  readonly strengthExposure: number;
  /** RR_UD stated as ≥ 1. */
  readonly strengthOutcome: number;
  /** Whether a value below 1 was inverted (exposure, outcome). */
  readonly inverted: { readonly exposure: boolean; readonly outcome: boolean };
  /** The largest factor by which such a confounder could move the risk ratio. */
  readonly boundingFactor: number;
  /** Whether that factor reaches the estimate's distance from the target (it could explain the estimate away). */
  readonly explainsEstimate: boolean;
  /** Whether it reaches the interval limit's distance (the interval could then include the target); null without an interval. */
  readonly explainsInterval: boolean | null;
}

/** What an assessment needs from an E-value result: how far the estimate and the interval limit are from the target. */
export interface DistanceToTarget {
  /** The risk-ratio-scale estimate over the target, stated as ≥ 1. */
  readonly ratioToTarget: number;
  /** The same for the interval limit nearer the target (1 when the interval contains it), or null. */
  readonly intervalRatioToTarget: number | null;
}

/**
 * Checks a reference confounder: a non-empty name and two positive finite risk ratios.
 *
 * @param confounder the reference confounder
 * @param field its field path in the caller's input, e.g. `confounders[2]`
 */
export function validateReferenceConfounder(confounder: ReferenceConfounder, field = 'confounder'): InputProblem[] {
  if (confounder === null || typeof confounder !== 'object') {
    return [inputProblem(field, 'required', 'needs a name and two risk ratios', confounder)];
  }
  const problems: InputProblem[] = [];
  if (typeof confounder.name !== 'string' || confounder.name.trim() === '') {
    problems.push(inputProblem(`${field}.name`, 'required', 'needs a name', confounder.name));
  }
  for (const key of ['rrExposure', 'rrOutcome'] as const) {
    const value = confounder[key];
    if (typeof value !== 'number' || Number.isNaN(value)) {
      problems.push(inputProblem(`${field}.${key}`, 'not-a-number', 'must be a number (a risk ratio)', value));
    } else if (!Number.isFinite(value)) {
      problems.push(inputProblem(`${field}.${key}`, 'not-finite', 'must be a finite number', value));
    } else if (value <= 0) {
      problems.push(inputProblem(`${field}.${key}`, 'not-positive', 'must be greater than 0 (a ratio is never 0 or negative)', value));
    }
  }
  return problems;
}

/**
 * Whether a hidden confounder as strong as a reference one would suffice to explain away the estimate (move
 * it to the target) and the interval (make it include the target).
 *
 * **Method.** The bounding factor B(RR_EU, RR_UD) of the reference strengths (each stated as ≥ 1) is the
 * most such a confounder can move the risk ratio; it suffices when B reaches the estimate's ratio to the
 * target (for the interval, the nearer limit's ratio). A relative slack of 1e-12 absorbs rounding, so that a
 * confounder exactly at the E-value counts as sufficient, as it should.
 *
 * **References.** Ding P, VanderWeele TJ (2016). Sensitivity analysis without assumptions. Epidemiology
 * 27(3):368–377, Theorem 2A and Section "Sensitivity analysis".
 *
 * **Special cases.** Strengths below 1 are inverted (and flagged in `inverted`). Without an interval,
 * `explainsInterval` is null; when the interval already contains the target, it is true.
 *
 * @param distance the estimate's (and interval's) distance from the target, from an E-value result
 * @param confounder a valid reference confounder (see {@link validateReferenceConfounder})
 */
export function assessReferenceConfounder(distance: DistanceToTarget, confounder: ReferenceConfounder): ReferenceConfounderAssessment {
  const strengthExposure = confounder.rrExposure >= 1 ? confounder.rrExposure : 1 / confounder.rrExposure;
  const strengthOutcome = confounder.rrOutcome >= 1 ? confounder.rrOutcome : 1 / confounder.rrOutcome;
  const factor = boundingFactor(strengthExposure, strengthOutcome);
  const reaches = (ratio: number) => factor >= ratio * (1 - 1e-12);
  return Object.freeze({
    name: confounder.name,
    strengthExposure,
    strengthOutcome,
    inverted: Object.freeze({ exposure: confounder.rrExposure < 1, outcome: confounder.rrOutcome < 1 }),
    boundingFactor: factor,
    explainsEstimate: reaches(distance.ratioToTarget),
    explainsInterval: distance.intervalRatioToTarget === null ? null : reaches(distance.intervalRatioToTarget),
  });
}
