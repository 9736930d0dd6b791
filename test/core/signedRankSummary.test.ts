import { describe, expect, test } from 'vitest';
import fc from 'fast-check';
import { analysePairs, type PairsInput } from '../../src/core/pairsAnalysis';
import { signedRanks } from '../../src/core/signedRanks';
import { signedRanksFromSummary, validateSignedRankSummary, type SignedRankSummary } from '../../src/core/signedRankSummary';
import { InputError } from '../../src/core/inputProblem';
import { expectClose } from '../support/expectClose';
import { readReferenceJson } from '../support/reference';

const reference = readReferenceJson('rosenbaum.json');

/** The summary a database query gives for these differences (Wilcoxon's rule, exact ties). */
function summaryOf(differences: readonly number[]): SignedRankSummary {
  const r = signedRanks(differences);
  return { pairs: r.pairs, zeros: r.zeros, nonZero: r.nonZero, positive: r.positive, statistic: r.statistic, sumRanks: r.sumRanks, sumSquaredRanks: r.sumSquaredRanks };
}

function expectSameBounds(differences: readonly number[], settings: Omit<PairsInput, 'data'>) {
  const raw = analysePairs({ ...settings, data: { kind: 'differences', differences }, method: 'normal' });
  // Signed-rank: the summary's default (auto) is the normal approximation; the sign test stays exact unless asked.
  const method = settings.test === 'sign' ? 'normal' : undefined;
  const fromSummary = analysePairs({ ...settings, method, data: { kind: 'signed-rank-summary', ...summaryOf(differences) } });
  expect(fromSummary.tailMethod).toBe('normal');
  expect(fromSummary.rows.map((r) => r.gamma)).toEqual(raw.rows.map((r) => r.gamma));
  fromSummary.rows.forEach((row, i) => {
    expectClose(row.pUpper, raw.rows[i].pUpper, { rel: 1e-9 }, `upper Γ=${row.gamma}`);
    expectClose(row.pLower, raw.rows[i].pLower, { rel: 1e-9 }, `lower Γ=${row.gamma}`);
  });
  if (raw.sensitivityValue === null) expect(fromSummary.sensitivityValue).toBeNull();
  else expectClose(fromSummary.sensitivityValue!, raw.sensitivityValue, { rel: 1e-9 }, 'sensitivity value');
  expect(fromSummary.signTestSensitivityValue).toBe(raw.signTestSensitivityValue);
  expect(fromSummary.amplification.length).toBe(raw.amplification.length);
  fromSummary.amplification.forEach((a, i) => {
    expectClose(a.lambda, raw.amplification[i].lambda, { rel: 1e-9 });
    expectClose(a.delta, raw.amplification[i].delta, { rel: 1e-9 });
  });
  expect([fromSummary.n, fromSummary.zeroDifferences, fromSummary.nonZero, fromSummary.favourable, fromSummary.statistic]).toEqual([
    raw.n, raw.zeroDifferences, raw.nonZero, raw.favourable, raw.statistic,
  ]);
  return fromSummary;
}

describe('signed-rank summary: the same bounds as the normal approximation on the differences', () => {
  test.each(Object.entries<any>(reference.datasets))('%s (R 4.2.2 reference data, test/reference/rosenbaum.json)', (_name, ds) => {
    const result = expectSameBounds(ds.differences, { gammas: reference.gammas });
    // The R reference itself: the normal-approximation upper bounds of rosenbaum.json
    result.rows.forEach((row, i) => expectClose(row.pUpper, ds.by_gamma[i].wilcoxon_upper_normal, { rel: 1e-9 }));
  });

  test('ties, zeros, both alternatives, the sign test and a continuity correction (fictional data)', () => {
    const d = [0, 0, 1.5, 1.5, -1.5, 2, 3, 3, 3, -0.5, 4, 4.25, 5, 0, 6, 7, -2, 2, 8, 9];
    expectSameBounds(d, {});
    expectSameBounds(d, { alternative: 'less' });
    expectSameBounds(d, { test: 'sign' });
    expectSameBounds(d, { continuityCorrection: true, alpha: 0.1 });
  });
});

