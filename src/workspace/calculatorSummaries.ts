import type { EValueResult } from '../core/eValueAnalysis';
import type { ReferenceConfounderAssessment } from '../core/referenceConfounder';
import type { PairsResult } from '../core/pairsAnalysis';
import type { OvbResult } from '../core/ovbAnalysis';
import type { CalculatorSummary } from './appraisal';
import type { RiskRatioConversion } from '../core/riskRatioScale';
import type { TippingGamma } from '../core/tippingGamma';

/**
 * Headline numbers of each calculator's result, as plain JSON: what an appraisal file keeps so that the
 * robustness statement and the bottom line can be written from the file alone. Non-finite numbers become null.
 */

export interface EValueSummary extends CalculatorSummary {
  kind: 'evalue';
  measure: string;
  estimate: number | null;
  lower: number | null;
  upper: number | null;
  level: number | null;
  target: number | null;
  targetIsNull: boolean;
  conversion: RiskRatioConversion;
  conversionNote: string;
  eValueEstimate: number | null;
  eValueInterval: number | null;
  intervalLimitUsed: string | null;
  /** Reference confounders (e.g. measured covariates of known strength) and what they could do. */
  references: Array<{ name: string; rrExposure: number | null; rrOutcome: number | null; explainsEstimate: boolean; explainsInterval: boolean | null }>;
}

export function eValueSummary(result: EValueResult, references: readonly ReferenceConfounderAssessment[] = []): EValueSummary {
  return {
    kind: 'evalue',
    measure: result.measure,
    estimate: finite(result.input.estimate),
    lower: finite(result.interval?.lower),
    upper: finite(result.interval?.upper),
    level: result.interval ? finite(result.level) : null,
    target: finite(result.target),
    targetIsNull: result.targetIsNull,
    conversion: result.conversion.kind,
    conversionNote: result.conversion.note,
    eValueEstimate: finite(result.eValueEstimate),
    eValueInterval: finite(result.eValueInterval),
    intervalLimitUsed: result.intervalLimitUsed,
    references: references.map((r) => ({
      name: r.name,
      rrExposure: finite(r.strengthExposure),
      rrOutcome: finite(r.strengthOutcome),
      explainsEstimate: r.explainsEstimate,
      explainsInterval: r.explainsInterval,
    })),
  };
}

export interface PairsSummary extends CalculatorSummary {
  kind: 'pairs';
  test: string;
  alternative: string;
  alpha: number | null;
  n: number | null;
  nonZero: number | null;
  pValue: number | null;
  sensitivityValue: number | null;
  sensitivityStatus: TippingGamma['status'];
  searchedUpTo: number | null;
  signTestSensitivityValue: number | null;
  tailMethod: string;
  estimate: number | null;
  /** The estimate range and sensitivity interval at the Γ nearest below the sensitivity value (or at Γ = 2). */
  rangeAt: { gamma: number | null; estimateLow: number | null; estimateHigh: number | null; intervalLow: number | null; intervalHigh: number | null } | null;
  amplification: Array<{ lambda: number | null; delta: number | null }>;
}

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
    estimate: finite(result.estimate),
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
  };
}

export interface OvbSummary extends CalculatorSummary {
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
  benchmarks: Array<{ covariate: string; k: number | null; r2dz: number | null; r2yz: number | null; correctedEstimate: number | null; correctedT: number | null }>;
}

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
        correctedEstimate: finite(b.correctedEstimate),
        correctedT: finite(b.correctedT),
      })),
  };
}

function finite(value: number | null | undefined): number | null {
  return value !== null && value !== undefined && Number.isFinite(value) ? value : null;
}
