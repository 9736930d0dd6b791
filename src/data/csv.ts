import Papa from 'papaparse';
import { InputError, inputProblem } from '../core/inputProblem';
import { parseNumberText } from './numberText';
import { isMissingCell } from './missingCell';
import { MAX_CSV_COLUMNS, MAX_CSV_RECORD_CHARS, binaryFileError, looksBinary, recordTooLongError, tooManyColumnsError } from './csvLimits';
import { printable, printableList } from './printable';

/** A CSV read into text cells; `null` marks a missing value. */
export interface CsvTable {
  readonly columns: readonly string[];
  /** Data rows (header excluded), each with exactly `columns.length` cells. */
  readonly rows: ReadonlyArray<ReadonlyArray<string | null>>;
  /** The field separator found: `,`, `;`, tab or `|`. */
  readonly delimiter: string;
  /** True when numbers in the file use a decimal comma ("1,5"). */
  readonly decimalComma: boolean;
  /** Things the reader repaired and the user should know (short rows padded, blank or duplicate headers renamed). */
  readonly warnings: readonly string[];
}

/**
 * Reads CSV text: a header row, then data rows.
 *
 * Handles a byte-order mark, CRLF or CR line ends, `,` `;` tab or `|` separators (found by papaparse),
 * quoted fields with separators, quotes and newlines inside, blank lines, and decimal commas (detected
 * from the cells when the separator is not a comma). A row with fewer cells than the header is padded
 * with missing values (and a warning says so); a row with more non-empty cells than the header is an error
 * naming the row, since its values cannot be matched to columns.
 *
 * The whole file is held in memory (several times its size while parsing); for large files read rows with
 * {@link csvRowBatches} / {@link readCsvRows} (src/data/csvStream.ts) instead.
 *
 * @param text the whole file as text
 * @param field the input field named in messages (default `file`)
 * @throws InputError when the file is empty, has no header, has rows longer than the header, looks binary
 *   (NUL in its first 64 KiB), has more than {@link MAX_CSV_COLUMNS} columns, or a row longer than
 *   {@link MAX_CSV_RECORD_CHARS} characters
 */
export function readCsvText(text: string, field = 'file'): CsvTable {
  const clean = text.charCodeAt(0) === 0xfeff ? text.slice(1) : text;
  if (clean.trim() === '') throw new InputError([inputProblem(field, 'empty-file', 'the file is empty')]);
  if (looksBinary(clean)) throw binaryFileError(field);
  refuseLongLines(clean, field);
  const parsed = Papa.parse<string[]>(clean, {
    header: false,
    skipEmptyLines: 'greedy',
    delimitersToGuess: [',', ';', '\t', '|'],
  });
  const data = parsed.data;
  if (data.length === 0) throw new InputError([inputProblem(field, 'empty-file', 'the file is empty')]);
  const delimiter = parsed.meta.delimiter || ',';
  const warnings: string[] = [];
  for (let r = 0; r < data.length; r++) if (data[r].length > MAX_CSV_COLUMNS) throw tooManyColumnsError(r + 1, MAX_CSV_COLUMNS, field);
  const columns = columnNamesFromHeader(data[0], warnings);
  const width = columns.length;
  if (data.length === 1) throw new InputError([inputProblem(field, 'no-rows', 'the file has a header but no data rows')]);

  const rows: (string | null)[][] = [];
  const shortRows: number[] = [];
  for (let r = 1; r < data.length; r++) {
    const raw = data[r];
    if (raw.length < width) shortRows.push(r);
    rows.push(rowCells(raw, width, r, delimiter, field));
  }
  const shortWarning = shortRowsWarning(shortRows);
  if (shortWarning !== null) warnings.push(shortWarning);
  const decimalComma = delimiter !== ',' && detectDecimalComma(rows);
  return Object.freeze({ columns: Object.freeze(columns), rows, delimiter, decimalComma, warnings: Object.freeze(warnings) });
}

/**
 * The position of a named column. Exact match first, then a case- and space-insensitive match.
 * @throws InputError naming the field and listing the columns there are
 */
export function columnIndex(table: Pick<CsvTable, 'columns'>, name: string, field: string): number {
  const exact = table.columns.indexOf(name);
  if (exact >= 0) return exact;
  const wanted = name.trim().toLowerCase();
  const loose = table.columns.findIndex((c) => c.trim().toLowerCase() === wanted);
  if (loose >= 0) return loose;
  throw new InputError([
    inputProblem(field, 'unknown-column', `no column named "${printable(name)}" (columns: ${printableList(table.columns, 20, false)})`, name),
  ]);
}

/**
 * A column's numbers; missing cells become NaN and are counted.
 * @throws InputError naming the column, the first row whose cell is not a number, and how many such cells there are
 */
export function numericColumn(table: CsvTable, name: string, field: string): { values: Float64Array; missing: number } {
  const c = columnIndex(table, name, field);
  const values = new Float64Array(table.rows.length);
  let missing = 0;
  let firstBad = -1;
  let bad = 0;
  for (let r = 0; r < table.rows.length; r++) {
    const cell = table.rows[r][c];
    if (cell === null) {
      values[r] = NaN;
      missing++;
      continue;
    }
    const number = parseNumberText(cell, table.decimalComma);
    if (Number.isNaN(number)) {
      if (firstBad < 0) firstBad = r;
      bad++;
    }
    values[r] = number;
  }
  if (bad > 0) {
    const cell = table.rows[firstBad][c];
    const others = bad > 1 ? ` (and ${bad - 1} more cells)` : '';
    throw new InputError([
      inputProblem(field, 'not-a-number', `column "${printable(table.columns[c])}" has "${printable(cell ?? '')}" in row ${firstBad + 1}, which is not a number${others}`, cell),
    ]);
  }
  return { values, missing };
}

