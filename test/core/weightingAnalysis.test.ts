import { describe, expect, test } from 'vitest';
import fc from 'fast-check';
import { analyseWeighting, finishWeighting } from '../../src/core/weightingAnalysis';
import { prepareWeighting, validateWeighting } from '../../src/core/weightingPreparation';
import { runBootstrapChunk } from '../../src/core/weightingBootstrap';
import { dummyCode } from '../../src/core/dummyCode';
import { InputError } from '../../src/core/inputProblem';
import { SplitMix64 } from '../../src/core/seededRandom';
import type { WeightingInput } from '../../src/core/weightingInput';
import { expectClose } from '../support/expectClose';
import { readReferenceJson, readReferenceText } from '../support/reference';

const reference = readReferenceJson('weighting.json');

/** Reads a plain comma-separated fixture (no quoting); empty cells become null. */
function readColumns(name: string): Record<string, (string | null)[]> {
  const [header, ...lines] = readReferenceText(name).trim().split('\n');
  const names = header.split(',');
  const out: Record<string, (string | null)[]> = Object.fromEntries(names.map((n) => [n, []]));
  for (const line of lines) line.split(',').forEach((cell, k) => out[names[k]].push(cell === '' ? null : cell));
  return out;
}
const numeric = (values: (string | null)[]) => values.map((v) => (v === null ? NaN : Number(v)));

