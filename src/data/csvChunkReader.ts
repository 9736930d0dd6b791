/** How a CSV file is written: its delimiter and its decimal mark. */
export interface CsvDialect {
  readonly delimiter: ',' | ';' | '\t';
  /** Numbers are written with a decimal comma (1,5), as usual with `;`-separated files. */
  readonly decimalComma: boolean;
}

/** Receives each record: its fields (the array is reused; copy it to keep it) and its 1-based record number (the header is record 1). */
export type CsvRecordHandler = (fields: string[], recordNumber: number) => void;

/**
 * One record as positions in a text, for readers that parse numbers without making a string per field.
 * Field i is `text.slice(start[i], end[i])` unless `unescaped[i]` is a string (a quoted field with "" or
 * text after its closing quote), in which case that string is the field. Reused between records.
 */
export interface CsvRecordSpans {
  text: string;
  count: number;
  start: Int32Array;
  end: Int32Array;
  unescaped: (string | null)[];
  /**
   * Field i read as a plain decimal number while it was scanned (readers made with `readNumbers`), or NaN
   * when it is anything else (quoted, empty, spaces, words, > 2^53 mantissa or |exponent| > 22): then read
   * `field(i)` with a full parser. Same rule and result as `parseDecimalSpan` (Clinger's fast path).
   */
  numbers: Float64Array;
  /** Field i as a string. */
  field(i: number): string;
}

/** Receives each record as spans, with its 1-based record number. */
export type CsvSpanHandler = (record: CsvRecordSpans, recordNumber: number) => void;

import { MAX_CSV_COLUMNS, MAX_CSV_RECORD_CHARS, binaryFileError, looksBinary, recordTooLongError, tooManyColumnsError } from './csvLimits';

/** Limits a reader enforces (defaults: {@link MAX_CSV_RECORD_CHARS}, {@link MAX_CSV_COLUMNS}). */
export interface CsvReaderLimits {
  /** The longest record in characters; a longer one is an InputError (code `record-too-long`). */
  readonly maxRecordChars?: number;
  /** The most fields in a record; more is an InputError (code `too-many-columns`). */
  readonly maxColumns?: number;
  /** The input field named in the errors (default `file`). */
  readonly field?: string;
}

/** Exact powers of ten representable in a double (10^0 … 10^22). */
const POWERS_OF_TEN = Array.from({ length: 23 }, (_, k) => Number(`1e${k}`));

const QUOTE = 34;
/** Record-boundary scan states: at a field's start, in an unquoted field, inside quotes, just after a quote. */
const SCAN_FIELD_START = 0;
const SCAN_UNQUOTED = 1;
const SCAN_QUOTED = 2;
const SCAN_AFTER_QUOTE = 3;
const LF = 10;
const CR = 13;

/** How much text is examined to detect the dialect before the first record is handed out. */
const DETECTION_SAMPLE = 64 * 1024;

class SpanRecord implements CsvRecordSpans {
  text = '';
  count = 0;
  start = new Int32Array(64);
  end = new Int32Array(64);
  numbers = new Float64Array(64).fill(NaN);
  unescaped: (string | null)[] = [];
  /** The most fields allowed; `overflow` is called (and must throw) when a record would have more. */
  maxFields = MAX_CSV_COLUMNS;
  overflow: () => never = () => {
    throw new RangeError('too many fields');
  };

  /** Sets the most fields allowed (the arrays never grow past it, so the limit is checked only on growth). */
  limitFields(max: number): void {
    this.maxFields = max;
    if (max < this.start.length) {
      this.start = new Int32Array(max);
      this.end = new Int32Array(max);
      this.numbers = new Float64Array(max).fill(NaN);
    }
  }

  field(i: number): string {
    const u = this.unescaped[i];
    return u !== null && u !== undefined ? u : this.text.slice(this.start[i], this.end[i]);
  }

