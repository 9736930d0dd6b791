import { Readable } from 'node:stream';
import { describe, expect, it } from 'vitest';
import { readCsvText } from '../../src/data/csv';
import { csvRowBatches, readCsvRows } from '../../src/data/csvStream';
import { InputError, type InputProblem } from '../../src/core/inputProblem';

const encoder = new TextEncoder();

/** A byte stream of `text` in pieces of `size` bytes (multi-byte characters may be split). */
function bytes(text: string, size = 7): Readable {
  const all = encoder.encode(text);
  const pieces: Uint8Array[] = [];
  for (let i = 0; i < all.length; i += size) pieces.push(all.subarray(i, i + size));
  return Readable.from(pieces);
}

async function readAll(text: string, size?: number) {
  const rows: (string | null)[][] = [];
  const summary = await readCsvRows(bytes(text, size), (row) => rows.push(row));
  return { rows, ...summary };
}

async function problemsOfAsync(run: () => Promise<unknown>): Promise<InputProblem[]> {
  try {
    await run();
  } catch (error) {
    if (error instanceof InputError) return [...error.problems];
    throw error;
  }
  throw new Error('expected an InputError');
}

// Adversarial files, generated here (invented values).
const files: Record<string, string> = {
  'byte-order mark and CRLF': '\ufeffid,score\r\n1,2.5\r\n2,3.5\r\n',
  '`;` with decimal commas': 'id;score;note\n1;2,5;a\n2;-3,25;"b;c"\n',
  tabs: 'id\tscore\n1\t2\n',
  'quoted headers with line breaks, quotes and delimiters': '"first\nname","say ""x""","a,b"\n1,2,3\n',
  'NA, empty and other missing cells': 'a,b,c\n1,,NA\nN/A,.,NULL\n #N/A ,nan,4\n',
  'a short (ragged) row, blank lines and a missing last line break': 'a,b,c\n1,2,3\n\n4,5\n\r\n6,7,8',
  'huge and tiny magnitudes': 'x,y\n1e308,-1e-308\n9.999e307,5e-324\n',
  'repeated and blank header names': 'a,,a, a \n1,2,3,4\n',
  'multi-byte characters': 'städt,年齢\nü,ß\n😀,x\n',
};

describe('readCsvRows: the same rows, columns and warnings as readCsvText', () => {
  for (const [name, text] of Object.entries(files)) {
    it(name, async () => {
      const whole = readCsvText(text);
      for (const size of [1, 3, 64 * 1024]) {
        const streamed = await readAll(text, size);
        expect(streamed.columns).toEqual(whole.columns);
        expect(streamed.rows).toEqual(whole.rows);
        expect(streamed.dialect.delimiter).toBe(whole.delimiter);
        expect(streamed.dialect.decimalComma).toBe(whole.decimalComma);
        expect(streamed.warnings).toEqual(whole.warnings);
        expect(streamed.rowCount).toBe(whole.rows.length);
      }
    });
  }
});

describe('csvRowBatches', () => {
  it('yields rows chunk by chunk, each batch with the columns, the dialect and its first row number', async () => {
    const text = 'g;v\n' + Array.from({ length: 30_000 }, (_, i) => `${i % 2};${i},5`).join('\n');
    const batches = [];
    for await (const batch of csvRowBatches(bytes(text, 16 * 1024))) batches.push(batch);
    expect(batches.length).toBeGreaterThan(5);
    expect(batches[0]).toMatchObject({ columns: ['g', 'v'], dialect: { delimiter: ';', decimalComma: true }, firstRowNumber: 1 });
    let next = 1;
    for (const batch of batches) {
      expect(batch.firstRowNumber).toBe(next);
      next += batch.rows.length;
    }
    expect(next - 1).toBe(30_000);
    expect(batches.at(-1)!.rows.at(-1)).toEqual(['1', '29999,5']);
  });

  it('accepts a web ReadableStream and text chunks', async () => {
    const web = new ReadableStream<Uint8Array>({
      start(controller) {
        controller.enqueue(encoder.encode('a,b\n1,'));
        controller.enqueue(encoder.encode('2\n'));
        controller.close();
      },
    });
    const rows: (string | null)[][] = [];
    await readCsvRows(web, (row) => rows.push(row));
    expect(rows).toEqual([['1', '2']]);
    const fromText: (string | null)[][] = [];
    await readCsvRows(Readable.from(['a,b\n3', ',4']), (row) => fromText.push(row));
    expect(fromText).toEqual([['3', '4']]);
  });
});

describe('readCsvRows: refusals', () => {
  it('a row with more non-empty cells than the header is named', async () => {
    const problems = await problemsOfAsync(() => readAll('a,b\n1,2\n3,4,5\n'));
    expect(problems[0]).toMatchObject({ field: 'file', code: 'ragged-row' });
    expect(problems[0].message).toBe('row 2 has 3 cells but the header names 2 columns');
  });

  it('an empty file, and a header without rows', async () => {
    expect((await problemsOfAsync(() => readAll('')))[0].code).toBe('empty-file');
    expect((await problemsOfAsync(() => readAll('\ufeff\r\n\r\n')))[0].code).toBe('empty-file');
    expect((await problemsOfAsync(() => readAll('a,b\n')))[0].code).toBe('no-rows');
  });

  it('binary bytes, a line over the limit, too many columns', async () => {
    const zip = new Uint8Array([0x50, 0x4b, 0x03, 0x04, 0x14, 0x00, 0x00, 0x00, 0x08, 0x00]);
    const binary = await problemsOfAsync(() => readCsvRows(Readable.from([zip]), () => {}));
    expect(binary[0]).toMatchObject({ field: 'file', code: 'binary-file' });
    const long = await problemsOfAsync(() => readCsvRows(bytes('a\n' + 'x'.repeat(5000), 512), () => {}, { maxRecordChars: 4096 }));
    expect(long[0].message).toBe('record 2 is longer than 4 KiB (the longest row this reader accepts); is this a CSV file?');
    const wide = await problemsOfAsync(() => readCsvRows(bytes('a,b,c\n1,2,3\n'), () => {}, { maxColumns: 2, field: 'data' }));
    expect(wide[0]).toMatchObject({ field: 'data', code: 'too-many-columns' });
  });

  it('stops when its signal aborts', async () => {
    const controller = new AbortController();
    controller.abort();
    await expect(readCsvRows(bytes('a\n1\n'), () => {}, { signal: controller.signal })).rejects.toMatchObject({ name: 'AbortError' });
  });
});
