// Speed of the matched-pairs calculator (invented data). Goals on this machine: the exact signed-rank bound at
// n = 1,000 pairs and the tipping-Γ search at n = 1,000 under 1 s each; the normal approximation on 1,000,000
// pairs including the CSV parse under 2 s. Run: npx vitest bench --run --project unit bench/pairs.bench.ts
import { bench, describe } from 'vitest';
import { analysePairs, outcomeDifferences, type PairsData } from '../src/core/pairsAnalysis';
import { signedRanks } from '../src/core/signedRanks';
import { signedRankBound, signedRankUpperP } from '../src/core/signedRankBound';
import { tippingGamma } from '../src/core/tippingGamma';
import { pairsFromCsvText } from '../src/methods/pairs/pairsFromCsv';

/** A reproducible stream of numbers in [0, 1) (linear congruential; invented data only). */
function random(seed: number): () => number {
  let state = seed >>> 0;
  return () => {
    state = (Math.imul(state, 1103515245) + 12345) >>> 0;
    return state / 4294967296;
  };
}

const next = random(20261202);
const thousand = Array.from({ length: 1000 }, () => next() - 0.44); // a modest effect: tipping Γ ≈ 1.4
const ranks = signedRanks(thousand);

const MILLION = 1_000_000;
const lines = ['treated,control'];
for (let i = 0; i < MILLION; i++) lines.push(`${(50 + 10 * next() + 0.2).toFixed(2)},${(50 + 10 * next()).toFixed(2)}`);
const csv = lines.join('\n') + '\n';
const options = { iterations: 5, warmupIterations: 1, time: 0 };

describe('exact bounds, n = 1,000 pairs', () => {
  bench('one Γ: upper and lower exact signed-rank bounds (Γ = 1.5)', () => void signedRankBound(ranks, 1.5, { method: 'exact' }), options);
  bench(
    'tipping Γ: exact search guided by the normal approximation (as analysePairs does)',
    () => {
      const normal = (g: number) => signedRankUpperP(ranks, g, { method: 'normal' });
      const guess = tippingGamma(normal, 0.05, { tolerance: 1e-4 }).gamma ?? undefined;
      tippingGamma((g) => signedRankUpperP(ranks, g, { method: 'exact' }), 0.05, { guess, tolerance: 1e-7, model: normal });
    },
    options,
  );
  bench(
    'whole analysis, exact (default Γ grid with p bounds, estimate ranges and intervals)',
    () => void analysePairs({ data: { kind: 'differences', differences: thousand } }),
    { iterations: 2, warmupIterations: 0, time: 0 },
  );
});

describe('normal approximation, 1,000,000 pairs', () => {
  bench(
    'CSV parse + signed-rank bounds at Γ = 1, 1.1, 1.2 + tipping Γ',
    () => {
      const data = pairsFromCsvText(csv, { treated: 'treated', control: 'control' }).data as Extract<PairsData, { kind: 'outcomes' }>;
      const ranksOfMillion = signedRanks(outcomeDifferences(data.treated, data.control));
      for (const gamma of [1, 1.1, 1.2]) signedRankBound(ranksOfMillion, gamma, { method: 'normal' });
      tippingGamma((g) => signedRankUpperP(ranksOfMillion, g, { method: 'normal' }), 0.05);
    },
    { iterations: 3, warmupIterations: 1, time: 0 },
  );
  bench(
    'CSV parse + whole analysis (normal; default grid with Hodges–Lehmann ranges by Walsh-average selection)',
    () => void analysePairs({ data: pairsFromCsvText(csv, { treated: 'treated', control: 'control' }).data, method: 'normal' }),
    { iterations: 2, warmupIterations: 0, time: 0 },
  );
});
