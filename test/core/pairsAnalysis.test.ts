import { describe, expect, test } from 'vitest';
import fc from 'fast-check';
import { analysePairs, validatePairsInput, defaultGammaGrid, EXACT_PAIRS_LIMIT, type PairsInput } from '../../src/core/pairsAnalysis';
import { InputError } from '../../src/core/inputProblem';
import { signedRanks } from '../../src/core/signedRanks';
import { signedRankBound } from '../../src/core/signedRankBound';
import { walshAverages } from '../../src/core/walshAverages';
import { effectUnderBias } from '../../src/core/hodgesLehmannRange';
import { expectClose } from '../support/expectClose';
import { readReferenceJson } from '../support/reference';

const reference = readReferenceJson('rosenbaum.json');
const datasets = Object.entries<any>(reference.datasets);

describe('reference values through the whole analysis', () => {
  test.each(datasets)('%s: table rows and sensitivity values (signed-rank and sign, exact and normal)', (_name, ds) => {
    // R 4.2.2 reference values, test/reference/rosenbaum.json
    for (const method of ['exact', 'normal'] as const) {
      for (const test of ['signrank', 'sign'] as const) {
        const result = analysePairs({ data: { kind: 'differences', differences: ds.differences }, method, test, gammas: reference.gammas });
        const prefix = test === 'sign' ? 'sign' : 'wilcoxon';
        result.rows.forEach((row, i) => {
          const expected = ds.by_gamma[i];
          expect(row.gamma).toBe(expected.gamma);
          expectClose(row.pUpper, expected[`${prefix}_upper_${method}`], { rel: 1e-11 }, `${test} ${method} upper Γ=${row.gamma}`);
          if (method === 'exact') expectClose(row.pLower, expected[`${prefix}_lower_exact`], { rel: 1e-11 }, 'lower');
        });
        expect(result.tailMethod).toBe(method);
        expectClose(result.sensitivityValue!, ds.sensitivity_value[`${prefix}_${method}`], { rel: 1e-8 }, `${test} ${method} Γ*`);
        expect(result.n).toBe(ds.n_pairs);
        expect(result.statistic).toBe(test === 'sign' ? ds.sign_S : ds.wilcoxon_T);
      }
    }
  });

  test('auto uses the exact distribution for these sizes and says so', () => {
    const result = analysePairs({ data: { kind: 'differences', differences: reference.datasets.n40.differences } });
    expect(result.tailMethod).toBe('exact');
    expect(result.tailMethodReason).toMatch(/exact/);
    // R 4.2.2 reference sensitivity value (exact signed-rank), rosenbaum.json
    expectClose(result.sensitivityValue!, reference.datasets.n40.sensitivity_value.wilcoxon_exact, { rel: 1e-8 });
    expectClose(result.pValue, reference.datasets.n40.checks_gamma1.psignrank_upper_lowertailFALSE, { rel: 1e-12 });
    expect(result.rows[0].gamma).toBe(1);
    expect(result.rows.at(-1)!.gamma).toBeGreaterThan(result.sensitivityValue!);
    expect(result.rows.at(-2)!.gamma).toBeLessThanOrEqual(result.sensitivityValue!);
    expect(Object.isFrozen(result)).toBe(true);
  });

  test('the shared table (untied ranks) gives the same bounds and intervals as separate computations', () => {
    const d = Array.from({ length: 200 }, (_, i) => Math.sin(i * 1.37) * 3 + 0.4 + i * 1e-9);
    const result = analysePairs({ data: { kind: 'differences', differences: d }, gammas: [1, 1.2, 1.5, 2, 4] });
    const ranks = signedRanks(d);
    const walsh = walshAverages(d);
    result.rows.forEach((row, i) => {
      const separate = signedRankBound(ranks, row.gamma, { method: 'exact' });
      expectClose(row.pUpper, separate.pUpper, { rel: 1e-12 }, `upper Γ=${row.gamma}`);
      expectClose(row.pLower, separate.pLower, { rel: 1e-12 }, `lower Γ=${row.gamma}`);
      const effect = effectUnderBias(walsh, 200, row.gamma, 0.05, { method: 'exact' });
      expect(result.estimates[i].intervalLow).toBe(effect.intervalLow);
      expect(result.estimates[i].intervalHigh).toBe(effect.intervalHigh);
    });
  });

  test(`more than ${EXACT_PAIRS_LIMIT} pairs use the normal approximation under auto, up to that many the exact tails`, () => {
    const d = Array.from({ length: EXACT_PAIRS_LIMIT + 1 }, (_, i) => Math.sin(i * 3.7) + 0.2);
    expect(analysePairs({ data: { kind: 'differences', differences: d.slice(0, EXACT_PAIRS_LIMIT) }, gammas: [1, 2] }).tailMethod).toBe('exact');
    const result = analysePairs({ data: { kind: 'differences', differences: d }, gammas: [1, 2] });
    expect(result.tailMethod).toBe('normal');
    expect(result.tailMethodReason).toMatch(/normal approximation/);
  });

  test('one rule under auto: all pairs (zeros included) decide, for the test and the estimates alike', () => {
    // EXACT_PAIRS_LIMIT + 1 pairs of which only 900 are non-zero: the normal approximation for both parts
    const d = Array.from({ length: EXACT_PAIRS_LIMIT + 1 }, (_, i) => (i < 900 ? Math.sin(i * 3.7) + 0.2 : 0));
    const result = analysePairs({ data: { kind: 'differences', differences: d }, gammas: [1, 1.5] });
    expect(result.nonZero).toBe(900);
    expect(result.tailMethod).toBe('normal');
    expect(result.estimates.every((e) => e.method === 'normal')).toBe(true);
    const small = analysePairs({ data: { kind: 'differences', differences: d.slice(0, 60) }, gammas: [1, 1.5] });
    expect(small.tailMethod).toBe('exact');
    expect(small.estimates.every((e) => e.method === 'exact')).toBe(true);
  });
});

