import { InputError, type InputProblem, inputProblem, throwIfProblems } from '../../core/inputProblem';
import type { CrossProductInput } from '../../core/crossProductFit';
import { quoteSqlIdentifier, quoteSqlString, readTableName } from '../../data/sqlText';

/** One variable of the summary query: a numeric column, or one level of a categorical column (0/1 indicator). */
export type SummaryVariable =
  | { readonly column: string }
  | { readonly column: string; readonly level: string };

/** What the summary-statistics query computes. */
export interface SummarySqlSpec {
  /** The table, as one name or as its parts (e.g. ["research", "visits"] for research.visits). */
  readonly table: string | readonly string[];
  /** The variables, in design order (e.g. covariates…, treatment, outcome). */
  readonly variables: readonly SummaryVariable[];
  /** The categorical columns' levels as one text (see categoryLevels.ts), returned as `lurk_levels` so that the result describes itself. */
  readonly levels?: string;
}

/** Name of a variable as the design calls it: the column, or `column=level` for an indicator. */
export function summaryVariableName(variable: SummaryVariable): string {
  return 'level' in variable ? `${variable.column}=${variable.level}` : variable.column;
}

export { quoteSqlIdentifier, quoteSqlString } from '../../data/sqlText';

/**
 * Checks the query spec. Fields: `table`, `variables`, `variables[i]`.
 */
export function validateSummarySqlSpec(spec: SummarySqlSpec): InputProblem[] {
  const problems: InputProblem[] = [];
  const parts = typeof spec.table === 'string' ? [spec.table] : spec.table;
  if (parts.length === 0 || parts.some((p) => typeof p !== 'string' || p.trim() === '')) {
    problems.push(inputProblem('table', 'required', 'needs the name of the table (or view) that holds the data.', spec.table));
  }
  if (spec.variables.length === 0) problems.push(inputProblem('variables', 'empty', 'needs at least one variable.'));
  const seen = new Set<string>();
  spec.variables.forEach((v, i) => {
    if (typeof v.column !== 'string' || v.column === '') {
      problems.push(inputProblem(`variables[${i}]`, 'required', 'needs a column name.', v.column));
      return;
    }
    if (/\u0000/.test(v.column) || ('level' in v && /\u0000/.test(v.level))) {
      problems.push(inputProblem(`variables[${i}]`, 'bad-character', 'must not contain a NUL character.', v.column));
    }
    const name = summaryVariableName(v);
    if (seen.has(name)) problems.push(inputProblem(`variables[${i}]`, 'chosen-twice', `"${name}" is chosen twice.`, name));
    seen.add(name);
  });
  return problems;
}

/** Marks the result row of the regression's summary query, so that a row from another query is recognised. */
export const REGRESSION_QUERY_MARK = 'lurk-regression-summary';

/**
 * One standard SQL query that computes, in the user's own database, exactly the summary statistics that
 * Lurk's regression needs, in a numerically stable form: the number of complete rows, the mean of each
 * variable, and the centred cross-products Σ(x_i − m_i)(x_j − m_j) — two passes in one statement (a CTE of
 * means, then sums of products of deviations), with the corrected two-pass term: the query also returns
 * d_i = Σ(x_i − m_i), and the reader subtracts d_i·d_j/n, which removes the rounding error of the means
 * (Chan, Golub & LeVeque 1983, Algorithms for computing the sample variance, The American Statistician
 * 37(3):242–247). Raw sums of products would lose every digit on data with large means and small spread
 * (dates, years, identifiers).
 *
 * Uses CTEs, `COUNT(*)`, `AVG`, `SUM`, `MIN`, `CAST(… AS DOUBLE PRECISION)` (so integer columns cannot
 * overflow), `CASE WHEN … THEN 1 ELSE 0 END` for category indicators, double-quoted identifiers (schema-qualified
 * tables quoted part by part) and a `WHERE … IS NOT NULL` filter that drops a row when any chosen column is
 * NULL — the same rows the CSV path drops. Result columns: `lurk_query` (a mark), `n`, `m_i`, `d_i`, `c_i_j`
 * (i ≤ j), numbered from 1 in the order given (the query's comment lists them). Checked on DuckDB and PostgreSQL.
 *
 * @throws InputError (fields as {@link validateSummarySqlSpec})
 */
