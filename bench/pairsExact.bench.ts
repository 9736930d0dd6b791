// Speed of the exact matched-pairs analysis against the normal approximation of the same (invented, fictional)
// data: in process (analysePairs, mean of runs after a warm-up) and as whole processes of the built CLI
// (`lurk pairs --file … --diff d --method exact|normal --json`, median wall time of 5 runs each), at 1,000 pairs
// with ties, 2,000 and 5,000 pairs, and 5,000 pairs whose differences take three sizes; and the sign test at a billion discordant pairs. Prints the exact/normal
// ratios after each group. Measures only; asserts nothing.
// Run: npx vitest bench --run --project unit bench/pairsExact.bench.ts
import { spawnSync } from 'node:child_process';
import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, bench, describe } from 'vitest';
import { analysePairs } from '../src/core/pairsAnalysis';
import { signTestBound } from '../src/core/signTestBound';
import { buildCliForTest } from '../test/support/builtCli';

/** A reproducible stream of numbers in [0, 1) (linear congruential; invented data only). */
function random(seed: number): () => number {
  let state = seed >>> 0;
  return () => {
    state = (Math.imul(state, 1103515245) + 12345) >>> 0;
    return state / 4294967296;
  };
}

const next = random(20261202);
/** Differences rounded to 0.1 (many tied magnitudes and some zeros); a modest effect. */
const tied1000 = Array.from({ length: 1000 }, () => Math.round((next() - 0.44) * 40) / 10);
/** Continuous differences with an effect that keeps the sensitivity value near 1.1–1.3 at each size. */
const continuous = (n: number) => Array.from({ length: n }, () => next() - 0.5 + 1.3 / Math.sqrt(n));

const folder = mkdtempSync(join(tmpdir(), 'lurk-pairs-bench-'));
const cli = await buildCliForTest();
afterAll(() => {
  cli.remove();
  rmSync(folder, { recursive: true, force: true });
});

const timings = new Map<string, number[]>();
function timed(key: string, run: () => unknown): () => void {
  return () => {
    const start = performance.now();
    run();
    const list = timings.get(key) ?? [];
    list.push(performance.now() - start);
    timings.set(key, list);
  };
}
const mean = (xs: number[] | undefined) => (xs && xs.length ? xs.reduce((a, b) => a + b, 0) / xs.length : NaN);
/** One run of a reporting bench (no warm-up, no time-based repetition). */
const ONCE = { iterations: 1, warmupIterations: 0, time: 0, warmupTime: 0 };
const printed = new Set<string>();
/** Prints a line once, however often the bench runner repeats the task. */
const printOnce = (key: string, line: () => string) => {
  if (printed.has(key)) return;
  printed.add(key);
  console.log(line());
};
const median = (xs: number[]) => [...xs].sort((a, b) => a - b)[Math.floor(xs.length / 2)];

/** Median wall time (ms) of whole `lurk pairs` processes on one file. */
function wholeProcess(file: string, method: 'exact' | 'normal', runs = 5): number {
  const times: number[] = [];
  for (let i = 0; i < runs; i++) {
    const started = performance.now();
    const run = spawnSync('node', [cli.lurk, 'pairs', '--file', file, '--diff', 'd', '--method', method, '--json'], { encoding: 'utf8', maxBuffer: 1 << 26 });
    times.push(performance.now() - started);
    if (run.status !== 0) throw new Error(`lurk pairs failed: ${run.stderr}`);
  }
  return median(times);
}

/** Differences of only three sizes, ±1, ±2, ±3 (a coarse scale: each size one mid-rank shared by many pairs). */
const threeSizes = (n: number) => Array.from({ length: n }, () => (1 + Math.floor(next() * 3)) * (next() < 0.56 ? 1 : -1));

const cases: [string, number[]][] = [
  ['1,000 pairs with ties', tied1000],
  ['2,000 pairs', continuous(2000)],
  ['5,000 pairs', continuous(5000)],
  ['5,000 pairs of three sizes (heavy ties)', threeSizes(5000)],
];

for (const [label, differences] of cases) {
  describe(`whole pairs analysis, ${label}`, () => {
    const data = { kind: 'differences' as const, differences };
    const options = { iterations: 3, warmupIterations: 1, time: 0 };
    bench('normal approximation (in process)', timed(`${label} normal`, () => analysePairs({ data, method: 'normal' })), options);
    bench('exact bounding distributions (in process)', timed(`${label} exact`, () => analysePairs({ data, method: 'exact' })), options);
    bench('whole CLI processes, exact against normal (5 runs each, medians)', () => printOnce(label, () => {
      const file = join(folder, `${label.replace(/\W+/g, '-')}.csv`);
      writeFileSync(file, `d\n${differences.join('\n')}\n`);
      const normalProcess = wholeProcess(file, 'normal');
      const exactProcess = wholeProcess(file, 'exact');
      const normal = mean(timings.get(`${label} normal`));
      const exact = mean(timings.get(`${label} exact`));
      return (
        `${label}: in process normal ${normal.toFixed(0)} ms, exact ${exact.toFixed(0)} ms, exact/normal = ${(exact / normal).toFixed(2)}; ` +
          `whole CLI process normal ${normalProcess.toFixed(0)} ms, exact ${exactProcess.toFixed(0)} ms, exact/normal = ${(exactProcess / normalProcess).toFixed(2)}`
      );
    }), ONCE);
  });
}

describe('sign test at a billion discordant pairs', () => {
  bench(
    'exact bounds at Γ = 1, 1.001, 1.01 (1,000,000,000 vs 999,000,000)',
    timed('sign', () => {
      for (const gamma of [1, 1.001, 1.01]) signTestBound(1_000_000_000, 1_999_000_000, gamma, { method: 'exact' });
    }),
    { iterations: 20, warmupIterations: 2, time: 0 },
  );
  bench(
    'whole analysis with the tipping Γ search',
    timed('sign analysis', () => analysePairs({ data: { kind: 'discordant', treatedOnly: 1_000_000_000, controlOnly: 999_000_000 } })),
    { iterations: 5, warmupIterations: 1, time: 0 },
  );
  bench('report', () => printOnce('sign', () => {
    return `sign test, 3 Γ: ${mean(timings.get('sign')).toFixed(3)} ms; whole analysis: ${mean(timings.get('sign analysis')).toFixed(1)} ms`;
  }), ONCE);
});
