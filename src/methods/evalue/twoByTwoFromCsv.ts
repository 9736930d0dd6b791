import { InputError, inputProblem } from '../../core/inputProblem';
import type { InputProblem } from '../../core/inputProblem';
import type { TwoByTwoCounts } from '../../core/twoByTwo';
import { columnIndex } from '../../data/csv';
import { csvRowBatches, type CsvStreamOptions } from '../../data/csvStream';
import type { ByteSource } from '../../data/byteSource';
import type { CsvTable } from '../../data/csv';

/** Which columns hold the exposure and the outcome, and which of their values mean "exposed" / "had the outcome". */
export interface TwoByTwoColumns {
  readonly exposureColumn: string;
  readonly outcomeColumn: string;
  /** The cell values that mean exposed; every other non-missing value means unexposed. Default: found from a yes/no-like column. */
  readonly exposedValues?: readonly string[] | null;
  /** The cell values that mean the outcome happened; every other non-missing value means it did not. Default as above. */
  readonly outcomeValues?: readonly string[] | null;
}

/** A 2×2 table counted from a CSV, with what was read and what was left out. */
export interface TwoByTwoFromCsv {
  readonly counts: TwoByTwoCounts;
  /** The values taken to mean exposed, and the other values seen. */
  readonly exposure: ColumnMapping;
  readonly outcome: ColumnMapping;
  readonly rowsUsed: number;
  /** Rows left out because the exposure or the outcome cell was missing. */
  readonly rowsMissing: number;
  readonly warnings: readonly string[];
}

export interface ColumnMapping {
  readonly column: string;
  /** The values counted as yes (exposed, or had the outcome). */
  readonly yesValues: readonly string[];
  /** The other values seen, counted as no. */
  readonly noValues: readonly string[];
  /** Whether the yes values were found from the column (0/1, yes/no, true/false, y/n) rather than given. */
  readonly guessed: boolean;
}

/** Two-valued columns whose meaning is plain: the second value of each pair means yes. */
const YES_NO_PAIRS: ReadonlyArray<readonly [string, string]> = [
  ['0', '1'],
  ['no', 'yes'],
  ['false', 'true'],
  ['n', 'y'],
];

/**
 * Counts an exposure × outcome table from two columns of a CSV.
 *
 * Rows where either cell is missing are left out and counted (with a warning). A value given as meaning
 * yes must occur in the column (exactly, or else ignoring case, when it names every such spelling). Without given values, a two-valued column of 0/1, no/yes, false/true or n/y
 * (any case; numbers such as 1.0 count as 1) is read with the second meaning yes; any other column needs the
 * values named.
 *
 * @param table the CSV, from `readCsvText`
 * @param columns the two columns and the values that mean yes
 * @throws InputError naming `exposure`/`outcome` (unknown column, values to be named, a value that does not
 *   occur) and `exposedValues`/`outcomeValues`
 */
export function twoByTwoFromCsv(table: CsvTable, columns: TwoByTwoColumns): TwoByTwoFromCsv {
  const [e, o] = chosenIndices(table.columns, columns);
  const pairs = new PairCounts();
  if (e >= 0 && o >= 0) for (const row of table.rows) pairs.add(row[e], row[o]);
  return twoByTwoFromPairCounts(table.columns, pairs, columns, table.warnings);
}

/**
 * The same table counted from a CSV byte stream (a file of any size, read chunk by chunk): only the distinct
 * (exposure, outcome) value pairs and their counts are kept, so memory stays bounded by the number of distinct
 * values, not by the file. Same rules and messages as {@link twoByTwoFromCsv}.
 */
export async function twoByTwoFromStream(source: ByteSource, columns: TwoByTwoColumns, options: CsvStreamOptions = {}): Promise<TwoByTwoFromCsv> {
  const pairs = new PairCounts();
  let header: readonly string[] | null = null;
  let e = -1;
  let o = -1;
  const batches = csvRowBatches(source, options);
  for (;;) {
    const next = await batches.next();
    if (next.done) {
      return twoByTwoFromPairCounts(next.value.columns, pairs, columns, next.value.warnings);
    }
    const batch = next.value;
    if (header === null) {
      header = batch.columns;
      [e, o] = chosenIndices(header, columns);
      // Unknown columns: the messages come from the counting step; nothing more to read.
      if (e < 0 || o < 0) return twoByTwoFromPairCounts(header, pairs, columns, []);
    }
    for (const row of batch.rows) pairs.add(row[e], row[o]);
  }
}

/** How often each (exposure, outcome) cell pair occurs; null is a missing cell. */
class PairCounts {
  readonly byExposure = new Map<string | null, Map<string | null, number>>();
  add(exposure: string | null, outcome: string | null): void {
    let inner = this.byExposure.get(exposure);
    if (!inner) this.byExposure.set(exposure, (inner = new Map()));
    inner.set(outcome, (inner.get(outcome) ?? 0) + 1);
  }
  /** The non-missing values of one side, in the order `columnLevels` gives (numbers in numeric order). */
  levels(side: 'exposure' | 'outcome'): string[] {
    const values = new Set<string>();
    for (const [ev, inner] of this.byExposure) {
      if (side === 'exposure') {
        if (ev !== null) values.add(ev);
      } else for (const ov of inner.keys()) if (ov !== null) values.add(ov);
    }
    return [...values].sort((a, b) => a.localeCompare(b, 'en', { numeric: true }));
  }
}

