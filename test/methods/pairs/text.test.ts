import { describe, expect, test } from 'vitest';
import fc from 'fast-check';
import { analysePairs } from '../../../src/core/pairsAnalysis';
import { formatGamma, factorWords, pairsReading, pairsReportText, pairsResultJson, pPhrase } from '../../../src/methods/pairs/text';

describe('formatting', () => {
  test('the tipping Γ is rounded down to 3 decimals, so the printed value still has p ≤ α', () => {
    expect(formatGamma(1.61183482643143)).toBe('1.611');
    expect(formatGamma(1.9999)).toBe('1.999');
    expect(formatGamma(2)).toBe('2.000');
    expect(formatGamma(null)).toBe('not available');
    expect(formatGamma(Infinity)).toBe('not available');
  });
  test('factors in words', () => {
    expect(factorWords(3)).toEqual({ verb: 'triples', by: '' });
    expect(factorWords(2.02)).toEqual({ verb: 'doubles', by: '' });
    expect(factorWords(6)).toEqual({ verb: 'multiplies', by: ' by 6' });
    expect(factorWords(2.83)).toEqual({ verb: 'multiplies', by: ' by 2.8' });
    expect(pPhrase(0.00001)).toBe('p < 0.0001');
    expect(pPhrase(0.0123)).toBe('p = 0.0123');
  });
});

describe('readings', () => {
  test('a significant finding: tipping Γ, amplification and the estimate range, with study labels', () => {
    const result = analysePairs({ data: { kind: 'differences', differences: [1.05, 1.3, -0.8, 0.29, 0.83, -0.53, 2.19, 1.62, 0.26, 1.26, 1.21, 0.51, -0.64, 0.42, 0.86] } });
    const text = pairsReading(result, { exposure: 'the new ward routine', outcome: 'recovery score', units: 'points' }).join(' ');
    expect(text).toMatch(/unless a hidden covariate makes matched units differ in their odds of the new ward routine by a factor of more than \d\.\d{3}/);
    expect(text).toMatch(/odds of a higher recovery score/);
    expect(text).toMatch(/points/);
  });
  test('not significant and unbounded intervals never print NaN, undefined or Infinity', () => {
    fc.assert(
      fc.property(fc.array(fc.integer({ min: -3, max: 3 }), { minLength: 2, maxLength: 8 }).filter((d) => d.filter((x) => x !== 0).length >= 2), (d) => {
        const result = analysePairs({ data: { kind: 'differences', differences: d } });
        const report = pairsReportText(result);
        expect(report).not.toMatch(/NaN|undefined|Infinity/);
        const json = JSON.stringify(pairsResultJson(result));
        expect(json).not.toMatch(/NaN|Infinity/);
      }),
      { numRuns: 80 },
    );
  });
  test('alternative less speaks of a lower outcome', () => {
    const result = analysePairs({ data: { kind: 'differences', differences: [-3, -2, -4, -5, -1, -6, -2.5, -3.5, 1, -7] }, alternative: 'less' });
    expect(pairsReading(result).join(' ')).toMatch(/treatment lowers the outcome/);
    expect(pairsReading(result).join(' ')).toMatch(/odds of a lower outcome/);
  });
});

describe('pairs text: defects fixed', () => {
  test('a zero Hodges–Lehmann estimate computed as 5.55e-17 prints as 0 (median of the Walsh averages = 0, R base)', () => {
    const result = analysePairs({ data: { kind: 'differences', differences: [1.1, 1.3, -0.7, -1.7] }, method: 'exact' });
    expect(result.estimate).not.toBe(0); // the floating-point value the core computes
    const text = pairsReportText(result);
    expect(text).toMatch(/Hodges–Lehmann estimate \(Γ = 1\): 0\n/);
    expect(text).not.toMatch(/\d\.\d+e-1[0-9]/); // no 5.55e-17 (the tie-tolerance convention writes "1e-10")
    expect(pairsResultJson(result).estimate).toBe(0);
  });
  test('data pointing the other way are said so, with the other direction offered (not a bare "not significant")', () => {
    const d = [-1.2, -0.5, 0.3, -2.1, -0.8, -1.1, 0.2, -0.9, -1.5, -0.65];
    const sentences = pairsReading(analysePairs({ data: { kind: 'differences', differences: d }, method: 'exact' }));
    expect(sentences[0]).toMatch(/^The data point the other way: the Hodges–Lehmann estimate is -0\.850/);
    expect(sentences[0]).toMatch(/choose the alternative "less"/);
  });
  test('the report lists the conventions and the JSON carries them with the zero rule and the tie tolerance', () => {
    const result = analysePairs({ data: { kind: 'differences', differences: [1.5, -0.5, 0, 2, 0, 3.5, -1, 2] }, zeroRule: 'pratt', method: 'exact' });
    const text = pairsReportText(result);
    expect(text).toContain('Conventions:');
    for (const c of result.conventions) expect(text).toContain(c.text);
    const json = pairsResultJson(result);
    expect(json.zeroRule).toBe('pratt');
    expect(json.conventions).toEqual(result.conventions);
    expect(json.tieTolerance).toBe(result.tieTolerance);
  });
});
