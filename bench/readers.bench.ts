// The CSV readers on absurd and large shapes: single lines of 2, 4 and 8 MB (work should grow linearly),
// a 50 MB single line (refused at 16 MiB), a 100,000-column header (also through the regression reader's
// header checks), and a 200 MB many-row file through the streaming row reader. Files are generated in the
// system's temporary folder and removed afterwards. Each case runs once; time and peak memory are printed.
// Run: npx vitest bench --run --project unit bench/readers.bench.ts
import { createReadStream, createWriteStream, mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, bench, describe } from 'vitest';
import { InputError } from '../src/core/inputProblem';
import { CsvChunkReader } from '../src/data/csvChunkReader';
import { readCsvRows } from '../src/data/csvStream';
import { accumulateRegressionFromStream } from '../src/methods/regression/regressionData';

const folder = mkdtempSync(join(tmpdir(), 'lurk-readers-'));
const MB = 1_000_000;

/**
 * A single line of about `bytes` bytes, no line break until the end: a number and a long quoted field
 * (commas, doubled quotes) every 250 bytes, so 8 MB stays under the 100,000-field limit.
 */
function singleLine(bytes: number): string {
  const path = join(folder, `line-${bytes}.csv`);
  const quoted = `"${'text, with ""quotes"" and commas '.repeat(7)}"`;
  const piece = `-12.5e3,${quoted}${' '.repeat(Math.max(0, 249 - 8 - quoted.length))},`;
  writeFileSync(path, piece.repeat(Math.ceil(bytes / piece.length)) + 'end\n');
  return path;
}

/** A 100,000-column header (invented names, every 1,000th repeated) and three rows. */
function wideFile(): string {
  const path = join(folder, 'wide.csv');
  const names = ['y', 't', ...Array.from({ length: 99_998 }, (_, i) => (i % 1000 === 1 ? `c${i - 1}` : `c${i}`))];
  const row = (k: number) => [k, k % 2, ...new Array(99_998).fill(k)].join(',');
  writeFileSync(path, [names.join(','), row(1), row(2), row(3), row(5)].join('\n') + '\n');
  return path;
}

/** About `bytes` bytes of ordinary rows (invented data, 8 columns). */
async function manyRows(bytes: number): Promise<string> {
  const path = join(folder, `rows-${bytes}.csv`);
  const out = createWriteStream(path);
  out.write('id,group,exposed,outcome,age,weight,site,note\n');
  let written = 0;
  let i = 0;
  while (written < bytes) {
    const lines: string[] = [];
    for (let k = 0; k < 10_000; k++, i++) lines.push(`${i},${i % 7},${i % 2},${(i * 7919) % 2},${20 + (i % 60)},${(50 + (i % 50) * 0.7).toFixed(1)},S${i % 13},"ok, ${i % 5}"`);
    const text = lines.join('\n') + '\n';
    written += text.length;
    if (!out.write(text)) await new Promise<void>((resolve) => out.once('drain', () => resolve()));
  }
  await new Promise<void>((resolve) => out.end(() => resolve()));
  return path;
}

function used(): number {
  const m = process.memoryUsage();
  return m.heapUsed + m.arrayBuffers;
}

/** Runs `read`, printing seconds, peak heap + buffers above the start (sampled by `sample`) and max RSS. */
async function measure(label: string, read: (sample: () => void) => Promise<string>): Promise<void> {
  globalThis.gc?.();
  const before = used();
  let peak = 0;
  const sample = () => void (peak = Math.max(peak, used() - before));
  const start = performance.now();
  let outcome: string;
  try {
    outcome = await read(sample);
  } catch (error) {
    if (!(error instanceof InputError)) throw error;
    outcome = `refused: ${error.problems[0].message}`;
  }
  sample();
  const seconds = (performance.now() - start) / 1000;
  const rss = process.resourceUsage().maxRSS / 1024;
  console.log(`${label}: ${seconds.toFixed(2)} s; peak heap + buffers above start ${(peak / 2 ** 20).toFixed(1)} MiB; max RSS so far ${rss.toFixed(0)} MiB; ${outcome}`);
}

/** The chunk reader fed 64 KiB of decoded text at a time, as the file readers do. */
async function chunkReader(path: string, sample: () => void): Promise<string> {
  let records = 0;
  let fields = 0;
  const reader = CsvChunkReader.withSpans((record) => {
    records++;
    fields += record.count;
  }, undefined, { readNumbers: true });
  const decoder = new TextDecoder();
  for await (const chunk of createReadStream(path, { highWaterMark: 64 * 1024 })) {
    reader.push(decoder.decode(chunk as Uint8Array, { stream: true }));
    sample();
  }
  reader.end();
  return `${records} records, ${fields} fields`;
}

async function rowReader(path: string, sample: () => void): Promise<string> {
  let cells = 0;
  const summary = await readCsvRows(createReadStream(path), (row) => (cells += row.length), { onProgress: sample });
  return `${summary.rowCount} rows, ${summary.columns.length} columns, ${cells} cells`;
}

const single = new Map([2, 4, 8, 50].map((mb) => [mb, singleLine(mb * MB)]));
const wide = wideFile();
const big = await manyRows(200 * MB);

afterAll(() => rmSync(folder, { recursive: true, force: true }));

const once = { iterations: 1, warmupIterations: 0, warmupTime: 0, time: 0 };

describe('a single long line (work should grow linearly with its length)', () => {
  for (const [mb, path] of single) {
    bench(`chunk reader, ${mb} MB line`, () => measure(`chunk reader, ${mb} MB single line`, (s) => chunkReader(path, s)), once);
  }
  for (const [mb, path] of single) {
    bench(`row reader, ${mb} MB line`, () => measure(`row reader, ${mb} MB single line`, (s) => rowReader(path, s)), once);
  }
});

describe('a 100,000-column header', () => {
  bench('chunk reader', () => measure('chunk reader, 100,000 columns', (s) => chunkReader(wide, s)), once);
  bench('row reader', () => measure('row reader, 100,000 columns', (s) => rowReader(wide, s)), once);
  bench('regression reader (header checks, three chosen columns)', () =>
    measure('regression reader, 100,000 columns', async (s) => {
      const data = await accumulateRegressionFromStream(createReadStream(wide), { outcome: 'y', treatment: 't', covariates: ['c0', 'c2'] }, { onProgress: s });
      return `${data.rowsUsed} rows used, ${data.warnings.length} warning(s)`;
    }), once);
});

describe('a 200 MB file of ordinary rows', () => {
  bench('chunk reader', () => measure('chunk reader, 200 MB rows', (s) => chunkReader(big, s)), once);
  bench('row reader', () => measure('row reader, 200 MB rows', (s) => rowReader(big, s)), once);
});
