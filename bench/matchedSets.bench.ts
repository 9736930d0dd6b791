// Speed of the matched-sets analysis (invented data): 10,000 sets with 1–4 controls each (about 35,000 rows),
// continuous outcome, the whole analysis (validation, default Γ grid with p-bounds, m-estimate ranges and
// sensitivity intervals, sensitivity value); for scale, the matched-pairs analysis (normal approximation) on
// 10,000 pairs drawn the same way. Run: npx vitest bench --run --project unit bench/matchedSets.bench.ts
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
