import fc from 'fast-check';
import Papa from 'papaparse';
import { describe, expect, it } from 'vitest';
import { CsvChunkReader, detectCsvDialect, type CsvDialect } from '../../src/data/csvChunkReader';
import { MAX_CSV_COLUMNS, MAX_CSV_RECORD_CHARS } from '../../src/data/csvLimits';
import { problemsOf } from '../support/thrownProblems';
import { parseDecimalSpan } from '../../src/data/decimalSpan';

function readAll(chunks: string[], dialect?: Partial<CsvDialect>): string[][] {
  const records: string[][] = [];
  const reader = new CsvChunkReader((fields) => records.push([...fields]), dialect);
  chunks.forEach((c) => reader.push(c));
  reader.end();
  return records;
}

const tricky =
  '\ufeff"id","note, with comma","multi\nline"\r\n' +
  '1,"say ""hi""",x\r\n' +
  '2,,"a\r\nb"\r\n' +
  '\r\n' +
  '3,"",last';

describe('CsvChunkReader', () => {
  it('reads quoted fields, doubled quotes, line breaks inside quotes, CRLF, a BOM and blank lines', () => {
    expect(readAll([tricky])).toEqual([
      ['id', 'note, with comma', 'multi\nline'],
      ['1', 'say "hi"', 'x'],
      ['2', '', 'a\r\nb'],
      ['3', '', 'last'],
    ]);
  });

  it('agrees with papaparse on the same text', () => {
    // papaparse 5.7.1 as an independent RFC 4180 reader
    const expected = Papa.parse<string[]>(tricky.slice(1), { skipEmptyLines: true }).data;
    expect(readAll([tricky])).toEqual(expected);
  });

  it('any split into chunks gives the same records (property)', () => {
    const whole = readAll([tricky]);
    fc.assert(
      fc.property(fc.uniqueArray(fc.integer({ min: 1, max: tricky.length - 1 }), { maxLength: 12 }), (cuts) => {
        const sorted = [...cuts].sort((a, b) => a - b);
        const chunks: string[] = [];
        let from = 0;
        for (const cut of [...sorted, tricky.length]) {
          chunks.push(tricky.slice(from, cut));
          from = cut;
        }
        expect(readAll(chunks, { delimiter: ',' })).toEqual(whole);
      }),
      { numRuns: 300 },
    );
  });

  it('a trailing delimiter gives a final empty field; an unterminated quote takes the rest', () => {
    expect(readAll(['a,b\n1,'])).toEqual([
      ['a', 'b'],
      ['1', ''],
    ]);
    expect(readAll(['a\n"open'])).toEqual([['a'], ['open']]);
  });

  it('old Mac line ends (\\r alone)', () => {
    expect(readAll(['a,b\r1,2\r3,4'])).toEqual([
      ['a', 'b'],
      ['1', '2'],
      ['3', '4'],
    ]);
  });
});

/** Cuts a text into pieces of `size` characters. */
function piecesOf(text: string, size: number): string[] {
  const out: string[] = [];
  for (let i = 0; i < text.length; i += size) out.push(text.slice(i, i + size));
  return out;
}

