import type { WeightingInput } from '../../src/core/weightingInput';
import { dummyCode } from '../../src/core/dummyCode';
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

export { generatedInput } from './generatedWeightingInput';

