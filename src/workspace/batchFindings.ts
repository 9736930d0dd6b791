import { analyseEValue, type EValueInput } from '../core/eValueAnalysis';
import { EFFECT_MEASURES, type EffectMeasure, type OutcomePrevalence } from '../core/riskRatioScale';
import { robustnessValue, robustnessValueAtLevel } from '../core/robustnessValue';
import { InputError } from '../core/inputProblem';
import { columnIndex, readCsvText, type CsvTable } from '../data/csv';
import { parseNumberText } from '../data/numberText';

/**
 * Batch appraisal: one reported finding per CSV row → its E-values and, where a standard error and residual
 * degrees of freedom are given, its robustness values. For reviewers and evidence synthesis.
 *
 * Columns (header names, any order, case-insensitive): `label`, `measure` (rr, or, hr, smd, md, or `coef` for a
 * linear-regression coefficient, which has robustness values but no E-value), `estimate`, and optionally
 * `lower`, `upper`, `se`, `df`, `level` (default 0.95), `outcome_prevalence` (rare/common; required for or/hr),
 * `sd` (required for md), `target`.
 *
 * Robustness values use t = estimate/SE on the scale the SE is on: the log ratio for rr/or/hr, d for smd, the
 * raw difference for md and coef. They are exact for a linear-regression coefficient (Cinelli & Hazlett 2020);
 * for other measures they are a rough guide, and the table says which scale was used.
 */
export const BATCH_COLUMNS = ['label', 'measure', 'estimate', 'lower', 'upper', 'se', 'df', 'level', 'outcome_prevalence', 'sd', 'target'] as const;
export type BatchMeasure = EffectMeasure | 'coef';
export const BATCH_MEASURES: readonly BatchMeasure[] = Object.freeze([...EFFECT_MEASURES, 'coef']);

export interface BatchRow {
  /** 1-based data row number in the file. */
  readonly row: number;
  readonly label: string;
  readonly measure: string;
  readonly estimate: number | null;
  readonly lower: number | null;
  readonly upper: number | null;
  readonly se: number | null;
  readonly df: number | null;
  readonly eValueEstimate: number | null;
  readonly eValueInterval: number | null;
  /** t = estimate/SE on the SE's scale (see above), when an SE is given. */
  readonly t: number | null;
  readonly partialR2: number | null;
  readonly rv: number | null;
  readonly rvAlpha: number | null;
  /** Why this row has no results (or only some), in plain words naming the column; empty when all is well. */
  readonly problem: string;
}

export interface BatchResult {
  readonly rows: readonly BatchRow[];
  /** Rows that gave an E-value. */
  readonly computed: number;
  /** Rows with a problem. */
  readonly withProblems: number;
  readonly alpha: number;
  readonly warnings: readonly string[];
}

/**
 * Reads a batch CSV and appraises every row. A row's problems never stop the others: each row carries its own
 * message. Problems with the file itself (empty, no `measure`/`estimate` column) throw InputError.
 */
export function appraiseBatchCsv(text: string, alpha = 0.05): BatchResult {
  const table = readCsvText(text, 'file');
  return appraiseBatchTable(table, alpha);
}

export function appraiseBatchTable(table: CsvTable, alpha = 0.05): BatchResult {
  const find = (name: string): number => {
    const wanted = name.toLowerCase();
    return table.columns.findIndex((c) => c.trim().toLowerCase().replace(/[\s.-]+/g, '_') === wanted);
  };
  for (const required of ['measure', 'estimate']) if (find(required) < 0) columnIndex(table, required, 'file');
  const at = Object.fromEntries(BATCH_COLUMNS.map((c) => [c, find(c)])) as Record<(typeof BATCH_COLUMNS)[number], number>;
  const unknown = table.columns.filter((c) => !BATCH_COLUMNS.includes(c.trim().toLowerCase().replace(/[\s.-]+/g, '_') as never));
  const warnings = [...table.warnings];
  if (unknown.length > 0) warnings.push(`columns not used: ${unknown.join(', ')}`);
  const rows = table.rows.map((cells, i) => appraiseRow(cells, at, i + 1, table.decimalComma, alpha));
  return Object.freeze({
    rows: Object.freeze(rows),
    computed: rows.filter((r) => r.eValueEstimate !== null).length,
    withProblems: rows.filter((r) => r.problem !== '').length,
    alpha,
    warnings: Object.freeze(warnings),
  });
}

