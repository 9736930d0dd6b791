import { readCsvText } from '../data/csv';
import { emptyEValueForm, type EValueFormInputs } from '../methods/evalue/request';
import { emptyOvbForm, type OvbFormInputs } from '../methods/regression/request';
import { BATCH_COLUMNS, eValueFormOfRow, ovbFormOfRow, type BatchColumn } from './batchFindings';

/**
 * Moving one finding between a calculator and the batch table, both ways, with the same reading of a row as the
 * table's (`eValueFormOfRow`, `ovbFormOfRow`): a reported ratio or difference is a row of the E-value calculator,
 * a regression coefficient (measure `coef`, with se and df) a row of the regression calculator.
 */

/** The columns a row written from a finding uses, in this order, when the table is new. */
const NEW_TABLE_COLUMNS: readonly BatchColumn[] = ['label', 'measure', 'estimate', 'lower', 'upper', 'se', 'df', 'level', 'outcome_prevalence', 'sd', 'target'];

/** A finding as the batch table would hold it: its method, its name and its form as typed. */
export interface BatchFinding {
  readonly method: 'evalue' | 'regression';
  readonly name: string;
  readonly inputs: EValueFormInputs | OvbFormInputs;
}

/**
 * The finding of data row `row` (1-based, as the table numbers them) of a batch CSV, ready to open in its
 * calculator; null when the row does not exist or its measure is not one the table reads.
 */
export function findingOfBatchRow(text: string, row: number, alpha = '0.05'): BatchFinding | null {
  const table = readCsvText(text, 'file');
  const cells = table.rows[row - 1];
  if (!cells) return null;
  const normal = (c: string) => c.trim().toLowerCase().replace(/[\s.-]+/g, '_');
  const cell = (column: BatchColumn) => {
    const at = table.columns.findIndex((c) => normal(c) === column);
    return at >= 0 ? (cells[at] ?? '') : '';
  };
  const measure = cell('measure').trim().toLowerCase();
  const name = cell('label').trim() || `Row ${row} of the table`;
  if (measure === 'coef') return { method: 'regression', name, inputs: ovbFormOfRow(cell, alpha) };
  if (['rr', 'or', 'hr', 'smd', 'md'].includes(measure)) return { method: 'evalue', name, inputs: eValueFormOfRow(cell) };
  return null;
}

/**
 * A finding's cells for a batch row, or the reason it has none: a reported estimate of the E-value calculator,
 * or a reported regression coefficient with its standard error and degrees of freedom.
 */
export function batchCellsOfFinding(method: string, name: string, inputs: unknown): { cells: Partial<Record<BatchColumn, string>> } | { reason: string } {
  if (method === 'evalue') {
    const form = { ...emptyEValueForm(), ...(inputs as Partial<EValueFormInputs>) };
    if (form.source !== 'reported') return { reason: 'only a reported estimate (not a 2×2 table or a data file) can be a row of the table' };
    const bySe = form.intervalBy === 'se';
    return {
      cells: {
        label: name,
        measure: form.measure,
        estimate: form.estimate,
        lower: bySe ? '' : form.lower,
        upper: bySe ? '' : form.upper,
        se: bySe ? form.se : '',
        level: form.level,
        outcome_prevalence: form.outcomePrevalence,
        sd: form.sd,
        target: form.target,
      },
    };
  }
  if (method === 'regression') {
    const form = { ...emptyOvbForm(), ...(inputs as Partial<OvbFormInputs>) };
    if (form.source !== 'reported') return { reason: 'only a reported coefficient (not a data file) can be a row of the table' };
    if (form.dfBy !== 'df') return { reason: 'the table needs the residual degrees of freedom (df) typed, not n and the number of coefficients' };
    return { cells: { label: name, measure: 'coef', estimate: form.estimate, se: form.se, df: form.df } };
  }
  return { reason: 'the table holds reported estimates (E-values) and regression coefficients (robustness values) only' };
}

/**
 * The batch text with a finding added as its last row (a header first when the text is empty). The row follows
 * the table's own columns; a finding that needs a column the table lacks is refused with a plain reason.
 */
export function withBatchRow(text: string, method: string, name: string, inputs: unknown): { text: string } | { reason: string } {
  const made = batchCellsOfFinding(method, name, inputs);
  if ('reason' in made) return made;
  const { cells } = made;
  if (text.trim() === '') return { text: `${NEW_TABLE_COLUMNS.join(',')}\n${NEW_TABLE_COLUMNS.map((c) => csvCell(cells[c] ?? '')).join(',')}\n` };
  const columns = readCsvText(text, 'file').columns;
  const normal = (c: string) => c.trim().toLowerCase().replace(/[\s.-]+/g, '_');
  const missing = (Object.keys(cells) as BatchColumn[]).filter((c) => (cells[c] ?? '').trim() !== '' && !columns.some((h) => normal(h) === c));
  if (missing.length > 0) return { reason: `the table has no ${missing.join(', ')} column; add ${missing.length === 1 ? 'it' : 'them'} to its first line first` };
  const line = columns.map((h) => {
    const column = normal(h) as BatchColumn;
    return BATCH_COLUMNS.includes(column) ? csvCell(cells[column] ?? '') : '';
  });
  return { text: `${text.replace(/\s*$/, '')}\n${line.join(',')}\n` };
}

/** A CSV cell: quoted when it holds a comma, a quote or a line break. */
function csvCell(text: string): string {
  return /[",\r\n]/.test(text) ? `"${text.replace(/"/g, '""')}"` : text;
}
