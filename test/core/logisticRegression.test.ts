import { describe, expect, test } from 'vitest';
import fc from 'fast-check';
import { fitLogisticRegression, logisticProbabilities } from '../../src/core/logisticRegression';
import { expectClose } from '../support/expectClose';
import { numeric, readColumns, weightingReference as reference } from '../support/weightingData';

function mtcarsDesign() {
  const c = readColumns('weighting_mtcars.csv');
  const hp = numeric(c.hp);
  const wt = numeric(c.wt);
  const design = new Float64Array(32 * 3);
  hp.forEach((v, i) => design.set([1, v, wt[i]], i * 3));
  return { design, am: numeric(c.am) };
}

describe('reference values: R 4.2.2 glm(…, family = binomial)', () => {
  test('mtcars am ~ hp + wt: coefficients, iterations and deviance equal R', () => {
    // R 4.2.2: glm(am ~ hp + wt, family = binomial, data = mtcars) — weighting.json "mtcars"
    const { design, am } = mtcarsDesign();
    const fit = fitLogisticRegression(design, 3, am);
    const ref = reference.mtcars;
    [...fit.coefficients].forEach((b, k) => expectClose(b, ref.coefficients[k], { rel: 1e-7 }));
    expect(fit.iterations).toBe(ref.iterations);
    expect(fit.converged).toBe(true);
    expect(fit.fittedAtBoundary).toBe(false);
    expectClose(fit.deviance, ref.deviance, { rel: 1e-10 });
    const e = logisticProbabilities(design, 3, fit.coefficients);
    ref.propensities.forEach((v: number, i: number) => expectClose(e[i], v, { rel: 1e-6 }));
  });
  test('frequency weights (some 0) equal R\'s prior weights', () => {
    // R 4.2.2: glm(am ~ hp + wt, family = binomial, weights = c(0, 0, rep(c(1, 2, 3), 10))) — weighting.json "logistic"
    const { design, am } = mtcarsDesign();
    const ref = reference.logistic.weighted_mtcars;
    const fit = fitLogisticRegression(design, 3, am, { weights: ref.weights });
    [...fit.coefficients].forEach((b, k) => expectClose(b, ref.coefficients[k], { rel: 1e-7 }));
    expect(fit.iterations).toBe(ref.iterations);
    expectClose(fit.deviance, ref.deviance, { rel: 1e-10 });
  });
  test('complete separation: not converged in 25 iterations, fitted probabilities at 0 or 1, as R reports', () => {
    // R 4.2.2: glm(y ~ x, x = 1..10, y = x > 5) warns "did not converge" and "fitted probabilities numerically 0 or 1"
    const ref = reference.logistic.separated;
    const design = new Float64Array(ref.x.flatMap((v: number) => [1, v]));
    const fit = fitLogisticRegression(design, 2, ref.y);
    expect(fit.converged).toBe(ref.converged);
    expect(fit.iterations).toBe(ref.iterations);
    expect(fit.fittedAtBoundary).toBe(ref.fitted_at_boundary);
  });
});

describe('special values', () => {
  test('intercept only: the coefficient is the log odds of the proportion', () => {
    const y = [1, 1, 1, 0];
    const fit = fitLogisticRegression(new Float64Array([1, 1, 1, 1]), 1, y);
    expectClose(fit.coefficients[0], Math.log(3), { rel: 1e-10 });
  });
  test('a covariate in tiny units (1e-150) is fitted, not refused as singular', () => {
    const x = [1, 2, 3, 4, 5, 6, 7, 8].map((v) => v * 1e-150);
    const y = [0, 1, 0, 0, 1, 1, 0, 1];
    const small = fitLogisticRegression(new Float64Array(x.flatMap((v) => [1, v])), 2, y);
    const plain = fitLogisticRegression(new Float64Array(x.flatMap((v) => [1, v * 1e150])), 2, y);
    expect(small.dependentColumn).toBe(-1);
    expectClose(small.coefficients[1] * 1e-150, plain.coefficients[1], { rel: 1e-9 });
  });
  test('a column of zeros is reported as dependent, with NaN coefficients', () => {
    const design = new Float64Array([1, 0, 1, 0, 1, 0, 1, 0]);
    const fit = fitLogisticRegression(design, 2, [1, 0, 1, 0]);
    expect(fit.dependentColumn).toBe(1);
    expect(fit.coefficients[0]).toBeNaN();
  });
  test('logisticProbabilities does not overflow for huge |η|', () => {
    const e = logisticProbabilities(new Float64Array([1, 1]), 1, [800]);
    expect(e[0]).toBe(1);
    expect(logisticProbabilities(new Float64Array([1]), 1, [-800])[0]).toBe(0);
  });
});

describe('invariants', () => {
  test('weight k on a row equals k copies of the row', () => {
    fc.assert(
      fc.property(fc.array(fc.record({ x: fc.integer({ min: -3, max: 3 }), y: fc.integer({ min: 0, max: 1 }), k: fc.integer({ min: 1, max: 3 }) }), { minLength: 4, maxLength: 20 }), (rows) => {
        // Anchors with both outcomes at x = −1 and x = 1 rule out separation, so the maximum exists.
        const anchors = [-1, -1, 1, 1].map((x, i) => ({ x, y: i % 2, k: 1 }));
        const data = [...rows, ...anchors];
        const y = data.map((r) => r.y);
        const weighted = fitLogisticRegression(new Float64Array(data.flatMap((r) => [1, r.x])), 2, y, { weights: data.map((r) => r.k) });
        const copies = data.flatMap((r, i) => Array.from({ length: r.k }, () => ({ x: r.x, y: y[i] })));
        const expanded = fitLogisticRegression(new Float64Array(copies.flatMap((r) => [1, r.x])), 2, copies.map((r) => r.y));
        expect(weighted.converged && !weighted.fittedAtBoundary).toBe(true);
        expectClose(weighted.coefficients[0], expanded.coefficients[0], { abs: 1e-7 });
        expectClose(weighted.coefficients[1], expanded.coefficients[1], { abs: 1e-7 });
      }),
      { numRuns: 50 },
    );
  });
});

describe('validation', () => {
  test('a design of the wrong size is refused', () => {
    expect(() => fitLogisticRegression(new Float64Array(5), 2, [0, 1, 0])).toThrow(RangeError);
    expect(() => fitLogisticRegression(new Float64Array(6), 2, [0, 1, 0], { weights: [1, 1] })).toThrow(RangeError);
  });
});

describe('non-mutation', () => {
  test('frozen response, weights and start are read only', () => {
    const { design, am } = mtcarsDesign();
    expect(() => fitLogisticRegression(design, 3, Object.freeze(am), { weights: Object.freeze(am.map(() => 1)), start: Object.freeze([0, 0, 0]) })).not.toThrow();
  });
});