function appraiseRow(
  cells: ReadonlyArray<string | null>,
  at: Record<(typeof BATCH_COLUMNS)[number], number>,
  row: number,
  decimalComma: boolean,
  alpha: number,
): BatchRow {
  const text = (column: (typeof BATCH_COLUMNS)[number]): string | null => (at[column] >= 0 ? cells[at[column]] : null);
  const problems: string[] = [];
  const number = (column: (typeof BATCH_COLUMNS)[number]): number | null => {
    const cell = text(column);
    if (cell === null) return null;
    const value = parseNumberText(cell, decimalComma);
    if (Number.isNaN(value)) {
      problems.push(`${column}: "${cell}" is not a number`);
      return null;
    }
    return value;
  };
  const label = text('label') ?? `row ${row}`;
  const measure = (text('measure') ?? '').toLowerCase();
  const estimate = number('estimate');
  const lower = number('lower');
  const upper = number('upper');
  const se = number('se');
  const df = number('df');
  const level = number('level');
  const sd = number('sd');
  const target = number('target');
  const prevalenceText = text('outcome_prevalence')?.toLowerCase() ?? null;
  const base = { row, label, measure, estimate, lower, upper, se, df };
  const empty = { eValueEstimate: null, eValueInterval: null, t: null, partialR2: null, rv: null, rvAlpha: null };

  if (!BATCH_MEASURES.includes(measure as BatchMeasure)) {
    problems.unshift(`measure: must be one of ${BATCH_MEASURES.join(', ')}${measure ? `, got "${measure}"` : ' (empty)'}`);
    return Object.freeze({ ...base, ...empty, problem: problems.join('; ') });
  }
  if (estimate === null && problems.length === 0) problems.push('estimate: is missing');
  if (problems.length > 0) return Object.freeze({ ...base, ...empty, problem: problems.join('; ') });
  if (prevalenceText !== null && prevalenceText !== 'rare' && prevalenceText !== 'common') {
    return Object.freeze({ ...base, ...empty, problem: `outcome_prevalence: must be rare or common, got "${prevalenceText}"` });
  }

  let eValueEstimate: number | null = null;
  let eValueInterval: number | null = null;
  if (measure !== 'coef') {
    const input: EValueInput = {
      measure: measure as EffectMeasure,
      estimate: estimate as number,
      lower,
      upper,
      // With limits given, the SE is for the robustness value only.
      se: lower === null && upper === null ? se : null,
      level,
      outcomePrevalence: prevalenceText as OutcomePrevalence | null,
      sd,
      target,
    };
    try {
      const result = analyseEValue(input);
      eValueEstimate = result.eValueEstimate;
      eValueInterval = result.eValueInterval;
    } catch (error) {
      if (!(error instanceof InputError)) throw error;
      problems.push(...error.problems.map((p) => `${columnOf(p.field)}: ${p.message}`));
    }
  }

  let t: number | null = null;
  let partialR2: number | null = null;
  let rv: number | null = null;
  let rvAlpha: number | null = null;
  if (se !== null && df !== null) {
    if (!(se > 0)) problems.push('se: must be positive');
    else if (!(df > 1) || !Number.isFinite(df)) problems.push('df: must be more than 1');
    else {
      const onScale = measure === 'rr' || measure === 'or' || measure === 'hr' ? Math.log(estimate as number) : (estimate as number);
      if (!Number.isFinite(onScale)) problems.push('estimate: a ratio must be positive for its t-statistic');
      else {
        t = onScale / se;
        partialR2 = (t * t) / (t * t + df);
        rv = robustnessValue(t, df, 1);
        rvAlpha = robustnessValueAtLevel(t, df, 1, alpha);
      }
    }
  } else if (measure === 'coef') {
    problems.push('se and df: a regression coefficient needs both for its robustness value');
  }
  return Object.freeze({ ...base, eValueEstimate, eValueInterval, t, partialR2, rv, rvAlpha, problem: problems.join('; ') });
}

/** Input-object fields map to batch columns of the same name, except outcomePrevalence. */
function columnOf(field: string): string {
  return field === 'outcomePrevalence' ? 'outcome_prevalence' : field;
}
