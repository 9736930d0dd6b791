// Speed of the streaming regression on 1,000,000 rows × 12 numeric columns (invented data) against reading
// the same CSV without any regression. Goals: the full result within 1.5× of the parse alone; memory flat
// in the number of rows (see regressionMemory.bench.ts). Run: npx vitest bench --run --project unit bench/regression.bench.ts
import { createReadStream } from 'node:fs';
import Papa from 'papaparse';
import { bench, describe } from 'vitest';
import { fitLeastSquares } from '../src/core/linearModel';
import { memoryIo } from '../src/cli/cliIo';
import { runLurk } from '../src/cli/main';
import { CsvChunkReader } from '../src/data/csvChunkReader';
import { accumulateRegressionFromStream } from '../src/methods/regression/regressionData';
import { benchCsv } from './regressionFixture';

const ROWS = 1_000_000;
const path = await benchCsv(ROWS);
const spec = { outcome: 'outcome', treatment: 'treatment' };
const options = { iterations: 3, warmupIterations: 1, time: 0 };
// Node's default 64 KiB chunks (what the CLI reads with).
const stream = () => createReadStream(path);

/** Reads the file and splits it into records of text fields, nothing more (the CSV parse alone). */
async function parseOnly(): Promise<number> {
  let records = 0;
  const reader = new CsvChunkReader(() => void records++, { delimiter: ',' });
  const decoder = new TextDecoder();
  for await (const chunk of stream()) reader.push(decoder.decode(chunk as Buffer, { stream: true }));
  reader.end();
  return records;
}

/** papaparse over the same stream, values left as text (its fastest mode). */
function papaparseOnly(): Promise<number> {
  return new Promise((resolve, reject) => {
    let records = 0;
    Papa.parse(createReadStream(path, { encoding: 'utf8' }) as unknown as File, {
      chunk: (results: Papa.ParseResult<unknown>) => void (records += results.data.length),
      complete: () => resolve(records),
      error: reject,
    });
  });
}

describe(`CSV of ${ROWS.toLocaleString('en')} rows × 12 numeric columns`, () => {
  bench('CSV parse alone: records of text fields (CsvChunkReader)', async () => void (await parseOnly()), options);
  bench('CSV parse alone: papaparse, text values', async () => void (await papaparseOnly()), options);
  bench(
    'full regression: stream → numbers → streaming QR → fit',
    async () => {
      const data = await accumulateRegressionFromStream(stream(), spec);
      fitLeastSquares(data.design, { response: data.outcomeColumn, predictors: data.predictors });
    },
    options,
  );
  bench(
    'full result through the CLI: lurk ovb --file … --json (benchmarks for 10 covariates)',
    async () => {
      const io = memoryIo();
      const status = await runLurk(['ovb', '--file', path, '--outcome', 'outcome', '--treatment', 'treatment', '--json'], io);
      if (status !== 0) throw new Error(io.stderr);
    },
    options,
  );
});
