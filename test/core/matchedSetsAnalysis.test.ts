import { describe, expect, test } from 'vitest';
import fc from 'fast-check';
import { analyseMatchedSets, validateMatchedSets, type MatchedSetsInput } from '../../src/core/matchedSetsAnalysis';
import { InputError } from '../../src/core/inputProblem';
import { signTestBound } from '../../src/core/signTestBound';
import { amplifiedGamma } from '../../src/core/amplification';
import { expectClose } from '../support/expectClose';
import { readReferenceJson } from '../support/reference';

// All data sets in matched_sets.json are invented (fictional); the values come from an independent base-R
// implementation of the same conventions (test/reference/generators/matched_sets.R, R 4.2.2).
const reference = readReferenceJson('matched_sets.json');
const continuous: any[] = reference.continuous;
const binary: any[] = reference.binary;
const rowsOf = (ds: any): MatchedSetsInput => ({ setIds: ds.setIds, treated: ds.treated, outcomes: ds.outcomes });

describe('reference values through the whole analysis (continuous outcomes)', () => {
  test.each(continuous.map((ds) => [ds.name, ds] as const))('%s: σ, T, p-bounds, estimates, intervals and Γ* agree with R', (_name, ds) => {
    // R 4.2.2 base, matched_sets.R (plain loops; pnorm; uniroot with tol 1e-13)
    const result = analyseMatchedSets({ ...rowsOf(ds), alternative: ds.alternative, gammas: reference.gammas });
    expect(result.outcomeKind).toBe('continuous');
    expect(result.counts.setsUsed).toBe(ds.sets_used);
    expectClose(result.scale!, ds.sigma, { rel: 1e-15 }, 'σ');
    expectClose(result.statistic, ds.statistic, { rel: 1e-12 }, 'T');
    expectClose(result.estimate!, ds.estimate, { rel: 1e-6, abs: 1e-9 }, 'estimate');
    result.rows.forEach((row, i) => {
      const r = ds.rows[i];
      const at = `Γ = ${row.gamma}`;
      expect(row.gamma).toBe(r.gamma);
      expectClose(row.pUpper, r.p_upper, { rel: 1e-8 }, `pUpper ${at}`);
      expectClose(row.pLower, r.p_lower, { rel: 1e-8 }, `pLower ${at}`);
      expectClose(row.expectation, r.expectation, { rel: 1e-8, abs: 1e-12 }, `E ${at}`);
      expectClose(row.variance, r.variance, { rel: 1e-8 }, `V ${at}`);
      expectClose(row.estimateLow!, r.estimate_low, { rel: 1e-6, abs: 1e-9 }, `estimateLow ${at}`);
      expectClose(row.estimateHigh!, r.estimate_high, { rel: 1e-6, abs: 1e-9 }, `estimateHigh ${at}`);
      for (const [mine, theirs, label] of [
        [row.intervalLow, r.interval_low, 'intervalLow'],
        [row.intervalHigh, r.interval_high, 'intervalHigh'],
      ] as const) {
        if (theirs === null) expect(mine, `${label} ${at}`).toBeNull();
        else expectClose(mine!, theirs, { rel: 1e-6, abs: 1e-9 }, `${label} ${at}`);
      }
    });
    if (ds.sensitivity_value === null) expect(result.sensitivityStatus).toBe('not-significant');
    else {
      expect(result.sensitivityStatus).toBe('found');
      expectClose(result.sensitivityValue!, ds.sensitivity_value, { rel: 1e-6 }, 'Γ*');
    }
  });

  test('a missing control outcome is left out and counted; a set without its treated outcome is dropped and named', () => {
    // matched_sets.R: fictional_b_missing has one control outcome and one treated outcome set to NA
    const ds = continuous.find((d) => d.name === 'fictional_b_missing');
    const result = analyseMatchedSets(rowsOf(ds));
    expect(result.counts.missingOutcomes).toBe(2);
    expect(result.counts.setsGiven).toBe(25);
    expect(result.counts.setsUsed).toBe(ds.sets_used);
    const dropped = result.counts.setsDropped.find((d) => d.code === 'missing-treated-outcome');
    expect(dropped?.ids).toEqual(['s7']);
    expect(result.warnings.join(' ')).toMatch(/2 rows have no outcome/);
    expect(result.counts.controlsPerSet.reduce((n, c) => n + c.sets, 0)).toBe(result.counts.setsUsed);
  });
});