  add(from: number, to: number, unescaped: string | null): void {
    const k = this.count;
    if (k === this.start.length) {
      if (k >= this.maxFields) this.overflow();
      const size = Math.min(k * 2, this.maxFields);
      const start = new Int32Array(size);
      start.set(this.start);
      this.start = start;
      const end = new Int32Array(size);
      end.set(this.end);
      this.end = end;
      const numbers = new Float64Array(size).fill(NaN);
      numbers.set(this.numbers);
      this.numbers = numbers;
    }
    this.start[k] = from;
    this.end[k] = to;
    this.unescaped[k] = unescaped;
    this.count = k + 1;
  }
}

/**
 * A streaming CSV record reader: text goes in chunk by chunk (any split, even inside a quoted field or
 * between \r and \n), complete records come out through a callback — as strings, or (made with
 * {@link CsvChunkReader.withSpans}) as positions in the text with plain decimals already read. Memory holds
 * one unfinished record.
 *
 * Follows RFC 4180 (Y. Shafranovich, "Common Format and MIME Type for Comma-Separated Values (CSV) Files",
 * IETF, 2005): fields may be quoted with "; "" inside quotes is one "; quoted fields may hold the delimiter
 * and line breaks. Also accepts \n or \r line ends, a byte-order mark, `;` or tab as the delimiter, and skips
 * blank lines. The dialect (delimiter, decimal comma) is detected from the first 64 KiB unless given.
 *
 * **Work and memory.** Each character is examined a bounded number of times however the text is split: a
 * record left unfinished at the end of a chunk is kept as pieces together with its scan state (inside
 * quotes or not, just after a quote), and the next chunk is scanned only from where the scan stopped, until
 * the record's line end; then the record is parsed once. Memory holds one unfinished record, at most
 * `maxRecordChars` characters.
 *
 * **Limits.** A record longer than {@link MAX_CSV_RECORD_CHARS} characters, a record with more than
 * {@link MAX_CSV_COLUMNS} fields, and NUL characters in the first 64 KiB (a binary file) are refused with an
 * InputError (field `file`, codes `record-too-long`, `too-many-columns`, `binary-file`) naming the rule and
 * the limit. The limits can be changed with the `limits` argument.
 */
export class CsvChunkReader {
  private pending = '';
  private started = false;
  private ended = false;
  private dialectValue: CsvDialect | null;
  private delimiterCode = 44;
  private readonly fields: string[] = [];
  private readonly record = new SpanRecord();
  private records = 0;
  private readonly presetDecimalComma: boolean | undefined;
  private onSpans: CsvSpanHandler | null = null;

  /**
   * @param onRecord receives each record as strings
   * @param dialect the delimiter (and decimal mark) when known; otherwise detected from the first 64 KiB
   */
  constructor(
    private readonly onRecord: CsvRecordHandler | null,
    dialect?: Partial<CsvDialect>,
    limits: CsvReaderLimits = {},
  ) {
    this.maxRecordChars = limits.maxRecordChars ?? MAX_CSV_RECORD_CHARS;
    this.field = limits.field ?? 'file';
    this.record.limitFields(limits.maxColumns ?? MAX_CSV_COLUMNS);
    this.record.overflow = () => {
      throw tooManyColumnsError(this.records + 1, this.record.maxFields, this.field);
    };
    this.dialectValue =
      dialect?.delimiter !== undefined
        ? { delimiter: dialect.delimiter, decimalComma: dialect.decimalComma ?? dialect.delimiter === ';' }
        : null;
    this.presetDecimalComma = dialect?.decimalComma;
  }

  /** A reader that hands out records as spans of the text (no string per field): for fast numeric reading. */
  static withSpans(
    onSpans: CsvSpanHandler,
    dialect?: Partial<CsvDialect>,
    options: { readNumbers?: boolean } & CsvReaderLimits = {},
  ): CsvChunkReader {
    const reader = new CsvChunkReader(null, dialect, options);
    reader.onSpans = onSpans;
    reader.readNumbers = options.readNumbers ?? false;
    return reader;
  }

  private readNumbers = false;
  private readonly maxRecordChars: number;
  private readonly field: string;
  /** Pieces of an unfinished record (null when there is none). */
  private carry: string[] | null = null;
  private carryLength = 0;
  /** Scan state at the end of the carried pieces (one of the SCAN_ constants). */
  private scanState = SCAN_FIELD_START;

  /** The dialect in use (null until enough text has been seen). */
  get dialect(): CsvDialect | null {
    return this.dialectValue;
  }

