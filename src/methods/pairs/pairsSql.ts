import type { SignedRankSummary } from '../../core/signedRankSummary';
import { InputError, inputProblem, type InputProblem } from '../../core/inputProblem';
import { quoteSqlIdentifier, quoteSqlString, quoteTableName, readTableName } from '../../data/sqlText';

/** Marks the result row of the matched-pairs query, so that a row from another query is recognised. */
export const PAIRS_QUERY_MARK = 'lurk-pairs-signed-ranks';

/** The table and either the difference column or the treated and control columns. */
export type PairsSqlSpec =
  | { readonly table: string; readonly differenceColumn: string }
  | { readonly table: string; readonly treatedColumn: string; readonly controlColumn: string };

/**
 * One standard SQL query that returns, from the user's own database, everything the normal approximation of
 * the signed-rank bounds needs (Rosenbaum 2002, §4.3.3: under Γ the bounding statistic has mean p·ΣRᵢ and
 * variance p(1 − p)·ΣRᵢ², p = Γ/(1 + Γ)): pairs read, pairs with a missing value, zero differences (dropped,
 * Wilcoxon's rule), non-zero pairs, positive pairs (for the sign test), T = the sum of the ranks of the positive
 * differences, ΣRᵢ and ΣRᵢ², with mid-ranks for tied |d| (RANK() plus half the tie group's size less one).
 *
 * Ties are exact equality of |d| in the database's double precision; the file path also ties differences that
 * agree to 12 significant digits (e.g. 1.3 − 1.2 and 2.3 − 2.2), so results agree whenever the differences are
 * stored (or computed) without such rounding noise. The Hodges–Lehmann estimate and its range need every
 * difference, not sums: they are not available from a summary.
 *
 * Uses CTEs, window functions (RANK, COUNT … OVER), CASE and CAST(… AS DOUBLE PRECISION); checked on DuckDB and
 * PostgreSQL.
 *
 * @throws InputError naming `sqlTable`, `differenceColumn`, `treatedColumn` or `controlColumn`
 */
export function pairsSql(spec: PairsSqlSpec): string {
  const problems: InputProblem[] = [];
  const { parts, problem } = readTableName(spec.table, 'sqlTable');
  if (problem) problems.push(problem);
  const columns = 'differenceColumn' in spec ? { differenceColumn: spec.differenceColumn } : { treatedColumn: spec.treatedColumn, controlColumn: spec.controlColumn };
  for (const [field, name] of Object.entries(columns)) {
    if (name.trim() === '') problems.push(inputProblem(field, 'required', 'needs the name of a column'));
  }
  if (problems.length > 0) throw new InputError(problems);
  const number = (column: string) => `CAST(${quoteSqlIdentifier(column)} AS DOUBLE PRECISION)`;
  const [difference, present, described] =
    'differenceColumn' in spec
      ? [number(spec.differenceColumn), `${quoteSqlIdentifier(spec.differenceColumn)} IS NOT NULL`, `difference ${quoteSqlIdentifier(spec.differenceColumn)}`]
      : [
          `${number(spec.treatedColumn)} - ${number(spec.controlColumn)}`,
          `${quoteSqlIdentifier(spec.treatedColumn)} IS NOT NULL AND ${quoteSqlIdentifier(spec.controlColumn)} IS NOT NULL`,
          `treated ${quoteSqlIdentifier(spec.treatedColumn)} minus control ${quoteSqlIdentifier(spec.controlColumn)}`,
        ];
  const table = quoteTableName(parts);
  return [
    `-- Signed ranks of matched-pair differences (${described}).`,
    '-- Paste the one result row into Lurk (lurk pairs --summary ROW).',
    'WITH pairs AS (',
    `  SELECT ${difference} AS d FROM ${table} WHERE ${present}`,
    '), ranked AS (',
    '  SELECT d, RANK() OVER (ORDER BY ABS(d)) + (COUNT(*) OVER (PARTITION BY ABS(d)) - 1) / 2.0 AS r',
    '  FROM pairs WHERE d <> 0',
    ')',
    'SELECT',
    `  ${quoteSqlString(PAIRS_QUERY_MARK)} AS lurk_query,`,
    `  (SELECT COUNT(*) FROM ${table}) AS rows_read,`,
    '  (SELECT COUNT(*) FROM pairs) AS pairs,',
    '  (SELECT COUNT(*) FROM pairs WHERE d = 0) AS zeros,',
    '  COUNT(*) AS non_zero,',
    '  COALESCE(SUM(CASE WHEN d > 0 THEN 1 ELSE 0 END), 0) AS positive,',
    '  COALESCE(SUM(CASE WHEN d > 0 THEN r ELSE 0 END), 0) AS rank_sum_positive,',
    '  COALESCE(SUM(r), 0) AS rank_sum,',
    '  COALESCE(SUM(r * r), 0) AS rank_sum_squares',
    'FROM ranked;',
    '',
  ].join('\n');
}

