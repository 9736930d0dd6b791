import { dummyCode, type RawColumn } from '../../core/dummyCode';
import { InputError, inputProblem, type InputProblem } from '../../core/inputProblem';
import type { WeightingInput } from '../../core/weightingInput';
import type { ByteSource } from '../../data/byteSource';
import { csvRowBatches, type CsvStreamSummary } from '../../data/csvStream';
import { parseNumberText } from '../../data/numberText';
import { printable } from '../../data/printable';
import type { WeightingColumns, WeightingSettings } from './request';

/** A text covariate with more levels than this is refused (likely an identifier; common practice, no source). */
export const MAX_LEVELS = 100;

/** What was read from a file, without the numbers: rows, columns used, coding and the reader's notes. */
export interface WeightingReadSummary {
  readonly rowsRead: number;
  readonly treatment: string;
  readonly outcome: string;
  /** The covariate columns as chosen (before dummy coding). */
  readonly covariates: readonly string[];
  /** Text or declared categorical columns and their reference level. */
  readonly coded: readonly { readonly column: string; readonly reference: string | null; readonly levels: number }[];
  readonly warnings: readonly string[];
}

/** A file's columns, read: the analysis input's data part and what was read. */
export interface WeightingRead {
  readonly data: Pick<WeightingInput, 'treatment' | 'outcome' | 'covariates'>;
  readonly summary: WeightingReadSummary;
}

/** Progress of reading a file. */
export interface WeightingReadProgress {
  readonly bytesRead: number;
  readonly rowsRead: number;
}

/** One column being read: numbers while every cell is one, then (on the first text) the cells as text. */
class ColumnCells {
  readonly numbers: number[] = [];
  texts: (string | null)[] | null;
  badCount = 0;
  firstBad: { row: number; text: string } | null = null;

  constructor(
    readonly name: string,
    keepText: boolean,
  ) {
    this.texts = keepText ? [] : null;
  }

  push(cell: string | null, row: number, decimalComma: boolean): void {
    if (cell === null) {
      this.numbers.push(NaN);
      this.texts?.push(null);
      return;
    }
    const value = parseNumberText(cell, decimalComma);
    this.numbers.push(value);
    if (Number.isNaN(value)) {
      this.badCount++;
      if (this.firstBad === null) this.firstBad = { row, text: cell };
      // Earlier cells were numbers: their text is the number's own (a mixed column is coded by its text).
      if (this.texts === null) this.texts = this.numbers.slice(0, -1).map((v) => (Number.isNaN(v) ? null : String(v)));
    }
    this.texts?.push(cell);
  }

  raw(): RawColumn {
    return { name: this.name, values: this.texts ?? this.numbers };
  }
}

/**
 * Reads the treatment, outcome and covariate columns of a CSV stream (chunk by chunk; memory holds the chosen
 * columns only) and makes the analysis input's data: the treatment as 0/1, the outcome as numbers, and the
 * covariates dummy-coded (`dummyCode`: text columns and declared categorical columns become indicators of
 * every level but the first). Missing cells (empty, NA, …) become NaN: the analysis leaves those people out
 * and counts them.
 *
 * @throws InputError: a column that is not in the header (`treatment`, `outcome`, `covariates`,
 *   `categorical`), a treatment that is not 0/1 or an outcome that is not numeric (named by column, with the
 *   count and the first such row), and the CSV reader's problems (`file`)
 */