describe('reference values through the whole analysis (binary outcomes)', () => {
  test.each(binary.map((ds) => [ds.name, ds] as const))('%s: exact and normal tails and Γ* agree with R', (_name, ds) => {
    // R 4.2.2 base, matched_sets.R: exact tail by convolving Bernoullis, normal by pnorm; uniroot for Γ*
    for (const tail of ['exact', 'normal'] as const) {
      const result = analyseMatchedSets({ ...rowsOf(ds), gammas: reference.gammas, tail });
      expect(result.outcomeKind).toBe('binary');
      expect(result.tail).toBe(tail);
      expect(result.statistic).toBe(ds.statistic);
      expect(result.counts.informativeSets).toBe(ds.informative_sets);
      expect(result.counts.uninformativeSets).toBe(ds.uninformative_sets);
      result.rows.forEach((row, i) => {
        const r = ds.rows[i];
        expectClose(row.pUpper, tail === 'exact' ? r.p_upper_exact : r.p_upper_normal, { rel: 1e-8 }, `${tail} pUpper Γ = ${row.gamma}`);
        if (tail === 'exact') expectClose(row.pLower, r.p_lower_exact, { rel: 1e-8 }, `pLower Γ = ${row.gamma}`);
        expectClose(row.expectation, r.expectation, { rel: 1e-12 });
        expectClose(row.variance, r.variance, { rel: 1e-12 });
        expect(row.estimateLow).toBeNull();
        expect(row.intervalHigh).toBeNull();
      });
      expectClose(result.sensitivityValue!, tail === 'exact' ? ds.sensitivity_value_exact : ds.sensitivity_value_normal, { rel: 1e-6 }, 'Γ*');
      expect(result.estimate).toBeNull();
      expect(result.scale).toBeNull();
    }
  });

  test('1:1 binary pairs: the bounds are binomial tails (R pbinom) and equal the sign-test (McNemar) bounds', () => {
    // R 4.2.2: pbinom(T − 1, D, Γ/(1 + Γ), lower.tail = FALSE), matched_sets.R pbinom_check
    const ds = binary.find((d) => d.name === 'fictional_binary_pairs');
    const result = analyseMatchedSets({ ...rowsOf(ds), gammas: reference.gammas });
    result.rows.forEach((row, i) => {
      expectClose(row.pUpper, ds.pbinom_check[i].pbinom_upper, { rel: 1e-12 });
      expectClose(row.pLower, ds.pbinom_check[i].pbinom_lower, { rel: 1e-12 });
      const sign = signTestBound(result.statistic, result.counts.informativeSets!, row.gamma, { method: 'exact' });
      expectClose(row.pUpper, sign.pUpper, { rel: 1e-12 });
    });
  });
});

describe('1:1 continuous data give the pair-matched m-test', () => {
  test('T, E, V and the upper p-bound equal the pair formula ψ(d/σ), |ψ|(Γ − 1)/(Γ + 1), ψ²·4Γ/(1 + Γ)²', () => {
    // R 4.2.2 base: the pair-matched m-statistic written directly from its formula (matched_sets.R pair_case)
    const ds = reference.pairs;
    const result = analyseMatchedSets({ ...rowsOf(ds), gammas: reference.gammas });
    expectClose(result.scale!, ds.sigma, { rel: 1e-15 });
    expectClose(result.statistic, ds.statistic, { rel: 1e-12 });
    result.rows.forEach((row, i) => {
      expectClose(row.expectation, ds.rows[i].expectation, { rel: 1e-12, abs: 1e-14 });
      expectClose(row.variance, ds.rows[i].variance, { rel: 1e-12 });
      expectClose(row.pUpper, ds.rows[i].p_upper, { rel: 1e-10 });
    });
  });
});