function mtcarsInput(estimand: 'ate' | 'att', extra: Partial<WeightingInput> = {}): WeightingInput {
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

function fictionalInput(estimand: 'ate' | 'att', extra: Partial<WeightingInput> = {}): WeightingInput {
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
function generatedInput(n: number, seed: number, extra: Partial<WeightingInput> = {}): WeightingInput {
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

const cases = [
  ['mtcars', mtcarsInput],
  ['fictional', fictionalInput],
] as const;

describe('reference values: R 4.2.2 glm and brute-force bounds (test/reference/generators/weighting.R)', () => {
  test.each(cases)('%s: the propensity model equals R glm(…, family = binomial)', (name, make) => {
    // R 4.2.2: glm coefficients, iterations (fit$iter), deviance — weighting.json
    const ref = reference[name];
    const result = analyseWeighting(make('ate'));
    expect(result.propensityModel.coefficients.map((c) => c.name)).toEqual(['(intercept)', ...ref.covariates]);
    result.propensityModel.coefficients.forEach((c, k) => expectClose(c.value, ref.coefficients[k], { rel: 1e-6 }, c.name));
    expect(result.propensityModel.iterations).toBe(ref.iterations);
    expect(result.propensityModel.converged).toBe(true);
    expectClose(result.propensityModel.deviance, ref.deviance, { rel: 1e-9 });
    expect(result.counts.used).toBe(ref.n);
  });

  test.each(cases.flatMap(([name, make]) => (['ate', 'att'] as const).map((estimand) => [name, estimand, make] as const)))(
    '%s %s: the estimate at Λ = 1 is R\'s Hájek estimate and the point bounds equal R\'s brute force',
    (name, estimand, make) => {
      // R 4.2.2: Hájek means from glm fitted values; bounds by enumeration of every split — weighting.json
      const ref = reference[name][estimand];
      const result = analyseWeighting(make(estimand));
      expectClose(result.estimate.treatedMean, ref.treated_mean, { rel: 1e-8 });
      expectClose(result.estimate.controlMean, ref.control_mean, { rel: 1e-8 });
      expectClose(result.estimate.effect, ref.effect, { rel: 1e-7 });
      result.rows.forEach((row, k) => {
        expect(row.lambda).toBe(ref.lambdas[k]);
        expectClose(row.lowerBound, ref.lower[k], { rel: 1e-6 }, `lower at Λ = ${row.lambda}`);
        expectClose(row.upperBound, ref.upper[k], { rel: 1e-6 }, `upper at Λ = ${row.lambda}`);
        expect(row.intervalLower).toBeNull();
        expect(row.intervalUpper).toBeNull();
      });
      // R 4.2.2: uniroot (tol 1e-12) on the bound nearer zero; null = still excludes 0 at Λ = 100
      if (ref.tipping_lambda_point === null) {
        expect(result.tippingPointStatus).toBe('beyond-range');
        expect(result.tippingLambdaPoint).toBeNull();
      } else {
        expect(result.tippingPointStatus).toBe('found');
        expectClose(result.tippingLambdaPoint!, ref.tipping_lambda_point, { rel: 1e-5 });
      }
      expect(result.tippingIntervalStatus).toBe('not-available');
      expect(result.tippingLambdaInterval).toBeNull();
    },
  );

  test('fictional: people with a missing value are dropped and counted by column', () => {
    // weighting.R sets age[7], site[20] and outcome[33] to NA: three people dropped, 147 used
    const result = analyseWeighting(fictionalInput('ate'));
    expect(result.counts.given).toBe(150);
    expect(result.counts.droppedMissing).toBe(3);
    expect(result.counts.used).toBe(147);
    expect(Object.fromEntries(result.counts.missingByColumn.map((m) => [m.column, m.count]))).toEqual({ outcome: 1, age: 1, 'site=north': 1, 'site=west': 1 });
    expect(result.warnings.some((w) => w.includes('3 of 150 people were left out'))).toBe(true);
  });

  test('mtcars: propensities below 0.01 or above 0.99 are counted and warned about', () => {
    // R 4.2.2 fitted values (weighting.json): 11 below 0.01, 5 above 0.99 — thresholds common practice, no source
    const e: number[] = reference.mtcars.propensities;
    const result = analyseWeighting(mtcarsInput('ate'));
    expect(result.overlap.belowLow).toBe(e.filter((v) => v < 0.01).length);
    expect(result.overlap.aboveHigh).toBe(e.filter((v) => v > 0.99).length);
    expect(result.warnings.some((w) => w.includes('below 0.01'))).toBe(true);
    const binTotal = result.overlap.bins.reduce((s, b) => s + b.treated + b.control, 0);
    expect(binTotal).toBe(32);
  });
});

describe('bootstrap contract', () => {
  const input = generatedInput(300, 11, { bootstrap: 60, seed: 7, lambdas: [1, 1.2, 1.5, 2] });
  const whole = analyseWeighting(input);

  test('a fixed seed reproduces the result exactly', () => {
    expect(analyseWeighting(input)).toEqual(whole);
  });
  test('splitting the resamples into chunks, in any order, gives identical results', () => {
    const prepared = prepareWeighting(input);
    const chunks = [runBootstrapChunk(prepared, { start: 41, count: 19 }), runBootstrapChunk(prepared, { start: 0, count: 17 }), runBootstrapChunk(prepared, { start: 17, count: 24 })];
    expect(finishWeighting(prepared, chunks)).toEqual(whole);
  });
  test('a cancelled chunk returns the finished resamples and the rest can be computed later', () => {
    const prepared = prepareWeighting(input);
    let asked = 0;
    const first = runBootstrapChunk(prepared, { start: 0, count: 60 }, { isCancelled: () => asked++ >= 25 });
    expect(first.count).toBe(25);
    const rest = runBootstrapChunk(prepared, { start: 25, count: 35 });
    expect(finishWeighting(prepared, [first, rest])).toEqual(whole);
  });
  test('progress is reported after each resample', () => {
    const prepared = prepareWeighting(input);
    const seen: number[] = [];
    runBootstrapChunk(prepared, { start: 3, count: 4 }, { onProgress: (done) => seen.push(done) });
    expect(seen).toEqual([1, 2, 3, 4]);
  });
  test('another seed gives another interval', () => {
    const other = analyseWeighting({ ...input, seed: 8 });
    expect(other.rows[1].intervalLower).not.toBe(whole.rows[1].intervalLower);
  });
  test('the interval contains the point bounds and widens with Λ', () => {
    let previous = { lower: Infinity, upper: -Infinity };
    for (const row of whole.rows) {
      expect(row.intervalLower!).toBeLessThanOrEqual(row.lowerBound);
      expect(row.intervalUpper!).toBeGreaterThanOrEqual(row.upperBound);
      expect(row.intervalLower!).toBeLessThanOrEqual(previous.lower);
      expect(row.intervalUpper!).toBeGreaterThanOrEqual(previous.upper);
      previous = { lower: row.intervalLower!, upper: row.intervalUpper! };
    }
    expect(whole.bootstrap).toMatchObject({ requested: 60, seed: 7, stratified: true });
    expect(whole.bootstrap.used + whole.bootstrap.failed).toBe(60);
  });
  test('the interval tipping Λ is where the interval at Λ first includes 0', () => {
    expect(whole.tippingIntervalStatus).toBe('found');
    const tip = whole.tippingLambdaInterval!;
    expect(tip).toBeLessThanOrEqual(whole.tippingLambdaPoint!);
    const check = analyseWeighting({ ...input, lambdas: [tip / 1.01, tip * 1.01] });
    const [before, after] = check.rows;
    expect(before.intervalLower! > 0 || before.intervalUpper! < 0).toBe(true);
    expect(after.intervalLower! <= 0 && after.intervalUpper! >= 0).toBe(true);
  });
  test('B = 0 gives point bounds only', () => {
    const result = analyseWeighting({ ...input, bootstrap: 0 });
    expect(result.rows.every((r) => r.intervalLower === null && r.intervalUpper === null)).toBe(true);
    expect(result.rows.map((r) => r.lowerBound)).toEqual(whole.rows.map((r) => r.lowerBound));
    expect(result.bootstrap).toMatchObject({ requested: 0, used: 0, failed: 0 });
  });
  test('chunks that leave out or repeat a resample are refused', () => {
    const prepared = prepareWeighting(input);
    const a = runBootstrapChunk(prepared, { start: 0, count: 30 });
    expect(() => finishWeighting(prepared, [a])).toThrow(RangeError);
    expect(() => finishWeighting(prepared, [a, a, runBootstrapChunk(prepared, { start: 30, count: 30 })])).toThrow(RangeError);
    expect(() => runBootstrapChunk(prepared, { start: 50, count: 11 })).toThrow(RangeError);
  });
});

describe('special values', () => {
  test('an effect of exactly 0 includes no effect at Λ = 1', () => {
    const result = analyseWeighting({ treatment: [1, 1, 0, 0, 1, 0], outcome: [1, 2, 1, 2, 3, 3], covariates: [], estimand: 'ate', bootstrap: 0 });
    expect(result.estimate.effect).toBe(0);
    expect(result.tippingLambdaPoint).toBe(1);
    expect(result.tippingPointStatus).toBe('includes-zero-at-one');
  });
  test('no covariates: the weights are constant and the estimate is the difference in means', () => {
    const result = analyseWeighting({ treatment: [1, 1, 1, 0, 0, 0], outcome: [5, 6, 7, 1, 2, 3], covariates: [], estimand: 'att', bootstrap: 0 });
    expectClose(result.estimate.effect, 4);
    expectClose(result.propensityModel.coefficients[0].value, 0, { abs: 1e-12 });
  });
  test('trimming drops and counts people outside the rule and refits', () => {
    const result = analyseWeighting(mtcarsInput('ate', { trim: { below: 0.01, above: 0.99 } }));
    expect(result.counts.trimmedBelow + result.counts.trimmedAbove).toBeGreaterThan(0);
    expect(result.counts.used).toBe(32 - result.counts.trimmedBelow - result.counts.trimmedAbove);
    expect(result.conventions.some((c) => c.startsWith('Trimming'))).toBe(true);
  });
  test('the result never shows NaN or infinity', () => {
    const result = analyseWeighting(fictionalInput('att', { bootstrap: 20 }));
    const text = JSON.stringify(result);
    expect(text).not.toMatch(/NaN|Infinity|undefined/);
    expect(JSON.stringify(result, (_k, v) => (typeof v === 'number' && !Number.isFinite(v) ? 'BAD' : v))).not.toContain('BAD');
  });
});

describe('invariants', () => {
  test('point bounds contain the estimate and widen with Λ (random fictional data)', () => {
    fc.assert(
      fc.property(
        fc.array(fc.record({ x: fc.double({ min: -2, max: 2, noNaN: true }), y: fc.double({ min: -10, max: 10, noNaN: true }), u: fc.double({ min: 0, max: 1, noNaN: true }) }), { minLength: 12, maxLength: 40 }),
        fc.constantFrom('ate' as const, 'att' as const),
        (people, estimand) => {
          const treatment = people.map((p, i) => (i < 3 ? 1 : i < 6 ? 0 : p.u < 1 / (1 + Math.exp(-p.x)) ? 1 : 0));
          const x = people.map((p, i) => (i === 0 || i === 4 ? 3 : i === 1 || i === 3 ? -3 : p.x));
          const input: WeightingInput = { treatment, outcome: people.map((p) => p.y), covariates: [{ name: 'x', values: x }], estimand, lambdas: [1, 1.5, 3], bootstrap: 0 };
          if (validateWeighting(input).length > 0) return;
          const r = analyseWeighting(input);
          const tol = 1e-9 * 10;
          expectClose(r.rows[0].lowerBound, r.estimate.effect, { abs: tol });
          expectClose(r.rows[0].upperBound, r.estimate.effect, { abs: tol });
          for (let k = 1; k < r.rows.length; k++) {
            expect(r.rows[k].lowerBound).toBeLessThanOrEqual(r.rows[k - 1].lowerBound + tol);
            expect(r.rows[k].upperBound).toBeGreaterThanOrEqual(r.rows[k - 1].upperBound - tol);
          }
        },
      ),
      { numRuns: 60 },
    );
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
  test('frozen input is accepted and left unchanged; the result is frozen', () => {
    const input = fictionalInput('ate', { bootstrap: 5 });
    const frozen = Object.freeze({
      ...input,
      treatment: Object.freeze([...input.treatment]),
      outcome: Object.freeze([...input.outcome]),
      covariates: Object.freeze(input.covariates.map((c) => Object.freeze({ name: c.name, values: Object.freeze([...c.values]) }))),
      lambdas: Object.freeze([...input.lambdas!]),
    });
    const copy = JSON.stringify(frozen);
    const result = analyseWeighting(frozen);
    expect(JSON.stringify(frozen)).toBe(copy);
    expect(Object.isFrozen(result)).toBe(true);
    expect(Object.isFrozen(result.rows[0])).toBe(true);
    expect(Object.isFrozen(result.overlap.bins)).toBe(true);
  });
});
