// The regression push-down against the CSV path on the same 10,000,000 rows (invented data, generated inside
// DuckDB by SQL with a seed): (1) the summary query runs in DuckDB and the Lurk command analyses its one result
// row; (2) the rows are exported with COPY … TO (CSV) and the Lurk command reads them with its streaming path.
// Printed: the wall time of each part and the peak memory (resident set high-water mark) of the Lurk process
// alone (a child process, so DuckDB's memory is not counted). Nothing is asserted. Rows: LURK_BENCH_ROWS (default 10,000,000).
// Run: npx vitest bench --run --project unit bench/pushdown.bench.ts   (a few minutes; needs about 1 GB of disk)
import { spawnSync } from 'node:child_process';
import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, beforeAll, bench, describe } from 'vitest';
import { DuckDBInstance, type DuckDBConnection } from '@duckdb/node-api';
import { buildCliForTest } from '../test/support/builtCli';

const ROWS = Number(process.env.LURK_BENCH_ROWS ?? 10_000_000);
const MODEL = ['--outcome', 'bp', '--treatment', 'dose', '--covariates', 'age,region,income', '--categorical', 'region'];
const folder = mkdtempSync(join(tmpdir(), 'lurk-pushdown-'));
const csvPath = join(folder, 'visits.csv');
const rssHook = join(folder, 'rss.cjs');
let connection: DuckDBConnection;
let cli: { lurk: string; remove(): void };

/** Runs the Lurk command in its own process; returns its output, wall time and peak memory (max RSS, MiB). */
function lurk(args: string[], input?: string): { out: string; seconds: number; maxRssMiB: number } {
  const start = performance.now();
  const run = spawnSync(process.execPath, ['--require', rssHook, cli.lurk, 'ovb', ...args], { input, encoding: 'utf8', maxBuffer: 1 << 26 });
  const seconds = (performance.now() - start) / 1000;
  if (run.status !== 0) throw new Error(`lurk failed: ${run.stderr}`);
  const rss = /lurk-max-rss (\d+)/.exec(run.stderr);
  return { out: run.stdout, seconds, maxRssMiB: rss ? Number(rss[1]) / 1024 : NaN };
}

async function rows(sql: string): Promise<Array<Record<string, unknown>>> {
  const reader = await connection.runAndReadAll(sql);
  return reader.getRowObjectsJS().map((r) => Object.fromEntries(Object.entries(r).map(([k, v]) => [k.toLowerCase(), typeof v === 'bigint' ? Number(v) : v])));
}

beforeAll(async () => {
  // Peak resident memory of this process alone: Linux's VmHWM starts afresh at exec, while maxRSS (getrusage)
  // keeps what the forked child inherited from this process (DuckDB's table) until exec; maxRSS elsewhere.
  writeFileSync(
    rssHook,
    "process.on('exit', () => { const fs = require('fs'); let kb = process.resourceUsage().maxRSS; " +
      "try { kb = Number(/VmHWM:\\s+(\\d+)/.exec(fs.readFileSync('/proc/self/status', 'utf8'))[1]); } catch {} " +
      "fs.writeSync(2, 'lurk-max-rss ' + kb + '\\n'); });\n",
  );
  cli = await buildCliForTest();
  const instance = await DuckDBInstance.create(':memory:');
  connection = await instance.connect();
  const start = performance.now();
  await connection.run('SELECT setseed(0.42)');
  await connection.run('CREATE SCHEMA bench');
  await connection.run(`
    CREATE TABLE bench.visits AS
    WITH base AS (
      SELECT i, 20 + 60 * random() AS age, random() AS u, random() AS e1, random() AS e2, random() AS e3 FROM range(${ROWS}) t(i)
    )
    SELECT age,
           CASE WHEN u < 0.3 THEN 'north' WHEN u < 0.7 THEN 'mid' ELSE 'south' END AS region,
           30000 + 400 * age + 5000 * e3 AS income,
           0.01 * age + e1 AS dose,
           100 + 0.3 * age + 2 * (0.01 * age + e1) + CASE WHEN u < 0.3 THEN 1.5 ELSE 0 END + 10 * (e2 - 0.5) AS bp
    FROM base`);
  console.log(`\n${ROWS.toLocaleString('en')} rows generated in DuckDB in ${((performance.now() - start) / 1000).toFixed(1)} s`);
  const copy = performance.now();
  await connection.run(`COPY bench.visits TO '${csvPath.replace(/'/g, "''")}' (HEADER, DELIMITER ',')`);
  console.log(`exported with COPY TO (CSV) in ${((performance.now() - copy) / 1000).toFixed(1)} s`);
}, 600_000);

afterAll(() => {
  connection?.closeSync();
  cli?.remove();
  rmSync(folder, { recursive: true, force: true });
});

describe(`regression on ${ROWS.toLocaleString('en')} rows: push-down against the CSV path`, () => {
  bench(
    'push-down: levels query, summary query in DuckDB, then lurk ovb --summary',
    async () => {
      const start = performance.now();
      const levelsQuery = JSON.parse(lurk(['--sql', 'bench.visits', ...MODEL, '--json']).out).query as string;
      const levels = await rows(levelsQuery);
      const levelsCsv = 'lurk_query,column_name,level\n' + levels.map((r) => `${r.lurk_query},${r.column_name},${r.level}`).join('\n') + '\n';
      const summaryQuery = JSON.parse(lurk(['--sql', 'bench.visits', ...MODEL, '--levels', levelsCsv, '--json']).out).query as string;
      const inDatabase = performance.now();
      const [row] = await rows(summaryQuery);
      const databaseSeconds = (performance.now() - inDatabase) / 1000;
      const analysis = lurk(['--summary', '-', ...MODEL, '--json'], JSON.stringify(row));
      const result = JSON.parse(analysis.out);
      console.log(
        `push-down: ${((performance.now() - start) / 1000).toFixed(1)} s in all (summary query in DuckDB ${databaseSeconds.toFixed(1)} s, ` +
          `Lurk's analysis ${analysis.seconds.toFixed(2)} s); Lurk process max RSS ${analysis.maxRssMiB.toFixed(0)} MiB; estimate ${result.estimate}, RV ${result.rv}`,
      );
    },
    { iterations: 1, warmupIterations: 0, warmupTime: 0, time: 0 },
  );

  bench(
    'CSV path: lurk ovb --file on the exported rows (streaming reader)',
    () => {
      const run = lurk(['--file', csvPath, ...MODEL, '--json']);
      const result = JSON.parse(run.out);
      console.log(`CSV path: ${run.seconds.toFixed(1)} s; Lurk process max RSS ${run.maxRssMiB.toFixed(0)} MiB; estimate ${result.estimate}, RV ${result.rv}`);
    },
    { iterations: 1, warmupIterations: 0, warmupTime: 0, time: 0 },
  );
});
