/**
 * A streaming CSV record reader: text goes in chunk by chunk (any split, even inside a quoted field or
 * between \r and \n), complete records come out through a callback. Memory holds one unfinished record.
 *
 * Follows RFC 4180 (fields may be quoted with "; "" inside quotes is one "; quoted fields may hold the
 * delimiter and line breaks), and also accepts \n or \r line ends, a byte-order mark, `;` or tab as the
 * delimiter, and skips blank lines. The dialect (delimiter, decimal comma) is detected from the first
 * records unless given.
 */
export interface CsvDialect {
  readonly delimiter: ',' | ';' | '\t';
  /** Numbers are written with a decimal comma (1,5), as usual with `;`-separated files. */
  readonly decimalComma: boolean;
}

/** Receives each record: its fields (the array is reused; copy it to keep it) and its 1-based record number (the header is record 1). */
export type CsvRecordHandler = (fields: string[], recordNumber: number) => void;

const QUOTE = 34;
const LF = 10;
const CR = 13;

/** How much text is examined to detect the dialect before the first record is handed out. */
const DETECTION_SAMPLE = 64 * 1024;

export class CsvChunkReader {
  private pending = '';
  private started = false;
  private ended = false;
  private dialectValue: CsvDialect | null;
  private delimiterCode = 44;
  private readonly fields: string[] = [];
  private records = 0;

  constructor(
    private readonly onRecord: CsvRecordHandler,
    dialect?: Partial<CsvDialect>,
  ) {
    this.dialectValue =
      dialect?.delimiter !== undefined
        ? { delimiter: dialect.delimiter, decimalComma: dialect.decimalComma ?? dialect.delimiter === ';' }
        : null;
    this.presetDecimalComma = dialect?.decimalComma;
  }

  private readonly presetDecimalComma: boolean | undefined;

  /** The dialect in use (null until enough text has been seen). */
  get dialect(): CsvDialect | null {
    return this.dialectValue;
  }

  /** Number of records handed out so far (header included). */
  get recordCount(): number {
    return this.records;
  }

  /** Adds the next piece of text. */
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
    this.pending = this.pending.length === 0 ? text : this.pending + text;
    this.parse(false);
  }

  /** Ends the input: the last record (without a final line break) is handed out. */
  end(): void {
    if (this.ended) return;
    if (!this.started) this.start();
    this.parse(true);
    this.ended = true;
  }

  private start(): void {
    this.started = true;
    if (this.dialectValue === null) {
      const detected = detectCsvDialect(this.pending);
      this.dialectValue = {
        delimiter: detected.delimiter,
        decimalComma: this.presetDecimalComma ?? detected.decimalComma,
      };
    }
    this.delimiterCode = this.dialectValue.delimiter.charCodeAt(0);
  }

  /** Parses every complete record in `pending`; with `final`, the rest is a record too. */
  private parse(final: boolean): void {
    const text = this.pending;
    const n = text.length;
    const delim = this.delimiterCode;
    const fields = this.fields;
    let pos = 0;
    outer: while (pos < n) {
      const recordStart = pos;
      fields.length = 0;
      // Blank line: skip.
      const first = text.charCodeAt(pos);
      if (first === LF || first === CR) {
        pos++;
        continue;
      }
      for (;;) {
        if (pos < n && text.charCodeAt(pos) === QUOTE) {
          // Quoted field.
          let value = '';
          let from = pos + 1;
          for (;;) {
            const close = text.indexOf('"', from);
            if (close < 0 || (close === n - 1 && !final)) {
              if (!final) {
                pos = recordStart;
                break outer;
              }
              // Unterminated quote at the end of the input: take the rest as the field.
              value += text.slice(from);
              pos = n;
              break;
            }
            if (close + 1 < n && text.charCodeAt(close + 1) === QUOTE) {
              value += text.slice(from, close + 1);
              from = close + 2;
              continue;
            }
            value += text.slice(from, close);
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
          if (end > pos) value += text.slice(pos, end);
          pos = end;
          fields.push(value);
        } else {
          let end = pos;
          while (end < n) {
            const c = text.charCodeAt(end);
            if (c === delim || c === LF || c === CR) break;
            end++;
          }
          fields.push(text.slice(pos, end));
          pos = end;
        }
        // After a field: delimiter, line end, or end of text.
        if (pos >= n) {
          if (!final) {
            pos = recordStart;
            break outer;
          }
          this.emit();
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
            fields.push('');
            this.emit();
            break outer;
          }
          continue;
        }
        // Line end (\n, \r or \r\n). A \r at the very end of a chunk may be followed by \n: the blank-line
        // rule then skips that \n.
        pos++;
        if (c === CR && pos < n && text.charCodeAt(pos) === LF) pos++;
        this.emit();
        continue outer;
      }
    }
    this.pending = pos >= n ? '' : text.slice(pos);
  }

  private emit(): void {
    this.records++;
    this.onRecord(this.fields, this.records);
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