function chosenIndices(header: readonly string[], columns: TwoByTwoColumns): [number, number] {
  const find = (name: string) => {
    if (typeof name !== 'string' || name.trim() === '') return -1;
    try {
      return columnIndex({ columns: header }, name, 'column');
    } catch {
      return -1;
    }
  };
  return [find(columns.exposureColumn), find(columns.outcomeColumn)];
}

function twoByTwoFromPairCounts(header: readonly string[], pairs: PairCounts, columns: TwoByTwoColumns, readWarnings: readonly string[]): TwoByTwoFromCsv {
  const problems: InputProblem[] = [];
  const exposure = mapColumn(header, pairs.levels('exposure'), columns.exposureColumn, columns.exposedValues, 'exposure', 'exposedValues', 'exposed', problems);
  const outcome = mapColumn(header, pairs.levels('outcome'), columns.outcomeColumn, columns.outcomeValues, 'outcome', 'outcomeValues', 'had the outcome', problems);
  if (!exposure || !outcome || problems.length > 0) throw new InputError(problems);

  const exposed = new Set(exposure.yesValues);
  const hadOutcome = new Set(outcome.yesValues);
  let a = 0;
  let b = 0;
  let c = 0;
  let d = 0;
  let rowsMissing = 0;
  for (const [e, inner] of pairs.byExposure) {
    for (const [o, count] of inner) {
      if (e === null || o === null) rowsMissing += count;
      else if (exposed.has(e)) {
        if (hadOutcome.has(o)) a += count;
        else b += count;
      } else if (hadOutcome.has(o)) c += count;
      else d += count;
    }
  }
  const warnings = [...readWarnings];
  if (rowsMissing > 0) {
    warnings.push(
      `${rowsMissing} ${rowsMissing === 1 ? 'row was' : 'rows were'} left out because the exposure or the outcome was missing.`,
    );
  }
  return Object.freeze({
    counts: Object.freeze({ a, b, c, d }),
    exposure: exposure.mapping,
    outcome: outcome.mapping,
    rowsUsed: a + b + c + d,
    rowsMissing,
    warnings: Object.freeze(warnings),
  });
}

/**
 * The values that would be read as yes in a column when none are named: the second value of a plain
 * two-valued column, or null when the column is not one (the user must then choose).
 */
export function guessYesValues(levels: readonly string[]): string[] | null {
  if (levels.length !== 2) return null;
  const key = (value: string) => {
    const number = Number(value);
    return value.trim() !== '' && Number.isFinite(number) ? String(number) : value.trim().toLowerCase();
  };
  const keys = levels.map(key);
  for (const [no, yes] of YES_NO_PAIRS) {
    if (keys.includes(no) && keys.includes(yes)) return [levels[keys.indexOf(yes)]];
  }
  return null;
}

function mapColumn(
  header: readonly string[],
  levelsOfColumn: readonly string[],
  column: string,
  given: readonly string[] | null | undefined,
  columnField: string,
  valuesField: string,
  meaning: string,
  problems: InputProblem[],
): { index: number; yesValues: readonly string[]; mapping: ColumnMapping } | null {
  if (typeof column !== 'string' || column.trim() === '') {
    problems.push(inputProblem(columnField, 'required', 'needs the name of a column'));
    return null;
  }
  let index: number;
  try {
    index = columnIndex({ columns: header }, column, columnField);
  } catch (error) {
    if (error instanceof InputError) problems.push(...error.problems);
    else throw error;
    return null;
  }
  const table = { columns: header };
  const levels = [...levelsOfColumn];
  if (levels.length === 0) {
    problems.push(inputProblem(columnField, 'empty-column', `column "${table.columns[index]}" has no values`));
    return null;
  }
  let yesValues: string[];
  let guessed = false;
  if (given && given.length > 0) {
    yesValues = [];
    for (const value of given) {
      // An exact match, or else every value that differs only in case ("true" names both "True" and "TRUE").
      const wanted = value.trim();
      const exact = levels.filter((level) => level === wanted);
      const matches = exact.length > 0 ? exact : levels.filter((level) => level.toLowerCase() === wanted.toLowerCase());
      if (matches.length === 0) {
        problems.push(
          inputProblem(valuesField, 'unknown-value', `"${value}" does not occur in column "${table.columns[index]}" (values: ${listValues(levels)})`, value),
        );
      }
      for (const match of matches) if (!yesValues.includes(match)) yesValues.push(match);
    }
  } else {
    const guess = guessYesValues(levels);
    if (!guess) {
      problems.push(
        inputProblem(
          valuesField,
          'required',
          `say which values of column "${table.columns[index]}" mean ${meaning} (values: ${listValues(levels)})`,
        ),
      );
      return null;
    }
    yesValues = guess;
    guessed = true;
  }
  const noValues = levels.filter((level) => !yesValues.includes(level));
  return {
    index,
    yesValues,
    mapping: Object.freeze({ column: table.columns[index], yesValues: Object.freeze(yesValues), noValues: Object.freeze(noValues), guessed }),
  };
}

function listValues(levels: readonly string[]): string {
  const shown = levels.slice(0, 8).map((level) => `"${level}"`);
  return shown.join(', ') + (levels.length > 8 ? ` and ${levels.length - 8} more` : '');
}