describe('signed-rank summary: what it cannot give', () => {
  const d = [1, 2, 2, 3, -1, 4, 5, 0, 6, 7];
  test('no Hodges–Lehmann estimate or range, and a warning that says why', () => {
    const result = analysePairs({ data: { kind: 'signed-rank-summary', ...summaryOf(d) } });
    expect(result.estimate).toBeNull();
    expect(result.estimates).toEqual([]);
    expect(result.warnings.join(' ')).toMatch(/Hodges–Lehmann estimate and its range .* need the differences themselves/);
  });
  test('exact tails requested: the normal approximation, with a warning', () => {
    const result = analysePairs({ data: { kind: 'signed-rank-summary', ...summaryOf(d) }, method: 'exact' });
    expect(result.tailMethod).toBe('normal');
    expect(result.warnings.join(' ')).toMatch(/exact tails need every rank/);
  });
  test("Pratt's rule requested: Wilcoxon's rule, with a warning", () => {
    const result = analysePairs({ data: { kind: 'signed-rank-summary', ...summaryOf(d) }, zeroRule: 'pratt' });
    expect(result.zeroRule).toBe('wilcoxon');
    expect(result.warnings.join(' ')).toMatch(/Pratt's rule needs the differences/);
  });
});

describe('signed-rank summary: invariants', () => {
  test('for any differences with ties and zeros, the summary gives the normal-approximation bounds of the differences', () => {
    fc.assert(
      fc.property(fc.array(fc.integer({ min: -6, max: 6 }), { minLength: 4, maxLength: 60 }), fc.constantFrom<'greater' | 'less'>('greater', 'less'), (ints, alternative) => {
        const d = ints.map((i) => i / 2);
        fc.pre(d.filter((x) => x !== 0).length >= 2);
        const raw = analysePairs({ data: { kind: 'differences', differences: d }, method: 'normal', alternative, gammas: [1, 1.5, 2, 3] });
        const s = analysePairs({ data: { kind: 'signed-rank-summary', ...summaryOf(d) }, alternative, gammas: [1, 1.5, 2, 3] });
        s.rows.forEach((row, i) => expectClose(row.pUpper, raw.rows[i].pUpper, { rel: 1e-9 }));
      }),
      { numRuns: 100 },
    );
  });
  test('the alternative "less" swaps the positive pairs and T for their complements', () => {
    const s = summaryOf([1, -2, 3, -4, 5]);
    const less = signedRanksFromSummary(s, -1);
    expect(less.positive).toBe(2);
    expect(less.statistic).toBe(s.sumRanks - s.statistic);
  });
});

describe('signed-rank summary: validation', () => {
  const good = summaryOf([1, 2, 2, -3, 0]);
  test('names each bad field', () => {
    expect(validateSignedRankSummary(good)).toEqual([]);
    expect(validateSignedRankSummary({ ...good, zeros: -1 }).map((p) => p.field)).toEqual(['data.zeros']);
    expect(validateSignedRankSummary({ ...good, sumRanks: Number.NaN }).map((p) => p.field)).toEqual(['data.sumRanks']);
    expect(validateSignedRankSummary({ ...good, sumRanks: 11 }).map((p) => p.field)).toEqual(['data.sumRanks']);
    expect(validateSignedRankSummary({ ...good, pairs: 9 }).map((p) => p.field)).toEqual(['data.pairs']);
    expect(validateSignedRankSummary({ ...good, sumSquaredRanks: 1000 }).map((p) => p.field)).toEqual(['data.sumSquaredRanks']);
    expect(validateSignedRankSummary({ ...good, positive: 7 }).map((p) => p.field)).toContain('data.positive');
  });
  test('fewer than two non-zero pairs is refused by the analysis', () => {
    const one = summaryOf([0, 0, 3]);
    expect(() => analysePairs({ data: { kind: 'signed-rank-summary', ...one } })).toThrow(InputError);
  });
  test('the input is not changed', () => {
    const input = Object.freeze({ data: Object.freeze({ kind: 'signed-rank-summary' as const, ...good }) });
    analysePairs(input);
    expect(input.data.statistic).toBe(good.statistic);
  });
});
