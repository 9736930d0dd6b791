import { describe, expect, test } from 'vitest';
import fc from 'fast-check';
import { criticalValueByInversion, prepareBernoulliSum, upperTailByInversion } from '../../src/core/bernoulliSumInversion';
import { sortedLowerTail, weightedBernoulliSumUpperTail } from '../../src/core/weightedBernoulliSumTail';
import { exactCriticalValue } from '../../src/core/hodgesLehmannRange';
import large from '../reference/signed_rank_large.json';
import { expectClose } from '../support/expectClose';
import { exactBernoulliTail as exactTail } from '../support/exactBernoulliTail';


const oneToN = (n: number) => Array.from({ length: n }, (_, i) => i + 1);
const relativeError = (actual: number, expected: number) => Math.abs(actual - expected) / expected;

describe('reference values', () => {
  test('upper tails of the signed-rank null distribution for 300, 600 and 1,000 pairs equal R psignrank to 3e-13', () => {
    // Source: R 4.2.2 base psignrank (test/reference/signed_rank_large.json, generators/signed_rank_large.R)
    for (const row of large.upperTails) {
      const prepared = prepareBernoulliSum(oneToN(row.pairs))!;
      const value = upperTailByInversion(prepared, row.t, 0.5, 0.5);
      expect(value, `n = ${row.pairs}, t = ${row.t}`).not.toBeNull();
      expectClose(value!, row.upperTail, { rel: 3e-13 });
    }
  });

  test('critical values for 300, 600 and 1,000 pairs equal those from R psignrank/qsignrank', () => {
    // Source: R 4.2.2 base (test/reference/signed_rank_large.json)
    for (const row of large.criticalValues) {
      expect(criticalValueByInversion(prepareBernoulliSum(oneToN(row.pairs))!, 0.5, 0.5, row.level)).toBe(row.critical);
    }
  });

  test('bounding tails under Γ > 1 (dyadic p) equal exact rational arithmetic to 1e-13, untied and with mid-rank ties', () => {
    // Independent route: BigInt expansion of the generating function (exactTail above).
    const tiedMidranks = (n: number, group: number) => Array.from({ length: n }, (_, i) => 2 * (Math.floor(i / group) * group) + group + 1);
    const cases: [string, number[]][] = [
      ['ranks 1…160', oneToN(160)],
      ['doubled mid-ranks, groups of 5 (160 pairs)', tiedMidranks(160, 5)],
      ['doubled mid-ranks, groups of 16 (192 pairs)', tiedMidranks(192, 16)],
    ];
    for (const [label, weights] of cases) {
      const prepared = prepareBernoulliSum(weights)!;
      const total = weights.reduce((a, b) => a + b, 0);
      for (const [a, m] of [[5n, 3n], [3n, 2n], [13n, 4n]] as [bigint, bigint][]) {
        const p = Number(a) / 2 ** Number(m);
        for (const where of [0.35, 0.62, 0.7, 0.8, 0.9]) {
          const t = Math.round(where * total);
          const expected = exactTail(weights, t, a, m);
          const value = upperTailByInversion(prepared, t, p, 1 - p);
          if (value === null) continue; // declined: the dynamic program answers (tested in weightedBernoulliSumTail.test.ts)
          expect(relativeError(value, expected), `${label}, p = ${p}, t = ${t}`).toBeLessThan(1e-13);
        }
      }
    }
  });
});

