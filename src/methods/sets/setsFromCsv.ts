import { InputError, inputProblem, type InputProblem } from '../../core/inputProblem';
import type { MatchedSetsInput } from '../../core/matchedSetsAnalysis';
import type { ByteSource } from '../../data/byteSource';
import { columnIndex, readCsvText } from '../../data/csv';
import { csvRowBatches } from '../../data/csvStream';
import { printable } from '../../data/printable';
import { parseNumericCell } from '../regression/regressionData';

/** Which columns of a matched-sets file hold the set id, the treated flag (1/0) and the outcome. */
export interface SetsColumns {
  readonly set: string;
  readonly treated: string;
  readonly outcome: string;
}

/** The three columns of a matched-sets file, one value per unit (row), as the core analysis takes them. */
export type SetsData = Pick<MatchedSetsInput, 'setIds' | 'treated' | 'outcomes'>;

/** Rows read from a matched-sets file, ready for `analyseMatchedSets`. */
export interface SetsRead {
  readonly data: SetsData;
  readonly columns: readonly string[];
  /** Data rows seen (blank lines excluded). */
  readonly rowsRead: number;
  /** Rows whose outcome cell is missing (empty, NA, …): passed on as missing; the analysis leaves them out and counts them. */
  readonly missingOutcomes: number;
  /** What the CSV reader repaired (short rows padded, header names renamed). */
  readonly warnings: readonly string[];
}

/** What was read, without the values themselves (what the page and the worker pass around). */
export type SetsReadSummary = Omit<SetsRead, 'data'>;

/** The form field of each column choice (the same names as the form's). */
const FIELDS = { set: 'setColumn', treated: 'treatedColumn', outcome: 'outcomeColumn' } as const;
const WHAT = { set: 'the set id', treated: 'the treated flag (1 treated, 0 control)', outcome: 'the outcome' } as const;
const LISTED = 3;

/** Checks a column choice before reading: three columns named, all different. */
export function validateSetsColumns(spec: SetsColumns): InputProblem[] {
  const problems: InputProblem[] = [];
  const keys = ['set', 'treated', 'outcome'] as const;
  for (const key of keys) {
    if (String(spec[key] ?? '').trim() === '') problems.push(inputProblem(FIELDS[key], 'required', `is required (the column of ${WHAT[key]})`));
  }
  const name = (key: (typeof keys)[number]) => String(spec[key] ?? '').trim();
  if (name('treated') !== '' && name('treated') === name('set')) problems.push(inputProblem('treatedColumn', 'same-column', 'must be a different column from the set id'));
  if (name('outcome') !== '' && (name('outcome') === name('set') || name('outcome') === name('treated'))) {
    problems.push(inputProblem('outcomeColumn', 'same-column', `must be a different column from the ${name('outcome') === name('set') ? 'set id' : 'treated flag'}`));
  }
  return problems;
}

/**
 * Collects matched-sets rows one at a time: the set id as text, the treated flag and the outcome as numbers
 * (read as CSV cells: decimal point, or decimal comma when the file uses one). A missing outcome becomes null
 * (left out and counted by the analysis); a missing or non-numeric treated flag is passed on as NaN (the
 * analysis names its rows); an outcome that is text is a problem naming its rows and their text.
 */
