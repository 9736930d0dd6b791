import { describe, expect, test } from 'vitest';
import fc from 'fast-check';
import { logisticStandardErrors } from '../../src/core/logisticStandardErrors';
import { prepareWeighting } from '../../src/core/weightingPreparation';
import { expectClose } from '../support/expectClose';
import { readReferenceJson } from '../support/reference';
import { fictionalInput, mtcarsInput } from '../support/weightingData';

/** R 4.2.2: summary(glm(..., family = binomial)) standard errors — generators/logistic_standard_errors.R. */
const reference = readReferenceJson('logistic_standard_errors.json');

describe('reference values', () => {
  test('mtcars am ~ hp + wt: standard errors equal R\'s summary.glm', () => {
    const prepared = prepareWeighting(mtcarsInput('ate'));
    const se = logisticStandardErrors(prepared.design, prepared.columnCount, prepared.propensities);
    reference.mtcars.standard_errors.forEach((v: number, k: number) => expectClose(se[k]!, v, { rel: 1e-6 }, prepared.columnNames[k]));
  });
  test('fictional data with a dummy-coded site: standard errors equal R\'s summary.glm', () => {
    const prepared = prepareWeighting(fictionalInput('ate'));
    expect(prepared.columnNames.slice(1)).toEqual(reference.fictional.columns.slice(1));
    const se = logisticStandardErrors(prepared.design, prepared.columnCount, prepared.propensities);
    reference.fictional.standard_errors.forEach((v: number, k: number) => expectClose(se[k]!, v, { rel: 1e-6 }, prepared.columnNames[k]));
  });
});

describe('special values', () => {
  test('an intercept-only model: SE = 1/√(n·e(1 − e)) (closed form)', () => {
    const n = 10;
    const e = 0.3;
    const se = logisticStandardErrors(new Float64Array(n).fill(1), 1, new Float64Array(n).fill(e));
    expectClose(se[0]!, 1 / Math.sqrt(n * e * (1 - e)), { rel: 1e-12 });
  });
  test('a singular information matrix gives null for every coefficient', () => {
    const design = Float64Array.from([1, 0, 1, 0, 1, 0]);
    expect(logisticStandardErrors(design, 2, Float64Array.from([0.5, 0.5, 0.5]))).toEqual([null, null]);
  });
  test('frequency weights count a row that many times', () => {
    const design = Float64Array.from([1, 1, 1, 2, 1, 3]);
    const e = Float64Array.from([0.2, 0.5, 0.7]);
    const weighted = logisticStandardErrors(design, 2, e, Float64Array.from([2, 1, 3]));
    const repeated = logisticStandardErrors(Float64Array.from([1, 1, 1, 1, 1, 2, 1, 3, 1, 3, 1, 3]), 2, Float64Array.from([0.2, 0.2, 0.5, 0.7, 0.7, 0.7]));
    weighted.forEach((v, k) => expectClose(v!, repeated[k]!, { rel: 1e-12 }));
  });
});

describe('invariants', () => {
  test('doubling every row divides the standard errors by √2', () => {
    fc.assert(
      fc.property(fc.array(fc.tuple(fc.double({ min: -3, max: 3, noNaN: true }), fc.double({ min: 0.05, max: 0.95, noNaN: true })), { minLength: 3, maxLength: 20 }), (rows) => {
        const xs = rows.map((r) => r[0]);
        if (Math.max(...xs) - Math.min(...xs) < 0.1) return;
        const design = Float64Array.from(rows.flatMap(([x]) => [1, x]));
        const e = Float64Array.from(rows.map((r) => r[1]));
        const once = logisticStandardErrors(design, 2, e);
        const twice = logisticStandardErrors(design, 2, e, new Float64Array(rows.length).fill(2));
        once.forEach((v, k) => expectClose(twice[k]!, v! / Math.SQRT2, { rel: 1e-6 }));
      }),
    );
  });
});

describe('validation', () => {
  test('a design whose size does not match the rows is refused', () => {
    expect(() => logisticStandardErrors(new Float64Array(5), 2, new Float64Array(3))).toThrow(RangeError);
  });
});

describe('non-mutation', () => {
  test('the inputs are left unchanged', () => {
    const design = Float64Array.from([1, 1, 1, 2, 1, 3]);
    const e = Float64Array.from([0.2, 0.5, 0.7]);
    logisticStandardErrors(design, 2, e);
    expect([...design]).toEqual([1, 1, 1, 2, 1, 3]);
    expect([...e]).toEqual([0.2, 0.5, 0.7]);
  });
});
