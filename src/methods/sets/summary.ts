import type { MatchedSetsResult } from '../../core/matchedSetsAnalysis';
import type { TippingGamma } from '../../core/tippingGamma';
import type { MethodSummary } from '../methodModule';
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
  readonly rangeAt: { gamma: number | null; estimateLow: number | null; estimateHigh: number | null; intervalLow: number | null; intervalHigh: number | null } | null;
  readonly amplification: ReadonlyArray<{ lambda: number | null; delta: number | null }>;
  /** The result's references (full citations) and conventions, for the statement. */
  readonly references: readonly string[];
  readonly conventions: readonly string[];
}

/** The summary of a result. */
export function setsSummary(result: MatchedSetsResult): SetsSummary {
  const g = result.sensitivityValue;
  const rows = result.outcomeKind === 'continuous' ? result.rows : [];
  const chosen =
    rows.length === 0 ? null : ((g !== null ? [...rows].reverse().find((r) => r.gamma <= g && r.gamma > 1) : undefined) ?? rows.find((r) => r.gamma === 2) ?? rows[rows.length - 1]);
  const controls = result.counts.controlsPerSet.map((c) => c.controls);
  return {
    kind: 'sets',
    outcomeKind: result.outcomeKind,
    alternative: result.alternative,
    tail: result.tail,
    alpha: finite(result.alpha),
    sets: finite(result.counts.setsUsed),
    units: finite(result.counts.units),
    controlsLow: controls.length > 0 ? controls[0] : null,
    controlsHigh: controls.length > 0 ? controls[controls.length - 1] : null,
    pValue: finite(result.pValue),
    sensitivityValue: finite(result.sensitivityValue),
    sensitivityStatus: result.sensitivityStatus,
    searchedUpTo: finite(result.searchedUpTo),
    estimate: finite(result.estimate),
    rangeAt: chosen
      ? { gamma: finite(chosen.gamma), estimateLow: finite(chosen.estimateLow), estimateHigh: finite(chosen.estimateHigh), intervalLow: finite(chosen.intervalLow), intervalHigh: finite(chosen.intervalHigh) }
      : null,
    amplification: result.amplification.slice(0, 3).map((a) => ({ lambda: finite(a.lambda), delta: finite(a.delta) })),
    references: [...result.references],
    conventions: [...result.conventions],
  };
}

/** The summary of an outcome (null while there is no result). */
export function summariseSets(outcome: SetsOutcome): SetsSummary | null {
  return outcome.result ? setsSummary(outcome.result) : null;
}

const STATUSES: readonly TippingGamma['status'][] = ['found', 'not-significant', 'beyond-range'];

/** A summary read back from a file or link, checked field by field; null when it is not a matched-sets summary. */
export function readSetsSummary(saved: unknown): SetsSummary | null {
  if (saved === null || typeof saved !== 'object') return null;
  const s = saved as Record<string, unknown>;
  if (s.kind !== 'sets') return null;
  const num = (v: unknown): number | null | undefined => (v === null ? null : typeof v === 'number' && Number.isFinite(v) ? v : undefined);
  const numbers = ['alpha', 'sets', 'units', 'controlsLow', 'controlsHigh', 'pValue', 'sensitivityValue', 'searchedUpTo', 'estimate'] as const;
  const read: Record<string, number | null> = {};
  for (const key of numbers) {
    const v = num(s[key]);
    if (v === undefined) return null;
    read[key] = v;
  }
  if (s.outcomeKind !== 'continuous' && s.outcomeKind !== 'binary') return null;
  if (s.alternative !== 'greater' && s.alternative !== 'less') return null;
  if (s.tail !== 'exact' && s.tail !== 'normal') return null;
  if (!STATUSES.includes(s.sensitivityStatus as TippingGamma['status'])) return null;
  const texts = (v: unknown): string[] | null => (Array.isArray(v) && v.every((x) => typeof x === 'string') ? [...(v as string[])] : null);
  const references = texts(s.references ?? []);
  const conventions = texts(s.conventions ?? []);
  if (!references || !conventions) return null;
  let rangeAt: SetsSummary['rangeAt'] = null;
  if (s.rangeAt !== null && s.rangeAt !== undefined) {
    if (typeof s.rangeAt !== 'object') return null;
    const r = s.rangeAt as Record<string, unknown>;
    const values = (['gamma', 'estimateLow', 'estimateHigh', 'intervalLow', 'intervalHigh'] as const).map((f) => num(r[f]));
    if (values.some((v) => v === undefined)) return null;
    const [gamma, estimateLow, estimateHigh, intervalLow, intervalHigh] = values as (number | null)[];
    rangeAt = { gamma, estimateLow, estimateHigh, intervalLow, intervalHigh };
  }
  const amplification: { lambda: number | null; delta: number | null }[] = [];
  if (s.amplification !== undefined) {
    if (!Array.isArray(s.amplification)) return null;
    for (const a of s.amplification) {
      if (a === null || typeof a !== 'object') return null;
      const lambda = num((a as Record<string, unknown>).lambda);
      const delta = num((a as Record<string, unknown>).delta);
      if (lambda === undefined || delta === undefined) return null;
      amplification.push({ lambda, delta });
    }
  }
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

function finite(value: number | null | undefined): number | null {
  return value !== null && value !== undefined && Number.isFinite(value) ? value : null;
}