  /** Number of records handed out so far (header included). */
  get recordCount(): number {
    return this.records;
  }

  /**
   * Adds the next piece of text.
   * @throws InputError when a record is too long or has too many fields, or the start of the text holds NUL
   */
  push(text: string): void {
    if (this.ended) throw new Error('push after end');
    if (!this.started) {
      this.pending += text;
      if (this.pending.length > 0 && this.pending.charCodeAt(0) === 0xfeff) this.pending = this.pending.slice(1);
      if (this.dialectValue === null && this.pending.length < DETECTION_SAMPLE) return;
      this.start();
      this.parse(false);
      return;
    }
    if (text.length === 0) return;
    const carry = this.carry;
    if (carry === null) {
      this.pending = text;
      this.parse(false);
      return;
    }
    // An unfinished record: scan only the new text, from the saved state, up to the record's line end.
    const end = this.scanToRecordEnd(text);
    if (end < 0) {
      carry.push(text);
      this.carryLength += text.length;
      if (this.carryLength > this.maxRecordChars) throw recordTooLongError(this.records + 1, this.maxRecordChars, this.field);
      return;
    }
    if (this.carryLength + end > this.maxRecordChars + 2) throw recordTooLongError(this.records + 1, this.maxRecordChars, this.field);
    carry.push(text);
    this.pending = carry.join('');
    this.carry = null;
    this.carryLength = 0;
    this.parse(false);
  }

  /** Ends the input: the last record (without a final line break) is handed out. */
  end(): void {
    if (this.ended) return;
    if (!this.started) this.start();
    if (this.carry !== null) {
      this.pending = this.carry.join('');
      this.carry = null;
      this.carryLength = 0;
    }
    this.parse(true);
    this.ended = true;
  }

  /**
   * Continues the record-boundary scan over `text` from `scanState`, by the same rules as `parse` (a quote
   * opens a quoted field only at a field's start; "" inside quotes is a quote; after the closing quote, text
   * runs to the delimiter). Returns the index just after the line end that closes the record, or −1 (the
   * state is saved for the next piece).
   */
  private scanToRecordEnd(text: string, from = 0): number {
    const n = text.length;
    const delim = this.delimiterCode;
    let state = this.scanState;
    let i = from;
    while (i < n) {
      if (state === SCAN_QUOTED) {
        const close = text.indexOf('"', i);
        if (close < 0) {
          i = n;
          break;
        }
        i = close + 1;
        state = SCAN_AFTER_QUOTE;
        continue;
      }
      const c = text.charCodeAt(i++);
      if (state === SCAN_AFTER_QUOTE && c === QUOTE) {
        state = SCAN_QUOTED;
        continue;
      }
      if (c === delim) state = SCAN_FIELD_START;
      else if (c === LF || c === CR) {
        this.scanState = SCAN_FIELD_START;
        return i;
      } else if (state === SCAN_FIELD_START) state = c === QUOTE ? SCAN_QUOTED : SCAN_UNQUOTED;
      else if (state === SCAN_AFTER_QUOTE) state = SCAN_UNQUOTED;
    }
    this.scanState = state;
    return -1;
  }

  private start(): void {
    this.started = true;
    if (looksBinary(this.pending)) throw binaryFileError(this.field);
    if (this.dialectValue === null) {
      const detected = detectCsvDialect(this.pending);
      this.dialectValue = {
        delimiter: detected.delimiter,
        decimalComma: this.presetDecimalComma ?? detected.decimalComma,
      };
    }
    this.delimiterCode = this.dialectValue.delimiter.charCodeAt(0);
    this.decimalCode = this.dialectValue.decimalComma ? 44 : 46;
  }

  private decimalCode = 46;

