import { describe, expect, test } from 'vitest';
import { analyseWeighting } from '../../src/core/weightingAnalysis';
import { prepareWeighting, validateWeighting } from '../../src/core/weightingPreparation';
import { InputError } from '../../src/core/inputProblem';
import type { WeightingInput } from '../../src/core/weightingInput';
import { expectClose } from '../support/expectClose';
import { fictionalInput, weightingReference as reference } from '../support/weightingData';

describe('reference values', () => {
  test('fictional: the prepared data hold R\'s fitted propensities (rows without a missing value, in order)', () => {
    // R 4.2.2: fitted(glm(treated ~ age + site + smoker, family = binomial)) — weighting.json
    const prepared = prepareWeighting(fictionalInput('ate'));
    const e: number[] = reference.fictional.propensities;
    expect(prepared.size).toBe(e.length);
    e.forEach((v, i) => expectClose(prepared.propensities[i], v, { rel: 1e-7 }));
  });
});

describe('special values', () => {
  test('people are sorted by outcome within each group, ties by position', () => {
    const prepared = prepareWeighting({ treatment: [1, 0, 1, 0, 1, 0], outcome: [3, 2, 1, 2, 3, 0], covariates: [], estimand: 'ate', bootstrap: 0 });
    expect([...prepared.treatedOrder]).toEqual([2, 0, 4]);
    expect([...prepared.controlOrder]).toEqual([5, 1, 3]);
  });
  test('a treatment of NaN is missing: dropped and counted', () => {
    const prepared = prepareWeighting({ treatment: [1, 0, NaN, 1, 0, 1, 0], outcome: [1, 2, 3, 4, 5, 6, 7], covariates: [], estimand: 'att', bootstrap: 0 });
    expect(prepared.counts).toMatchObject({ given: 7, droppedMissing: 1, used: 6, treated: 3, control: 3 });
    expect(prepared.counts.missingByColumn).toEqual([{ column: 'treatment', count: 1 }]);
  });
  test('trimming that leaves one group empty is refused, naming the trimming rule', () => {
    const input = fictionalInput('ate', { trim: { below: 0.49, above: 0.5 } });
    const problems = validateWeighting(input);
    expect(problems.length).toBeGreaterThan(0);
    expect(problems.every((p) => p.field === 'trim')).toBe(true);
  });
});