describe('binary outcomes', () => {
  test('discordant counts give the sign test (McNemar) bounds', () => {
    // Same numbers as the sign test of small_n15 (S = 12 of D = 15), R 4.2.2 pbinom reference
    const ds = reference.datasets.small_n15;
    const result = analysePairs({ data: { kind: 'discordant', treatedOnly: 12, controlOnly: 3 }, gammas: reference.gammas });
    expect(result.test).toBe('sign');
    result.rows.forEach((row, i) => expectClose(row.pUpper, ds.by_gamma[i].sign_upper_exact, { rel: 1e-12 }));
    expectClose(result.sensitivityValue!, ds.sensitivity_value.sign_exact, { rel: 1e-8 });
    expect(result.estimates).toEqual([]);
    expect(result.estimate).toBeNull();
  });
  test('asking for the signed-rank test with counts uses the sign test and says so', () => {
    const result = analysePairs({ data: { kind: 'discordant', treatedOnly: 30, controlOnly: 10 }, test: 'signrank' });
    expect(result.test).toBe('sign');
    expect(result.warnings.join(' ')).toMatch(/sign test was used/);
  });
  test('concordant pairs count in n but not in the test', () => {
    const result = analysePairs({ data: { kind: 'discordant', treatedOnly: 30, controlOnly: 10, concordant: 60 }, gammas: [1] });
    const without = analysePairs({ data: { kind: 'discordant', treatedOnly: 30, controlOnly: 10 }, gammas: [1] });
    expect(result.n).toBe(100);
    expect(result.nonZero).toBe(40);
    expect(result.rows).toEqual(without.rows);
    expect(result.warnings.join(' ')).toMatch(/60 concordant pairs/);
    expect(validatePairsInput({ data: { kind: 'discordant', treatedOnly: 3, controlOnly: 1, concordant: -1 } })[0].field).toBe('data.concordant');
  });
  test('alternative less swaps the counts', () => {
    const a = analysePairs({ data: { kind: 'discordant', treatedOnly: 30, controlOnly: 10 }, gammas: [1, 2] });
    const b = analysePairs({ data: { kind: 'discordant', treatedOnly: 10, controlOnly: 30 }, alternative: 'less', gammas: [1, 2] });
    expect(b.rows).toEqual(a.rows);
  });
});