describe('special values', () => {
  const a = continuous.find((d) => d.name === 'fictional_a');
  const d = continuous.find((x) => x.name === 'fictional_d_large_effect');

  test('at Γ = 1 both bounds are the same p-value and the estimate range is the point estimate', () => {
    const result = analyseMatchedSets({ ...rowsOf(d), gammas: [1, 2] });
    const row = result.rows[0];
    expect(row.pUpper).toBe(row.pLower);
    expect(row.pUpper).toBe(result.pValue);
    expect(row.estimateLow).toBe(result.estimate);
    expect(row.estimateHigh).toBe(result.estimate);
    expect(result.rows[1].estimateLow!).toBeLessThan(result.estimate!);
    expect(result.rows[1].estimateHigh!).toBeGreaterThan(result.estimate!);
  });

  test('not significant at Γ = 1 → no sensitivity value, status not-significant, a warning, no amplification', () => {
    const result = analyseMatchedSets(rowsOf(a));
    expect(result.sensitivityValue).toBeNull();
    expect(result.sensitivityStatus).toBe('not-significant');
    expect(result.amplification).toEqual([]);
    expect(result.warnings.join(' ')).toMatch(/not significant/);
  });

  test('the amplification pairs reproduce the sensitivity value: Γ = (ΛΔ + 1)/(Λ + Δ)', () => {
    const result = analyseMatchedSets(rowsOf(d));
    expect(result.amplification.length).toBeGreaterThan(0);
    for (const { lambda, delta } of result.amplification) expectClose(amplifiedGamma(lambda, delta), result.sensitivityValue!, { rel: 1e-12 });
  });

  test('the default Γ grid runs from 1 to just past the sensitivity value', () => {
    const result = analyseMatchedSets(rowsOf(d));
    expect(result.rows[0].gamma).toBe(1);
    expect(result.rows.at(-1)!.gamma).toBeGreaterThan(result.sensitivityValue!);
    expect(result.rows.at(-2)!.gamma).toBeLessThanOrEqual(result.sensitivityValue!);
  });

  test('few sets: an interval end that no shift can reject is null, with a warning, never ±Infinity', () => {
    // Two 1:1 pairs: (T − E)/√V tops out at √(2/Γ) < 1.96, so neither end of the interval exists.
    const result = analyseMatchedSets({ setIds: ['p', 'p', 'q', 'q'], treated: [1, 0, 1, 0], outcomes: [3, 1, 2, 1.5], gammas: [1, 2] });
    for (const row of result.rows) {
      expect(row.intervalLow).toBeNull();
      expect(row.intervalHigh).toBeNull();
      expect(Number.isFinite(row.estimateLow!)).toBe(true);
    }
    expect(result.warnings.join(' ')).toMatch(/no lower end/);
  });

  test('alternative less mirrors greater on negated outcomes; the estimates stay on the original scale', () => {
    const negated = { ...rowsOf(d), outcomes: d.outcomes.map((y: number | null) => (y === null ? null : -y)) };
    const less = analyseMatchedSets({ ...negated, alternative: 'less', gammas: [1, 1.5, 3] });
    const greater = analyseMatchedSets({ ...rowsOf(d), gammas: [1, 1.5, 3] });
    // equal up to the order of summation (the controls of a set are held in ascending order)
    expectClose(less.statistic, greater.statistic, { rel: 1e-14 });
    less.rows.forEach((row, i) => {
      expectClose(row.pUpper, greater.rows[i].pUpper, { rel: 1e-12 });
      expectClose(row.estimateLow!, -greater.rows[i].estimateHigh!, { rel: 1e-9, abs: 1e-9 });
    });
    expectClose(less.estimate!, -greater.estimate!, { rel: 1e-9 });
  });

  test('binary alternative less swaps events and non-events', () => {
    const ds = binary.find((x) => x.name === 'fictional_binary_mixed');
    const flipped = { ...rowsOf(ds), outcomes: ds.outcomes.map((y: number) => 1 - y) };
    const less = analyseMatchedSets({ ...flipped, alternative: 'less', gammas: [1, 2] });
    const greater = analyseMatchedSets({ ...rowsOf(ds), gammas: [1, 2] });
    expect(less.rows).toEqual(greater.rows);
  });

  test('outcomeKind continuous on 0/1 data with a positive scale uses the m-statistic', () => {
    // half the sets discordant in the treated unit's favour: median |difference| = 1
    const result = analyseMatchedSets({
      setIds: ['a', 'a', 'b', 'b', 'c', 'c', 'd', 'd'],
      treated: [1, 0, 1, 0, 1, 0, 1, 0],
      outcomes: [1, 0, 1, 0, 1, 0, 0, 0],
      outcomeKind: 'continuous',
    });
    expect(result.outcomeKind).toBe('continuous');
    expect(result.scale).toBe(1);
  });

  test('nothing in the result is NaN, undefined or infinite; the result is frozen and self-describing', () => {
    for (const ds of [...continuous, ...binary]) {
      const result = analyseMatchedSets(rowsOf(ds));
      const walk = (x: unknown, path: string): void => {
        if (typeof x === 'number') expect(Number.isFinite(x), path).toBe(true);
        else if (x === undefined) throw new Error(`undefined at ${path}`);
        else if (x && typeof x === 'object') {
          expect(Object.isFrozen(x), path).toBe(true);
          for (const [k, v] of Object.entries(x)) walk(v, `${path}.${k}`);
        }
      };
      walk(result, ds.name);
      expect(result.method).toMatch(/matched sets/);
      expect(result.references.length).toBeGreaterThan(0);
      expect(result.conventions.length).toBeGreaterThan(3);
    }
  });
});

