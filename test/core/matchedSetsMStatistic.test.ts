import { describe, expect, test } from 'vitest';
import fc from 'fast-check';
import { huberPsi, matchedSetsMStatistic, mStatisticScale, mStatisticUpperP } from '../../src/core/matchedSetsMStatistic';
import { groupMatchedSets, type MatchedSetsLayout } from '../../src/core/matchedSetsGrouping';
import { upperNormalTail } from '../../src/core/upperNormalTail';
import { expectClose } from '../support/expectClose';
import { readReferenceJson } from '../support/reference';

const reference = readReferenceJson('matched_sets.json');

/** Sets given as [treated, ...controls]. */
function layoutOf(sets: number[][]): MatchedSetsLayout {
  const setIds: string[] = [];
  const treated: number[] = [];
  const outcomes: number[] = [];
  sets.forEach((set, s) =>
    set.forEach((y, i) => {
      setIds.push(`s${String(s).padStart(3, '0')}`);
      treated.push(i === 0 ? 1 : 0);
      outcomes.push(y);
    }),
  );
  return groupMatchedSets({ setIds, treated, outcomes }).layout;
}

describe('reference values', () => {
  test.each(reference.continuous.filter((d: any) => d.alternative === 'greater').map((d: any) => [d.name, d]) as [string, any][])(
    '%s: σ, T and the bounds at each Γ agree with R',
    (_name, ds: any) => {
      // R 4.2.2 base, matched_sets.R (plain loops)
      const layout = groupMatchedSets(ds).layout;
      const sigma = mStatisticScale(layout);
      expectClose(sigma, ds.sigma, { rel: 1e-15 });
      const m = matchedSetsMStatistic(layout, sigma, reference.trim);
      for (const row of ds.rows) {
        const b = m.at(0, row.gamma);
        expectClose(b.statistic, ds.statistic, { rel: 1e-12 });
        expectClose(b.upperExpectation, row.expectation, { rel: 1e-9, abs: 1e-13 });
        expectClose(b.upperVariance, row.variance, { rel: 1e-12 });
        expectClose(mStatisticUpperP(b), row.p_upper, { rel: 1e-9 });
        expectClose(mStatisticUpperP(b, 'lower'), row.p_lower, { rel: 1e-9 });
      }
    },
  );

  test('one control per set: the pair formula E = Σ|ψ|(Γ − 1)/(Γ + 1), V = Σψ²·4Γ/(1 + Γ)²', () => {
    // R 4.2.2 base, matched_sets.R pair_case (the pair-matched formula written directly)
    const layout = groupMatchedSets(reference.pairs).layout;
    const m = matchedSetsMStatistic(layout, mStatisticScale(layout), 2.5);
    for (const row of reference.pairs.rows) {
      const b = m.at(0, row.gamma);
      expectClose(b.upperExpectation, row.expectation, { rel: 1e-12, abs: 1e-14 });
      expectClose(b.upperVariance, row.variance, { rel: 1e-12 });
      expectClose(mStatisticUpperP(b), row.p_upper, { rel: 1e-10 });
    }
  });
});