/** Whether a column can be read as numbers (every non-missing cell parses). */
export function isNumericColumn(table: CsvTable, c: number): boolean {
  let seen = 0;
  for (const row of table.rows) {
    const cell = row[c];
    if (cell === null) continue;
    if (Number.isNaN(parseNumberText(cell, table.decimalComma))) return false;
    seen++;
  }
  return seen > 0;
}

/** The distinct non-missing values of a column, sorted, with their counts (for mapping categories). */
export function columnLevels(table: CsvTable, name: string, field: string): { value: string; count: number }[] {
  const c = columnIndex(table, name, field);
  const counts = new Map<string, number>();
  for (const row of table.rows) {
    const cell = row[c];
    if (cell !== null) counts.set(cell, (counts.get(cell) ?? 0) + 1);
  }
  return [...counts.entries()]
    .map(([value, count]) => ({ value, count }))
    .sort((a, b) => a.value.localeCompare(b.value, 'en', { numeric: true }));
}

/** Decimal commas: numeric-looking cells with a comma and none with a decimal point. */
function detectDecimalComma(rows: ReadonlyArray<ReadonlyArray<string | null>>): boolean {
  let comma = 0;
  let point = 0;
  const limit = Math.min(rows.length, 2000);
  for (let r = 0; r < limit; r++) {
    for (const cell of rows[r]) {
      if (cell === null) continue;
      if (/^[+-]?\d*,\d+([eE][+-]?\d+)?$/.test(cell) || /^[+-]?\d{1,3}(\.\d{3})+,\d*$/.test(cell)) comma++;
      else if (/^[+-]?\d*\.\d+([eE][+-]?\d+)?$/.test(cell)) point++;
    }
  }
  return comma > 0 && point === 0;
}

/**
 * Column names from a header record: trimmed; a blank name becomes "column i"; a repeated name gets " (2)",
 * " (3)" … (a warning says so for each). Linear in the header's width (one Map of names). Shared by
 * {@link readCsvText} and the streaming row reader.
 */
export function columnNamesFromHeader(header: readonly string[], warnings: string[]): string[] {
  const seen = new Map<string, number>();
  const taken = new Set<string>(header.map((name) => name.trim()));
  return header.map((raw, i) => {
    const name = raw.trim();
    let result = name === '' ? `column ${i + 1}` : name;
    if (name === '') warnings.push(`column ${i + 1} has no name in the header; it is called "${result}"`);
    const count = seen.get(result) ?? 0;
    seen.set(result, count + 1);
    if (count > 0) {
      let k = count + 1;
      let renamed = `${result} (${k})`;
      // Never rename onto a name the header already uses (a header "a, a, a (2)").
      while (taken.has(renamed)) renamed = `${result} (${++k})`;
      taken.add(renamed);
      seen.set(result, k);
      warnings.push(`the header names "${printable(result)}" more than once; the repeat is called "${printable(renamed)}"`);
      result = renamed;
    }
    return result;
  });
}

/**
 * One data row as cells of the header's width: trimmed, missing cells (see `isMissingCell`) as null, a short
 * row padded with null. Shared by {@link readCsvText} and the streaming row reader.
 * @param rowNumber the 1-based data row number, for the message
 * @throws InputError (`ragged-row`) when the row has more non-empty cells than the header has columns
 */
export function rowCells(raw: readonly string[], width: number, rowNumber: number, delimiter: string, field = 'file'): (string | null)[] {
  if (raw.length > width) {
    for (let c = width; c < raw.length; c++) {
      if (raw[c].trim() !== '') {
        throw new InputError([
          inputProblem(field, 'ragged-row', `row ${rowNumber} has ${raw.length} cells but the header names ${width} columns`, printable(raw.join(delimiter), 200)),
        ]);
      }
    }
  }
  const row: (string | null)[] = new Array(width);
  for (let c = 0; c < width; c++) {
    const cell = c < raw.length ? raw[c] : '';
    row[c] = isMissingCell(cell) ? null : cell.trim();
  }
  return row;
}

/** The warning for rows shorter than the header (null when there are none). */
export function shortRowsWarning(shortRows: readonly number[], total = shortRows.length): string | null {
  if (total === 0) return null;
  const list = shortRows.slice(0, 5).join(', ') + (total > 5 ? ` and ${total - 5} more` : '');
  return `${total === 1 ? 'row' : 'rows'} ${list} had fewer cells than the header; the missing cells count as missing values`;
}

/** Refuses a line longer than {@link MAX_CSV_RECORD_CHARS} (one scan of line ends; quotes are not considered). */
function refuseLongLines(text: string, field: string): void {
  if (text.length <= MAX_CSV_RECORD_CHARS) return;
  let start = 0;
  let line = 1;
  let lf = text.indexOf('\n');
  let cr = text.indexOf('\r');
  while (start < text.length) {
    if (lf >= 0 && lf < start) lf = text.indexOf('\n', start);
    if (cr >= 0 && cr < start) cr = text.indexOf('\r', start);
    const end = Math.min(lf < 0 ? text.length : lf, cr < 0 ? text.length : cr);
    if (end - start > MAX_CSV_RECORD_CHARS) throw recordTooLongError(line, MAX_CSV_RECORD_CHARS, field, 'line');
    start = end + 1;
    line++;
  }
}
