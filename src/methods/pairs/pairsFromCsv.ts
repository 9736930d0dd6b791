import { InputError, inputProblem, type InputProblem } from '../../core/inputProblem';
import type { PairsData } from '../../core/pairsAnalysis';
import { CsvChunkReader, type CsvDialect } from '../../data/csvChunkReader';
import { byteSourceChunks, type ByteSource } from '../../data/byteSource';
import { isMissingCell } from '../../data/missingCell';
import { parseNumericCell } from '../regression/regressionData';

/** Which columns hold the pairs: treated and control outcomes, or one column of treated − control differences. */
export interface PairsColumns {
  readonly treated?: string;
  readonly control?: string;
  readonly difference?: string;
  /**
   * `auto` (default): two columns holding only 0 and 1 are a binary outcome and become discordant counts;
   * `numeric`: always differences; `binary`: insist on 0/1 values.
   */
  readonly outcome?: 'auto' | 'numeric' | 'binary';
}

/** Pairs read from a file or a paste box, ready for `analysePairs`. */
export interface PairsRead {
  readonly data: PairsData;
  /** Column names of the file (empty for pasted numbers without a header). */
  readonly columns: readonly string[];
  /** Data rows seen (blank lines excluded). */
  readonly rowsRead: number;
  /** Rows left out because a needed value was missing (empty, NA, …). */
  readonly droppedRows: number;
  /** Pairs used: rowsRead − droppedRows. */
  readonly pairs: number;
  /** True when two 0/1 columns were turned into discordant counts. */
  readonly binary: boolean;
  readonly warnings: readonly string[];
}

export interface PairsReadProgress {
  readonly bytesRead: number;
  readonly totalBytes: number | null;
  readonly rowsRead: number;
}

/** Checks a column choice before reading: either both outcome columns, or the difference column. */
export function validatePairsColumns(spec: PairsColumns): InputProblem[] {
  const problems: InputProblem[] = [];
  const has = (v: string | undefined) => typeof v === 'string' && v.trim() !== '';
  if (has(spec.difference)) {
    if (has(spec.treated) || has(spec.control)) {
      problems.push(inputProblem('difference', 'conflicting-columns', 'give either a difference column or treated and control columns, not both'));
    }
  } else if (!has(spec.treated) && !has(spec.control)) {
    problems.push(inputProblem('treated', 'missing', 'name the treated-outcome column and the control-outcome column, or a difference column'));
  } else if (!has(spec.treated)) {
    problems.push(inputProblem('treated', 'missing', 'name the treated-outcome column (the control column alone is not enough)'));
  } else if (!has(spec.control)) {
    problems.push(inputProblem('control', 'missing', 'name the control-outcome column (the treated column alone is not enough)'));
  } else if (spec.treated!.trim() === spec.control!.trim()) {
    problems.push(inputProblem('control', 'same-column', 'must be a different column from the treated outcome'));
  }
  return problems;
}

/** A growable Float64Array. */
class NumberList {
  values = new Float64Array(1024);
  length = 0;
  push(v: number): void {
    if (this.length === this.values.length) {
      const bigger = new Float64Array(this.values.length * 2);
      bigger.set(this.values);
      this.values = bigger;
    }
    this.values[this.length++] = v;
  }
  toArray(): Float64Array {
    return this.values.slice(0, this.length);
  }
}

/**
 * Reads matched pairs from CSV text pushed chunk by chunk (any split), keeping two numbers per row.
 *
 * Rows missing a needed value (empty, NA, N/A, NaN, NULL, ".") are dropped and counted; a cell that is not a
 * number is an error naming its column, row and text; a row with more non-empty cells than the header is an
 * error naming the row. Differences are treated − control.
 */
