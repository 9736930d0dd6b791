import type { EValueResult } from '../../core/eValueAnalysis';
import type { ReferenceConfounderAssessment } from '../../core/referenceConfounder';
import type { RiskRatioConversion } from '../../core/riskRatioScale';
import { readConventions, type SummaryConvention } from '../summaryConventions';
import type { EValueFormOutcome } from './request';

/** A reference confounder in the summary: its strengths and what it could do. */
export type EValueSummaryReference = {
  readonly name: string;
  readonly rrExposure: number | null;
  readonly rrOutcome: number | null;
  readonly explainsEstimate: boolean;
  readonly explainsInterval: boolean | null;
};

/**
 * Headline numbers of an E-value result, as plain JSON: what an appraisal file keeps so that the robustness
 * statement and the bottom line can be written from the file alone. Non-finite numbers become null.
 */
export type EValueSummary = {
  readonly kind: 'evalue';
  readonly measure: string;
  readonly estimate: number | null;
  readonly lower: number | null;
  readonly upper: number | null;
  readonly level: number | null;
  readonly target: number | null;
  readonly targetIsNull: boolean;
  readonly conversion: RiskRatioConversion;
  readonly conversionNote: string;
  readonly eValueEstimate: number | null;
  readonly eValueInterval: number | null;
  readonly intervalLimitUsed: string | null;
  /** Reference confounders (e.g. measured covariates of known strength) and what they could do. */
  readonly references: readonly EValueSummaryReference[];
  /** Which confounding the E-values refer to (see the core's `targetDirection`); absent in older files. */
  readonly targetDirection?: 'toward-null' | 'away-from-null' | null;
  /** The conventions the analysis followed, in the core's words; absent in older files. */
  readonly conventions?: readonly SummaryConvention[];
  /** The numbers as the user typed them (estimate, limits, target), to echo with the precision typed. */
  readonly typed?: { readonly estimate: string; readonly lower: string; readonly upper: string; readonly target: string };
};

/** The summary of a result and its assessed reference confounders. */
export function eValueSummary(
  result: EValueResult,
  references: readonly ReferenceConfounderAssessment[] = [],
  typed?: EValueSummary['typed'],
): EValueSummary {
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
    targetDirection: result.targetDirection,
    conventions: result.conventions.map((c) => ({ id: c.id, text: c.text })),
    ...(typed ? { typed: { ...typed } } : {}),
  };
}

/** The summary of what the form gave, or null while there is no result. */
export function summariseEValue(outcome: EValueFormOutcome): EValueSummary | null {
  if (!outcome.result) return null;
  return eValueSummary(
    outcome.result,
    outcome.confounders.filter((c): c is ReferenceConfounderAssessment => c !== null),
    outcome.typed,
  );
}

/** A summary read back from a file or a link, checked field by field; null when it is not an E-value summary. */
export function readEValueSummary(saved: unknown): EValueSummary | null {
  if (saved === null || typeof saved !== 'object' || Array.isArray(saved)) return null;
  const s = saved as Record<string, unknown>;
  if (s.kind !== 'evalue') return null;
  const strings = ['measure', 'conversionNote'] as const;
  const numbers = ['estimate', 'lower', 'upper', 'level', 'target', 'eValueEstimate', 'eValueInterval'] as const;
  if (!strings.every((k) => typeof s[k] === 'string')) return null;
  if (!numbers.every((k) => isNumberOrNull(s[k]))) return null;
  if (typeof s.targetIsNull !== 'boolean') return null;
  if (!(RISK_RATIO_CONVERSIONS as readonly unknown[]).includes(s.conversion)) return null;
  if (s.intervalLimitUsed !== null && typeof s.intervalLimitUsed !== 'string') return null;
  const references = s.references === undefined ? [] : s.references;
  if (!Array.isArray(references)) return null;
  const readReferences: EValueSummaryReference[] = [];
  for (const r of references) {
    if (r === null || typeof r !== 'object') return null;
    const ref = r as Record<string, unknown>;
    if (typeof ref.name !== 'string' || !isNumberOrNull(ref.rrExposure) || !isNumberOrNull(ref.rrOutcome)) return null;
    if (typeof ref.explainsEstimate !== 'boolean' || (ref.explainsInterval !== null && typeof ref.explainsInterval !== 'boolean')) return null;
    readReferences.push({
      name: ref.name,
      rrExposure: ref.rrExposure as number | null,
      rrOutcome: ref.rrOutcome as number | null,
      explainsEstimate: ref.explainsEstimate,
      explainsInterval: ref.explainsInterval as boolean | null,
    });
  }
  return {
    kind: 'evalue',
    measure: s.measure as string,
    estimate: s.estimate as number | null,
    lower: s.lower as number | null,
    upper: s.upper as number | null,
    level: s.level as number | null,
    target: s.target as number | null,
    targetIsNull: s.targetIsNull,
    conversion: s.conversion as RiskRatioConversion,
    conversionNote: s.conversionNote as string,
    eValueEstimate: s.eValueEstimate as number | null,
    eValueInterval: s.eValueInterval as number | null,
    intervalLimitUsed: s.intervalLimitUsed as string | null,
    references: readReferences,
    targetDirection: s.targetDirection === 'toward-null' || s.targetDirection === 'away-from-null' ? s.targetDirection : null,
    conventions: readConventions(s.conventions),
    ...(readTyped(s.typed) ? { typed: readTyped(s.typed) as EValueSummary['typed'] } : {}),
  };
}

const RISK_RATIO_CONVERSIONS: readonly RiskRatioConversion[] = [
  'none',
  'odds-ratio-rare-outcome',
  'odds-ratio-square-root',
  'hazard-ratio-rare-outcome',
  'hazard-ratio-common-outcome',
  'standardized-mean-difference',
  'mean-difference-via-sd',
];

function isNumberOrNull(value: unknown): boolean {
  return value === null || (typeof value === 'number' && Number.isFinite(value));
}

function finite(value: number | null | undefined): number | null {
  return value !== null && value !== undefined && Number.isFinite(value) ? value : null;
}

function readTyped(value: unknown): EValueSummary['typed'] | null {
  if (value === null || typeof value !== 'object') return null;
  const t = value as Record<string, unknown>;
  const keys = ['estimate', 'lower', 'upper', 'target'] as const;
  if (!keys.every((k) => typeof t[k] === 'string')) return null;
  return { estimate: t.estimate as string, lower: t.lower as string, upper: t.upper as string, target: t.target as string };
}