export function summaryStatisticsSql(spec: SummarySqlSpec): string {
  throwIfProblems(validateSummarySqlSpec(spec));
  const parts = typeof spec.table === 'string' ? tableParts(spec.table) : spec.table;
  const table = parts.map(quoteSqlIdentifier).join('.');
  const expressions = spec.variables.map(variableExpression);
  const k = expressions.length;
  const lines: string[] = [];
  lines.push('-- Summary statistics for a linear regression: rows, means and centred sums of products.');
  spec.variables.forEach((v, i) => lines.push(`-- ${i + 1} = ${summaryVariableName(v).replace(/[\r\n]+/g, ' ')}`));
  const columns = [...new Set(spec.variables.map((v) => v.column))];
  lines.push('WITH complete AS (');
  lines.push(`  SELECT ${expressions.map((e, i) => `${e} AS v_${i + 1}`).join(',\n         ')}`);
  lines.push(`  FROM ${table}`);
  lines.push(`  WHERE ${columns.map((c) => `${quoteSqlIdentifier(c)} IS NOT NULL`).join('\n    AND ')}`);
  lines.push('), means AS (');
  lines.push(`  SELECT COUNT(*) AS n, ${expressions.map((_, i) => `AVG(v_${i + 1}) AS m_${i + 1}`).join(', ')} FROM complete`);
  lines.push(')');
  lines.push('SELECT');
  const select: string[] = [`  ${quoteSqlString(REGRESSION_QUERY_MARK)} AS lurk_query`, '  MIN(means.n) AS n'];
  if (spec.levels) select.push(`  ${quoteSqlString(spec.levels)} AS lurk_levels`);
  for (let i = 1; i <= k; i++) select.push(`  MIN(means.m_${i}) AS m_${i}`);
  for (let i = 1; i <= k; i++) select.push(`  SUM(v_${i} - means.m_${i}) AS d_${i}`);
  for (let i = 1; i <= k; i++) {
    for (let j = i; j <= k; j++) select.push(`  SUM((v_${i} - means.m_${i}) * (v_${j} - means.m_${j})) AS c_${i}_${j}`);
  }
  lines.push(select.join(',\n'));
  lines.push('FROM complete CROSS JOIN means;');
  return lines.join('\n') + '\n';
}

/** A table name as typed ("research.visits", '"my.table"') in its parts; validation has checked it. */
function tableParts(text: string): string[] {
  const { parts, problem } = readTableName(text);
  return problem ? [text] : parts;
}

function variableExpression(v: SummaryVariable): string {
  const column = quoteSqlIdentifier(v.column);
  // Compared as text, as the levels query lists them (so a numeric code compares the same on every engine).
  if ('level' in v) return `CASE WHEN CAST(${column} AS VARCHAR) = ${quoteSqlString(v.level)} THEN 1.0 ELSE 0.0 END`;
  return `CAST(${column} AS DOUBLE PRECISION)`;
}

/**
 * Reads the one result row of {@link summaryStatisticsSql} (as returned by a database driver, or pasted:
 * numbers, bigints or numeric strings) into the input of `designFromCrossProducts`: means and the covariance
 * (centred cross-products, corrected by d_i·d_j/n, over n − 1). A row of the earlier raw form (`s_i` sums and
 * raw `c_i_j` products) is still read as raw cross-products.
 *
 * @throws InputError naming the result column (`n`, `m_i`, `d_i`, `c_i_j`) that is absent or not a number, or
 *   `summary` for a row of another calculator's query.
 */
export function crossProductsFromSqlRow(
  row: Readonly<Record<string, unknown>>,
  variables: readonly SummaryVariable[],
  options: { intercept?: boolean } = {},
): CrossProductInput {
  const problems: InputProblem[] = [];
  const lower: Record<string, unknown> = {};
  for (const [key, value] of Object.entries(row)) lower[key.toLowerCase()] = value;
  const mark = lower.lurk_query;
  if ((mark !== undefined && mark !== REGRESSION_QUERY_MARK) || (mark === undefined && ('a' in lower || 'rank_sum' in lower))) {
    throw new InputError([inputProblem('summary', 'other-query', "is the result of another calculator's query, not of the regression's summary query: print it with lurk ovb --sql and run it")]);
  }
  const read = (key: string): number => {
    const value = lower[key];
    const number = typeof value === 'bigint' ? Number(value) : typeof value === 'string' ? Number(value.trim()) : value;
    if (typeof number !== 'number' || !Number.isFinite(number) || (typeof value === 'string' && value.trim() === '')) {
      problems.push(inputProblem(key, value === undefined || value === null ? 'missing' : 'not-a-number', value === undefined || value === null ? 'is missing from the query result (run the whole query unchanged).' : `must be a number, got "${String(value)}".`, value));
      return NaN;
    }
    return number;
  };
  const k = variables.length;
  const rowCount = read('n');
  const centred = 'm_1' in lower || !('s_1' in lower);
  const vector = variables.map((_, i) => read(centred ? `m_${i + 1}` : `s_${i + 1}`));
  const offsets = centred ? variables.map((_, i) => read(`d_${i + 1}`)) : [];
  const matrix: number[][] = variables.map(() => new Array<number>(k).fill(0));
  for (let i = 0; i < k; i++) {
    for (let j = i; j < k; j++) {
      const v = read(`c_${i + 1}_${j + 1}`);
      matrix[i][j] = v;
      matrix[j][i] = v;
    }
  }
  if (problems.length > 0) throw new InputError(problems);
  const columnNames = Object.freeze(variables.map(summaryVariableName));
  if (!centred) {
    return Object.freeze({ kind: 'cross-products' as const, columnNames, rowCount, sums: Object.freeze(vector), crossProducts: Object.freeze(matrix.map((r) => Object.freeze(r))), intercept: options.intercept ?? true });
  }
  const covariance = matrix.map((r, i) => Object.freeze(r.map((c, j) => (c - (offsets[i] * offsets[j]) / rowCount) / (rowCount - 1))));
  return Object.freeze({ kind: 'covariance' as const, columnNames, rowCount, means: Object.freeze(vector), covariance: Object.freeze(covariance), intercept: options.intercept ?? true });
}
