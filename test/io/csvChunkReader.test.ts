import fc from 'fast-check';
import Papa from 'papaparse';
import { describe, expect, it } from 'vitest';
import { CsvChunkReader, detectCsvDialect, type CsvDialect } from '../../src/io/csvChunkReader';

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