describe('special cases', () => {
  test('not significant at Γ = 1: no sensitivity value, a short default grid, a warning', () => {
    const result = analysePairs({ data: { kind: 'differences', differences: [1, -1, 2, -2, 0.5, -0.4] } });
    expect(result.sensitivityValue).toBeNull();
    expect(result.sensitivityStatus).toBe('not-significant');
    expect(result.rows.map((r) => r.gamma)).toEqual([1, 1.25, 1.5, 2, 3]);
    expect(result.warnings.join(' ')).toMatch(/not significant/);
    expect(result.amplification).toEqual([]);
  });
  test('zero differences are counted and reported', () => {
    const result = analysePairs({ data: { kind: 'differences', differences: [0, 1, 2, 3, 0, 4, 5, 6, 7, 8] } });
    expect(result.zeroDifferences).toBe(2);
    expect(result.nonZero).toBe(8);
    expect(result.n).toBe(10);
    expect(result.warnings.join(' ')).toMatch(/2 pairs have a difference of zero/);
  });
  test('the default grid ends just past the sensitivity value', () => {
    expect(defaultGammaGrid({ gamma: 1.61, status: 'found', searchedUpTo: 1e6 })).toEqual([1, 1.1, 1.2, 1.3, 1.4, 1.5, 1.6, 1.7]);
    expect(defaultGammaGrid({ gamma: 4.2, status: 'found', searchedUpTo: 1e6 })).toEqual([1, 1.5, 2, 2.5, 3, 3.5, 4, 4.5]);
    const wide = defaultGammaGrid({ gamma: 240, status: 'found', searchedUpTo: 1e6 });
    expect(wide.length).toBeLessThanOrEqual(12);
    expect(wide.at(-1)).toBeGreaterThan(240);
  });
});

describe('invariants', () => {
  const pairs = fc
    .array(fc.tuple(fc.integer({ min: 0, max: 20 }), fc.integer({ min: 0, max: 20 })), { minLength: 3, maxLength: 25 })
    .filter((list) => list.filter(([t, c]) => t !== c).length >= 2);

  test('swapping treated and control with the alternative reversed gives the same bounds', () => {
    fc.assert(
      fc.property(pairs, fc.constantFrom('exact' as const, 'normal' as const), (list, method) => {
        const treated = list.map(([t]) => t);
        const control = list.map(([, c]) => c);
        const gammas = [1, 1.5, 2.5];
        const a = analysePairs({ data: { kind: 'outcomes', treated, control }, method, gammas });
        const b = analysePairs({ data: { kind: 'outcomes', treated: control, control: treated }, alternative: 'less', method, gammas });
        expect(b.rows).toEqual(a.rows);
        expect(b.sensitivityValue).toBe(a.sensitivityValue);
      }),
      { numRuns: 60 },
    );
  });

  test('outcome columns and their differences give the same analysis', () => {
    fc.assert(
      fc.property(pairs, (list) => {
        const treated = list.map(([t]) => t);
        const control = list.map(([, c]) => c);
        const a = analysePairs({ data: { kind: 'outcomes', treated, control }, gammas: [1, 2] });
        const b = analysePairs({ data: { kind: 'differences', differences: list.map(([t, c]) => t - c) }, gammas: [1, 2] });
        expect(a.rows).toEqual(b.rows);
        expect(a.estimates).toEqual(b.estimates);
      }),
      { numRuns: 40 },
    );
  });

  test('rows: pUpper non-decreasing, pLower non-increasing, pLower ≤ p(Γ = 1) ≤ pUpper', () => {
    fc.assert(
      fc.property(pairs, fc.array(fc.double({ min: 1, max: 12, noNaN: true }), { minLength: 1, maxLength: 6 }), (list, raw) => {
        const gammas = [...raw].sort((x, y) => x - y);
        const result = analysePairs({ data: { kind: 'differences', differences: list.map(([t, c]) => t - c) }, gammas });
        for (let i = 0; i < result.rows.length; i++) {
          const row = result.rows[i];
          expect(row.pLower).toBeLessThanOrEqual(result.pValue + 1e-12);
          expect(row.pUpper).toBeGreaterThanOrEqual(result.pValue - 1e-12);
          if (i > 0) {
            expect(row.pUpper).toBeGreaterThanOrEqual(result.rows[i - 1].pUpper - 1e-12);
            expect(row.pLower).toBeLessThanOrEqual(result.rows[i - 1].pLower + 1e-12);
          }
        }
      }),
      { numRuns: 60 },
    );
  });
});

