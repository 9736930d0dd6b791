import { formatNumber, formatPercent } from '../../format/formatNumber';
import type { OvbSummary, OvbSummaryBenchmark } from './summary';
import { CAPPED_BOUND_WORDS } from './text';

/**
 * Words shared by the regression's statement paragraph and bottom line, written from its summary so that every
 * sentence agrees with its number: significance before adjustment, the strongest measured covariate (the core's
 * one rule, kept in the summary), and what one benchmark bound does.
 */

/** Whether the estimate is significant before any adjustment: RV_q,α > 0, or |t| above t* when it is known. */
export function summarySignificant(r: OvbSummary): boolean {
  if (r.t !== null && r.criticalT !== null && r.criticalT !== undefined) return Math.abs(r.t) > r.criticalT;
  return r.rvAlpha === null || r.rvAlpha > 0;
}

/** The strongest measured covariate's bound at k = 1 (by the core's rule); null when the summary names none. */
export function summaryStrongest(r: OvbSummary): OvbSummaryBenchmark | null {
  if (!r.strongestCovariate) return null;
  const rows = (r.benchmarks ?? []).filter((b) => b.covariate === r.strongestCovariate);
  return rows.find((b) => b.k === 1 && (b.kOutcome ?? 1) === 1) ?? rows[0] ?? null;
}

/** "as strong as", "2 times as strong as", or separate multiples for the two sides. */
export function summaryMultiple(b: OvbSummaryBenchmark): string {
  const kOutcome = b.kOutcome ?? b.k;
  if (kOutcome !== null && b.k !== null && kOutcome !== b.k) {
    return `${num(b.k)} times as strongly related to the treatment and ${num(kOutcome)} times to the outcome as`;
  }
  return b.k === 1 ? 'as strong as' : `${num(b.k)} times as strong as`;
}

/**
 * What a confounder of a benchmark's strength would do, as the end of a sentence that starts "a confounder …
 * would": not informative (capped), lose significance (adjusted |t| at or below t*), or stay significant.
 */
export function summaryBenchmarkOutcome(r: OvbSummary, b: OvbSummaryBenchmark): string {
  if (b.informative === false) return `give a bound that is not informative: ${b.reason ?? CAPPED_BOUND_WORDS}`;
  const adjusted = `leave an adjusted estimate of ${num(b.correctedEstimate)}`;
  const classical = (r.seKind ?? 'classical') === 'classical';
  if (!classical || b.correctedT === null || r.criticalT === null || r.criticalT === undefined) return adjusted;
  const t = formatNumber(b.correctedT, { digits: 2 });
  const threshold = formatNumber(r.criticalT, { digits: 2 });
  if (!summarySignificant(r)) return `${adjusted} (t = ${t}; the estimate was not significant to begin with)`;
  return Math.abs(b.correctedT) <= r.criticalT
    ? `${adjusted}, with t = ${t}, at or below the ${threshold} needed for significance at α = ${num(r.alpha)}: the estimate would no longer be statistically significant`
    : `${adjusted}, still significant at α = ${num(r.alpha)} (t = ${t}, above ${threshold})`;
}

/** The share a benchmark's confounder explains, in words. */
export function summaryShares(b: OvbSummaryBenchmark, exposure: string, outcome: string): string {
  return `${formatPercent(b.r2dz)} of the residual variance of ${exposure} and ${formatPercent(b.r2yz)} of ${outcome}`;
}

export function num(value: number | null | undefined): string {
  const text = formatNumber(value, { significant: 3 });
  return /^-?\d+\.\d+$/.test(text) ? text.replace(/\.?0+$/, '') : text;
}
