import fc from 'fast-check';
import Papa from 'papaparse';
import { describe, expect, it } from 'vitest';
import { CsvChunkReader, detectCsvDialect, type CsvDialect } from '../../src/data/csvChunkReader';
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