describe('invariants', () => {
  /** Small matched-set studies: 2–8 sets with 1–4 controls, outcomes on a 1/8 grid (exact in binary). */
  const studies = fc
    .array(fc.tuple(fc.integer({ min: -80, max: 80 }), fc.array(fc.integer({ min: -80, max: 80 }), { minLength: 1, maxLength: 4 })), {
      minLength: 2,
      maxLength: 8,
    })
    .map((sets) => {
      const setIds: string[] = [];
      const treated: number[] = [];
      const outcomes: number[] = [];
      sets.forEach(([t, controls], s) => {
        setIds.push(`set ${s}`);
        treated.push(1);
        outcomes.push(t / 8 + 1.5);
        for (const c of controls) {
          setIds.push(`set ${s}`);
          treated.push(0);
          outcomes.push(c / 8);
        }
      });
      return { setIds, treated, outcomes, outcomeKind: 'continuous' as const };
    })
    .filter((input) => validateMatchedSets(input).length === 0);
  const grid = [1, 1.1, 1.5, 2, 3, 5, 10];

  test('the upper p-bound rises and the lower falls as Γ grows', () => {
    fc.assert(
      fc.property(studies, (input) => {
        const rows = analyseMatchedSets({ ...input, gammas: grid }).rows;
        for (let i = 1; i < rows.length; i++) {
          expect(rows[i].pUpper).toBeGreaterThanOrEqual(rows[i - 1].pUpper * (1 - 1e-12));
          expect(rows[i].pLower).toBeLessThanOrEqual(rows[i - 1].pLower * (1 + 1e-12));
          expect(rows[i].estimateLow!).toBeLessThanOrEqual(rows[i - 1].estimateLow! + 1e-9);
          expect(rows[i].estimateHigh!).toBeGreaterThanOrEqual(rows[i - 1].estimateHigh! - 1e-9);
        }
      }),
      { numRuns: 60 },
    );
  });

  test('shifting every outcome by a constant changes neither σ, T nor the bounds; the estimates do not move', () => {
    fc.assert(
      fc.property(studies, fc.integer({ min: -1000, max: 1000 }), (input, shift) => {
        const base = analyseMatchedSets({ ...input, gammas: [1, 2] });
        const moved = analyseMatchedSets({ ...input, outcomes: input.outcomes.map((y) => y + shift), gammas: [1, 2] });
        expect(moved.scale).toBe(base.scale);
        expect(moved.statistic).toBe(base.statistic);
        moved.rows.forEach((row, i) => expect(row.pUpper).toBe(base.rows[i].pUpper));
        expectClose(moved.estimate!, base.estimate!, { abs: 1e-9 });
      }),
      { numRuns: 60 },
    );
  });

  test('scaling the outcomes by k > 0 scales σ and the estimates by k and leaves T and p unchanged', () => {
    fc.assert(
      fc.property(studies, fc.constantFrom(0.25, 0.5, 2, 8, 1024), fc.double({ min: 0.01, max: 100, noNaN: true }), (input, k, any) => {
        // powers of two: exact in binary floating point
        const base = analyseMatchedSets({ ...input, gammas: [1, 2] });
        const scaled = analyseMatchedSets({ ...input, outcomes: input.outcomes.map((y) => y * k), gammas: [1, 2] });
        expect(scaled.scale).toBe(base.scale! * k);
        expect(scaled.statistic).toBe(base.statistic);
        scaled.rows.forEach((row, i) => expect(row.pUpper).toBe(base.rows[i].pUpper));
        expectClose(scaled.estimate!, base.estimate! * k, { rel: 1e-9, abs: 1e-9 * k });
        // any other factor: equal up to rounding
        const other = analyseMatchedSets({ ...input, outcomes: input.outcomes.map((y) => y * any), gammas: [1, 2] });
        expectClose(other.scale!, base.scale! * any, { rel: 1e-12 });
        other.rows.forEach((row, i) => expectClose(row.pUpper, base.rows[i].pUpper, { rel: 1e-9, abs: 1e-15 }));
      }),
      { numRuns: 60 },
    );
  });

  test('shuffling the rows gives identical results', () => {
    fc.assert(
      fc.property(studies, fc.integer({ min: 1, max: 2 ** 31 - 1 }), (input, seed) => {
        const order = input.setIds.map((_, i) => i);
        let state = seed;
        for (let i = order.length - 1; i > 0; i--) {
          state = (Math.imul(state, 1103515245) + 12345) >>> 0;
          const j = state % (i + 1);
          [order[i], order[j]] = [order[j], order[i]];
        }
        const shuffled = {
          ...input,
          setIds: order.map((i) => input.setIds[i]),
          treated: order.map((i) => input.treated[i]),
          outcomes: order.map((i) => input.outcomes[i]),
        };
        expect(analyseMatchedSets(shuffled)).toEqual(analyseMatchedSets(input));
      }),
      { numRuns: 60 },
    );
  });

  test('shuffling the rows of the reference data sets gives identical results', () => {
    for (const ds of [...continuous, ...binary]) {
      const n = ds.setIds.length;
      const order = Array.from({ length: n }, (_, i) => (i * 7 + 3) % n);
      if (new Set(order).size !== n) continue;
      const pick = (col: any[]) => order.map((i) => col[i]);
      const shuffled = { setIds: pick(ds.setIds), treated: pick(ds.treated), outcomes: pick(ds.outcomes) };
      expect(analyseMatchedSets(shuffled), ds.name).toEqual(analyseMatchedSets(rowsOf(ds)));
    }
  });
});

