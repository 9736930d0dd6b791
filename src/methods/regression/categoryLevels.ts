import { InputError, inputProblem, type InputProblem } from '../../core/inputProblem';
import { readCsvText } from '../../data/csv';
import { quoteSqlIdentifier, quoteSqlString, quoteTableName, readTableName } from '../../data/sqlText';
import type { SummaryVariable } from './summaryStatisticsSql';

/** Marks the result rows of the levels query, so that rows of another query are recognised. */
export const LEVELS_QUERY_MARK = 'lurk-regression-levels';

/** The levels of each categorical column, each list in character-code order (its first level is the reference). */
export type CategoryLevels = ReadonlyMap<string, readonly string[]>;

/**
 * One standard SQL query that lists the levels of the categorical columns over the rows the summary query will
 * use (no chosen column NULL): one row per column and level, `SELECT DISTINCT … UNION ALL … ORDER BY`. Levels are
 * read as text (CAST … AS VARCHAR), as the summary query's indicators compare them. Lurk orders the levels
 * itself (by character code, as the CSV path does), so the database's collation does not matter.
 *
 * @param spec the table, every chosen column (for the filter) and the categorical ones
 * @throws InputError naming `summaryTable` or `categorical`
 */
export function categoryLevelsSql(spec: { table: string; columns: readonly string[]; categorical: readonly string[] }): string {
  const { parts, problem } = readTableName(spec.table, 'summaryTable');
  const problems: InputProblem[] = problem ? [problem] : [];
  if (spec.categorical.length === 0) problems.push(inputProblem('categorical', 'required', 'name the categorical columns'));
  if (problems.length > 0) throw new InputError(problems);
  const table = quoteTableName(parts);
  const filter = [...new Set(spec.columns)].map((c) => `${quoteSqlIdentifier(c)} IS NOT NULL`).join(' AND ');
  const selects = spec.categorical.map(
    (column) =>
      `SELECT DISTINCT ${quoteSqlString(LEVELS_QUERY_MARK)} AS lurk_query, ${quoteSqlString(column)} AS column_name, CAST(${quoteSqlIdentifier(column)} AS VARCHAR) AS level\n` +
      `  FROM ${table} WHERE ${filter}`,
  );
  return [
    `-- Levels of the categorical columns ${spec.categorical.map(quoteSqlIdentifier).join(', ')} in the rows the regression uses.`,
    '-- Paste all the result rows into Lurk (lurk ovb --sql … --levels RESULT prints the summary query).',
    selects.join('\nUNION ALL\n'),
    'ORDER BY 2, 3;',
    '',
  ].join('\n');
}

/**
 * The levels as pasted: the result of {@link categoryLevelsSql} (CSV text with a header line holding
 * column_name and level, or a JSON array of its rows), or a JSON object {"column": ["level", …], …}. Each list
 * is sorted by character code and must name every categorical column with at least two levels.
 *
 * @throws InputError naming `field`
 */
export function readCategoryLevels(text: string, categorical: readonly string[], field = 'summaryLevels'): CategoryLevels {
  const refuse = (message: string): never => {
    throw new InputError([inputProblem(field, 'bad-levels', message)]);
  };
  const pairs: Array<[string, string]> = [];
  const s = text.replace(/^\uFEFF/, '').trim();
  if (s === '') refuse('paste the result of the levels query (print it with --sql and --categorical)');
  if (s.startsWith('{') || s.startsWith('[')) {
    let json: unknown;
    try {
      json = JSON.parse(s);
    } catch {
      refuse('is not valid JSON: give {"column": ["level", …]} or the rows of the levels query');
    }
    if (Array.isArray(json)) {
      for (const row of json) {
        const r = Object.fromEntries(Object.entries((row ?? {}) as Record<string, unknown>).map(([k, v]) => [k.toLowerCase(), v]));
        pairs.push(levelRow(r, refuse));
      }
    } else if (json && typeof json === 'object') {
      for (const [column, levels] of Object.entries(json as Record<string, unknown>)) {
        if (!Array.isArray(levels)) refuse(`"${column}" must list its levels: {"${column}": ["level", …]}`);
        for (const level of levels as unknown[]) pairs.push([column, String(level)]);
      }
    }
  } else {
    const table = readCsvText(s, field);
    const header = table.columns.map((c) => c.trim().toLowerCase());
    for (const cells of table.rows) pairs.push(levelRow(Object.fromEntries(header.map((h, i) => [h, cells[i]])), refuse));
  }
  const levels = new Map<string, string[]>();
  for (const [column, level] of pairs) {
    if (!categorical.includes(column)) refuse(`names the column "${column}", which is not among the categorical columns (${categorical.join(', ')})`);
    const list = levels.get(column) ?? [];
    if (!list.includes(level)) list.push(level);
    levels.set(column, list);
  }
  for (const column of categorical) {
    const list = levels.get(column);
    if (!list) refuse(`has no levels of "${column}": run the levels query for every categorical column`);
    else if (list.length < 2) refuse(`"${column}" has only one level ("${list[0]}") in the rows used, so its effect cannot be estimated`);
    else list.sort();
  }
  return levels;
}

function levelRow(r: Record<string, unknown>, refuse: (message: string) => never): [string, string] {
  if (r.lurk_query !== undefined && r.lurk_query !== LEVELS_QUERY_MARK) refuse(`is the result of another query ("${String(r.lurk_query)}"), not of the levels query`);
  if (r.column_name === undefined || r.level === undefined) refuse('must have the columns column_name and level (the result of the levels query)');
  if (r.level === null || r.column_name === null) refuse('has an empty column_name or level');
  return [String(r.column_name), String(r.level)];
}

/**
 * The summary query's variables and the covariates' design columns: covariates in order (a categorical one as
 * indicators of its levels but the first, `column=level`), then the treatment and the outcome.
 */
export function summaryDesign(
  covariates: readonly string[],
  treatment: string,
  outcome: string,
  levels: CategoryLevels,
): { variables: SummaryVariable[]; covariates: Array<{ name: string; designColumns: string[] }> } {
  const variables: SummaryVariable[] = [];
  const groups = covariates.map((name) => {
    const list = levels.get(name);
    const own: SummaryVariable[] = list ? list.slice(1).map((level) => ({ column: name, level })) : [{ column: name }];
    variables.push(...own);
    return { name, designColumns: own.map((v) => ('level' in v ? `${v.column}=${v.level}` : v.column)) };
  });
  variables.push({ column: treatment }, { column: outcome });
  return { variables, covariates: groups };
}

/**
 * The levels written into the summary query's result (`lurk_levels`), so that pasting the result is enough:
 * `column=level+level+… column=…`, each name percent-encoded (no comma, quote or space inside).
 */
export function encodeCategoryLevels(levels: CategoryLevels): string {
  const encode = (text: string) => encodeURIComponent(text).replace(/'/g, '%27');
  return [...levels].map(([column, list]) => `${encode(column)}=${list.map(encode).join('+')}`).join(' ');
}

/** The levels read back from `lurk_levels` ({@link encodeCategoryLevels}); null when the text is not of that form. */
export function decodeCategoryLevels(text: string): Map<string, string[]> | null {
  const levels = new Map<string, string[]>();
  try {
    for (const entry of text.trim().split(/\s+/).filter((e) => e !== '')) {
      const [column, list] = entry.split('=');
      if (column === undefined || list === undefined) return null;
      levels.set(decodeURIComponent(column), list.split('+').map(decodeURIComponent));
    }
  } catch {
    return null;
  }
  return levels;
}
