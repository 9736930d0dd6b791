import type { PairsResult } from '../../core/pairsAnalysis';
import type { TippingGamma } from '../../core/tippingGamma';
import type { MethodSummary } from '../methodModule';
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
  readonly rangeAt: { gamma: number | null; estimateLow: number | null; estimateHigh: number | null; intervalLow: number | null; intervalHigh: number | null } | null;
  readonly amplification: ReadonlyArray<{ lambda: number | null; delta: number | null }>;
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
  const g = result.sensitivityValue;
  const rows = result.estimates;
  const chosen = rows.length === 0 ? null : (g !== null ? [...rows].reverse().find((r) => r.gamma <= g && r.gamma > 1) : undefined) ?? rows.find((r) => r.gamma === 2) ?? rows[rows.length - 1];
  return {
    kind: 'pairs',
    test: result.test,
    alternative: result.alternative,
    alpha: finite(result.alpha),
    n: finite(result.n),
    nonZero: finite(result.nonZero),
    pValue: finite(result.pValue),
    sensitivityValue: finite(result.sensitivityValue),
    sensitivityStatus: result.sensitivityStatus,
    searchedUpTo: finite(result.searchedUpTo),
    signTestSensitivityValue: finite(result.signTestSensitivityValue),
    tailMethod: result.tailMethod,
    estimate: finite(cleanEstimate(result)),
    rangeAt: chosen
      ? {
          gamma: finite(chosen.gamma),
          estimateLow: finite(chosen.estimateLow),
          estimateHigh: finite(chosen.estimateHigh),
          intervalLow: finite(chosen.intervalLow),
          intervalHigh: finite(chosen.intervalHigh),
        }
      : null,
    amplification: result.amplification.slice(0, 3).map((a) => ({ lambda: finite(a.lambda), delta: finite(a.delta) })),
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

const STATUSES: readonly TippingGamma['status'][] = ['found', 'not-significant', 'beyond-range'];

/** A summary read back from a file or link, checked field by field; null when it is not a matched-pairs summary. */
export function readPairsSummary(saved: unknown): PairsSummary | null {
  if (saved === null || typeof saved !== 'object') return null;
  const s = saved as Record<string, unknown>;
  if (s.kind !== 'pairs') return null;
  const num = (v: unknown): number | null | undefined => (v === null ? null : typeof v === 'number' && Number.isFinite(v) ? v : undefined);
  const numbers = ['alpha', 'n', 'nonZero', 'pValue', 'sensitivityValue', 'searchedUpTo', 'signTestSensitivityValue', 'estimate'] as const;
  const read: Record<string, number | null> = {};
  for (const key of numbers) {
    const v = num(s[key]);
    if (v === undefined) return null;
    read[key] = v;
  }
  if (typeof s.test !== 'string' || typeof s.alternative !== 'string' || typeof s.tailMethod !== 'string') return null;
  if (!STATUSES.includes(s.sensitivityStatus as TippingGamma['status'])) return null;
  let rangeAt: PairsSummary['rangeAt'] = null;
  if (s.rangeAt !== null && s.rangeAt !== undefined) {
    if (typeof s.rangeAt !== 'object') return null;
    const r = s.rangeAt as Record<string, unknown>;
    const fields = ['gamma', 'estimateLow', 'estimateHigh', 'intervalLow', 'intervalHigh'] as const;
    const values = fields.map((f) => num(r[f]));
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

function finite(value: number | null | undefined): number | null {
  return value !== null && value !== undefined && Number.isFinite(value) ? value : null;
}
