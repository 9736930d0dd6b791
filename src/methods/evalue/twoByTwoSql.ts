import { InputError, inputProblem, type InputProblem } from '../../core/inputProblem';
import type { TwoByTwoCounts } from '../../core/twoByTwo';
import { MISSING_CELL_TEXTS } from '../../data/missingCell';
import { quoteSqlIdentifier, quoteSqlString, quoteTableName, readTableName } from '../../data/sqlText';

/** Marks the result row of the 2×2 counting query, so that a row from another query is recognised. */
export const TWO_BY_TWO_QUERY_MARK = 'lurk-2x2-counts';

/** What the 2×2 counting query needs: the table, the two columns and the values that mean yes (or none: 1/yes/true/y). */
export interface TwoByTwoSqlSpec {
  readonly table: string;
  readonly exposureColumn: string;
  readonly outcomeColumn: string;
  readonly exposedValues?: readonly string[] | null;
  readonly outcomeValues?: readonly string[] | null;
}

const YES_TEXTS = ['1', '1.0', 'yes', 'true', 'y'];
const KNOWN_TEXTS = [...YES_TEXTS, '0', '0.0', 'no', 'false', 'n'];

/**
 * One standard SQL query that counts the exposure × outcome table in the user's own database, so that no row
 * leaves it: a (exposed, had the outcome), b (exposed, did not), c (unexposed, had it), d (unexposed, did not),
 * and `rows_missing` (either cell NULL, empty, or one of the texts that mean missing in a CSV:
 * NA, N/A, NaN, ".", NULL, #N/A, any case) — the same rows the file path leaves out.
 *
 * A cell means yes when its text (trimmed) is one of the given values; without given values, when it is
 * 1, yes, true or y (any case), and the query also counts the column's other values (`*_other_values`) so that
 * a column that is not plainly yes/no is refused, as the file path refuses it.
 *
 * Uses a CTE, CASE, COALESCE, COUNT(DISTINCT) and CAST(… AS VARCHAR); checked on DuckDB and PostgreSQL.
 *
 * @throws InputError naming `sqlTable`, `exposure` or `outcome`
 */
export function twoByTwoSql(spec: TwoByTwoSqlSpec): string {
  const problems: InputProblem[] = [];
  const { parts, problem } = readTableName(spec.table, 'sqlTable');
  if (problem) problems.push(problem);
  if (spec.exposureColumn.trim() === '') problems.push(inputProblem('exposure', 'required', 'needs the name of the exposure column'));
  if (spec.outcomeColumn.trim() === '') problems.push(inputProblem('outcome', 'required', 'needs the name of the outcome column'));
  if (problems.length > 0) throw new InputError(problems);
  const text = (column: string) => `TRIM(CAST(${quoteSqlIdentifier(column)} AS VARCHAR))`;
  const missing = (column: string) =>
    `${quoteSqlIdentifier(column)} IS NULL OR UPPER(${text(column)}) IN ('', ${MISSING_CELL_TEXTS.map(quoteSqlString).join(', ')})`;
  const yes = (column: string, values: readonly string[] | null | undefined) =>
    values && values.length > 0
      ? `${text(column)} IN (${values.map((v) => quoteSqlString(v.trim())).join(', ')})`
      : `LOWER(${text(column)}) IN (${YES_TEXTS.map(quoteSqlString).join(', ')})`;
  const code = (column: string, values: readonly string[] | null | undefined) =>
    `CASE WHEN ${missing(column)} THEN NULL WHEN ${yes(column, values)} THEN 1 ELSE 0 END`;
  const other = (column: string, values: readonly string[] | null | undefined) =>
    values && values.length > 0
      ? 'COALESCE(SUM(0), 0)'
      : `COALESCE(SUM(CASE WHEN ${missing(column)} THEN 0 WHEN LOWER(${text(column)}) IN (${KNOWN_TEXTS.map(quoteSqlString).join(', ')}) THEN 0 ELSE 1 END), 0)`;
  const cell = (e: number, o: number) => `COALESCE(SUM(CASE WHEN exposed = ${e} AND had_outcome = ${o} THEN 1 ELSE 0 END), 0)`;
  const table = quoteTableName(parts);
  return [
    `-- A 2×2 table for an E-value: exposure ${quoteSqlIdentifier(spec.exposureColumn)}, outcome ${quoteSqlIdentifier(spec.outcomeColumn)}.`,
    '-- Paste the one result row into Lurk (lurk evalue --summary ROW).',
    'WITH coded AS (',
    `  SELECT ${code(spec.exposureColumn, spec.exposedValues)} AS exposed,`,
    `         ${code(spec.outcomeColumn, spec.outcomeValues)} AS had_outcome`,
    `  FROM ${table}`,
    '), other_values AS (',
    `  SELECT ${other(spec.exposureColumn, spec.exposedValues)} AS exposure_other_values,`,
    `         ${other(spec.outcomeColumn, spec.outcomeValues)} AS outcome_other_values`,
    `  FROM ${table}`,
    ')',
    'SELECT',
    `  ${quoteSqlString(TWO_BY_TWO_QUERY_MARK)} AS lurk_query,`,
    `  ${cell(1, 1)} AS a,`,
    `  ${cell(1, 0)} AS b,`,
    `  ${cell(0, 1)} AS c,`,
    `  ${cell(0, 0)} AS d,`,
    '  COALESCE(SUM(CASE WHEN exposed IS NULL OR had_outcome IS NULL THEN 1 ELSE 0 END), 0) AS rows_missing,',
    '  MIN(other_values.exposure_other_values) AS exposure_other_values,',
    '  MIN(other_values.outcome_other_values) AS outcome_other_values',
    'FROM coded CROSS JOIN other_values;',
    '',
  ].join('\n');
}

