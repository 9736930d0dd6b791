import { describe, expect, test } from 'vitest';
import fc from 'fast-check';
import { matchedSetsEventBound, matchedSetsEventCounts } from '../../src/core/matchedSetsEventBound';
import { groupMatchedSets } from '../../src/core/matchedSetsGrouping';
import { signTestBound } from '../../src/core/signTestBound';
import { expectClose } from '../support/expectClose';
import { readReferenceJson } from '../support/reference';

const reference = readReferenceJson('matched_sets.json');

describe('reference values', () => {
  test.each(reference.binary.map((d: any) => [d.name, d]) as [string, any][])('%s: T, counts and both tails at each Γ agree with R', (_name, ds: any) => {
    // R 4.2.2 base, matched_sets.R: convolution of Bernoullis; pnorm for the normal tail
    const counts = matchedSetsEventCounts(groupMatchedSets(ds).layout);
    expect(counts.statistic).toBe(ds.statistic);
    expect(counts.informativeSets).toBe(ds.informative_sets);
    expect(counts.uninformativeSets).toBe(ds.uninformative_sets);
    for (const row of ds.rows) {
      const exact = matchedSetsEventBound(counts, row.gamma, 'exact');
      expectClose(exact.pUpper, row.p_upper_exact, { rel: 1e-12 });
      expectClose(exact.pLower, row.p_lower_exact, { rel: 1e-12 });
      expectClose(exact.expectation, row.expectation, { rel: 1e-14 });
      expectClose(exact.variance, row.variance, { rel: 1e-14 });
      expectClose(matchedSetsEventBound(counts, row.gamma, 'normal').pUpper, row.p_upper_normal, { rel: 1e-12 });
    }
  });
});

describe('special values', () => {
  const counts = matchedSetsEventCounts(
    groupMatchedSets({
      setIds: ['a', 'a', 'a', 'b', 'b', 'c', 'c', 'c', 'd', 'd'],
      treated: [1, 0, 0, 1, 0, 1, 0, 0, 1, 0],
      outcomes: [1, 0, 1, 1, 0, 0, 0, 0, 1, 1],
    }).layout,
  );

  test('sets with no or all events are left out and counted', () => {
    // a: 2 of 3, b: 1 of 2, c: none, d: both → informative a, b; T = 2
    expect(counts.informativeSets).toBe(2);
    expect(counts.uninformativeSets).toBe(2);
    expect(counts.statistic).toBe(2);
    expect(Array.from(counts.events)).toEqual([2, 1]);
    expect(Array.from(counts.units)).toEqual([3, 2]);
  });

  test('worked by hand: at Γ = 2, P(both treated had the event) = (4/5)(2/3)', () => {
    // a: Γe/(Γe + n − e) = 4/5; b: 2/3
    const b = matchedSetsEventBound(counts, 2, 'exact');
    expectClose(b.pUpper, (4 / 5) * (2 / 3), { rel: 1e-15 });
    // lower: e/(e + Γ(n − e)) = 2/4 and 1/3
    expectClose(b.pLower, (2 / 4) * (1 / 3), { rel: 1e-15 });
    expectClose(b.expectation, 4 / 5 + 2 / 3, { rel: 1e-15 });
  });

  test('Γ = 1: both bounds are the randomization p-value', () => {
    const b = matchedSetsEventBound(counts, 1, 'exact');
    expect(b.pUpper).toBe(b.pLower);
    expectClose(b.pUpper, (2 / 3) * (1 / 2), { rel: 1e-15 });
  });

  test('huge Γ keeps the complements exact: the worst case tends to 1 without rounding to it early', () => {
    const b = matchedSetsEventBound(counts, 1e12, 'exact');
    // 1 − P = 1 − (1 − 1/(2e12 + 1))(1 − 1/(1e12 + 1)) ≈ 1.5e-12
    expect(b.pUpper).toBeLessThan(1);
    expect(b.pUpper).toBeGreaterThan(1 - 2e-12);
  });

  test('no informative sets → p = 1; NaN Γ → NaN', () => {
    const none = matchedSetsEventCounts(groupMatchedSets({ setIds: ['a', 'a'], treated: [1, 0], outcomes: [1, 1] }).layout);
    expect(matchedSetsEventBound(none, 2, 'exact').pUpper).toBe(1);
    expect(matchedSetsEventBound(none, 2, 'normal').pUpper).toBe(1);
    expect(matchedSetsEventBound(counts, NaN, 'exact').pUpper).toBeNaN();
  });
});

describe('invariants', () => {
  test('1:1 pairs give the sign-test (McNemar) bounds for any counts and Γ', () => {
    fc.assert(
      fc.property(fc.nat(30), fc.nat(30), fc.nat(10), fc.double({ min: 1, max: 20, noNaN: true }), (favour, against, ties, gamma) => {
        const setIds: string[] = [];
        const treated: number[] = [];
        const outcomes: number[] = [];
        const add = (t: number, c: number) => {
          const id = `p${setIds.length}`;
          setIds.push(id, id);
          treated.push(1, 0);
          outcomes.push(t, c);
        };
        for (let i = 0; i < favour; i++) add(1, 0);
        for (let i = 0; i < against; i++) add(0, 1);
        for (let i = 0; i < ties; i++) add(1, 1);
        const counts = matchedSetsEventCounts(groupMatchedSets({ setIds, treated, outcomes }).layout);
        const mine = matchedSetsEventBound(counts, gamma, 'exact');
        const sign = signTestBound(favour, favour + against, gamma, { method: 'exact' });
        expectClose(mine.pUpper, sign.pUpper, { rel: 1e-11, abs: 1e-300 });
        expectClose(mine.pLower, sign.pLower, { rel: 1e-11, abs: 1e-300 });
      }),
    );
  });

  test('the upper bound rises and the lower falls with Γ', () => {
    const counts = matchedSetsEventCounts(groupMatchedSets(reference.binary[1]).layout);
    let last = matchedSetsEventBound(counts, 1, 'exact');
    for (const gamma of [1.1, 1.5, 2, 4, 10]) {
      const b = matchedSetsEventBound(counts, gamma, 'exact');
      expect(b.pUpper).toBeGreaterThan(last.pUpper);
      expect(b.pLower).toBeLessThan(last.pLower);
      last = b;
    }
  });
});