describe('validation', () => {
  const codes = (input: unknown) => validatePairsInput(input as PairsInput).map((p) => `${p.field}:${p.code}`);

  test('fewer than two non-zero differences', () => {
    expect(codes({ data: { kind: 'differences', differences: [0, 0, 3] } })).toEqual(['data.differences:too-few-pairs']);
    expect(codes({ data: { kind: 'outcomes', treated: [1, 2], control: [1, 2] } })).toEqual(['data:too-few-pairs']);
    expect(codes({ data: { kind: 'discordant', treatedOnly: 1, controlOnly: 0 } })).toEqual(['data:too-few-pairs']);
  });
  test('non-numeric or non-finite values name the pair', () => {
    const problems = validatePairsInput({ data: { kind: 'differences', differences: [1, NaN, 3] } });
    expect(problems[0].field).toBe('data.differences[1]');
    expect(problems[0].message).toMatch(/pair 2 is not a finite number/);
    expect(codes({ data: { kind: 'outcomes', treated: [1, 2, Infinity], control: [1, 2, 3] } })).toEqual(['data.treated[2]:not-finite']);
  });
  test('Γ below 1, α outside (0, 1), unequal columns, bad counts and choices', () => {
    const good = { kind: 'differences', differences: [1, 2, 3] };
    expect(codes({ data: good, gammas: [1, 0.5] })).toEqual(['gammas[1]:below-one']);
    expect(codes({ data: good, gammas: [] })).toEqual(['gammas:empty']);
    expect(codes({ data: good, alpha: 0 })).toEqual(['alpha:outside-interval']);
    expect(codes({ data: good, alpha: 1.5 })).toEqual(['alpha:outside-interval']);
    expect(codes({ data: { kind: 'outcomes', treated: [1, 2, 3], control: [1, 2] } })).toEqual(['data.control:unequal-length']);
    expect(codes({ data: { kind: 'discordant', treatedOnly: 2.5, controlOnly: -1 } })).toEqual([
      'data.treatedOnly:not-count',
      'data.controlOnly:not-count',
    ]);
    expect(codes({ data: good, test: 'median', alternative: 'two', method: 'fast' })).toEqual([
      'test:not-a-choice',
      'alternative:not-a-choice',
      'method:not-a-choice',
    ]);
    expect(codes({})).toEqual(['data:missing']);
  });
  test('analysePairs throws one InputError carrying every problem', () => {
    try {
      analysePairs({ data: { kind: 'differences', differences: [1, 2, 3] }, alpha: 2, gammas: [0] });
      expect.unreachable();
    } catch (error) {
      expect(error).toBeInstanceOf(InputError);
      expect((error as InputError).problems.map((p) => p.field)).toEqual(['alpha', 'gammas[0]']);
    }
  });
});

describe('non-mutation', () => {
  test('frozen inputs are accepted and left unchanged', () => {
    const differences = Object.freeze([3, 1, -2, 5, 4, 0, 6]);
    const gammas = Object.freeze([1, 2]);
    const input = Object.freeze({ data: Object.freeze({ kind: 'differences' as const, differences }), gammas });
    const result = analysePairs(input);
    expect(differences).toEqual([3, 1, -2, 5, 4, 0, 6]);
    expect(result.rows.map((r) => r.gamma)).toEqual([1, 2]);
  });
});

describe('huge magnitudes', () => {
  test('differences near the largest double give finite estimates; overflowing differences are refused', () => {
    const result = analysePairs({ data: { kind: 'differences', differences: [1.5e308, 1.6e308, -1e308, 1.7e308, 1.2e308] }, gammas: [1, 2] });
    for (const e of result.estimates) {
      expect(Number.isFinite(e.estimateLow) && Number.isFinite(e.estimateHigh)).toBe(true);
    }
    // The 8th of the 15 Walsh averages (−1, 0.1, 0.25, 0.3, 0.35, 1.2, 1.35, 1.4, … ×1e308), computed as a/2 + b/2
    expectClose(result.estimate!, 1.4e308, { rel: 1e-15 });
    const problems = validatePairsInput({ data: { kind: 'outcomes', treated: [1e308, 2, 3], control: [-1e308, 1, 1] } });
    expect(problems.map((p) => p.code)).toEqual(['difference-overflow']);
    expect(problems[0].message).toMatch(/pair 1 is too large/);
  });
});

