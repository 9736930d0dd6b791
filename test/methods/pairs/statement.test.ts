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
