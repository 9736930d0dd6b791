// Speed of the exact matched-pairs analysis against the normal approximation of the same (invented) data, and
// of the sign test at a billion discordant pairs. Prints the exact/normal ratio of mean times after each group.
// Run: npx vitest bench --run --project unit bench/pairsExact.bench.ts
// The 5,000-pair exact run takes many minutes with the present dynamic program; it runs only when
// LURK_BENCH_LARGE=1 is set.
import { afterAll, bench, describe } from 'vitest';
import { analysePairs } from '../src/core/pairsAnalysis';
import { signTestBound } from '../src/core/signTestBound';

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
/** Continuous differences with an effect that keeps the sensitivity value near 1.3 at each size. */
const continuous = (n: number) => Array.from({ length: n }, () => next() - 0.5 + 1.3 / Math.sqrt(n));

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

const cases: [string, number[], boolean][] = [
  ['1,000 pairs with ties', tied1000, true],
  ['2,000 pairs', continuous(2000), true],
  ['5,000 pairs', continuous(5000), process.env.LURK_BENCH_LARGE === '1'],
];

for (const [label, differences, runExact] of cases) {
  describe(`whole pairs analysis, ${label}`, () => {
    const data = { kind: 'differences' as const, differences };
    bench('normal approximation', timed(`${label} normal`, () => analysePairs({ data, method: 'normal' })), {
      iterations: 3,
      warmupIterations: 1,
      time: 0,
    });
    if (runExact) {
      bench('exact bounding distributions', timed(`${label} exact`, () => analysePairs({ data, method: 'exact' })), {
        iterations: 1,
        warmupIterations: 0,
        time: 0,
      });
    }
    afterAll(() => {
      const normal = mean(timings.get(`${label} normal`));
      const exact = mean(timings.get(`${label} exact`));
      console.log(
        `${label}: normal ${normal.toFixed(0)} ms, exact ${Number.isFinite(exact) ? exact.toFixed(0) + ' ms' : 'not run'}` +
          (Number.isFinite(exact) ? `, exact/normal = ${(exact / normal).toFixed(1)}` : ''),
      );
    });
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
  afterAll(() => {
    console.log(`sign test, 3 Γ: ${mean(timings.get('sign')).toFixed(3)} ms; whole analysis: ${mean(timings.get('sign analysis')).toFixed(1)} ms`);
  });
});