describe('decimal differences', () => {
  test('1.3 − 1.2 and 2.3 − 2.2 tie, as they do on paper', () => {
    const result = analysePairs({ data: { kind: 'outcomes', treated: [1.3, 2.3, 5, 7, 9], control: [1.2, 2.2, 1, 1, 1] }, gammas: [1] });
    const same = analysePairs({ data: { kind: 'differences', differences: [0.1, 0.1, 4, 6, 8] }, gammas: [1] });
    expect(result.rows).toEqual(same.rows);
    expect(result.warnings.join(' ')).toMatch(/equal sizes/);
  });
});

describe('ranking tolerance', () => {
  test('near-equal differences on either side of a 12-digit rounding boundary tie (100000.3 − 100000.2 and 0.1)', () => {
    // 100000.3 − 100000.2 = 0.10000000000582077 in binary arithmetic; rounded to 12 significant digits it is
    // 0.100000000006 ≠ 0.1, so rounding did not make it tie; the relative tolerance 1e-10 does (hand computation).
    const result = analysePairs({ data: { kind: 'outcomes', treated: [100000.3, 1.1, 5, 7, 9], control: [100000.2, 1, 1, 1, 1] }, gammas: [1] });
    const same = analysePairs({ data: { kind: 'differences', differences: [0.1, 0.1, 4, 6, 8] }, gammas: [1] });
    expect(result.statistic).toBe(same.statistic);
    expect(result.rows).toEqual(same.rows);
    expect(result.tieTolerance).toBe(1e-10);
  });
});

const pratt = readReferenceJson('pratt_signed_rank.json');

