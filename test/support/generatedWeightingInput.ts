// Browser-safe (no file reading): used by the figure cases in Chromium and, through weightingData.ts, by Node tests.
import type { WeightingInput } from '../../src/core/weightingInput';
import { SplitMix64 } from '../../src/core/seededRandom';

/** Invented data (fictional): two covariates, confounded treatment, a clear effect of 1.5 on the outcome. */
export function generatedInput(n: number, seed: number, extra: Partial<WeightingInput> = {}): WeightingInput {
  const g = new SplitMix64(seed);
  const normal = () => Math.sqrt(-2 * Math.log(1 - g.nextDouble())) * Math.cos(2 * Math.PI * g.nextDouble());
  const x1: number[] = [];
  const x2: number[] = [];
  const treatment: number[] = [];
  const outcome: number[] = [];
  for (let i = 0; i < n; i++) {
    const a = normal();
    const b = g.nextDouble() < 0.4 ? 1 : 0;
    const t = g.nextDouble() < 1 / (1 + Math.exp(-(0.6 * a - 0.5 * b))) ? 1 : 0;
    x1.push(a);
    x2.push(b);
    treatment.push(t);
    outcome.push(1.5 * t + a + 0.5 * b + normal());
  }
  return { treatment, outcome, covariates: [{ name: 'x1', values: x1 }, { name: 'x2', values: x2 }], estimand: 'ate', ...extra };
}