export function createPairsReader(spec: PairsColumns, options: { dialect?: Partial<CsvDialect> } = {}) {
  const specProblems = validatePairsColumns(spec);
  if (specProblems.length > 0) throw new InputError(specProblems);
  const byDifference = typeof spec.difference === 'string' && spec.difference.trim() !== '';
  let header: string[] | null = null;
  let first = -1;
  let second = -1;
  let rowsRead = 0;
  let dropped = 0;
  let binaryCandidate = true;
  const a = new NumberList();
  const b = new NumberList();
  let reader: CsvChunkReader;

  const findColumn = (name: string, field: string): number => {
    const cols = header!;
    const exact = cols.indexOf(name);
    if (exact >= 0) return exact;
    const wanted = name.trim().toLowerCase();
    const loose = cols.findIndex((c) => c.trim().toLowerCase() === wanted);
    if (loose >= 0) return loose;
    throw new InputError([inputProblem(field, 'unknown-column', `no column named "${name}" (columns: ${cols.join(', ')})`, name)]);
  };
  const readCell = (fields: string[], index: number, field: string, row: number): number => {
    const text = index < fields.length ? fields[index] : '';
    if (isMissingCell(text)) return NaN;
    const value = parseNumericCell(text.trim(), reader.dialect?.decimalComma ?? false);
    if (Number.isNaN(value)) {
      throw new InputError([
        inputProblem(field, 'not-a-number', `column "${header![index]}" has "${text.trim()}" in row ${row}, which is not a number`, text),
      ]);
    }
    return value;
  };

  reader = new CsvChunkReader((fields, recordNumber) => {
    if (header === null) {
      header = fields.map((f, i) => f.trim() || `column ${i + 1}`);
      if (byDifference) first = findColumn(spec.difference!, 'difference');
      else {
        first = findColumn(spec.treated!, 'treated');
        second = findColumn(spec.control!, 'control');
        if (first === second) throw new InputError([inputProblem('control', 'same-column', 'must be a different column from the treated outcome')]);
      }
      return;
    }
    const row = recordNumber - 1;
    if (fields.length > header.length) {
      for (let i = header.length; i < fields.length; i++) {
        if (fields[i].trim() !== '') {
          throw new InputError([
            inputProblem('file', 'ragged-row', `row ${row} has ${fields.length} cells but the header names ${header.length} columns`),
          ]);
        }
      }
    }
    rowsRead++;
    const x = readCell(fields, first, byDifference ? 'difference' : 'treated', row);
    const y = byDifference ? 0 : readCell(fields, second, 'control', row);
    if (Number.isNaN(x) || Number.isNaN(y)) {
      dropped++;
      return;
    }
    if (binaryCandidate && (byDifference || !((x === 0 || x === 1) && (y === 0 || y === 1)))) binaryCandidate = false;
    a.push(x);
    if (!byDifference) b.push(y);
  }, options.dialect);

  return {
    push(text: string): void {
      reader.push(text);
    },
    get rowsRead(): number {
      return rowsRead;
    },
    finish(): PairsRead {
      reader.end();
      if (header === null) throw new InputError([inputProblem('file', 'empty-file', 'the file is empty')]);
      if (rowsRead === 0) throw new InputError([inputProblem('file', 'no-rows', 'the file has a header but no data rows')]);
      const warnings: string[] = [];
      if (dropped > 0) {
        warnings.push(`${dropped} of ${rowsRead} ${rowsRead === 1 ? 'row was' : 'rows were'} left out because a value was missing.`);
      }
      const outcome = spec.outcome ?? 'auto';
      let data: PairsData;
      let binary = false;
      if (byDifference) {
        if (outcome === 'binary') {
          throw new InputError([inputProblem('outcome', 'not-binary', 'a binary outcome needs two 0/1 columns (treated and control), not a difference column')]);
        }
        data = { kind: 'differences', differences: a.toArray() };
      } else if (outcome === 'binary' || (outcome === 'auto' && binaryCandidate && a.length > 0)) {
        if (!binaryCandidate) {
          throw new InputError([inputProblem('outcome', 'not-binary', 'a binary outcome needs every treated and control value to be 0 or 1')]);
        }
        let treatedOnly = 0;
        let controlOnly = 0;
        for (let i = 0; i < a.length; i++) {
          if (a.values[i] === 1 && b.values[i] === 0) treatedOnly++;
          else if (a.values[i] === 0 && b.values[i] === 1) controlOnly++;
        }
        binary = true;
        data = { kind: 'discordant', treatedOnly, controlOnly, concordant: a.length - treatedOnly - controlOnly };
        warnings.push(
          `Both columns hold only 0 and 1, so the outcome is binary: ${treatedOnly} pairs where only the treated unit had the event, ${controlOnly} where only the control did.`,
        );
      } else {
        data = { kind: 'outcomes', treated: a.toArray(), control: b.toArray() };
      }
      return Object.freeze({
        data,
        columns: Object.freeze([...header]),
        rowsRead,
        droppedRows: dropped,
        pairs: rowsRead - dropped,
        binary,
        warnings: Object.freeze(warnings),
      });
    },
  };
}

/** Reads pairs from a whole CSV text. @throws InputError (fields `treated`, `control`, `difference`, `outcome`, `file`). */
export function pairsFromCsvText(text: string, spec: PairsColumns): PairsRead {
  if (text.replace(/^\ufeff/, '').trim() === '') throw new InputError([inputProblem('file', 'empty-file', 'the file is empty')]);
  const reader = createPairsReader(spec);
  reader.push(text);
  return reader.finish();
}

/** Anything that yields the bytes of a CSV file: a Node stream, a web ReadableStream, or an async iterable of chunks. */
export type PairsByteSource = ByteSource;

/**
 * Reads pairs from a UTF-8 byte stream chunk by chunk (memory holds only the two numbers per pair),
 * reporting progress; cancellable with `signal`.
 */
export async function pairsFromCsvStream(
  source: PairsByteSource,
  spec: PairsColumns,
  options: { onProgress?: (progress: PairsReadProgress) => void; signal?: AbortSignal; totalBytes?: number } = {},
): Promise<PairsRead> {
  const reader = createPairsReader(spec);
  const decoder = new TextDecoder('utf-8');
  let bytesRead = 0;
  let sawText = false;
  for await (const chunk of byteSourceChunks(source)) {
    options.signal?.throwIfAborted();
    const text = typeof chunk === 'string' ? chunk : decoder.decode(chunk, { stream: true });
    bytesRead += typeof chunk === 'string' ? chunk.length : chunk.byteLength;
    if (text.trim() !== '' && text !== '\ufeff') sawText = true;
    reader.push(text);
    options.onProgress?.({ bytesRead, totalBytes: options.totalBytes ?? null, rowsRead: reader.rowsRead });
  }
  options.signal?.throwIfAborted();
  const tail = decoder.decode();
  if (tail) reader.push(tail);
  if (!sawText) throw new InputError([inputProblem('file', 'empty-file', 'the file is empty')]);
  return reader.finish();
}