describe("zero differences: Wilcoxon's and Pratt's rules against R base enumeration", () => {
  for (const [name, ds] of Object.entries<any>(pratt.datasets)) {
    for (const rule of ['wilcoxon', 'pratt'] as const) {
      for (const alternative of ['greater', 'less'] as const) {
        test(`${name}, ${rule}, ${alternative}: statistic and exact bounds at Γ = 1, 1.5, 2, 3`, () => {
          // R 4.2.2 base: full enumeration of the sign patterns with rank(abs(d)) (Pratt: over all pairs, zeros
          // included; Wilcoxon: over the non-zero pairs), test/reference/pratt_signed_rank.json
          const expected = ds[rule];
          const result = analysePairs({
            data: { kind: 'differences', differences: ds.differences },
            zeroRule: rule,
            alternative,
            method: 'exact',
            gammas: expected.by_gamma.map((r: any) => r.gamma),
          });
          expect(result.zeroRule).toBe(rule);
          expect(result.statistic).toBe(expected[`statistic_${alternative}`]);
          result.rows.forEach((row, i) => {
            const r = expected.by_gamma[i];
            expectClose(row.pUpper, r[`${alternative}_upper`], { rel: 1e-12 }, `upper Γ=${row.gamma}`);
            expectClose(row.pLower, r[`${alternative}_lower`], { rel: 1e-12 }, `lower Γ=${row.gamma}`);
          });
          expectClose(result.pValue, expected.by_gamma[0][`${alternative}_upper`], { rel: 1e-12 }, 'p at Γ = 1');
          if (ds.psignrank_upper !== undefined && alternative === 'greater') {
            // R 4.2.2: psignrank(T − 1, n, lower.tail = FALSE) (no zeros, no ties: both rules are Wilcoxon's)
            expectClose(result.pValue, ds.psignrank_upper, { rel: 1e-12 });
          }
        });
      }
    }
    test(`${name}: the Hodges–Lehmann estimate and intervals do not depend on the zero rule`, () => {
      const base = { data: { kind: 'differences' as const, differences: ds.differences }, gammas: [1, 2] };
      const w = analysePairs({ ...base, zeroRule: 'wilcoxon' });
      const p = analysePairs({ ...base, zeroRule: 'pratt' });
      expect(p.estimates).toEqual(w.estimates);
      expect(p.estimate).toBe(w.estimate);
    });
  }

  test("Pratt's rule: the normal approximation uses the Pratt ranks' mean and variance", () => {
    // Rosenbaum 2002 §4.3.3: mean p·ΣRᵢ and variance p(1 − p)·ΣRᵢ² over the scored pairs; ΣRᵢ from R (pratt_signed_rank.json)
    const ds = pratt.datasets.zeros_and_ties;
    const ranks = signedRanks(ds.differences, { zeroRule: 'pratt' });
    expect(Array.from(ranks.ranks)).toEqual([...ds.pratt.ranks_of_nonzero].sort((a: number, b: number) => a - b));
    expect(ranks.sumRanks).toBe(ds.pratt.sum_ranks);
    const result = analysePairs({ data: { kind: 'differences', differences: ds.differences }, zeroRule: 'pratt', method: 'normal', gammas: [1] });
    const z = (ds.pratt.statistic_greater - 0.5 * ds.pratt.sum_ranks) / Math.sqrt(0.25 * ranks.sumSquaredRanks);
    expect(result.pValue).toBeCloseTo(0.5 * (1 - erf(z / Math.SQRT2)), 6);
  });

  test("Pratt's rule is named in the warnings, conventions and references", () => {
    const ds = pratt.datasets.zeros_and_ties;
    const result = analysePairs({ data: { kind: 'differences', differences: ds.differences }, zeroRule: 'pratt' });
    expect(result.warnings.join(' ')).toMatch(/Pratt's rule/);
    expect(result.conventions.find((c) => c.id === 'zero-differences')!.text).toMatch(/Pratt's rule/);
    expect(result.references.join(' ')).toMatch(/Pratt JW \(1959\)/);
    const wilcoxon = analysePairs({ data: { kind: 'differences', differences: ds.differences } });
    expect(wilcoxon.zeroRule).toBe('wilcoxon');
    expect(wilcoxon.conventions.find((c) => c.id === 'zero-differences')!.text).toMatch(/left out of the signed-rank test \(Wilcoxon's rule\) but count in the Hodges–Lehmann/);
    expect(wilcoxon.references.join(' ')).toMatch(/Wilcoxon F \(1945\)/);
    expect(wilcoxon.references.join(' ')).toMatch(/Zhao Q \(2019\)/);
  });

  test("the sign test ignores Pratt's rule and says so", () => {
    const result = analysePairs({ data: { kind: 'differences', differences: [1, 2, 0, -1, 3, 4] }, test: 'sign', zeroRule: 'pratt' });
    expect(result.zeroRule).toBe('wilcoxon');
    expect(result.warnings.join(' ')).toMatch(/signed-rank test only/);
  });

  test('an unknown zero rule is refused on the field zeroRule', () => {
    const problems = validatePairsInput({ data: { kind: 'differences', differences: [1, 2, 3] }, zeroRule: 'keep' as never });
    expect(problems.map((p) => [p.field, p.code])).toEqual([['zeroRule', 'not-a-choice']]);
  });
});

describe('conventions', () => {
  test('every result carries a frozen list of conventions with ids and plain text', () => {
    const result = analysePairs({ data: { kind: 'differences', differences: reference.datasets.small_n15.differences } });
    expect(Object.isFrozen(result.conventions)).toBe(true);
    expect(result.conventions.map((c) => c.id)).toEqual(['zero-differences', 'tied-differences', 'one-sided-bounds', 'interval-two-sided', 'estimate-whole-number']);
    for (const c of result.conventions) {
      expect(Object.isFrozen(c)).toBe(true);
      expect(c.text).not.toMatch(/NaN|undefined|Infinity/);
    }
    const counts = analysePairs({ data: { kind: 'discordant', treatedOnly: 12, controlOnly: 3, concordant: 5 }, method: 'normal' });
    expect(counts.conventions.map((c) => c.id)).toEqual(['zero-differences', 'one-sided-bounds', 'normal-approximation']);
    expect(counts.tieTolerance).toBe(0);
  });
});

/** erf by its Maclaurin series (enough terms for |x| < 3), for the hand check above. */
function erf(x: number): number {
  let sum = 0;
  let term = x;
  for (let n = 0; n < 200; n++) {
    sum += term / (2 * n + 1);
    term *= (-x * x) / (n + 1);
  }
  return (2 / Math.sqrt(Math.PI)) * sum;
}