  /** Parses every complete record in `pending`; with `final`, the rest is a record too. */
  private parse(final: boolean): void {
    const text = this.pending;
    const n = text.length;
    const delim = this.delimiterCode;
    const record = this.record;
    record.text = text;
    let pos = 0;
    outer: while (pos < n) {
      const recordStart = pos;
      record.count = 0;
      // Blank line: skip.
      const first = text.charCodeAt(pos);
      if (first === LF || first === CR) {
        pos++;
        continue;
      }
      for (;;) {
        if (pos < n && text.charCodeAt(pos) === QUOTE) {
          // Quoted field: a span inside the quotes, or an unescaped string when it holds "" or trails text.
          let value: string | null = null;
          const contentStart = pos + 1;
          let from = contentStart;
          let contentEnd: number;
          for (;;) {
            const close = text.indexOf('"', from);
            if (close < 0 || (close === n - 1 && !final)) {
              if (!final) {
                pos = recordStart;
                break outer;
              }
              // Unterminated quote at the end of the input: take the rest as the field.
              value = (value ?? '') + text.slice(from);
              contentEnd = n;
              pos = n;
              break;
            }
            if (close + 1 < n && text.charCodeAt(close + 1) === QUOTE) {
              value = (value ?? '') + text.slice(from, close + 1);
              from = close + 2;
              continue;
            }
            if (value !== null) value += text.slice(from, close);
            contentEnd = close;
            pos = close + 1;
            break;
          }
          // Anything between the closing quote and the delimiter is kept (lenient).
          let end = pos;
          while (end < n) {
            const c = text.charCodeAt(end);
            if (c === delim || c === LF || c === CR) break;
            end++;
          }
          if (end > pos) value = (value ?? text.slice(contentStart, contentEnd)) + text.slice(pos, end);
          pos = end;
          record.add(contentStart, contentEnd, value);
          record.numbers[record.count - 1] = NaN;
        } else if (this.readNumbers) {
          const end = this.scanNumber(text, pos, n, delim);
          record.add(pos, end, null);
          record.numbers[record.count - 1] = this.scannedNumber;
          pos = end;
        } else {
          let end = pos;
          while (end < n) {
            const c = text.charCodeAt(end);
            if (c === delim || c === LF || c === CR) break;
            end++;
          }
          record.add(pos, end, null);
          pos = end;
        }
        // After a field: delimiter, line end, or end of text.
        if (pos >= n) {
          if (!final) {
            pos = recordStart;
            break outer;
          }
          this.emit(pos - recordStart);
          break outer;
        }
        const c = text.charCodeAt(pos);
        if (c === delim) {
          pos++;
          if (pos >= n && !final) {
            pos = recordStart;
            break outer;
          }
          if (pos >= n) {
            record.add(pos, pos, null);
            record.numbers[record.count - 1] = NaN;
            this.emit(pos - recordStart);
            break outer;
          }
          continue;
        }
        // Line end (\n, \r or \r\n). A \r at the very end of a chunk may be followed by \n: the blank-line
        // rule then skips that \n.
        this.emit(pos - recordStart);
        pos++;
        if (c === CR && pos < n && text.charCodeAt(pos) === LF) pos++;
        continue outer;
      }
    }
    this.pending = '';
    record.text = '';
    if (pos < n) {
      // An unfinished record: keep it with its scan state; the next text is scanned from there.
      const tail = text.slice(pos);
      this.scanState = SCAN_FIELD_START;
      this.scanToRecordEnd(tail);
      this.carry = [tail];
      this.carryLength = tail.length;
      if (tail.length > this.maxRecordChars) throw recordTooLongError(this.records + 1, this.maxRecordChars, this.field);
    }
  }

  private scannedNumber = NaN;

