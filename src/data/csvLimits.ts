import { InputError, inputProblem } from '../core/inputProblem';

/**
 * The longest record (one row of a CSV, in characters) the readers accept: 16 MiB. A longer "line" is almost
 * always a file that is not CSV (a binary file, a whole file with a lone \r or no line breaks); refusing it
 * early saves minutes of work. Common practice, no source: the figure is a generous cap well above real rows.
 */
export const MAX_CSV_RECORD_CHARS = 16 * 1024 * 1024;

/** The most columns a CSV header may have: 100,000 (common practice, no source: well above real tables). */
export const MAX_CSV_COLUMNS = 100_000;

/** How much of the start of a file is examined for NUL bytes (a binary file, or UTF-16 text). */
export const BINARY_SNIFF_CHARS = 64 * 1024;

/** The limit written for a person: "16 MiB". */
export function describeCharLimit(chars: number): string {
  if (chars % (1024 * 1024) === 0) return `${chars / (1024 * 1024)} MiB`;
  if (chars % 1024 === 0) return `${chars / 1024} KiB`;
  return `${chars.toLocaleString('en')} characters`;
}

/**
 * The error for a record above the length limit (record 1 is the header). `unit` says whether the number
 * counts records (a quoted field may span lines) or physical lines.
 */
export function recordTooLongError(recordNumber: number, limit: number, field = 'file', unit: 'record' | 'line' = 'record'): InputError {
  return new InputError([
    inputProblem(
      field,
      'record-too-long',
      `${unit} ${recordNumber.toLocaleString('en')}${recordNumber === 1 ? ' (the header)' : ''} is longer than ${describeCharLimit(limit)} (the longest row this reader accepts); is this a CSV file?`,
      recordNumber,
    ),
  ]);
}

/** The error for a record with more fields than the column limit. */
export function tooManyColumnsError(recordNumber: number, limit: number, field = 'file'): InputError {
  return new InputError([
    inputProblem(
      field,
      'too-many-columns',
      `record ${recordNumber.toLocaleString('en')}${recordNumber === 1 ? ' (the header)' : ''} has more than ${limit.toLocaleString('en')} fields (the most columns this reader accepts); is the delimiter right, and is this a CSV file?`,
      recordNumber,
    ),
  ]);
}

/** The error for a file with NUL bytes near its start. */
export function binaryFileError(field = 'file'): InputError {
  return new InputError([
    inputProblem(
      field,
      'binary-file',
      `looks like a binary file, not CSV: it has NUL bytes in its first ${describeCharLimit(BINARY_SNIFF_CHARS)} (a CSV file is text; if it is UTF-16 text, save it as UTF-8).`,
      null,
    ),
  ]);
}

/** True when the start of a text holds a NUL character (checked in the first {@link BINARY_SNIFF_CHARS}). */
export function looksBinary(text: string): boolean {
  const sample = text.length > BINARY_SNIFF_CHARS ? text.slice(0, BINARY_SNIFF_CHARS) : text;
  return sample.includes('\u0000');
}
