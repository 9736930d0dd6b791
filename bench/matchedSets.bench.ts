// Speed of the matched-sets analysis (invented data): 10,000 sets with 1–4 controls each (about 35,000 rows),
// continuous outcome, the whole analysis (validation, default Γ grid with p-bounds, m-estimate ranges and
// sensitivity intervals, sensitivity value); for scale, the matched-pairs analysis (normal approximation) on
// 10,000 pairs drawn the same way; and a binary outcome on the same sets, exact Poisson-binomial tails against
// the normal approximation, with the exact/normal ratio of mean times printed.
// Run: npx vitest bench --run --project unit bench/matchedSets.bench.ts
import { bench, describe } from 'vitest';
import { analyseMatchedSets, type MatchedSetsInput } from '../src/core/matchedSetsAnalysis';
import { analysePairs } from '../src/core/pairsAnalysis';

/** A reproducible stream of numbers in [0, 1) (linear congruential; invented data only). */
function random(seed: number): () => number {
  let state = seed >>> 0;
  return () => {
    state = (Math.imul(state, 1103515245) + 12345) >>> 0;
    return state / 4294967296;
  };
}

const next = random(20260611);
const normal = () => Math.sqrt(-2 * Math.log(1 - next())) * Math.cos(2 * Math.PI * next());
const SETS = 10_000;
const setIds: string[] = [];
const treated: number[] = [];
const outcomes: number[] = [];
const pairTreated: number[] = [];
const pairControl: number[] = [];
for (let s = 0; s < SETS; s++) {
  const controls = 1 + Math.floor(next() * 4);
  const t = 50 + 10 * normal() + 0.8; // a small effect: the sensitivity value is modest
  setIds.push(`set${s}`);
  treated.push(1);
  outcomes.push(t);
  for (let k = 0; k < controls; k++) {
    const c = 50 + 10 * normal();
    setIds.push(`set${s}`);
    treated.push(0);
    outcomes.push(c);
    if (k === 0) {
      pairTreated.push(t);
      pairControl.push(c);
    }
  }
}
const input: MatchedSetsInput = { setIds, treated, outcomes };
const options = { iterations: 5, warmupIterations: 1, time: 0 };

describe(`matched sets, ${SETS.toLocaleString('en')} sets with 1–4 controls (${setIds.length.toLocaleString('en')} rows)`, () => {
  bench('whole analysis, continuous (default Γ grid, estimates, intervals, sensitivity value)', () => void analyseMatchedSets(input), options);
  bench(
    'matched pairs on 10,000 pairs (treated and first control), normal approximation, whole analysis',
    () => void analysePairs({ data: { kind: 'outcomes', treated: pairTreated, control: pairControl }, method: 'normal' }),
    options,
  );
});

/** The same sets with a 0/1 outcome (fictional): an event when the continuous outcome passes 55. */
const binaryInput: MatchedSetsInput = { setIds, treated, outcomes: outcomes.map((y) => (y > 55 ? 1 : 0)) };
const binaryTimes = { exact: [] as number[], normal: [] as number[] };
const timedRun = (tail: 'exact' | 'normal') => () => {
  const started = performance.now();
  analyseMatchedSets({ ...binaryInput, tail });
  binaryTimes[tail].push(performance.now() - started);
};
let binaryPrinted = false;

describe(`matched sets, binary outcome, ${SETS.toLocaleString('en')} sets`, () => {
  bench('whole analysis, exact Poisson-binomial tails', timedRun('exact'), options);
  bench('whole analysis, normal approximation', timedRun('normal'), options);
  bench(
    'report: exact/normal ratio of mean times',
    () => {
      if (binaryPrinted) return;
      binaryPrinted = true;
      const mean = (xs: number[]) => xs.reduce((a, b) => a + b, 0) / xs.length;
      const exact = mean(binaryTimes.exact);
      const normal = mean(binaryTimes.normal);
      console.log(`binary sets, ${SETS.toLocaleString('en')} sets: exact ${exact.toFixed(0)} ms, normal ${normal.toFixed(0)} ms, exact/normal = ${(exact / normal).toFixed(2)}`);
    },
    { iterations: 1, warmupIterations: 0, time: 0, warmupTime: 0 },
  );
});
