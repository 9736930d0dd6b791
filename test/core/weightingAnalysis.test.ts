import { describe, expect, test } from 'vitest';
import fc from 'fast-check';
import { analyseWeighting } from '../../src/core/weightingAnalysis';
import { validateWeighting } from '../../src/core/weightingPreparation';
import type { WeightingInput } from '../../src/core/weightingInput';
import { expectClose } from '../support/expectClose';
import { fictionalInput, generatedInput, mtcarsInput, weightingReference as reference } from '../support/weightingData';

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
    expect(result.conventions.some((c) => c.id === 'trimming' && c.text.startsWith('Trimming'))).toBe(true);
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
