import { describe, expect, test } from 'vitest';
import { analysePairs } from '../../../src/core/pairsAnalysis';
import { pairsSummary } from '../../../src/methods/pairs/summary';
import { pairsBottomLine } from '../../../src/methods/pairs/bottomLine';
import { readReferenceJson } from '../../support/reference';

const rosenbaum = readReferenceJson('rosenbaum.json');
const study = { finding: 'A fictional finding', exposure: 'cycling to work', outcome: 'blood pressure', units: 'mmHg', source: 'invented' };
// R 4.2.2 (rosenbaum.json, small_n15): signed-rank sensitivity value 1.6118… (exact), shown floored to 1.611
const summary = pairsSummary(analysePairs({ data: { kind: 'differences', differences: rosenbaum.datasets.small_n15.differences }, method: 'exact' }));

describe('pairsBottomLine', () => {
  test('in plain words: what would and would not overturn the matched comparison', () => {
    const line = pairsBottomLine(summary, study);
    expect(line.howStrong[0]).toContain('by more than 1.611 to 1 (Γ = 1.611)');
    expect(line.wouldChange[0]).toContain('more than 1.611-fold');
    expect(line.wouldNotChange[0]).toContain('smaller than 1.611-fold');
    expect(line.comparedWithMeasured).toEqual([]);
  });
  test('not significant without hidden bias: says so; no p-value: nothing', () => {
    const weak = pairsBottomLine({ ...summary, sensitivityValue: null, sensitivityStatus: 'not-significant' }, study);
    expect(weak.howStrong[0]).toMatch(/not statistically significant even without hidden bias/);
    expect(pairsBottomLine({ ...summary, pValue: null }, study).howStrong).toEqual([]);
  });
});
