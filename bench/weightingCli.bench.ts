// The weighting command end to end through the built CLI: invented data (fictional), 100,000 people × 5
// covariates (three normal, two binary), B = 200 bootstrap resamples, ATE — reading the CSV, the propensity
// fit, the bootstrap on two worker threads, the report as JSON. Prints wall time, CPU time and the process's
// peak resident memory (from /usr/bin/time; worker threads share the process). Measures only; asserts nothing.
// Run once: npx vitest bench --run --project unit bench/weightingCli.bench.ts
import { spawnSync } from 'node:child_process';
import { existsSync, mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, bench, describe } from 'vitest';
import { fictionalCsv } from './weightingFixture';
import { buildCliForTest } from '../test/support/builtCli';

const folder = mkdtempSync(join(tmpdir(), 'lurk-weighting-bench-'));
const csv = join(folder, 'fictional-100k.csv');
writeFileSync(csv, fictionalCsv(100_000, 20261202));
const cli = await buildCliForTest();
afterAll(() => {
  cli.remove();
  rmSync(folder, { recursive: true, force: true });
});

describe('lurk weighting, built CLI, two threads', () => {
  bench(
    '100,000 people × 5 covariates, B = 200',
    () => {
      const args = [cli.lurk, 'weighting', '--file', csv, '--treatment', 'treated', '--outcome', 'outcome', '--bootstrap', '200', '--seed', '1', '--json'];
      const timed = existsSync('/usr/bin/time');
      const started = performance.now();
      const run = timed ? spawnSync('/usr/bin/time', ['-f', 'LURK_TIME %e %U %S %M', 'node', ...args], { encoding: 'utf8', maxBuffer: 1 << 26 }) : spawnSync('node', args, { encoding: 'utf8', maxBuffer: 1 << 26 });
      const wall = (performance.now() - started) / 1000;
      if (run.status !== 0) throw new Error(`lurk weighting failed: ${run.stderr}`);
      const json = JSON.parse(run.stdout);
      const line = /LURK_TIME ([\d.]+) ([\d.]+) ([\d.]+) (\d+)/.exec(run.stderr ?? '');
      const usage = line ? `; user ${line[2]} s + system ${line[3]} s CPU; peak RSS ${(Number(line[4]) / 1024).toFixed(0)} MiB` : '';
      console.log(`lurk weighting 100,000 × 5, B = 200: wall ${wall.toFixed(1)} s${usage}; ${json.bootstrap.used} resamples used; effect ${json.estimate.effect.toFixed(4)}; tipping Λ (interval) ${json.tippingLambdaInterval}`);
    },
    { iterations: 1, warmupIterations: 0, time: 0 },
  );
});
