import { describe, expect, test } from 'vitest';
import { analysePairs } from '../../../src/core/pairsAnalysis';
import { pairsSummary } from '../../../src/methods/pairs/summary';
import { PAIRS_REFERENCES, pairsStatement } from '../../../src/methods/pairs/statement';
import { readReferenceJson } from '../../support/reference';

const rosenbaum = readReferenceJson('rosenbaum.json');
const study = { finding: 'A fictional finding', exposure: 'cycling to work', outcome: 'blood pressure', units: 'mmHg', source: 'invented' };
// R 4.2.2 (rosenbaum.json, small_n15): signed-rank sensitivity value 1.6118… (exact), shown floored to 1.611
const summary = pairsSummary(analysePairs({ data: { kind: 'differences', differences: rosenbaum.datasets.small_n15.differences }, method: 'exact' }));

describe('pairsStatement', () => {
  const cited: string[] = [];
  const part = pairsStatement(summary, study, (r) => {
    cited.push(r);
    return `[${cited.length}]`;
  })!;
  test('states the tipping Γ, the test and the estimate with its references', () => {
    expect(part.paragraph).toContain('In 15 matched pairs, a one-sided Wilcoxon signed-rank test of the hypothesis that cycling to work raises blood pressure');
    expect(part.paragraph).toContain('up to Γ = 1.611 (exact bounding distribution)');
    expect(part.paragraph).toContain('The Hodges–Lehmann estimate of the effect is');
    expect(cited).toContain(PAIRS_REFERENCES.rosenbaum);
    expect(cited).toContain(PAIRS_REFERENCES.hodgesLehmann);
  });
  test('the conventions are listed apart, each a capitalised item ending with a full stop', () => {
    expect(part.assumptions.length).toBeGreaterThan(0);
    // The core's convention texts carry decimals ("1.3 − 1.2") and may be two sentences; one item, one line.
    for (const a of part.assumptions) expect(a).toMatch(/^[A-Z][^\n]*\.$/);
    expect(part.paragraph).not.toContain('assumes');
  });
  test('no p-value, no paragraph; never NaN, undefined or Infinity', () => {
    expect(pairsStatement({ ...summary, pValue: null }, study, () => '')).toBeNull();
    expect(part.paragraph).not.toMatch(/NaN|undefined|Infinity/);
  });
});

describe('pairsStatement wording', () => {
  const plainWords = readReferenceJson('plain_words_cases.json');
  const empty = { finding: '', exposure: '', outcome: '', units: '', source: '' };
  test('writes "p < 0.0001", never "p = < 0.0001" (R: exact signed-rank p of 30 positive pairs = 2^-30)', () => {
    const differences = Array.from({ length: 30 }, (_, i) => 0.5 * (i + 1));
    const part = pairsStatement(pairsSummary(analysePairs({ data: { kind: 'differences', differences }, method: 'exact' })), study, () => '[1]');
    expect(plainWords.pairs_tiny_p.p).toBeLessThan(1e-4);
    expect(part?.paragraph).toContain('gave p < 0.0001 in the absence of hidden bias');
    expect(part?.paragraph).not.toMatch(/p = [<>]/);
  });
  test('says "the odds of a higher outcome" when no outcome label was given (never "a higher the outcome")', () => {
    const part = pairsStatement(summary, empty, () => '[1]');
    expect(part?.paragraph).toMatch(/the odds of a higher outcome by/);
    expect(part?.paragraph).not.toMatch(/a higher the outcome/);
  });
  test('says first that the data point the other way, and offers the other direction (R: p = 0.99707, HL −0.85)', () => {
    const d = [-1.2, -0.5, 0.3, -2.1, -0.8, -1.1, 0.2, -0.9, -1.5, -0.65];
    const p = pairsSummary(analysePairs({ data: { kind: 'differences', differences: d }, method: 'exact', alternative: 'greater' }));
    expect(p.pValue).toBeCloseTo(plainWords.pairs_other_way.pGreater, 12);
    expect(p.estimate).toBeCloseTo(plainWords.pairs_other_way.hodgesLehmann, 12);
    const part = pairsStatement(p, study, () => '[1]');
    expect(part?.paragraph).toMatch(/^The data point the other way: the Hodges–Lehmann estimate, -0\.85 mmHg, is opposite in sign to the hypothesis that cycling to work raises blood pressure/);
    expect(part?.paragraph).toContain('the opposite direction would need its own, pre-specified test');
  });
  test('lists the result’s conventions among the assumptions, in the core’s words (Pratt’s rule included)', () => {
    const result = analysePairs({ data: { kind: 'differences', differences: [1.5, -0.5, 0, 2, 0, 3.5, -1, 2] }, zeroRule: 'pratt', method: 'exact' });
    const part = pairsStatement(pairsSummary(result), study, () => '[1]');
    for (const c of result.conventions) expect(part?.assumptions).toContain(c.text);
    expect(part?.assumptions.join(' ')).toMatch(/Pratt's rule/);
  });
});

describe('pairsStatement: the normal approximation’s measured error', () => {
  test('with more than 5,000 pairs the paragraph gives the reason for the normal approximation and its measured error', () => {
    // Invented differences (fictional): 6,000 pairs, a small shift; the error figure is the project's own measurement (NORMAL_APPROXIMATION_MEASURED_ERROR).
    const differences = Array.from({ length: 6000 }, (_, i) => ((i * 7919) % 1000) / 100 - 4.9);
    const result = analysePairs({ data: { kind: 'differences', differences } });
    expect(result.tailMethod).toBe('normal');
    const part = pairsStatement(pairsSummary(result), study, () => '[1]');
    expect(result.sensitivityValue).not.toBeNull();
    expect(part?.paragraph).toContain(result.tailMethodReason);
    expect(result.tailMethodReason).toMatch(/relative error was measured at up to 0\.7%/);
  });
});
