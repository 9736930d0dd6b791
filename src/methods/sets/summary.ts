import type { MatchedSetsResult } from '../../core/matchedSetsAnalysis';
import type { TippingGamma } from '../../core/tippingGamma';
import type { MethodSummary } from '../methodModule';
import { amplificationOf, finiteOrNull, rangeAtOf, readSavedAmplification, readSavedNumber, readSavedRangeAt, rowForSummary, TIPPING_STATUSES, type SummaryAmplification, type SummaryRangeAt } from '../summaryFields';
import type { SetsOutcome } from './runner';

/**
 * Headline numbers of a matched-sets result, as plain JSON: what an appraisal file keeps so that the robustness
 * statement and the bottom line can be written from the file alone (a file's rows are never saved). Non-finite
 * numbers become null.
 */
export interface SetsSummary extends MethodSummary {
  readonly kind: 'sets';
  readonly outcomeKind: 'continuous' | 'binary';
  readonly alternative: 'greater' | 'less';
  readonly tail: 'exact' | 'normal';
  readonly alpha: number | null;
  readonly sets: number | null;
  readonly units: number | null;
  /** The fewest and the most controls in a set. */
  readonly controlsLow: number | null;
  readonly controlsHigh: number | null;
  readonly pValue: number | null;
  readonly sensitivityValue: number | null;
  readonly sensitivityStatus: TippingGamma['status'];
  readonly searchedUpTo: number | null;
  readonly estimate: number | null;
  /** The estimate range and sensitivity interval at the largest tabulated Γ at or below the tipping Γ (else at Γ = 2). */
  readonly rangeAt: SummaryRangeAt | null;
  readonly amplification: readonly SummaryAmplification[];
  /** The result's references (full citations) and conventions, for the statement. */
  readonly references: readonly string[];
  readonly conventions: readonly string[];
}

/** The summary of a result. */
export function setsSummary(result: MatchedSetsResult): SetsSummary {
  const chosen = rowForSummary(result.outcomeKind === 'continuous' ? result.rows : [], result.sensitivityValue);
  const controls = result.counts.controlsPerSet.map((c) => c.controls);
  return {
    kind: 'sets',
    outcomeKind: result.outcomeKind,
    alternative: result.alternative,
    tail: result.tail,
    alpha: finiteOrNull(result.alpha),
    sets: finiteOrNull(result.counts.setsUsed),
    units: finiteOrNull(result.counts.units),
    controlsLow: controls.length > 0 ? controls[0] : null,
    controlsHigh: controls.length > 0 ? controls[controls.length - 1] : null,
    pValue: finiteOrNull(result.pValue),
    sensitivityValue: finiteOrNull(result.sensitivityValue),
    sensitivityStatus: result.sensitivityStatus,
    searchedUpTo: finiteOrNull(result.searchedUpTo),
    estimate: finiteOrNull(result.estimate),
    rangeAt: rangeAtOf(chosen),
    amplification: amplificationOf(result.amplification),
    references: [...result.references],
    conventions: result.conventions.map((c) => c.text),
  };
}

/** The summary of an outcome (null while there is no result). */
export function summariseSets(outcome: SetsOutcome): SetsSummary | null {
  return outcome.result ? setsSummary(outcome.result) : null;
}

/** A summary read back from a file or link, checked field by field; null when it is not a matched-sets summary. */
export function readSetsSummary(saved: unknown): SetsSummary | null {
  if (saved === null || typeof saved !== 'object') return null;
  const s = saved as Record<string, unknown>;
  if (s.kind !== 'sets') return null;
  const numbers = ['alpha', 'sets', 'units', 'controlsLow', 'controlsHigh', 'pValue', 'sensitivityValue', 'searchedUpTo', 'estimate'] as const;
  const read: Record<string, number | null> = {};
  for (const key of numbers) {
    const v = readSavedNumber(s[key]);
    if (v === undefined) return null;
    read[key] = v;
  }
  if (s.outcomeKind !== 'continuous' && s.outcomeKind !== 'binary') return null;
  if (s.alternative !== 'greater' && s.alternative !== 'less') return null;
  if (s.tail !== 'exact' && s.tail !== 'normal') return null;
  if (!TIPPING_STATUSES.includes(s.sensitivityStatus as TippingGamma['status'])) return null;
  const texts = (v: unknown): string[] | null => (Array.isArray(v) && v.every((x) => typeof x === 'string') ? [...(v as string[])] : null);
  const references = texts(s.references ?? []);
  const conventions = texts(s.conventions ?? []);
  if (!references || !conventions) return null;
  const rangeAt = readSavedRangeAt(s.rangeAt);
  const amplification = readSavedAmplification(s.amplification);
  if (rangeAt === undefined || amplification === undefined) return null;
  return {
    kind: 'sets',
    outcomeKind: s.outcomeKind,
    alternative: s.alternative,
    tail: s.tail,
    alpha: read.alpha,
    sets: read.sets,
    units: read.units,
    controlsLow: read.controlsLow,
    controlsHigh: read.controlsHigh,
    pValue: read.pValue,
    sensitivityValue: read.sensitivityValue,
    sensitivityStatus: s.sensitivityStatus as TippingGamma['status'],
    searchedUpTo: read.searchedUpTo,
    estimate: read.estimate,
    rangeAt,
    amplification,
    references,
    conventions,
  };
}
