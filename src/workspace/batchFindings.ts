import { InputError } from '../core/inputProblem';
import type { InputProblem } from '../core/inputProblem';
import { columnIndex, readCsvText, type CsvTable } from '../data/csv';
import { csvRowBatches } from '../data/csvStream';
import type { ByteSource } from '../data/byteSource';
import { emptyEValueForm, evaluateEValueForm, type EValueFormInputs } from '../methods/evalue/request';
import { emptyOvbForm, evaluateOvbForm, type OvbFormInputs } from '../methods/regression/request';

/**
 * Batch appraisal: one reported finding per CSV row → its E-values and, for a linear-regression coefficient
 * (measure `coef`) with its standard error and residual degrees of freedom, its robustness values. For
 * reviewers and evidence synthesis.
 *
 * Each row is read by the same request readers as the E-value and regression calculators (a row's cells are
 * the forms' typed text), so a cell gives the same value or the same message as the page and the command line.
 *
 * Columns (header names, any order, case-insensitive): `label`, `measure` (rr, or, hr, smd, md, or `coef`),
 * `estimate`, and optionally `lower`, `upper`, `se`, `df`, `level` (default 95%), `outcome_prevalence`
 * (rare/common; required for or/hr), `sd` (required for md), `target`.
 *
 * Robustness values are computed for regression coefficients only: they are defined for the t-statistic of a
 * coefficient in a linear regression (Cinelli & Hazlett 2020) and have no such meaning for a log risk, odds or
 * hazard ratio, so ratio rows get E-values only.
 */
export const BATCH_COLUMNS = ['label', 'measure', 'estimate', 'lower', 'upper', 'se', 'df', 'level', 'outcome_prevalence', 'sd', 'target'] as const;
export type BatchColumn = (typeof BATCH_COLUMNS)[number];
export const BATCH_MEASURES = Object.freeze(['rr', 'or', 'hr', 'smd', 'md', 'coef'] as const);
export type BatchMeasure = (typeof BATCH_MEASURES)[number];

/** The rule behind the batch table's robustness-value columns, for its help text and notes. */
export const BATCH_RV_RULE = 'Robustness values are given for regression coefficients (measure coef, with se and df) only; ratio measures get E-values only.';

/** The CSV's note on a row without robustness values because it is not a regression coefficient. */
export const BATCH_RV_NOTE = 'no robustness value: computed for coef rows only';

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
  /** The coefficient's t = estimate/SE (coef rows). */
  readonly t: number | null;
  readonly partialR2: number | null;
  readonly rv: number | null;
  readonly rvAlpha: number | null;
  /** Why this row has no results (or only some), in plain words naming the column; empty when all is well. */
  readonly problem: string;
}

export interface BatchResult {
  readonly rows: readonly BatchRow[];
  /** Rows that gave an E-value or a robustness value. */
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
  return appraiseBatchTable(readCsvText(text, 'file'), alpha);
}

export function appraiseBatchTable(table: CsvTable, alpha = 0.05): BatchResult {
  const { at, unknown } = batchColumns(table.columns);
  const rows = table.rows.map((cells, i) => appraiseRow((column) => (at[column] >= 0 ? (cells[at[column]] ?? '') : ''), i + 1, alpha));
  return batchResult(rows, [...table.warnings, ...unknown], alpha);
}

/**
 * The same appraisal of a CSV byte stream (a file of any size, read chunk by chunk): each row is appraised as it
 * arrives and only its results are kept, so memory holds one chunk of the file at a time.
 */
export async function appraiseBatchStream(source: ByteSource, alpha = 0.05): Promise<BatchResult> {
  const rows: BatchRow[] = [];
  let layout: ReturnType<typeof batchColumns> | null = null;
  const batches = csvRowBatches(source);
  for (;;) {
    const next = await batches.next();
    if (next.done) return batchResult(rows, [...next.value.warnings, ...(layout?.unknown ?? [])], alpha);
    const batch = next.value;
    layout ??= batchColumns(batch.columns);
    const { at } = layout;
    batch.rows.forEach((cells, i) => rows.push(appraiseRow((column) => (at[column] >= 0 ? (cells[at[column]] ?? '') : ''), batch.firstRowNumber + i, alpha)));
  }
}

/** Where each batch column is (−1 when absent); the file must have `measure` and `estimate`. */
function batchColumns(columns: readonly string[]): { at: Record<BatchColumn, number>; unknown: string[] } {
  const normal = (c: string) => c.trim().toLowerCase().replace(/[\s.-]+/g, '_');
  const find = (name: string): number => columns.findIndex((c) => normal(c) === name);
  for (const required of ['measure', 'estimate']) if (find(required) < 0) columnIndex({ columns }, required, 'file');
  const at = Object.fromEntries(BATCH_COLUMNS.map((c) => [c, find(c)])) as Record<BatchColumn, number>;
  const unknownColumns = columns.filter((c) => !BATCH_COLUMNS.includes(normal(c) as BatchColumn));
  return { at, unknown: unknownColumns.length > 0 ? [`columns not used: ${unknownColumns.join(', ')}`] : [] };
}

