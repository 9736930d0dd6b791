import { InputError, inputProblem, type InputProblem } from '../../core/inputProblem';
import { readResultRow } from '../../data/sqlText';
import type { PairsRead } from './pairsFromCsv';
import { pairsSql, pairsSummaryFromSqlRow } from './pairsSql';

/** What the matched-pairs query needs from the form: the table and the columns (difference, or treated and control). */
export interface PairsQueryFields {
  readonly summaryTable: string;
  readonly columnsBy: 'outcomes' | 'difference';
  readonly treatedColumn: string;
  readonly controlColumn: string;
  readonly differenceColumn: string;
}

/**
 * The matched-pairs query for the form's table and columns, or the problems (named by form field:
 * `summaryTable`, `differenceColumn`, `treatedColumn`, `controlColumn`).
 */
export function pairsQueryOfForm(form: PairsQueryFields): { sql: string; problems: InputProblem[] } {
  try {
    const sql =
      form.columnsBy === 'difference'
        ? pairsSql({ table: form.summaryTable, differenceColumn: form.differenceColumn.trim() })
        : pairsSql({ table: form.summaryTable, treatedColumn: form.treatedColumn.trim(), controlColumn: form.controlColumn.trim() });
    return { sql, problems: [] };
  } catch (error) {
    if (!(error instanceof InputError)) throw error;
    return { sql: '', problems: error.problems.map((p) => (p.field === 'sqlTable' ? { ...p, field: 'summaryTable' } : p)) };
  }
}

/**
 * The pasted result of the matched-pairs query (a JSON object, or CSV text with a header line and the one row)
 * as pairs read: the signed-rank summary, with the rows left out for a missing value.
 *
 * @throws InputError naming `field`, each message naming the result's column (or saying it is another query's)
 */
export function pairsFromSummaryText(text: string, field = 'summaryResult'): PairsRead {
  if (text.trim() === '') throw new InputError([inputProblem(field, 'required', 'paste the one row the matched-pairs query returned')]);
  const row = readResultRow(text);
  if (!row) {
    throw new InputError([inputProblem(field, 'not-a-result', 'must be the query\'s one result row: a JSON object, or CSV text with the header line and the row')]);
  }
  try {
    const s = pairsSummaryFromSqlRow(row);
    const warnings =
      s.droppedRows > 0 ? [`${s.droppedRows} of ${s.rowsRead} ${s.rowsRead === 1 ? 'row was' : 'rows were'} left out because a value was missing.`] : [];
    return Object.freeze({
      data: Object.freeze({
        kind: 'signed-rank-summary' as const,
        pairs: s.pairs,
        zeros: s.zeros,
        nonZero: s.nonZero,
        positive: s.positive,
        statistic: s.statistic,
        sumRanks: s.sumRanks,
        sumSquaredRanks: s.sumSquaredRanks,
      }),
      columns: Object.freeze([]),
      rowsRead: s.rowsRead,
      droppedRows: s.droppedRows,
      pairs: s.pairs,
      binary: false,
      warnings: Object.freeze(warnings),
    });
  } catch (error) {
    if (!(error instanceof InputError)) throw error;
    throw new InputError(error.problems.map((p) => resultProblem(p, field)));
  }
}

/** A problem of the result row (`summary.rank_sum`) as a problem of the paste box, naming the column. */
export function resultProblem(p: InputProblem, field: string): InputProblem {
  const column = /^summary\.(.+)$/.exec(p.field)?.[1];
  return { ...p, field, message: column ? `column ${column} ${p.message}` : p.message };
}
