import { InputError, type InputProblem, inputProblem, throwIfProblems } from '../../core/inputProblem';
import type { RawCrossProductInput } from '../../core/crossProductFit';

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
}

/** Name of a variable as the design calls it: the column, or `column=level` for an indicator. */
export function summaryVariableName(variable: SummaryVariable): string {
  return 'level' in variable ? `${variable.column}=${variable.level}` : variable.column;
}

/** A standard SQL delimited identifier: in double quotes, with any " doubled (SQL:1992 §5.2). */
export function quoteSqlIdentifier(name: string): string {
  return `"${name.replace(/"/g, '""')}"`;
}

/** A standard SQL character literal: in single quotes, with any ' doubled. */
export function quoteSqlString(text: string): string {
  return `'${text.replace(/'/g, "''")}'`;
}

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

/**
 * One standard SQL query that computes, in the user's own database, exactly the summary statistics that
 * Lurk's regression needs: the number of rows with every chosen column present, the sum of each variable
 * and the sum of each product of two variables (the cross-product matrix of [1, variables…]).
 *
 * Uses only SQL-92: `COUNT(*)`, `SUM`, `CAST(… AS DOUBLE PRECISION)` (so integer columns cannot overflow),
 * `CASE WHEN … THEN 1 ELSE 0 END` for category indicators, double-quoted identifiers and a `WHERE … IS NOT
 * NULL` filter that drops a row when any chosen column is NULL — the same rows the CSV path drops. Result
 * columns: `n`, `s_i` (Σ variable i), `c_i_j` (Σ variable i × variable j, i ≤ j), with i, j numbered from 1
 * in the order given (the query's comment lists them).
 *
 * @throws InputError (fields as {@link validateSummarySqlSpec})
 */
export function summaryStatisticsSql(spec: SummarySqlSpec): string {
  throwIfProblems(validateSummarySqlSpec(spec));
  const parts = typeof spec.table === 'string' ? [spec.table] : spec.table;
  const table = parts.map(quoteSqlIdentifier).join('.');
  const expressions = spec.variables.map(variableExpression);
  const lines: string[] = [];
  lines.push('-- Summary statistics for a linear regression: rows, sums and sums of products.');
  spec.variables.forEach((v, i) => lines.push(`-- ${i + 1} = ${summaryVariableName(v).replace(/[\r\n]+/g, ' ')}`));
  lines.push('SELECT');
  const select: string[] = ['  COUNT(*) AS n'];
  expressions.forEach((e, i) => select.push(`  SUM(${e}) AS s_${i + 1}`));
  for (let i = 0; i < expressions.length; i++) {
    for (let j = i; j < expressions.length; j++) select.push(`  SUM(${expressions[i]} * ${expressions[j]}) AS c_${i + 1}_${j + 1}`);
  }
  lines.push(select.join(',\n'));
  lines.push(`FROM ${table}`);
  const columns = [...new Set(spec.variables.map((v) => v.column))];
  lines.push(`WHERE ${columns.map((c) => `${quoteSqlIdentifier(c)} IS NOT NULL`).join('\n  AND ')};`);
  return lines.join('\n') + '\n';
}

function variableExpression(v: SummaryVariable): string {
  const column = quoteSqlIdentifier(v.column);
  if ('level' in v) return `CASE WHEN ${column} = ${quoteSqlString(v.level)} THEN 1.0 ELSE 0.0 END`;
  return `CAST(${column} AS DOUBLE PRECISION)`;
}

/**
 * Reads the one result row of {@link summaryStatisticsSql} (as returned by a database driver, or pasted:
 * numbers, bigints or numeric strings) into the input of `designFromCrossProducts`.
 *
 * @throws InputError naming the result column (`n`, `s_i`, `c_i_j`) that is absent or not a number.
 */
export function crossProductsFromSqlRow(
  row: Readonly<Record<string, unknown>>,
  variables: readonly SummaryVariable[],
  options: { intercept?: boolean } = {},
): RawCrossProductInput {
  const problems: InputProblem[] = [];
  const lower: Record<string, unknown> = {};
  for (const [key, value] of Object.entries(row)) lower[key.toLowerCase()] = value;
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
  const sums = variables.map((_, i) => read(`s_${i + 1}`));
  const crossProducts: number[][] = variables.map(() => new Array<number>(k).fill(0));
  for (let i = 0; i < k; i++) {
    for (let j = i; j < k; j++) {
      const v = read(`c_${i + 1}_${j + 1}`);
      crossProducts[i][j] = v;
      crossProducts[j][i] = v;
    }
  }
  if (problems.length > 0) throw new InputError(problems);
  return Object.freeze({
    kind: 'cross-products' as const,
    columnNames: Object.freeze(variables.map(summaryVariableName)),
    rowCount,
    sums: Object.freeze(sums),
    crossProducts: Object.freeze(crossProducts.map((r) => Object.freeze(r))),
    intercept: options.intercept ?? true,
  });
}