describe('CsvChunkReader: an unfinished record resumes where its scan stopped', { timeout: 120_000 }, () => {
  // Adversarial records for the resumed scan: quotes at piece ends, "" escapes, CR|LF split, text after a
  // closing quote, a quote inside an unquoted field, delimiters and line breaks inside quotes.
  const adversarial =
    'h1,"h\n2",h3\r\n' +
    '"a""b",x"y,"c\r\nd"\r\n' +
    '"q"tail,,"\n"\n' +
    '\r\n' +
    '1,2,"3,4"';

  it('a single long line split into 64 KiB pieces gives one record with every field', () => {
    const fields = Array.from({ length: 40_000 }, (_, i) => (i % 3 === 0 ? `"v,${i}"` : `${i}.5`));
    const line = fields.join(',');
    const records = readAll(piecesOf(`${line}\n${line}\n`, 64 * 1024));
    expect(records).toHaveLength(2);
    expect(records[0]).toHaveLength(40_000);
    expect(records[0][3]).toBe('v,3');
    expect(records[1][39_998]).toBe('39998.5');
  });

  it('splits into pieces of every size, down to one character, give the same records as the whole text', () => {
    const whole = readAll([adversarial], { delimiter: ',' });
    expect(whole).toEqual([
      ['h1', 'h\n2', 'h3'],
      ['a"b', 'x"y', 'c\r\nd'],
      ['qtail', '', '\n'],
      ['1', '2', '3,4'],
    ]);
    for (let size = 1; size <= adversarial.length; size++) expect(readAll(piecesOf(adversarial, size), { delimiter: ',' })).toEqual(whole);
  });

  it('any split of random quoted text gives the same records as papaparse (property)', () => {
    // papaparse 5.7.1 as an independent RFC 4180 reader, on well-formed records
    const cell = fc.oneof(fc.stringMatching(/^[a-z0-9 ]{0,6}$/), fc.stringMatching(/^[a-z,\n"\r]{0,8}$/).map((t) => `"${t.replace(/"/g, '""')}"`));
    const text = fc.array(fc.array(cell, { minLength: 3, maxLength: 3 }), { minLength: 1, maxLength: 8 }).map((rows) => rows.map((r) => r.join(',')).join('\r\n'));
    fc.assert(
      fc.property(text, fc.integer({ min: 1, max: 20 }), (csv, size) => {
        const expected = Papa.parse<string[]>(csv, { delimiter: ',', skipEmptyLines: true }).data.filter((r) => r.some((c) => c !== ''));
        const actual = readAll(piecesOf(csv, size), { delimiter: ',' }).filter((r) => r.some((c) => c !== ''));
        expect(actual).toEqual(expected);
      }),
      { numRuns: 300 },
    );
  });
});

// Generous time limits: some of these read tens of megabytes on a shared machine (not a speed check).
describe('CsvChunkReader: limits', { timeout: 120_000 }, () => {
  it(`exports its limits: records of at most ${MAX_CSV_RECORD_CHARS} characters (16 MiB), at most ${MAX_CSV_COLUMNS} columns`, () => {
    expect(MAX_CSV_RECORD_CHARS).toBe(16 * 1024 * 1024);
    expect(MAX_CSV_COLUMNS).toBe(100_000);
  });

  it('a line longer than the limit is refused with a message naming the line, the rule and the limit', () => {
    const reader = new CsvChunkReader(() => {}, { delimiter: ',' }, { maxRecordChars: 1000 });
    reader.push('a,b\n');
    const problems = problemsOf(() => reader.push('x'.repeat(1001) + '\n'));
    expect(problems[0]).toMatchObject({ field: 'file', code: 'record-too-long' });
    expect(problems[0].message).toBe('record 2 is longer than 1,000 characters (the longest row this reader accepts); is this a CSV file?');
  });

  it('an unfinished record is refused as soon as it passes the limit: memory stays bounded', () => {
    const reader = new CsvChunkReader(() => {}, { delimiter: ',' }, { maxRecordChars: 4096 });
    reader.push('a\n');
    let pushed = 0;
    const problems = problemsOf(() => {
      for (;;) {
        reader.push('"'.repeat(pushed === 0 ? 1 : 0) + 'y'.repeat(1000));
        pushed++;
        if (pushed > 100) throw new Error('never refused');
      }
    });
    expect(problems[0].code).toBe('record-too-long');
    expect(pushed).toBe(4);
  });

  it('the default limit is 16 MiB and the message says so', () => {
    const reader = new CsvChunkReader(() => {}, { delimiter: ',' });
    const piece = 'z'.repeat(1024 * 1024);
    const problems = problemsOf(() => {
      for (let i = 0; i < 17; i++) reader.push(piece);
    });
    expect(problems[0].message).toBe('record 1 (the header) is longer than 16 MiB (the longest row this reader accepts); is this a CSV file?');
  });

  it('a data row with more fields than the column limit is refused, naming the record and the limit', () => {
    const reader = new CsvChunkReader(() => {}, { delimiter: ',' }, { maxColumns: 10 });
    reader.push('a,b,c,d,e,f,g,h,i,j\n');
    const problems = problemsOf(() => reader.push('1,2,3,4,5,6,7,8,9,10,11\n'));
    expect(problems[0]).toMatchObject({ field: 'file', code: 'too-many-columns' });
    expect(problems[0].message).toBe('record 2 has more than 10 fields (the most columns this reader accepts); is the delimiter right, and is this a CSV file?');
  });

  it(`a header with more than ${MAX_CSV_COLUMNS.toLocaleString('en')} columns is refused; exactly that many is read`, () => {
    const at = Array.from({ length: MAX_CSV_COLUMNS }, (_, i) => `c${i}`).join(',');
    expect(readAll([at + '\n1'])[0]).toHaveLength(MAX_CSV_COLUMNS);
    const problems = problemsOf(() => readAll([at + ',one-more\n1']));
    expect(problems[0]).toMatchObject({ field: 'file', code: 'too-many-columns' });
    expect(problems[0].message).toContain('record 1 (the header) has more than 100,000 fields');
  });

  it('NUL bytes near the start are refused as a binary file', () => {
    const binary = 'PK\u0003\u0004\u0000\u0000\u0008\u0000abc';
    const problems = problemsOf(() => readAll([binary]));
    expect(problems[0]).toMatchObject({ field: 'file', code: 'binary-file' });
    expect(problems[0].message).toMatch(/^looks like a binary file, not CSV: it has NUL bytes in its first 64 KiB/);
    // UTF-16 text has a NUL beside every ASCII letter
    expect(problemsOf(() => readAll(['a\u0000,\u0000b\u0000\n\u0000'], { delimiter: ',' }))[0].code).toBe('binary-file');
  });
});

describe('CsvChunkReader.withSpans with readNumbers', () => {
  function numbersOf(line: string, dialect: Partial<CsvDialect> = { delimiter: ',' }): number[][] {
    const out: number[][] = [];
    const reader = CsvChunkReader.withSpans((record) => out.push(Array.from(record.numbers.subarray(0, record.count))), dialect, { readNumbers: true });
    reader.push(line);
    reader.end();
    return out;
  }

  it('reads plain decimals while splitting; anything else is NaN (left to the full parser)', () => {
    const [row] = numbersOf('12,-0.5,"3",,1e3, 4,NA,0x1,5.e2,-,1.5e');
    expect(row.slice(0, 2)).toEqual([12, -0.5]);
    expect(row[2]).toBeNaN(); // quoted
    expect(row[3]).toBeNaN(); // empty
    expect(row[4]).toBe(1000);
    for (const k of [5, 6, 7, 9, 10]) expect(row[k], String(k)).toBeNaN();
    expect(row[8]).toBe(500);
  });

  it('decimal commas with `;`', () => {
    expect(numbersOf('1,5;-2,25;3.5', { delimiter: ';', decimalComma: true })[0].slice(0, 2)).toEqual([1.5, -2.25]);
  });

  it('agrees with parseDecimalSpan, and with Number where it answers (property)', () => {
    fc.assert(
      fc.property(fc.array(fc.stringMatching(/^[+-]?\d{0,17}(\.\d{0,17})?([eE][+-]?\d{1,3})?$/), { minLength: 1, maxLength: 6 }), (cells) => {
        // A leading constant field keeps the line from being blank.
        const [row] = numbersOf(['0', ...cells].join(',') + '\n').map((r) => r.slice(1));
        cells.forEach((cell, k) => {
          const expected = parseDecimalSpan(cell, 0, cell.length, 46);
          expect(Object.is(row[k], expected) || (Number.isNaN(row[k]) && Number.isNaN(expected)), cell).toBe(true);
          if (!Number.isNaN(row[k])) expect(Object.is(row[k], Number(cell)), cell).toBe(true);
        });
      }),
      { numRuns: 2000 },
    );
  });
});

describe('detectCsvDialect', () => {
  it('comma, semicolon with decimal commas, tab', () => {
    expect(detectCsvDialect('a,b\n1.5,2')).toEqual({ delimiter: ',', decimalComma: false });
    expect(detectCsvDialect('a;b\n1,5;2')).toEqual({ delimiter: ';', decimalComma: true });
    expect(detectCsvDialect('a;b\n1.5;2')).toEqual({ delimiter: ';', decimalComma: false });
    expect(detectCsvDialect('a\tb\n1\t2')).toEqual({ delimiter: '\t', decimalComma: false });
  });
  it('ignores delimiters inside quoted header names', () => {
    expect(detectCsvDialect('"a;b;c",d\n1,2')).toEqual({ delimiter: ',', decimalComma: false });
  });
  it('a single column defaults to comma', () => {
    expect(detectCsvDialect('x\n1\n2')).toEqual({ delimiter: ',', decimalComma: false });
  });
});
