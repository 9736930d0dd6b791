import { describe, expect, test } from 'vitest';
import fc from 'fast-check';
import { RANK_TIE_TOLERANCE, signedRanks } from '../../src/core/signedRanks';
import { readReferenceJson } from '../support/reference';

const pratt = readReferenceJson('pratt_signed_rank.json');

describe('signedRanks: reference values', () => {
  for (const [name, ds] of Object.entries<any>(pratt.datasets)) {
    test(`${name}: Wilcoxon and Pratt ranks equal R's rank(abs(d))`, () => {
      // R 4.2.2 base: rank(abs(d[d != 0])) (Wilcoxon 1945) and rank(abs(d))[d != 0] (Pratt 1959),
      // test/reference/pratt_signed_rank.json
      for (const rule of ['wilcoxon', 'pratt'] as const) {
        const ranks = signedRanks(ds.differences, { zeroRule: rule });
        expect(Array.from(ranks.ranks)).toEqual([...ds[rule].ranks_of_nonzero].sort((a: number, b: number) => a - b));
        expect(ranks.statistic).toBe(ds[rule].statistic_greater);
        expect(ranks.sumRanks).toBe(ds[rule].sum_ranks);
        expect(ranks.zeros).toBe(ds.zeros);
        expect(ranks.zeroRule).toBe(rule);
      }
    });
  }
});

describe('signedRanks: ties within a relative tolerance', () => {
  test('1.3 − 1.2 and 2.3 − 2.2 tie with the tolerance and not without it', () => {
    // hand computation: 0.10000000000000009 and 0.09999999999999964 differ by 4.5e-15 relative
    const d = [1.3 - 1.2, 2.3 - 2.2, 5];
    expect(Array.from(signedRanks(d, { tieTolerance: RANK_TIE_TOLERANCE }).ranks)).toEqual([1.5, 1.5, 3]);
    expect(Array.from(signedRanks(d).ranks)).toEqual([1, 2, 3]);
  });
  test('a tie group is measured from its smallest member (no chaining beyond the tolerance)', () => {
    const step = 0.6e-10;
    const d = [1, 1 + step, 1 + 2 * step];
    // 1 + 2·step is 1.2e-10 above the smallest: outside the group of 1 and 1 + step
    expect(Array.from(signedRanks(d, { tieTolerance: 1e-10 }).ranks)).toEqual([1.5, 1.5, 3]);
  });
  test('zeros never tie with small non-zero differences', () => {
    const ranks = signedRanks([0, 1e-300, -1e-300, 2], { tieTolerance: RANK_TIE_TOLERANCE, zeroRule: 'pratt' });
    expect(Array.from(ranks.ranks)).toEqual([2.5, 2.5, 4]);
    expect(ranks.zeros).toBe(1);
  });
  test('Σ ranks and Σ ranks² agree with the ranks for any data and rule (fast-check)', () => {
    fc.assert(
      fc.property(fc.array(fc.integer({ min: -6, max: 6 }), { minLength: 1, maxLength: 40 }), fc.boolean(), (d, usePratt) => {
        const r = signedRanks(d, { zeroRule: usePratt ? 'pratt' : 'wilcoxon' });
        const list = Array.from(r.ranks);
        expect(r.sumRanks).toBe(list.reduce((a, b) => a + b, 0));
        expect(r.sumSquaredRanks).toBe(list.reduce((a, b) => a + b * b, 0));
        if (!usePratt) expect(r.sumRanks).toBe((r.nonZero * (r.nonZero + 1)) / 2);
        else expect(r.sumRanks).toBe(((r.pairs * (r.pairs + 1)) / 2) - (r.zeros * (r.zeros + 1)) / 2);
      }),
    );
  });
});

describe('signedRanks: non-mutation', () => {
  test('the differences are left unchanged', () => {
    const d = Object.freeze([3, -1, 0, 2]);
    signedRanks(d, { zeroRule: 'pratt', tieTolerance: RANK_TIE_TOLERANCE });
    expect(d).toEqual([3, -1, 0, 2]);
  });
});