/** The counts read back from the query's result row, with the rows it left out. */
export interface TwoByTwoFromSql {
  readonly counts: TwoByTwoCounts;
  readonly rowsMissing: number;
  readonly warnings: readonly string[];
}

/**
 * Reads the result row of {@link twoByTwoSql}. Every problem names the result column (missing, not a whole
 * number of 0 or more, a row from another query, a column that is not plainly yes/no).
 *
 * @throws InputError with fields `summary.<column>` (or `summary` for a row of another query)
 */
export function twoByTwoFromSqlRow(row: Readonly<Record<string, unknown>>): TwoByTwoFromSql {
  const problems: InputProblem[] = [];
  const mark = row.lurk_query;
  if (mark !== undefined && mark !== TWO_BY_TWO_QUERY_MARK) {
    throw new InputError([inputProblem('summary', 'other-query', `is the result of another query ("${String(mark)}"), not of the 2×2 counting query: print the query with lurk evalue --sql and run it`)]);
  }
  if (mark === undefined && ('n' in row || 's_1' in row || 'sum_rank' in row)) {
    throw new InputError([inputProblem('summary', 'other-query', 'looks like the result of another calculator\'s query, not of the 2×2 counting query')]);
  }
  const count = (key: string): number => {
    const value = row[key];
    const number = typeof value === 'bigint' ? Number(value) : typeof value === 'string' && value.trim() !== '' ? Number(value.trim()) : value;
    if (value === undefined || value === null) problems.push(inputProblem(`summary.${key}`, 'missing', 'is missing from the result (run the whole query unchanged)'));
    else if (typeof number !== 'number' || !Number.isInteger(number) || number < 0) problems.push(inputProblem(`summary.${key}`, 'not-a-count', `must be a whole number of 0 or more, got "${String(value)}"`, value));
    else return number;
    return 0;
  };
  const counts = { a: count('a'), b: count('b'), c: count('c'), d: count('d') };
  const rowsMissing = count('rows_missing');
  for (const [key, what] of [['exposure_other_values', 'exposure'], ['outcome_other_values', 'outcome']] as const) {
    if (row[key] !== undefined && count(key) > 0) {
      problems.push(inputProblem(`summary.${key}`, 'not-yes-no', `the ${what} column has values other than 1/0, yes/no, true/false or y/n: name the values that mean yes and print the query again`));
    }
  }
  if (problems.length > 0) throw new InputError(problems);
  const warnings = rowsMissing > 0 ? [`${rowsMissing} ${rowsMissing === 1 ? 'row was' : 'rows were'} left out because the exposure or the outcome was missing.`] : [];
  return Object.freeze({ counts: Object.freeze(counts), rowsMissing, warnings: Object.freeze(warnings) });
}