function batchResult(rows: BatchRow[], readWarnings: string[], alpha: number): BatchResult {
  const warnings = [...readWarnings];
  if (rows.some((r) => r.measure !== 'coef' && r.measure !== '' && r.se !== null && r.df !== null)) warnings.push(BATCH_RV_RULE);
  return Object.freeze({
    rows: Object.freeze(rows),
    computed: rows.filter((r) => r.eValueEstimate !== null || r.rv !== null).length,
    withProblems: rows.filter((r) => r.problem !== '').length,
    alpha,
    warnings: Object.freeze(warnings),
  });
}

function appraiseRow(cell: (column: BatchColumn) => string, row: number, alpha: number): BatchRow {
  const label = cell('label').trim() || `row ${row}`;
  const measure = cell('measure').trim().toLowerCase();
  const empty = { estimate: null, lower: null, upper: null, se: null, df: null, eValueEstimate: null, eValueInterval: null, t: null, partialR2: null, rv: null, rvAlpha: null };
  if (!BATCH_MEASURES.includes(measure as BatchMeasure)) {
    const problem = `measure: must be one of ${BATCH_MEASURES.join(', ')}${measure ? `, got "${cell('measure').trim()}"` : ' (empty)'}`;
    return Object.freeze({ row, label, measure, ...empty, problem });
  }
  if (measure === 'coef') return coefficientRow(cell, row, label, alpha);
  const form = eValueFormOfRow(cell);
  const outcome = evaluateEValueForm(form, null);
  const result = outcome.result;
  const problems = [...outcome.problems];
  if (!['', 'rare', 'common'].includes(form.outcomePrevalence)) {
    problems.unshift({ field: 'outcomePrevalence', code: 'not-a-choice', message: `must be rare or common, got "${cell('outcome_prevalence').trim()}"` });
  }
  return Object.freeze({
    row,
    label,
    measure,
    ...empty,
    estimate: result ? result.input.estimate : null,
    lower: result?.interval?.lower ?? null,
    upper: result?.interval?.upper ?? null,
    eValueEstimate: result ? result.eValueEstimate : null,
    eValueInterval: result ? result.eValueInterval : null,
    problem: problemText(problems),
  });
}

/** The E-value calculator's form of a batch row (its cells as typed): the same reading as the batch table's. */
export function eValueFormOfRow(cell: (column: BatchColumn) => string): EValueFormInputs {
  const hasLimits = cell('lower').trim() !== '' || cell('upper').trim() !== '';
  return {
    ...emptyEValueForm(),
    source: 'reported',
    measure: cell('measure').trim().toLowerCase() as EValueFormInputs['measure'],
    estimate: cell('estimate'),
    intervalBy: hasLimits || cell('se').trim() === '' ? 'limits' : 'se',
    lower: cell('lower'),
    upper: cell('upper'),
    se: cell('se'),
    level: cell('level').trim() === '' ? '95' : cell('level'),
    outcomePrevalence: cell('outcome_prevalence').trim().toLowerCase() as EValueFormInputs['outcomePrevalence'],
    sd: cell('sd'),
    target: cell('target'),
  };
}

/** The regression calculator's form of a `coef` batch row (estimate, se, df), with α as typed. */
export function ovbFormOfRow(cell: (column: BatchColumn) => string, alpha: string): OvbFormInputs {
  return { ...emptyOvbForm(), source: 'reported', estimate: cell('estimate'), se: cell('se'), dfBy: 'df', df: cell('df'), alpha };
}

function coefficientRow(cell: (column: BatchColumn) => string, row: number, label: string, alpha: number): BatchRow {
  const form = ovbFormOfRow(cell, String(alpha));
  const outcome = evaluateOvbForm(form, null);
  const r = outcome.result;
  const problems = outcome.problems.length > 0 && (cell('se').trim() === '' || cell('df').trim() === '')
    ? [{ field: 'se and df', code: 'required', message: 'a regression coefficient needs both for its robustness value' } as InputProblem]
    : outcome.problems;
  return Object.freeze({
    row,
    label,
    measure: 'coef',
    estimate: r ? r.estimate : null,
    lower: null,
    upper: null,
    se: r ? r.se : null,
    df: r ? r.df : null,
    eValueEstimate: null,
    eValueInterval: null,
    t: r ? r.t : null,
    partialR2: r ? r.partialR2 : null,
    rv: r ? r.rv : null,
    rvAlpha: r ? r.rvAlpha : null,
    problem: problemText(problems),
  });
}

/** Problems of a row, each naming its column, joined by "; ". */
function problemText(problems: readonly InputProblem[]): string {
  const column = (field: string) => (field === 'outcomePrevalence' ? 'outcome_prevalence' : field);
  return problems.map((p) => `${column(p.field)}: ${p.message.replace(/\.$/, '')}`).join('; ');
}

export { InputError };
