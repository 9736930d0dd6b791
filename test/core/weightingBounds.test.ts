import { describe, expect, test } from 'vitest';
import fc from 'fast-check';
import { weightingBoundTables, weightingEffectBounds } from '../../src/core/weightingBounds';
import { expectClose } from '../support/expectClose';
import { weightingReference as reference } from '../support/weightingData';
import { numeric, readColumns } from '../support/weightingData';

/** mtcars with R's fitted propensities (weighting.json): η = logit(e). */
function mtcarsTables(estimand: 'ate' | 'att') {
  const c = readColumns('weighting_mtcars.csv');
  const am = numeric(c.am);
  const mpg = numeric(c.mpg);
  const eta = reference.mtcars.propensities.map((e: number) => Math.log(e / (1 - e)));
  const order = (g: number) => am.map((t, i) => [t, i]).filter(([t]) => t === g).map(([, i]) => i).sort((a, b) => mpg[a] - mpg[b] || a - b);
  return weightingBoundTables(estimand, mpg, order(1), order(0), eta, null);
}

describe('reference values: R 4.2.2 brute force over every split (weighting.R)', () => {
  test.each(['ate', 'att'] as const)('mtcars %s: bounds from R\'s own propensities equal R\'s enumeration', (estimand) => {
    // R 4.2.2: effect_bounds() in test/reference/generators/weighting.R, weighting.json mtcars
    const ref = reference.mtcars[estimand];
    const tables = mtcarsTables(estimand);
    ref.lambdas.forEach((lambda: number, k: number) => {
      const b = weightingEffectBounds(tables, lambda);
      expectClose(b.lowerBound, ref.lower[k], { rel: 1e-9 });
      expectClose(b.upperBound, ref.upper[k], { rel: 1e-9 });
    });
  });
});

describe('special values', () => {
  test('Λ = 1: both bounds are the Hájek estimate; ATT treated mean does not move with Λ', () => {
    const tables = mtcarsTables('att');
    const one = weightingEffectBounds(tables, 1);
    expect(one.lowerBound).toBe(one.upperBound);
    const five = weightingEffectBounds(tables, 5);
    expect(five.treatedLower).toBe(one.treatedLower);
    expect(five.treatedUpper).toBe(one.treatedLower);
  });
  test('a multiplicity of 0 leaves a person out, and 2 counts them twice', () => {
    const y = [1, 2, 3, 4];
    const eta = [0, 0.5, -0.5, 1];
    const withCounts = weightingBoundTables('ate', y, [0, 1], [2, 3], eta, [2, 0, 1, 1]);
    const expanded = weightingBoundTables('ate', [1, 1, 3, 4], [0, 1], [2, 3], [0, 0, -0.5, 1], null);
    expect(weightingEffectBounds(withCounts, 2)).toEqual(weightingEffectBounds(expanded, 2));
  });
});

describe('invariants', () => {
  test('the Hájek estimate lies within the bounds at every Λ, and shifting all outcomes shifts nothing', () => {
    fc.assert(
      fc.property(
        fc.array(fc.record({ y: fc.double({ min: -50, max: 50, noNaN: true }), eta: fc.double({ min: -4, max: 4, noNaN: true }) }), { minLength: 4, maxLength: 25 }),
        fc.double({ min: 1, max: 10, noNaN: true }),
        fc.double({ min: -100, max: 100, noNaN: true }),
        fc.constantFrom('ate' as const, 'att' as const),
        (people, lambda, shift, estimand) => {
          const y = people.map((p) => p.y);
          const eta = people.map((p) => p.eta);
          const idx = people.map((_, i) => i);
          const treated = idx.filter((i) => i % 2 === 0).sort((a, b) => y[a] - y[b]);
          const control = idx.filter((i) => i % 2 === 1).sort((a, b) => y[a] - y[b]);
          const tables = weightingBoundTables(estimand, y, treated, control, eta, null);
          const at1 = weightingEffectBounds(tables, 1).lowerBound;
          const b = weightingEffectBounds(tables, lambda);
          const tol = 1e-9 * 100;
          expect(b.lowerBound).toBeLessThanOrEqual(at1 + tol);
          expect(b.upperBound).toBeGreaterThanOrEqual(at1 - tol);
          const shifted = weightingEffectBounds(weightingBoundTables(estimand, y.map((v) => v + shift), treated, control, eta, null), lambda);
          expectClose(shifted.lowerBound, b.lowerBound, { abs: 1e-8 * (100 + Math.abs(shift)) });
          expectClose(shifted.upperBound, b.upperBound, { abs: 1e-8 * (100 + Math.abs(shift)) });
        },
      ),
      { numRuns: 200 },
    );
  });
});

describe('non-mutation', () => {
  test('frozen inputs are only read', () => {
    const f = <T>(a: T[]) => Object.freeze(a);
    expect(() => weightingEffectBounds(weightingBoundTables('ate', f([1, 2, 3, 4]), f([0, 1]), f([2, 3]), f([0, 0, 0, 0]), null), 2)).not.toThrow();
  });
});
