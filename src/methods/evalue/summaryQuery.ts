import { InputError, type InputProblem } from '../../core/inputProblem';
import type { EValueFormInputs } from './request';
import { twoByTwoSql } from './twoByTwoSql';

/**
 * The counting query for the form's table and columns (summary source), or the problems that prevent it, named
 * by form field: `summaryTable`, `exposure`, `outcome`. The page shows it; `lurk evalue --sql` prints it.
 */
export function eValueSummaryQuery(form: EValueFormInputs): { sql: string; problems: InputProblem[] } {
  try {
    const sql = twoByTwoSql({
      table: form.summaryTable ?? '',
      exposureColumn: form.exposureColumn.trim(),
      outcomeColumn: form.outcomeColumn.trim(),
      exposedValues: form.exposedValues,
      outcomeValues: form.outcomeValues,
    });
    return { sql, problems: [] };
  } catch (error) {
    if (!(error instanceof InputError)) throw error;
    return { sql: '', problems: error.problems.map((p) => (p.field === 'sqlTable' ? { ...p, field: 'summaryTable' } : p)) };
  }
}
