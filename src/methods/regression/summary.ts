import type { OvbResult } from '../../core/ovbAnalysis';
import { withoutRoundingNoise } from '../../format/formatNumber';
import { notInformativeWords } from './text';
import { readConventions, summaryConventions, type SummaryConvention } from '../summaryConventions';

/** A benchmark bound that is available, as kept in an appraisal file. */
export interface OvbSummaryBenchmark {
  covariate: string;
  k: number | null;
  r2dz: number | null;
  r2yz: number | null;
  correctedEstimate: number | null;
  correctedT: number | null;
  /** The outcome-side multiple k_Y (k when not given separately); absent in older files. */
  kOutcome?: number | null;
  /** False when the bound is capped (not informative); absent in older files (then informative). */
  informative?: boolean;
  /** Why the bound is not informative, in the core's words; null when it is. */
  reason?: string | null;
}

/** Headline numbers of a regression sensitivity analysis, as plain JSON (non-finite numbers become null). */
export interface OvbSummary {
  [key: string]: unknown;
  kind: 'regression';
  estimate: number | null;
  se: number | null;
  t: number | null;
  df: number | null;
  q: number | null;
  alpha: number | null;
  direction: string;
  partialR2: number | null;
  rv: number | null;
  rvAlpha: number | null;
  /** Benchmark bounds that are available, k = 1 first. */
  benchmarks: OvbSummaryBenchmark[];
  /** The significance threshold t* (df − 1 degrees of freedom); absent in older files. */
  criticalT?: number | null;
  /** The strongest measured covariate by the core's one rule; absent in older files. */
  strongestCovariate?: string | null;
  /** How the standard error was computed; absent in older files (classical). */
  seKind?: string;
  /** The conventions the analysis followed, in the core's words; absent in older files. */
  conventions?: SummaryConvention[];
}

/** The summary of a result, for the appraisal file, the statement and the bottom line. */
export function ovbSummary(result: OvbResult): OvbSummary {
  return {
    kind: 'regression',
    estimate: finite(result.estimate),
    se: finite(result.se),
    t: finite(result.t),
    df: finite(result.df),
    q: finite(result.q),
    alpha: finite(result.alpha),
    direction: result.direction,
    partialR2: finite(result.partialR2),
    rv: finite(result.rv),
    rvAlpha: finite(result.rvAlpha),
    benchmarks: result.benchmarks
      .filter((b) => b.unavailable === null)
      .map((b) => ({
        covariate: b.covariate,
        k: finite(b.k),
        r2dz: finite(b.r2dz),
        r2yz: finite(b.r2yz),
        correctedEstimate: finite(withoutRoundingNoise(b.correctedEstimate, Math.abs(result.estimate))),
        correctedT: finite(b.correctedT),
        kOutcome: finite(b.kOutcome),
        informative: b.informative,
        reason: b.informative ? null : notInformativeWords(b),
      })),
    criticalT: finite(result.criticalT),
    strongestCovariate: result.strongestCovariate,
    seKind: result.seKind,
    conventions: summaryConventions(result.conventions),
  };
}

const NUMBER_FIELDS = ['estimate', 'se', 't', 'df', 'q', 'alpha', 'partialR2', 'rv', 'rvAlpha'] as const;
const BENCHMARK_NUMBERS = ['k', 'r2dz', 'r2yz', 'correctedEstimate', 'correctedT', 'kOutcome'] as const;

/** A summary read back from a file or link, checked field by field; null when it is not a regression summary. */
export function readOvbSummary(saved: unknown): OvbSummary | null {
  if (!saved || typeof saved !== 'object') return null;
  const s = saved as Record<string, unknown>;
  if (s.kind !== 'regression') return null;
  const num = (v: unknown): number | null => (typeof v === 'number' && Number.isFinite(v) ? v : null);
  const numbers = Object.fromEntries(NUMBER_FIELDS.map((f) => [f, num(s[f])])) as Record<(typeof NUMBER_FIELDS)[number], number | null>;
  const benchmarks = Array.isArray(s.benchmarks)
    ? s.benchmarks
        .filter((b): b is Record<string, unknown> => !!b && typeof b === 'object' && typeof (b as Record<string, unknown>).covariate === 'string')
        .map((b) => ({
          covariate: b.covariate as string,
          ...(Object.fromEntries(BENCHMARK_NUMBERS.map((f) => [f, num(b[f])])) as Record<(typeof BENCHMARK_NUMBERS)[number], number | null>),
          informative: b.informative !== false,
          reason: typeof b.reason === 'string' ? b.reason : null,
        }))
    : [];
  return {
    kind: 'regression',
    ...numbers,
    direction: s.direction === 'away-from-zero' ? 'away-from-zero' : 'toward-zero',
    benchmarks,
    criticalT: num(s.criticalT),
    strongestCovariate: typeof s.strongestCovariate === 'string' ? s.strongestCovariate : null,
    seKind: typeof s.seKind === 'string' ? s.seKind : 'classical',
    conventions: readConventions(s.conventions),
  };
}

function finite(value: number | null | undefined): number | null {
  return value !== null && value !== undefined && Number.isFinite(value) ? value : null;
}
