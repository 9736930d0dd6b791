import type { WeightingInput } from '../../src/core/weightingInput';
import { dummyCode } from '../../src/core/dummyCode';
import { SplitMix64 } from '../../src/core/seededRandom';
import { readReferenceJson, readReferenceText } from './reference';

/** R 4.2.2 reference values (test/reference/generators/weighting.R). */
export const weightingReference = readReferenceJson('weighting.json');
const reference = weightingReference;

/** Reads a plain comma-separated fixture (no quoting); empty cells become null. */
export function readColumns(name: string): Record<string, (string | null)[]> {
  const [header, ...lines] = readReferenceText(name).trim().split('\n');
  const names = header.split(',');
  const out: Record<string, (string | null)[]> = Object.fromEntries(names.map((n) => [n, []]));
  for (const line of lines) line.split(',').forEach((cell, k) => out[names[k]].push(cell === '' ? null : cell));
  return out;
}
export const numeric = (values: (string | null)[]) => values.map((v) => (v === null ? NaN : Number(v)));

export function mtcarsInput(estimand: 'ate' | 'att', extra: Partial<WeightingInput> = {}): WeightingInput {
  const c = readColumns('weighting_mtcars.csv');
  return {
    treatment: numeric(c.am),
    outcome: numeric(c.mpg),
    covariates: [
      { name: 'hp', values: numeric(c.hp) },
      { name: 'wt', values: numeric(c.wt) },
    ],
    estimand,
    lambdas: reference.mtcars.ate.lambdas,
    bootstrap: 0,
    ...extra,
  };
}

export function fictionalInput(estimand: 'ate' | 'att', extra: Partial<WeightingInput> = {}): WeightingInput {
  const c = readColumns('weighting_fictional.csv');
  const coded = dummyCode([
    { name: 'age', values: numeric(c.age) },
    { name: 'site', values: c.site },
    { name: 'smoker', values: numeric(c.smoker) },
  ]);
  return {
    treatment: numeric(c.treated),
    outcome: numeric(c.outcome),
    covariates: coded.columns.map((col) => ({ name: col.name, values: [...col.values] })),
    estimand,
    lambdas: reference.fictional.ate.lambdas,
    bootstrap: 0,
    ...extra,
  };
}

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