function createSetsCollector(spec: SetsColumns) {
  const specProblems = validateSetsColumns(spec);
  if (specProblems.length > 0) throw new InputError(specProblems);
  const setIds: string[] = [];
  const treated: number[] = [];
  const outcomes: (number | null)[] = [];
  const badOutcomes: { row: number; text: string }[] = [];
  let badOutcomeCount = 0;
  let missingOutcomes = 0;
  let index: { set: number; treated: number; outcome: number } | null = null;
  let outcomeName = '';
  return {
    columns(columns: readonly string[]): void {
      if (index !== null) return;
      const problems: InputProblem[] = [];
      const find = (key: keyof SetsColumns) => {
        try {
          return columnIndex({ columns }, spec[key].trim(), FIELDS[key]);
        } catch (error) {
          if (!(error instanceof InputError)) throw error;
          problems.push(...error.problems);
          return -1;
        }
      };
      const found = { set: find('set'), treated: find('treated'), outcome: find('outcome') };
      if (problems.length > 0) throw new InputError(problems);
      index = found;
      outcomeName = columns[found.outcome];
    },
    row(cells: readonly (string | null)[], rowNumber: number, decimalComma: boolean): void {
      const at = index!;
      setIds.push(cells[at.set] ?? '');
      const flag = cells[at.treated];
      treated.push(flag === null ? NaN : parseNumericCell(flag, decimalComma));
      const y = cells[at.outcome];
      if (y === null) {
        missingOutcomes++;
        outcomes.push(null);
        return;
      }
      const value = parseNumericCell(y, decimalComma);
      if (Number.isNaN(value)) {
        badOutcomeCount++;
        if (badOutcomes.length < LISTED) badOutcomes.push({ row: rowNumber, text: y });
        outcomes.push(null);
        return;
      }
      outcomes.push(value);
    },
    finish(columns: readonly string[], rowsRead: number, warnings: readonly string[]): SetsRead {
      if (badOutcomeCount > 0) {
        const listed = badOutcomes.map((b) => `row ${b.row} "${printable(b.text, 40)}"`).join(', ');
        const more = badOutcomeCount > LISTED ? ` and ${badOutcomeCount - LISTED} more` : '';
        throw new InputError([
          inputProblem(
            'outcomeColumn',
            'not-a-number',
            `column "${printable(outcomeName)}" has ${badOutcomeCount === 1 ? 'a value that is' : `${badOutcomeCount} values that are`} not a number (${listed}${more}); leave a missing outcome empty or write NA`,
          ),
        ]);
      }
      return Object.freeze({
        data: Object.freeze({ setIds, treated, outcomes }),
        columns: Object.freeze([...columns]),
        rowsRead,
        missingOutcomes,
        warnings: Object.freeze([...warnings]),
      });
    },
  };
}

/**
 * Reads a matched-sets CSV held as text (one row per unit; see {@link readCsvText} for the dialects).
 * @throws InputError (fields `file`, `setColumn`, `treatedColumn`, `outcomeColumn`)
 */
export function setsFromCsvText(text: string, spec: SetsColumns): SetsRead {
  const collector = createSetsCollector(spec);
  const table = readCsvText(text);
  collector.columns(table.columns);
  table.rows.forEach((cells, i) => collector.row(cells, i + 1, table.decimalComma));
  return collector.finish(table.columns, table.rows.length, table.warnings);
}

/**
 * Reads a matched-sets CSV from a byte stream chunk by chunk ({@link readCsvRows}): for large files, standard
 * input and Web Workers. Same rows, same rules and messages as {@link setsFromCsvText}.
 * @throws InputError (fields `file`, `setColumn`, `treatedColumn`, `outcomeColumn`); AbortError when aborted
 */
export async function setsFromCsvStream(
  source: ByteSource,
  spec: SetsColumns,
  options: { signal?: AbortSignal; onProgress?: (bytesRead: number, rowsRead: number) => void } = {},
): Promise<SetsRead> {
  const collector = createSetsCollector(spec);
  let rows = 0;
  let bytes = 0;
  const batches = csvRowBatches(source, { signal: options.signal, onProgress: (b) => (bytes = b) });
  for (;;) {
    const next = await batches.next();
    if (next.done) return collector.finish(next.value.columns, next.value.rowCount, next.value.warnings);
    const batch = next.value;
    collector.columns(batch.columns);
    for (let i = 0; i < batch.rows.length; i++) collector.row(batch.rows[i], batch.firstRowNumber + i, batch.dialect.decimalComma);
    rows += batch.rows.length;
    options.onProgress?.(bytes, rows);
  }
}