describe('validation', () => {
  const ok: MatchedSetsInput = { setIds: ['a', 'a', 'b', 'b', 'b'], treated: [1, 0, 1, 0, 0], outcomes: [3, 1, 4, 2, 1.5] };
  const codes = (input: MatchedSetsInput) => validateMatchedSets(input).map((p) => p.code);

  test('a valid input has no problems', () => {
    expect(validateMatchedSets(ok)).toEqual([]);
  });

  test('sets without a control are named', () => {
    const problems = validateMatchedSets({ setIds: ['a', 'a', 'b', 'c', 'c'], treated: [1, 0, 1, 1, 0], outcomes: [1, 2, 3, 4, 5] });
    expect(problems.map((p) => p.code)).toEqual(['set-without-control']);
    expect(problems[0].message).toMatch(/set b\b/);
  });

  test('sets with several treated units: one message, naming them, saying the layout is not supported', () => {
    const problems = validateMatchedSets({ setIds: ['a', 'a', 'a', 'b', 'b'], treated: [1, 1, 0, 1, 0], outcomes: [1, 2, 3, 4, 5] });
    expect(problems.map((p) => p.code)).toEqual(['several-treated']);
    expect(problems[0].message).toMatch(/\(set a\);/);
    expect(problems[0].message).toMatch(/several treated with one control is not supported/);
  });

  test('long lists name ten sets and say how many more', () => {
    const ids = Array.from({ length: 14 }, (_, i) => `k${String(i).padStart(2, '0')}`);
    const problems = validateMatchedSets({ setIds: [...ids, 'z', 'z'], treated: [...ids.map(() => 1), 1, 0], outcomes: [...ids.map(() => 1), 1, 2] });
    expect(problems[0].message).toMatch(/k00, k01, .*k09 and 4 more/);
  });

  test('treated values other than 0/1, missing set ids and non-numeric outcomes are each reported once with a count', () => {
    const problems = validateMatchedSets({
      setIds: ['a', 'a', '', 'b', 'b', 'b'],
      treated: [1, 2, 0, 1, 0, 0],
      outcomes: [1, 2, 3, 4, Infinity, 'x' as unknown as number],
    });
    expect(problems.map((p) => p.code)).toEqual(['missing-set-id', 'not-zero-one', 'not-a-number']);
    expect(problems[1].message).toMatch(/1 row is neither \(row 2\)/);
    expect(problems[2].message).toMatch(/2 outcomes are not a finite number \(row 5, 6\)/);
  });

  test('non-numeric outcomes alone give one problem with their count, nothing else', () => {
    const problems = validateMatchedSets({ ...ok, outcomes: [3, 'n/a' as unknown as number, 4, 2, Infinity] });
    expect(problems.map((p) => p.code)).toEqual(['not-a-number']);
    expect(problems[0].message).toMatch(/^2 outcomes are not a finite number \(row 2, 5\)/);
  });

  test('a single set, all outcomes equal, and a zero scale are refused with plain reasons', () => {
    expect(codes({ setIds: ['a', 'a'], treated: [1, 0], outcomes: [1, 2] })).toEqual(['too-few-sets']);
    expect(codes({ ...ok, outcomes: [2, 2, 2, 2, 2] })).toEqual(['all-equal']);
    const zero = validateMatchedSets({
      setIds: ['a', 'a', 'b', 'b', 'c', 'c'],
      treated: [1, 0, 1, 0, 1, 0],
      outcomes: [1.5, 1.5, 2, 2, 3, 1],
    });
    expect(zero.map((p) => p.code)).toEqual(['zero-scale']);
    expect(zero[0].message).toMatch(/more than half/);
  });

  test('missing outcomes that leave fewer than two sets are refused', () => {
    expect(codes({ ...ok, outcomes: [3, null, 4, 2, 1.5] })).toEqual(['too-few-sets']);
  });

  test('binary: non-0/1 outcomes when binary is asked for, and no informative set, are refused', () => {
    expect(codes({ ...ok, outcomeKind: 'binary' })).toEqual(['not-binary']);
    expect(codes({ setIds: ['a', 'a', 'b', 'b'], treated: [1, 0, 1, 0], outcomes: [1, 1, 0, 0] })).toEqual(['no-informative-sets']);
  });

  test('options: Γ below 1, α outside (0, 0.5], bad trim and unknown choices', () => {
    const problems = validateMatchedSets({
      ...ok,
      gammas: [1, 0.5, NaN],
      alpha: 0.6,
      trim: 0,
      alternative: 'two' as never,
      outcomeKind: 'count' as never,
      tail: 'mid' as never,
    });
    expect(problems.map((p) => `${p.field}:${p.code}`)).toEqual([
      'alternative:not-a-choice',
      'outcomeKind:not-a-choice',
      'tail:not-a-choice',
      'alpha:outside-interval',
      'trim:not-positive',
      'gammas[1]:below-one',
      'gammas[2]:not-finite',
    ]);
    expect(codes({ ...ok, alpha: 0 })).toEqual(['outside-interval']);
    expect(codes({ ...ok, alpha: 0.5 })).toEqual([]);
    expect(codes({ ...ok, gammas: [] })).toEqual(['empty']);
  });

  test('columns of different lengths or missing columns are refused', () => {
    expect(codes({ ...ok, outcomes: [1, 2] })).toEqual(['unequal-length']);
    expect(codes({ ...ok, treated: undefined as never })).toEqual(['missing']);
  });

  test('analyseMatchedSets throws an InputError carrying every problem', () => {
    try {
      analyseMatchedSets({ ...ok, alpha: 2, gammas: [0] });
      expect.unreachable();
    } catch (e) {
      expect(e).toBeInstanceOf(InputError);
      expect((e as InputError).problems.map((p) => p.code)).toEqual(['outside-interval', 'below-one']);
    }
  });
});

describe('non-mutation', () => {
  test('frozen inputs are accepted and left unchanged', () => {
    const ds = continuous.find((d) => d.name === 'fictional_b_missing');
    const input = Object.freeze({
      setIds: Object.freeze([...ds.setIds]),
      treated: Object.freeze([...ds.treated]),
      outcomes: Object.freeze([...ds.outcomes]),
      gammas: Object.freeze([1, 2]),
    });
    const copy = JSON.stringify(input);
    analyseMatchedSets(input);
    expect(JSON.stringify(input)).toBe(copy);
  });
});