export async function readWeightingColumns(
  source: ByteSource,
  columns: WeightingColumns,
  options: { readonly signal?: AbortSignal; readonly onProgress?: (progress: WeightingReadProgress) => void } = {},
): Promise<WeightingRead> {
  let cells: ColumnCells[] | null = null;
  let indices: number[] = [];
  let rowsRead = 0;
  let covariateNames: string[] = [];
  const batches = csvRowBatches(source, {
    signal: options.signal,
    onProgress: (bytesRead) => options.onProgress?.({ bytesRead, rowsRead }),
  });
  let summary: CsvStreamSummary;
  for (;;) {
    const next = await batches.next();
    if (next.done) {
      summary = next.value;
      break;
    }
    const { rows, firstRowNumber, columns: header, dialect } = next.value;
    if (cells === null) {
      covariateNames = columns.covariates.length > 0 ? [...columns.covariates] : header.filter((c) => c !== columns.treatment && c !== columns.outcome);
      refuseUnknownColumns(header, columns);
      const names = [columns.treatment, columns.outcome, ...covariateNames];
      indices = names.map((n) => header.indexOf(n));
      cells = names.map((n, k) => new ColumnCells(n, k >= 2 && columns.categorical.includes(n)));
    }
    const decimalComma = dialect.decimalComma;
    for (let i = 0; i < rows.length; i++) {
      const row = rows[i];
      for (let k = 0; k < indices.length; k++) cells[k].push(row[indices[k]], firstRowNumber + i, decimalComma);
    }
    rowsRead = firstRowNumber + rows.length - 1;
  }
  const read = cells as ColumnCells[] | null;
  if (read === null) throw new InputError([inputProblem('file', 'no-rows', 'the file has a header but no data rows')]);
  const problems: InputProblem[] = [];
  const [treatment, outcome, ...covariates] = read;
  const treatmentValues = treatment.numbers;
  let notBinary = 0;
  let firstNotBinary: { row: number; text: string } | null = treatment.firstBad;
  treatmentValues.forEach((v, i) => {
    if (!Number.isNaN(v) && v !== 0 && v !== 1) {
      notBinary++;
      if (firstNotBinary === null || i + 1 < firstNotBinary.row) firstNotBinary = { row: i + 1, text: String(v) };
    }
  });
  notBinary += treatment.badCount;
  if (notBinary > 0 && firstNotBinary !== null) {
    problems.push(
      inputProblem(
        'treatment',
        'not-binary',
        `column "${printable(columns.treatment)}" must hold 0 (control) or 1 (treated): ${count(notBinary)} not (first at data row ${firstNotBinary.row}: "${printable(firstNotBinary.text)}")`,
        notBinary,
      ),
    );
  }
  if (outcome.badCount > 0 && outcome.firstBad !== null) {
    problems.push(
      inputProblem(
        'outcome',
        'not-numeric',
        `column "${printable(columns.outcome)}" must hold numbers: ${count(outcome.badCount)} not (first at data row ${outcome.firstBad.row}: "${printable(outcome.firstBad.text)}")`,
        outcome.badCount,
      ),
    );
  }
  if (problems.length > 0) throw new InputError(problems);
  const coding = dummyCode(
    covariates.map((c) => c.raw()),
    columns.categorical.filter((c) => covariateNames.includes(c)),
  );
  const tooMany = coding.codings.filter((c) => c.levels.length > MAX_LEVELS);
  if (tooMany.length > 0) {
    throw new InputError(
      tooMany.map((c) =>
        inputProblem(
          'covariates',
          'too-many-levels',
          `"${printable(c.column)}" has ${c.levels.length.toLocaleString('en')} different text values (more than ${MAX_LEVELS}); is it an identifier? Leave it out of the covariates or code it numerically`,
          c.column,
        ),
      ),
    );
  }
  const badTreatment = treatmentValues.map((v) => (v === 0 || v === 1 ? v : NaN));
  return {
    data: {
      treatment: badTreatment,
      outcome: outcome.numbers,
      covariates: coding.columns,
    },
    summary: Object.freeze({
      rowsRead,
      treatment: columns.treatment,
      outcome: columns.outcome,
      covariates: Object.freeze(covariateNames),
      coded: Object.freeze(
        coding.codings.filter((c) => c.kind === 'categorical').map((c) => Object.freeze({ column: c.column, reference: c.reference, levels: c.levels.length })),
      ),
      warnings: summary.warnings,
    }),
  };
}

function refuseUnknownColumns(header: readonly string[], columns: WeightingColumns): void {
  const problems: InputProblem[] = [];
  const known = (name: string) => header.includes(name);
  const list = header.map((h) => `"${printable(h)}"`).join(', ');
  if (!known(columns.treatment)) problems.push(inputProblem('treatment', 'unknown-column', `"${printable(columns.treatment)}" is not a column of the file (columns: ${list})`));
  if (!known(columns.outcome)) problems.push(inputProblem('outcome', 'unknown-column', `"${printable(columns.outcome)}" is not a column of the file (columns: ${list})`));
  const missing = columns.covariates.filter((c) => !known(c));
  if (missing.length > 0) {
    problems.push(inputProblem('covariates', 'unknown-column', `${missing.map((m) => `"${printable(m)}"`).join(', ')} ${missing.length === 1 ? 'is not a column' : 'are not columns'} of the file (columns: ${list})`));
  }
  const missingCategorical = columns.categorical.filter((c) => !known(c));
  if (missingCategorical.length > 0) {
    problems.push(inputProblem('categorical', 'unknown-column', `${missingCategorical.map((m) => `"${printable(m)}"`).join(', ')} ${missingCategorical.length === 1 ? 'is not a column' : 'are not columns'} of the file`));
  }
  if (problems.length > 0) throw new InputError(problems);
}

function count(k: number): string {
  return k === 1 ? '1 value is' : `${k.toLocaleString('en')} values are`;
}

/** The analysis input from the settings and the columns read. */
export function weightingInputOf(settings: WeightingSettings, read: WeightingRead): WeightingInput {
  return {
    ...read.data,
    estimand: settings.estimand,
    ...(settings.lambdas !== undefined ? { lambdas: settings.lambdas } : {}),
    ...(settings.bootstrap !== undefined ? { bootstrap: settings.bootstrap } : {}),
    ...(settings.seed !== undefined ? { seed: settings.seed } : {}),
    ...(settings.alpha !== undefined ? { alpha: settings.alpha } : {}),
    trim: settings.trim,
  };
}

/** A string (a whole CSV text) as a byte source. */
export async function* textSource(text: string): AsyncGenerator<string> {
  yield text;
}