describe('validation', () => {
  const base: WeightingInput = {
    treatment: [1, 0, 1, 0, 1, 0, 1, 0],
    outcome: [3, 1, 4, 1, 5, 9, 2, 6],
    covariates: [{ name: 'age', values: [30, 31, 45, 20, 50, 41, 33, 52] }],
    estimand: 'ate',
    bootstrap: 0,
  };
  const problems = (over: Partial<WeightingInput>) => validateWeighting({ ...base, ...over });
  test('valid input has no problems', () => {
    expect(problems({})).toEqual([]);
  });
  test('treatment not 0/1 is counted', () => {
    expect(problems({ treatment: [1, 0, 2, 0, 1, 0, 3, 0] })).toMatchObject([{ field: 'treatment', code: 'not-binary', value: 2 }]);
  });
  test('everyone treated', () => {
    expect(problems({ treatment: base.treatment.map(() => 1) })).toMatchObject([{ field: 'treatment', code: 'one-group' }]);
  });
  test('a covariate that separates the groups is named', () => {
    const p = problems({ covariates: [{ name: 'dose', values: [5, 1, 6, 2, 7, 3, 8, 4] }] });
    expect(p).toMatchObject([{ field: 'covariates[0]', code: 'separation' }]);
    expect(p[0].message).toContain('"dose"');
  });
  test('quasi-separation (ranges touch, as a dummy present only among the treated) is named', () => {
    expect(problems({ covariates: [{ name: 'rare', values: [1, 0, 0, 0, 1, 0, 0, 0] }] })).toMatchObject([{ field: 'covariates[0]', code: 'separation' }]);
  });
  test('separation by a combination of covariates is refused and the diverging covariates named', () => {
    // Invented data: treated exactly when x1 + x2 > 1, both groups on the line x1 + x2 = 1 (quasi-complete
    // separation; R 4.2.2 glm warns "fitted probabilities numerically 0 or 1 occurred" on these data)
    const x1 = [0, 1, 2, 0, 1, 2, 0, 1, 2, 0.5, 0.5, 3, -1, 1.5];
    const x2 = [0, 0, 0, 1, 1, 1, 2, 2, 2, 0.5, 0.5, -1, 3, -0.5];
    const treatment = [0, 0, 1, 1, 1, 1, 1, 1, 1, 0, 1, 1, 1, 0];
    const p = validateWeighting({ treatment, outcome: x1.map((v, i) => v - x2[i]), covariates: [{ name: 'x1', values: x1 }, { name: 'x2', values: x2 }], estimand: 'ate' });
    expect(p).toMatchObject([{ field: 'covariates', code: 'separation' }]);
    expect(p[0].message).toContain('"x1"');
    expect(p[0].message).toContain('"x2"');
  });
  test('a constant covariate and a collinear covariate are named', () => {
    expect(problems({ covariates: [...base.covariates, { name: 'one', values: base.treatment.map(() => 2) }] })).toMatchObject([{ field: 'covariates[1]', code: 'constant' }]);
    const twice = base.covariates[0].values.map((v) => 2 * v + 1);
    expect(problems({ covariates: [...base.covariates, { name: 'age2', values: twice }] })).toMatchObject([{ field: 'covariates[1]', code: 'collinear' }]);
  });
  test('Λ below 1, a bad B, seed, α and trimming rule', () => {
    expect(problems({ lambdas: [1, 0.5] })).toMatchObject([{ field: 'lambdas[1]', code: 'below-one' }]);
    expect(problems({ bootstrap: 2.5 })).toMatchObject([{ field: 'bootstrap' }]);
    expect(problems({ seed: -1 })).toMatchObject([{ field: 'seed' }]);
    expect(problems({ alpha: 1 })).toMatchObject([{ field: 'alpha' }]);
    expect(problems({ trim: { below: 0.6, above: 0.9 } })).toMatchObject([{ field: 'trim' }]);
    expect(problems({ estimand: 'atc' as never })).toMatchObject([{ field: 'estimand' }]);
  });
  test('a non-numeric outcome is counted; NaN is missing, not an error', () => {
    expect(problems({ outcome: [3, 'x', 4, 1, Infinity, 9, 2, 6] as never })).toMatchObject([{ field: 'outcome', code: 'not-numeric', value: 2 }]);
    expect(problems({ outcome: [3, NaN, 4, 1, 5, 9, 2, 6, 0, 0].slice(0, 8) })).toEqual([]);
  });
  test('too few people', () => {
    expect(problems({ treatment: [1, 0, 0], outcome: [1, 2, 3], covariates: [] })).toMatchObject([{ field: 'treatment', code: 'too-few-people' }]);
  });
  test('columns of different lengths', () => {
    expect(problems({ outcome: [1, 2] })).toMatchObject([{ field: 'outcome', code: 'length' }]);
  });
  test('analyseWeighting throws an InputError carrying the problems', () => {
    expect(() => analyseWeighting({ ...base, lambdas: [0.5] })).toThrow(InputError);
  });
});

describe('non-mutation', () => {
  test('validation leaves a frozen input unchanged', () => {
    const input = Object.freeze({
      treatment: Object.freeze([1, 0, 1, 0, 1, 0]),
      outcome: Object.freeze([1, 2, 3, 4, 5, 6]),
      covariates: Object.freeze([Object.freeze({ name: 'x', values: Object.freeze([1, 3, 2, 5, 6, 4]) })]),
      estimand: 'ate' as const,
    });
    expect(validateWeighting(input)).toEqual([]);
    expect(input.outcome).toEqual([1, 2, 3, 4, 5, 6]);
  });
});