describe('special values', () => {
  test('thresholds at and beyond the ends of the support are exact', () => {
    const prepared = prepareBernoulliSum(oneToN(400))!;
    const total = 400 * 401 / 2;
    expect(upperTailByInversion(prepared, 0, 0.6, 0.4)).toBe(1);
    expect(upperTailByInversion(prepared, -5, 0.6, 0.4)).toBe(1);
    expect(upperTailByInversion(prepared, total + 1, 0.6, 0.4)).toBe(0);
    expectClose(upperTailByInversion(prepared, total, 0.6, 0.4)!, 0.6 ** 400, { rel: 1e-12 });
    expect(upperTailByInversion(prepared, 100, 1, 0)).toBe(1);
    expect(upperTailByInversion(prepared, 100, 0, 1)).toBe(0);
    expect(Number.isNaN(upperTailByInversion(prepared, NaN, 0.6, 0.4))).toBe(true);
  });

  test('a common divisor of the weights is taken out exactly (a threshold between lattice points rounds up)', () => {
    const weights = oneToN(300).map((w) => 3 * w);
    const prepared = prepareBernoulliSum(weights)!;
    expect(prepared.divisor).toBe(3);
    const onLattice = upperTailByInversion(prepared, 3 * 25000, 0.6, 0.4)!;
    expect(upperTailByInversion(prepared, 3 * 25000 - 1, 0.6, 0.4)).toBe(onLattice);
    expect(upperTailByInversion(prepared, 3 * 25000 - 2, 0.6, 0.4)).toBe(onLattice);
    expectClose(onLattice, weightedBernoulliSumUpperTail(oneToN(300), 25000, 0.6, 0.4), { rel: 1e-11 });
  });

  test('a lattice-like weight set (all but one weight a multiple of 7) is answered correctly or declined, never wrong', () => {
    // The generating function has near-periodic peaks at ω = 2πk/7 that a centre-only sum would miss.
    const weights = [...oneToN(250).map((w) => 7 * w), 1, 1];
    const prepared = prepareBernoulliSum(weights)!;
    const total = weights.reduce((a, b) => a + b, 0);
    for (const where of [0.55, 0.6, 0.7]) {
      const t = Math.round(where * total);
      const value = upperTailByInversion(prepared, t, 0.6, 0.4);
      const sorted = Float64Array.from(weights).sort();
      const reference = 1 - sortedLowerTail(sorted, t - 1, 0.6, 0.4);
      const direct = sortedLowerTail(sorted, total - t, 0.4, 0.6);
      const expected = direct < 0.5 ? direct : reference;
      if (value !== null) expect(relativeError(value, expected), `t = ${t}`).toBeLessThan(1e-11);
    }
  });
});

describe('invariants', () => {
  test('agrees with the dynamic program to 1e-11 for random weight sets with ties (400–700 weights)', () => {
    fc.assert(
      fc.property(
        fc.integer({ min: 400, max: 700 }),
        fc.integer({ min: 1, max: 12 }),
        fc.double({ min: 0.3, max: 0.95, noNaN: true }),
        fc.double({ min: 0.5, max: 0.9, noNaN: true }),
        fc.integer({ min: 0, max: 2 ** 31 - 1 }),
        (n, tieGroup, where, p, seed) => {
          let state = seed >>> 0;
          const weights = Array.from({ length: n }, () => {
            state = (Math.imul(state, 1103515245) + 12345) >>> 0;
            return 1 + Math.floor(((state / 4294967296) * 2 * n) / tieGroup) * tieGroup;
          });
          const total = weights.reduce((a, b) => a + b, 0);
          const t = Math.round(where * total);
          const prepared = prepareBernoulliSum(weights)!;
          const value = upperTailByInversion(prepared, t, p, 1 - p);
          if (value === null) return true;
          const sorted = Float64Array.from(weights).sort();
          const direct = sortedLowerTail(sorted, total - t, 1 - p, p);
          const expected = direct < 0.5 ? direct : 1 - sortedLowerTail(sorted, t - 1, p, 1 - p);
          return expected === 0 ? value < 1e-300 : relativeError(value, expected) < 1e-11;
        },
      ),
      { numRuns: 12, seed: 20261202 },
    );
  });

  test('critical values under Γ > 1 have the defining property under the dynamic program (250–450 pairs)', () => {
    for (const n of [250, 333, 450]) {
      for (const gamma of [1.25, 2, 4]) {
        const p = gamma / (1 + gamma);
        const q = 1 / (1 + gamma);
        for (const level of [0.025, 0.005]) {
          const fromInversion = criticalValueByInversion(prepareBernoulliSum(oneToN(n))!, p, q, level);
          // The defining property, checked with the dynamic program's tails; where the inversion declines (weak
          // decay of the generating function at few pairs and large Γ) exactCriticalValue uses the table.
          const c = fromInversion ?? exactCriticalValue(n, p, q, level);
          const sorted = Float64Array.from(oneToN(n));
          const total = (n * (n + 1)) / 2;
          expect(sortedLowerTail(sorted, total - c, q, p), `n ${n}, Γ ${gamma}, tail at c`).toBeLessThanOrEqual(level);
          expect(sortedLowerTail(sorted, total - c + 1, q, p), `n ${n}, Γ ${gamma}, tail at c − 1`).toBeGreaterThan(level);
          expect(exactCriticalValue(n, p, q, level)).toBe(c);
        }
      }
    }
  });

  test('the tail falls as the threshold rises and rises with p', () => {
    const prepared = prepareBernoulliSum(oneToN(500))!;
    let previous = 1;
    for (let t = 60000; t <= 100000; t += 5000) {
      const value = upperTailByInversion(prepared, t, 0.55, 0.45)!;
      expect(value).toBeLessThanOrEqual(previous);
      previous = value;
    }
    expect(upperTailByInversion(prepared, 80000, 0.6, 0.4)!).toBeGreaterThan(upperTailByInversion(prepared, 80000, 0.55, 0.45)!);
  });
});
