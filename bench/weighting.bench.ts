// Speed of the weighting sensitivity analysis on invented data (fictional): 100,000 people × 5 covariates
// (three normal, two binary), B = 200 bootstrap resamples, ATE, the whole analysis (validation, propensity
// fit, point bounds, bootstrap with a refit per resample, tipping Λ). Single thread; a CLI can split the resamples
// over two worker threads with splitBootstrap/runBootstrapChunk. Measured 2026-12-02 on the shared 2-core machine
// (load average 6): whole analysis 11.6 s wall, 8–10 s CPU; prepare 0.8 s. Run once:
//   npx vitest bench --run --project unit bench/weighting.bench.ts
import { bench, describe } from 'vitest';
import { SplitMix64 } from '../src/core/seededRandom';
import { analyseWeighting } from '../src/core/weightingAnalysis';
import { prepareWeighting } from '../src/core/weightingPreparation';
import { runBootstrapChunk } from '../src/core/weightingBootstrap';
import type { WeightingInput } from '../src/core/weightingInput';

function generated(n: number, seed: number): WeightingInput {
  const g = new SplitMix64(seed);
  const normal = () => Math.sqrt(-2 * Math.log(1 - g.nextDouble())) * Math.cos(2 * Math.PI * g.nextDouble());
  const cols = [[], [], [], [], []] as number[][];
  const treatment: number[] = [];
  const outcome: number[] = [];
  for (let i = 0; i < n; i++) {
    const x = [normal(), normal(), normal(), g.nextDouble() < 0.3 ? 1 : 0, g.nextDouble() < 0.6 ? 1 : 0];
    x.forEach((v, k) => cols[k].push(v));
    const eta = 0.4 * x[0] - 0.3 * x[1] + 0.2 * x[2] + 0.5 * x[3] - 0.4 * x[4];
    const t = g.nextDouble() < 1 / (1 + Math.exp(-eta)) ? 1 : 0;
    treatment.push(t);
    outcome.push(0.3 * t + x[0] + 0.5 * x[1] + 0.3 * x[3] + normal());
  }
  return { treatment, outcome, covariates: cols.map((values, k) => ({ name: `x${k + 1}`, values })), estimand: 'ate', bootstrap: 200, seed: 1 };
}

const input = generated(100_000, 20261202);
const prepared = prepareWeighting(input);
const once = { iterations: 1, warmupIterations: 0, time: 0, warmupTime: 0 };

describe('weighting sensitivity, 100,000 people × 5 covariates', () => {
  bench('prepare only (validation, propensity fit, sorting)', () => void prepareWeighting(input), once);
  bench('ten bootstrap resamples (refit + bounds at the Λ values and on the tipping grid)', () => void runBootstrapChunk(prepared, { start: 0, count: 10 }), once);
  bench('whole analysis, B = 200', () => {
    const cpu = process.cpuUsage();
    const wall = performance.now();
    const result = analyseWeighting(input);
    const used = process.cpuUsage(cpu);
    console.log(
      `wall ${((performance.now() - wall) / 1000).toFixed(1)} s, CPU ${((used.user + used.system) / 1e6).toFixed(1)} s; effect ${result.estimate.effect.toFixed(4)}, tipping Λ point ${result.tippingLambdaPoint?.toFixed(4)}, interval ${result.tippingLambdaInterval?.toFixed(4)}, resamples used ${result.bootstrap.used}, iterations ${result.propensityModel.iterations}`,
    );
  }, once);
});