describe('special values', () => {
  test('ψ clips at ±c, is odd, and passes NaN', () => {
    expect(huberPsi(3, 2.5)).toBe(2.5);
    expect(huberPsi(-3, 2.5)).toBe(-2.5);
    expect(huberPsi(1.25, 2.5)).toBe(1.25);
    expect(huberPsi(Infinity, 2.5)).toBe(2.5);
    expect(huberPsi(-Infinity, 2.5)).toBe(-2.5);
    expect(huberPsi(NaN, 2.5)).toBeNaN();
    expect(Object.is(huberPsi(-0, 2.5), -0)).toBe(true);
  });

  test('σ is the median absolute treated-minus-control difference (odd and even counts, as R’s median)', () => {
    // differences |5−1|, |5−2|, |3−2| = 4, 3, 1 → median 3; adding a set with difference 6 → (3 + 4)/2
    expect(mStatisticScale(layoutOf([[5, 1, 2], [3, 2]]))).toBe(3);
    expect(mStatisticScale(layoutOf([[5, 1, 2], [3, 2], [0, 6]]))).toBe(3.5);
    expect(mStatisticScale(layoutOf([]))).toBeNaN();
  });

  test('Γ = 1: both bounds are 0 per set (scores sum to 0) and the variance is the permutation variance Σq²/n', () => {
    // one set 1:2 with outcomes 4, 1, 2 and σ = 1, c = 2.5: scores (ψ(3) + ψ(2))/2 = 2.25, (ψ(−3) + ψ(−1))/2 = −1.75,
    // (ψ(−2) + ψ(1))/2 = −0.5 — worked by hand
    const m = matchedSetsMStatistic(layoutOf([[4, 1, 2]]), 1, 2.5);
    const b = m.at(0, 1);
    expect(b.statistic).toBe(2.25);
    expectClose(b.upperExpectation, 0, { abs: 1e-15 });
    expectClose(b.lowerExpectation, 0, { abs: 1e-15 });
    const permutation = (2.25 ** 2 + 1.75 ** 2 + 0.5 ** 2) / 3;
    expectClose(b.upperVariance, permutation, { rel: 1e-15 });
    expectClose(b.lowerVariance, permutation, { rel: 1e-15 });
  });

  test('Γ = 3 on that set: the split with weight Γ on the top score wins (worked by hand)', () => {
    // sorted scores −1.75, −0.5, 2.25; a = 1: (−1.75 + 3(1.75))/7 = 0.5; a = 2: (−2.25 + 6.75)/5 = 0.9 → 0.9
    const b = matchedSetsMStatistic(layoutOf([[4, 1, 2]]), 1, 2.5).at(0, 3);
    expectClose(b.upperExpectation, 0.9, { rel: 1e-15 });
    // variance at a = 2: (2.65² + 1.4² + 3·1.35²)/5
    expectClose(b.upperVariance, (2.65 ** 2 + 1.4 ** 2 + 3 * 1.35 ** 2) / 5, { rel: 1e-14 });
    // lower: weight Γ on the a smallest; a = 1: (3(−1.75) + 1.75)/5 = −0.7; a = 2: (3(−2.25) + 2.25)/7 = −0.642857 → −0.7
    expectClose(b.lowerExpectation, -0.7, { rel: 1e-15 });
  });

  test('a set whose outcomes are all equal adds nothing', () => {
    const alone = matchedSetsMStatistic(layoutOf([[4, 1, 2]]), 1, 2.5).at(0, 2);
    const withFlat = matchedSetsMStatistic(layoutOf([[4, 1, 2], [7, 7, 7, 7]]), 1, 2.5).at(0, 2);
    expect(withFlat).toEqual(alone);
  });

  test('zero variance gives p = 1 at or below the expectation, else 0', () => {
    expect(mStatisticUpperP({ statistic: 0, upperExpectation: 0, upperVariance: 0, lowerExpectation: 0, lowerVariance: 0 })).toBe(1);
    expect(mStatisticUpperP({ statistic: 1, upperExpectation: 0, upperVariance: 0, lowerExpectation: 0, lowerVariance: 0 })).toBe(0);
    expect(mStatisticUpperP({ statistic: 3, upperExpectation: 1, upperVariance: 4, lowerExpectation: 0, lowerVariance: 1 })).toBe(upperNormalTail(1));
    expect(mStatisticUpperP({ statistic: 3, upperExpectation: 1, upperVariance: 4, lowerExpectation: 0, lowerVariance: 1 }, 'lower')).toBe(upperNormalTail(3));
  });
});

describe('invariants', () => {
  const sets = fc.array(fc.array(fc.double({ min: -50, max: 50, noNaN: true }), { minLength: 2, maxLength: 6 }), { minLength: 1, maxLength: 6 });

  test('lower expectation ≤ T’s Γ = 1 mean ≤ upper expectation, widening with Γ', () => {
    fc.assert(
      fc.property(sets, fc.double({ min: -20, max: 20, noNaN: true }), (s, shift) => {
        const m = matchedSetsMStatistic(layoutOf(s), 3, 2.5);
        let last = m.at(shift, 1);
        for (const gamma of [1.2, 2, 5, 50]) {
          const b = m.at(shift, gamma);
          expect(b.upperExpectation).toBeGreaterThanOrEqual(last.upperExpectation - 1e-12);
          expect(b.lowerExpectation).toBeLessThanOrEqual(last.lowerExpectation + 1e-12);
          expect(b.upperVariance).toBeGreaterThanOrEqual(0);
          last = b;
        }
      }),
    );
  });

  test('T falls as the hypothesised effect grows, and T − E_upper does too', () => {
    fc.assert(
      fc.property(sets, fc.double({ min: -20, max: 20, noNaN: true }), fc.double({ min: 0, max: 5, noNaN: true }), (s, tau, step) => {
        const m = matchedSetsMStatistic(layoutOf(s), 2, 2.5);
        const a = m.at(tau, 2);
        const b = m.at(tau + step, 2);
        expect(b.statistic).toBeLessThanOrEqual(a.statistic + 1e-12);
        expect(b.statistic - b.upperExpectation).toBeLessThanOrEqual(a.statistic - a.upperExpectation + 1e-12);
      }),
    );
  });

  test('the upper bound with negated outcomes is the negated lower bound', () => {
    fc.assert(
      fc.property(sets, fc.double({ min: 1, max: 10, noNaN: true }), (s, gamma) => {
        const m = matchedSetsMStatistic(layoutOf(s), 2, 2.5).at(0, gamma);
        const n = matchedSetsMStatistic(layoutOf(s.map((set) => set.map((y) => -y))), 2, 2.5).at(0, gamma);
        // splits whose means tie within 1e-12·c may be chosen differently after negation (rounding)
        expectClose(n.upperExpectation, -m.lowerExpectation, { rel: 1e-12, abs: 1e-11 });
        expectClose(n.upperVariance, m.lowerVariance, { rel: 1e-10, abs: 1e-9 });
      }),
    );
  });
});

describe('non-mutation', () => {
  test('the layout is left unchanged', () => {
    const layout = layoutOf([[4, 1, 2], [3, 0]]);
    const before = Array.from(layout.values);
    matchedSetsMStatistic(layout, 1, 2.5).at(1, 2);
    expect(Array.from(layout.values)).toEqual(before);
  });
});
