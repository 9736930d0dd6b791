import { describe, expect, test } from 'vitest';
import fc from 'fast-check';
import { mEstimate, mEstimateBracket, mEstimateUnderBias } from '../../src/core/matchedSetsEstimate';
import { matchedSetsMStatistic, mStatisticScale } from '../../src/core/matchedSetsMStatistic';
import { groupMatchedSets, type MatchedSetsLayout } from '../../src/core/matchedSetsGrouping';
import { expectClose } from '../support/expectClose';
import { readReferenceJson } from '../support/reference';

const reference = readReferenceJson('matched_sets.json');

function setup(layout: MatchedSetsLayout, trim = 2.5) {
  const scale = mStatisticScale(layout);
  return { statistic: matchedSetsMStatistic(layout, scale, trim), bracket: mEstimateBracket(layout, scale, trim) };
}

function layoutOf(sets: number[][]): MatchedSetsLayout {
  const setIds: string[] = [];
  const treated: number[] = [];
  const outcomes: number[] = [];
  sets.forEach((set, s) => set.forEach((y, i) => (setIds.push(`s${s}`), treated.push(i === 0 ? 1 : 0), outcomes.push(y))));
  return groupMatchedSets({ setIds, treated, outcomes }).layout;
}

describe('reference values', () => {
  test.each(reference.continuous.filter((d: any) => d.alternative === 'greater').map((d: any) => [d.name, d]) as [string, any][])(
    '%s: estimate, range and interval at each Γ agree with R’s uniroot',
    (_name, ds: any) => {
      // R 4.2.2 base, matched_sets.R: uniroot(tol = 1e-13) on the same equations
      const { statistic, bracket } = setup(groupMatchedSets(ds).layout);
      expectClose(mEstimate(statistic, bracket), ds.estimate, { rel: 1e-6, abs: 1e-9 });
      for (const row of ds.rows) {
        const r = mEstimateUnderBias(statistic, bracket, row.gamma, reference.alpha);
        expectClose(r.estimateLow, row.estimate_low, { rel: 1e-6, abs: 1e-9 }, `low Γ=${row.gamma}`);
        expectClose(r.estimateHigh, row.estimate_high, { rel: 1e-6, abs: 1e-9 }, `high Γ=${row.gamma}`);
        expectClose(r.intervalLow!, row.interval_low, { rel: 1e-6, abs: 1e-9 }, `interval low Γ=${row.gamma}`);
        expectClose(r.intervalHigh!, row.interval_high, { rel: 1e-6, abs: 1e-9 }, `interval high Γ=${row.gamma}`);
      }
    },
  );
});

describe('special values', () => {
  test('pairs whose differences are symmetric about 1 give the estimate 1 (worked by hand)', () => {
    // differences 0.5, 1, 1.5, 5, −3 lie symmetrically about 1, so Σψ((d − 1)/σ) = 0 there
    const sym = setup(layoutOf([[0.5, 0], [1, 0], [1.5, 0], [5, 0], [-3, 0]]));
    expectClose(mEstimate(sym.statistic, sym.bracket), 1, { abs: 1e-12 });
  });

  test('Γ = 1: the range is a single point, the estimate', () => {
    const { statistic, bracket } = setup(layoutOf([[3, 1, 2], [5, 4], [2, 2.5, 0, 1], [4, 3.2]]));
    const r = mEstimateUnderBias(statistic, bracket, 1, 0.05);
    expect(r.estimateHigh).toBe(r.estimateLow);
    expectClose(r.estimateLow, mEstimate(statistic, bracket), { abs: 1e-12 });
    expect(r.intervalLow!).toBeLessThan(r.estimateLow);
    expect(r.intervalHigh!).toBeGreaterThan(r.estimateLow);
  });

  test('too few sets for any shift to be rejected → interval ends null, range finite', () => {
    const { statistic, bracket } = setup(layoutOf([[3, 1], [2, 1.5]]));
    const r = mEstimateUnderBias(statistic, bracket, 2, 0.05);
    expect(r.intervalLow).toBeNull();
    expect(r.intervalHigh).toBeNull();
    expect(Number.isFinite(r.estimateLow) && Number.isFinite(r.estimateHigh)).toBe(true);
  });

  test('the bracket covers every treated-minus-control difference by more than cσ', () => {
    const layout = layoutOf([[3, 1, 2], [5, 4]]);
    // differences 2, 1 and 1
    const [lo, hi] = mEstimateBracket(layout, 1, 2.5);
    expect(lo).toBeLessThan(1 - 2.5);
    expect(hi).toBeGreaterThan(2 + 2.5);
  });
});

describe('invariants', () => {
  const sets = fc.array(fc.array(fc.integer({ min: -40, max: 40 }), { minLength: 2, maxLength: 5 }), { minLength: 3, maxLength: 8 });

  test('range and interval are nested and widen with Γ', () => {
    fc.assert(
      fc.property(sets, (s) => {
        const layout = layoutOf(s.map((set) => set.map((y, i) => (i === 0 ? y / 4 + 2 : y / 4))));
        fc.pre(mStatisticScale(layout) > 0);
        const { statistic, bracket } = setup(layout);
        let last = mEstimateUnderBias(statistic, bracket, 1, 0.05);
        for (const gamma of [1.5, 3]) {
          const r = mEstimateUnderBias(statistic, bracket, gamma, 0.05);
          expect(r.estimateLow).toBeLessThanOrEqual(last.estimateLow + 1e-9);
          expect(r.estimateHigh).toBeGreaterThanOrEqual(last.estimateHigh - 1e-9);
          if (r.intervalLow !== null) expect(r.intervalLow).toBeLessThanOrEqual(r.estimateLow + 1e-9);
          if (r.intervalHigh !== null) expect(r.intervalHigh).toBeGreaterThanOrEqual(r.estimateHigh - 1e-9);
          last = r;
        }
      }),
      { numRuns: 60 },
    );
  });
});