/** The signed-rank summary read back from the query's result row. */
export interface PairsRankSummary extends SignedRankSummary {
  readonly rowsRead: number;
  /** Rows left out because a value was missing. */
  readonly droppedRows: number;
}

/**
 * Reads the result row of {@link pairsSql}, checking each column (present, a number, whole where it counts
 * pairs, 0 or more) and the identities between them (pairs = zeros + non-zero; ΣRᵢ = n(n + 1)/2).
 *
 * @throws InputError with fields `summary.<column>` (or `summary` for a row of another query)
 */
export function pairsSummaryFromSqlRow(row: Readonly<Record<string, unknown>>): PairsRankSummary {
  const mark = row.lurk_query;
  if (mark !== undefined && mark !== PAIRS_QUERY_MARK) {
    throw new InputError([inputProblem('summary', 'other-query', `is the result of another query ("${String(mark)}"), not of the matched-pairs query: print the query with lurk pairs --sql and run it`)]);
  }
  if (mark === undefined && ('a' in row || 's_1' in row || 'n' in row)) {
    throw new InputError([inputProblem('summary', 'other-query', "looks like the result of another calculator's query, not of the matched-pairs query")]);
  }
  const problems: InputProblem[] = [];
  const read = (key: string, whole: boolean): number => {
    const value = row[key];
    const number = typeof value === 'bigint' ? Number(value) : typeof value === 'string' && value.trim() !== '' ? Number(value.trim()) : value;
    if (value === undefined || value === null) problems.push(inputProblem(`summary.${key}`, 'missing', 'is missing from the result (run the whole query unchanged)'));
    else if (typeof number !== 'number' || !Number.isFinite(number) || number < 0 || (whole && !Number.isInteger(number))) {
      problems.push(inputProblem(`summary.${key}`, 'not-a-count', `must be ${whole ? 'a whole number' : 'a number'} of 0 or more, got "${String(value)}"`, value));
    } else return number;
    return NaN;
  };
  const s = {
    rowsRead: read('rows_read', true),
    pairs: read('pairs', true),
    zeros: read('zeros', true),
    nonZero: read('non_zero', true),
    positive: read('positive', true),
    statistic: read('rank_sum_positive', false),
    sumRanks: read('rank_sum', false),
    sumSquaredRanks: read('rank_sum_squares', false),
  };
  if (problems.length === 0) {
    if (s.zeros + s.nonZero !== s.pairs) problems.push(inputProblem('summary.pairs', 'inconsistent', `must equal zeros + non_zero (${s.zeros} + ${s.nonZero}), got ${s.pairs}`));
    if (Math.abs(s.sumRanks - (s.nonZero * (s.nonZero + 1)) / 2) > 1e-9 * Math.max(1, s.sumRanks)) {
      problems.push(inputProblem('summary.rank_sum', 'inconsistent', `must be non_zero·(non_zero + 1)/2 = ${(s.nonZero * (s.nonZero + 1)) / 2}, got ${s.sumRanks}`));
    }
    if (s.statistic > s.sumRanks || s.positive > s.nonZero) problems.push(inputProblem('summary.rank_sum_positive', 'inconsistent', 'cannot exceed rank_sum'));
    if (s.pairs > s.rowsRead) problems.push(inputProblem('summary.rows_read', 'inconsistent', 'cannot be fewer than pairs'));
  }
  if (problems.length > 0) throw new InputError(problems);
  return Object.freeze({ ...s, droppedRows: s.rowsRead - s.pairs });
}
