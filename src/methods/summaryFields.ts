import type { TippingGamma } from '../core/tippingGamma';

/** The estimate range and sensitivity interval at one Γ, as a summary keeps them. */
export interface SummaryRangeAt {
  gamma: number | null;
  estimateLow: number | null;
  estimateHigh: number | null;
  intervalLow: number | null;
  intervalHigh: number | null;
}

/** One amplification of Γ into (Λ, Δ), as a summary keeps it. */
export interface SummaryAmplification {
  lambda: number | null;
  delta: number | null;
}

/** The tipping-Γ statuses a saved summary may hold. */
export const TIPPING_STATUSES: readonly TippingGamma['status'][] = ['found', 'not-significant', 'beyond-range'];

/** A number for a summary: non-finite numbers, null and undefined become null. */
export function finiteOrNull(value: number | null | undefined): number | null {
  return value !== null && value !== undefined && Number.isFinite(value) ? value : null;
}

/** A saved number read back: null stays null, a finite number is kept, anything else is undefined (not valid). */
export function readSavedNumber(value: unknown): number | null | undefined {
  return value === null ? null : typeof value === 'number' && Number.isFinite(value) ? value : undefined;
}

/**
 * The row of a Γ table a summary keeps: the largest Γ above 1 at or below the sensitivity value, else Γ = 2,
 * else the last row; null when there are no rows.
 */
export function rowForSummary<Row extends { gamma: number }>(rows: readonly Row[], sensitivityValue: number | null): Row | null {
  if (rows.length === 0) return null;
  const g = sensitivityValue;
  return (g !== null ? [...rows].reverse().find((r) => r.gamma <= g && r.gamma > 1) : undefined) ?? rows.find((r) => r.gamma === 2) ?? rows[rows.length - 1];
}

/** The range and interval of a Γ row for a summary (null for no row). */
export function rangeAtOf(row: { readonly [K in keyof SummaryRangeAt]: number | null } | null): SummaryRangeAt | null {
  return row
    ? {
        gamma: finiteOrNull(row.gamma),
        estimateLow: finiteOrNull(row.estimateLow),
        estimateHigh: finiteOrNull(row.estimateHigh),
        intervalLow: finiteOrNull(row.intervalLow),
        intervalHigh: finiteOrNull(row.intervalHigh),
      }
    : null;
}

/** The first three amplifications of a result for a summary. */
export function amplificationOf(amplification: ReadonlyArray<{ lambda: number; delta: number }>): SummaryAmplification[] {
  return amplification.slice(0, 3).map((a) => ({ lambda: finiteOrNull(a.lambda), delta: finiteOrNull(a.delta) }));
}

/** A saved `rangeAt` read back: null when absent, undefined when not valid. */
export function readSavedRangeAt(saved: unknown): SummaryRangeAt | null | undefined {
  if (saved === null || saved === undefined) return null;
  if (typeof saved !== 'object') return undefined;
  const r = saved as Record<string, unknown>;
  const values = (['gamma', 'estimateLow', 'estimateHigh', 'intervalLow', 'intervalHigh'] as const).map((f) => readSavedNumber(r[f]));
  if (values.some((v) => v === undefined)) return undefined;
  const [gamma, estimateLow, estimateHigh, intervalLow, intervalHigh] = values as (number | null)[];
  return { gamma, estimateLow, estimateHigh, intervalLow, intervalHigh };
}

/** A saved `amplification` list read back: empty when absent, undefined when not valid. */
export function readSavedAmplification(saved: unknown): SummaryAmplification[] | undefined {
  const amplification: SummaryAmplification[] = [];
  if (saved === undefined) return amplification;
  if (!Array.isArray(saved)) return undefined;
  for (const a of saved) {
    if (a === null || typeof a !== 'object') return undefined;
    const lambda = readSavedNumber((a as Record<string, unknown>).lambda);
    const delta = readSavedNumber((a as Record<string, unknown>).delta);
    if (lambda === undefined || delta === undefined) return undefined;
    amplification.push({ lambda, delta });
  }
  return amplification;
}
