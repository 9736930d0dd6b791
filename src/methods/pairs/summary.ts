import type { PairsResult } from '../../core/pairsAnalysis';
import type { TippingGamma } from '../../core/tippingGamma';
import type { MethodSummary } from '../methodModule';
import { amplificationOf, finiteOrNull, rangeAtOf, readSavedAmplification, readSavedNumber, readSavedRangeAt, rowForSummary, TIPPING_STATUSES, type SummaryAmplification, type SummaryRangeAt } from '../summaryFields';
import { readConventions, type SummaryConvention } from '../summaryConventions';
import type { PairsOutcome } from './runner';
import { cleanEstimate, pointsOtherWay } from './text';

/**
 * Headline numbers of a matched-pairs result, as plain JSON: what an appraisal file keeps so that the robustness
 * statement and the bottom line can be written from the file alone. Non-finite numbers become null.
 */
export interface PairsSummary extends MethodSummary {
  readonly kind: 'pairs';
  readonly test: string;
  readonly alternative: string;
  readonly alpha: number | null;
  readonly n: number | null;
  readonly nonZero: number | null;
  readonly pValue: number | null;
  readonly sensitivityValue: number | null;
  readonly sensitivityStatus: TippingGamma['status'];
  readonly searchedUpTo: number | null;
  readonly signTestSensitivityValue: number | null;
  readonly tailMethod: string;
  readonly estimate: number | null;
  /** The estimate range and sensitivity interval at the Γ nearest below the sensitivity value (or at Γ = 2). */
  readonly rangeAt: SummaryRangeAt | null;
  readonly amplification: readonly SummaryAmplification[];
  /** Whether the data point against the alternative tested (see `pointsOtherWay` in text.ts); absent in older files. */
  readonly pointsOtherWay?: boolean;
  /** How the tails were computed and why (with the measured error of the normal approximation); absent in older files. */
  readonly tailMethodReason?: string;
  /** The zero rule of the signed-rank test; absent in older files. */
  readonly zeroRule?: string;
  /** The conventions the analysis followed, in the core's words; absent in older files. */
  readonly conventions?: readonly SummaryConvention[];
}

/** The summary of a result. */
export function pairsSummary(result: PairsResult): PairsSummary {
  const chosen = rowForSummary(result.estimates, result.sensitivityValue);
  return {
    kind: 'pairs',
    test: result.test,
    alternative: result.alternative,
    alpha: finiteOrNull(result.alpha),
    n: finiteOrNull(result.n),
    nonZero: finiteOrNull(result.nonZero),
    pValue: finiteOrNull(result.pValue),
    sensitivityValue: finiteOrNull(result.sensitivityValue),
    sensitivityStatus: result.sensitivityStatus,
    searchedUpTo: finiteOrNull(result.searchedUpTo),
    signTestSensitivityValue: finiteOrNull(result.signTestSensitivityValue),
    tailMethod: result.tailMethod,
    estimate: finiteOrNull(cleanEstimate(result)),
    rangeAt: rangeAtOf(chosen),
    amplification: amplificationOf(result.amplification),
    pointsOtherWay: pointsOtherWay(result),
    tailMethodReason: result.tailMethodReason,
    zeroRule: result.zeroRule,
    conventions: result.conventions.map((c) => ({ id: c.id, text: c.text })),
  };
}

/** The summary of an outcome (null while there is no result). */
export function summarisePairs(outcome: PairsOutcome): PairsSummary | null {
  return outcome.result ? pairsSummary(outcome.result) : null;
}

/** A summary read back from a file or link, checked field by field; null when it is not a matched-pairs summary. */
export function readPairsSummary(saved: unknown): PairsSummary | null {
  if (saved === null || typeof saved !== 'object') return null;
  const s = saved as Record<string, unknown>;
  if (s.kind !== 'pairs') return null;
  const numbers = ['alpha', 'n', 'nonZero', 'pValue', 'sensitivityValue', 'searchedUpTo', 'signTestSensitivityValue', 'estimate'] as const;
  const read: Record<string, number | null> = {};
  for (const key of numbers) {
    const v = readSavedNumber(s[key]);
    if (v === undefined) return null;
    read[key] = v;
  }
  if (typeof s.test !== 'string' || typeof s.alternative !== 'string' || typeof s.tailMethod !== 'string') return null;
  if (!TIPPING_STATUSES.includes(s.sensitivityStatus as TippingGamma['status'])) return null;
  const rangeAt = readSavedRangeAt(s.rangeAt);
  const amplification = readSavedAmplification(s.amplification);
  if (rangeAt === undefined || amplification === undefined) return null;
  return {
    kind: 'pairs',
    test: s.test,
    alternative: s.alternative,
    alpha: read.alpha,
    n: read.n,
    nonZero: read.nonZero,
    pValue: read.pValue,
    sensitivityValue: read.sensitivityValue,
    sensitivityStatus: s.sensitivityStatus as TippingGamma['status'],
    searchedUpTo: read.searchedUpTo,
    signTestSensitivityValue: read.signTestSensitivityValue,
    tailMethod: s.tailMethod,
    estimate: read.estimate,
    rangeAt,
    amplification,
    pointsOtherWay: s.pointsOtherWay === true,
    ...(typeof s.tailMethodReason === 'string' ? { tailMethodReason: s.tailMethodReason } : {}),
    ...(typeof s.zeroRule === 'string' ? { zeroRule: s.zeroRule } : {}),
    conventions: readConventions(s.conventions),
  };
}