  /**
   * Scans an unquoted field from `pos` to the next delimiter or line end (returned) and, in the same pass,
   * reads it as a plain decimal `[+-]digits[.digits][(e|E)[+-]digits]` into `scannedNumber` (NaN if it is
   * not one, or outside Clinger's fast path: mantissa ≥ 2^53 or |exponent| > 22). One pass instead of two
   * is what keeps the numeric CSV path close to the speed of splitting alone. See `decimalSpan.ts`.
   */
  private scanNumber(text: string, pos: number, n: number, delim: number): number {
    const mark = this.decimalCode;
    // States: 0 start, 1 after sign, 2 integer digits, 3 fraction, 4 after e, 5 after exponent sign,
    // 6 exponent digits, 7 not a plain number.
    let state = 0;
    let mantissa = 0;
    let digits = 0;
    let fractionDigits = 0;
    let exponent = 0;
    let negative = false;
    let exponentNegative = false;
    let end = pos;
    while (end < n) {
      const c = text.charCodeAt(end);
      if (c === delim || c === LF || c === CR) break;
      const d = c - 48;
      if (d >= 0 && d <= 9) {
        if (state <= 3) {
          mantissa = mantissa * 10 + d;
          digits++;
          if (state === 3) fractionDigits++;
          else state = 2;
        } else if (state <= 6) {
          if (exponent < 10000) exponent = exponent * 10 + d;
          state = 6;
        }
      } else if (c === mark && state <= 2) state = 3;
      else if ((c === 45 || c === 43) && state === 0) {
        negative = c === 45;
        state = 1;
      } else if ((c === 45 || c === 43) && state === 4) {
        exponentNegative = c === 45;
        state = 5;
      } else if ((c === 101 || c === 69) && (state === 2 || state === 3) && digits > 0) state = 4;
      else state = 7;
      end++;
    }
    let value = NaN;
    if (((state === 2 || state === 3) && digits > 0) || state === 6) {
      const power = (exponentNegative ? -exponent : exponent) - fractionDigits;
      if (mantissa < 9007199254740992) {
        if (mantissa === 0 || power === 0) value = mantissa;
        else if (power > 0 && power <= 22) value = mantissa * POWERS_OF_TEN[power];
        else if (power < 0 && power >= -22) value = mantissa / POWERS_OF_TEN[-power];
        if (negative) value = -value;
      }
    }
    this.scannedNumber = value;
    return end;
  }

  private emit(length: number): void {
    if (length > this.maxRecordChars) throw recordTooLongError(this.records + 1, this.maxRecordChars, this.field);
    this.records++;
    const record = this.record;
    if (this.onSpans !== null) {
      this.onSpans(record, this.records);
      return;
    }
    const fields = this.fields;
    fields.length = record.count;
    for (let i = 0; i < record.count; i++) fields[i] = record.field(i);
    this.onRecord!(fields, this.records);
  }
}

/**
 * Guesses the delimiter and the decimal mark from the start of a CSV text.
 *
 * The delimiter is whichever of `,` `;` tab occurs most often outside quotes on the first line (ties and
 * none: `,`), provided the next lines agree. Decimal commas are assumed when the delimiter is not a comma
 * and a field on the sampled lines looks like `12,5`.
 */
export function detectCsvDialect(sample: string): CsvDialect {
  const lines = firstLines(sample.charCodeAt(0) === 0xfeff ? sample.slice(1) : sample, 20);
  const header = lines[0] ?? '';
  const candidates: CsvDialect['delimiter'][] = [',', ';', '\t'];
  let delimiter: CsvDialect['delimiter'] = ',';
  let best = 0;
  for (const d of candidates) {
    const count = countOutsideQuotes(header, d);
    if (count > best) {
      best = count;
      delimiter = d;
    }
  }
  let decimalComma = false;
  if (delimiter !== ',') {
    const decimal = /^\s*"?[+\-\u2212]?\d[\d.]*,\d+([eE][+-]?\d+)?"?\s*$/;
    for (const line of lines.slice(1)) {
      if (line.split(delimiter).some((field) => decimal.test(field))) {
        decimalComma = true;
        break;
      }
    }
  }
  return { delimiter, decimalComma };
}

function firstLines(text: string, count: number): string[] {
  const lines: string[] = [];
  let inQuotes = false;
  let start = 0;
  for (let i = 0; i < text.length && lines.length < count; i++) {
    const c = text.charCodeAt(i);
    if (c === QUOTE) inQuotes = !inQuotes;
    else if (!inQuotes && (c === LF || c === CR)) {
      if (i > start) lines.push(text.slice(start, i));
      start = i + 1;
    }
  }
  if (lines.length < count && start < text.length) lines.push(text.slice(start));
  return lines;
}

function countOutsideQuotes(line: string, delimiter: string): number {
  let inQuotes = false;
  let count = 0;
  for (const ch of line) {
    if (ch === '"') inQuotes = !inQuotes;
    else if (!inQuotes && ch === delimiter) count++;
  }
  return count;
}
