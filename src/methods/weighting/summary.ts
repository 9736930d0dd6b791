import type { WeightingResult, WeightingTippingStatus } from '../../core/weightingAnalysis';
import type { MethodSummary } from '../methodModule';
import type { WeightingOutcome } from './runner';

/**
 * Headline numbers of a weighting result, as plain JSON: what an appraisal file keeps so that the statement
 * and the bottom line can be written from the file alone (the rows of a file are never saved).
 */
export interface WeightingSummary extends MethodSummary {
  readonly kind: 'weighting';
  readonly estimand: 'ate' | 'att';
  readonly alpha: number | null;
  readonly used: number | null;
  readonly treated: number | null;
  readonly control: number | null;
  readonly effect: number | null;
  /** The sensitivity interval at Λ = 1 (null without bootstrap or when Λ = 1 was not among the values). */
  readonly intervalLowAtOne: number | null;
  readonly intervalHighAtOne: number | null;
  readonly tippingLambdaPoint: number | null;
  readonly tippingPointStatus: WeightingTippingStatus;
  readonly tippingLambdaInterval: number | null;
  readonly tippingIntervalStatus: WeightingTippingStatus;
  readonly searchedUpTo: number | null;
  readonly bootstrap: number | null;
}

export function weightingSummary(result: WeightingResult): WeightingSummary {
  const atOne = result.rows.find((r) => r.lambda === 1);
  return {
    kind: 'weighting',
    estimand: result.estimand,
    alpha: finite(result.inputs.alpha),
    used: finite(result.counts.used),
    treated: finite(result.counts.treated),
    control: finite(result.counts.control),
    effect: finite(result.estimate.effect),
    intervalLowAtOne: finite(atOne?.intervalLower),
    intervalHighAtOne: finite(atOne?.intervalUpper),
    tippingLambdaPoint: finite(result.tippingLambdaPoint),
    tippingPointStatus: result.tippingPointStatus,
    tippingLambdaInterval: finite(result.tippingLambdaInterval),
    tippingIntervalStatus: result.tippingIntervalStatus,
    searchedUpTo: finite(result.inputs.lambdaSearchLimit),
    bootstrap: finite(result.bootstrap.requested),
  };
}

export function summariseWeighting(outcome: WeightingOutcome): WeightingSummary | null {
  return outcome.result ? weightingSummary(outcome.result) : null;
}

const STATUSES: readonly WeightingTippingStatus[] = ['found', 'includes-zero-at-one', 'beyond-range', 'not-available'];
const NUMBERS = ['alpha', 'used', 'treated', 'control', 'effect', 'intervalLowAtOne', 'intervalHighAtOne', 'tippingLambdaPoint', 'tippingLambdaInterval', 'searchedUpTo', 'bootstrap'] as const;

/** A summary read back from a file or link, checked field by field; null when it is not a weighting summary. */
export function readWeightingSummary(saved: unknown): WeightingSummary | null {
  if (saved === null || typeof saved !== 'object') return null;
  const s = saved as Record<string, unknown>;
  if (s.kind !== 'weighting') return null;
  if (s.estimand !== 'ate' && s.estimand !== 'att') return null;
  if (!STATUSES.includes(s.tippingPointStatus as WeightingTippingStatus) || !STATUSES.includes(s.tippingIntervalStatus as WeightingTippingStatus)) return null;
  const read: Record<string, number | null> = {};
  for (const key of NUMBERS) {
    const v = s[key];
    if (v === null || v === undefined) read[key] = null;
    else if (typeof v === 'number' && Number.isFinite(v)) read[key] = v;
    else return null;
  }
  return {
    kind: 'weighting',
    estimand: s.estimand,
    alpha: read.alpha,
    used: read.used,
    treated: read.treated,
    control: read.control,
    effect: read.effect,
    intervalLowAtOne: read.intervalLowAtOne,
    intervalHighAtOne: read.intervalHighAtOne,
    tippingLambdaPoint: read.tippingLambdaPoint,
    tippingPointStatus: s.tippingPointStatus as WeightingTippingStatus,
    tippingLambdaInterval: read.tippingLambdaInterval,
    tippingIntervalStatus: s.tippingIntervalStatus as WeightingTippingStatus,
    searchedUpTo: read.searchedUpTo,
    bootstrap: read.bootstrap,
  };
}

function finite(value: number | null | undefined): number | null {
  return value !== null && value !== undefined && Number.isFinite(value) ? value : null;
}
