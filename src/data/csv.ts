import Papa from 'papaparse';
import { InputError, inputProblem } from '../core/inputProblem';
import { parseNumberText } from './numberText';
import { isMissingCell } from './missingCell';

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
 * @param text the whole file as text
 * @param field the input field named in messages (default `file`)
 * @throws InputError when the file is empty, has no header, or has rows longer than the header
 */
export function readCsvText(text: string, field = 'file'): CsvTable {
  const clean = text.charCodeAt(0) === 0xfeff ? text.slice(1) : text;
  if (clean.trim() === '') throw new InputError([inputProblem(field, 'empty-file', 'the file is empty')]);
  const parsed = Papa.parse<string[]>(clean, {
    header: false,
    skipEmptyLines: 'greedy',
    delimitersToGuess: [',', ';', '\t', '|'],
  });
  const data = parsed.data;
  if (data.length === 0) throw new InputError([inputProblem(field, 'empty-file', 'the file is empty')]);
  const delimiter = parsed.meta.delimiter || ',';
  const warnings: string[] = [];
  const columns = uniqueColumnNames(data[0].map((name) => name.trim()), warnings);
  const width = columns.length;
  if (data.length === 1) throw new InputError([inputProblem(field, 'no-rows', 'the file has a header but no data rows')]);

  const rows: (string | null)[][] = [];
  const shortRows: number[] = [];
  for (let r = 1; r < data.length; r++) {
    const raw = data[r];
    if (raw.length > width) {
      const extra = raw.slice(width).filter((cell) => cell.trim() !== '');
      if (extra.length > 0) {
        throw new InputError([
          inputProblem(field, 'ragged-row', `row ${r} has ${raw.length} cells but the header names ${width} columns`, raw.join(delimiter)),
        ]);
      }
    }
    if (raw.length < width) shortRows.push(r);
    const row: (string | null)[] = new Array(width);
    for (let c = 0; c < width; c++) {
      const cell = c < raw.length ? raw[c] : '';
      row[c] = isMissingCell(cell) ? null : cell.trim();
    }
    rows.push(row);
  }
  if (shortRows.length > 0) {
    const list = shortRows.slice(0, 5).join(', ') + (shortRows.length > 5 ? ` and ${shortRows.length - 5} more` : '');
    warnings.push(`${shortRows.length === 1 ? 'row' : 'rows'} ${list} had fewer cells than the header; the missing cells count as missing values`);
  }
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
    inputProblem(field, 'unknown-column', `no column named "${name}" (columns: ${table.columns.join(', ')})`, name),
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
      inputProblem(field, 'not-a-number', `column "${table.columns[c]}" has "${cell}" in row ${firstBad + 1}, which is not a number${others}`, cell),
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

function uniqueColumnNames(names: string[], warnings: string[]): string[] {
  const seen = new Map<string, number>();
  return names.map((name, i) => {
    let result = name === '' ? `column ${i + 1}` : name;
    if (name === '') warnings.push(`column ${i + 1} has no name in the header; it is called "${result}"`);
    const count = seen.get(result) ?? 0;
    seen.set(result, count + 1);
    if (count > 0) {
      const renamed = `${result} (${count + 1})`;
      warnings.push(`the header names "${result}" more than once; the repeat is called "${renamed}"`);
      result = renamed;
    }
    return result;
  });
}
