import { describe, expect, test } from 'vitest';
import { analysePairs } from '../../../src/core/pairsAnalysis';
import { pairsSummary, readPairsSummary, summarisePairs } from '../../../src/methods/pairs/summary';
import { pairsMethod } from '../../../src/methods/pairs/method';
import { expectClose } from '../../support/expectClose';
import { readReferenceJson } from '../../support/reference';

const rosenbaum = readReferenceJson('rosenbaum.json');
const result = analysePairs({ data: { kind: 'differences', differences: rosenbaum.datasets.small_n15.differences }, method: 'exact' });

describe('pairsSummary', () => {
  test('keeps the headline numbers of the result', () => {
    const summary = pairsSummary(result);
    // R 4.2.2 reference (test/reference/rosenbaum.json, small_n15): exact signed-rank sensitivity value
    expectClose(summary.sensitivityValue!, rosenbaum.datasets.small_n15.sensitivity_value.wilcoxon_exact, { rel: 1e-8 });
    expect(summary).toMatchObject({ kind: 'pairs', test: 'signrank', alternative: 'greater', n: 15, tailMethod: 'exact' });
  });
  test('an outcome without a result has no summary', () => {
    expect(summarisePairs({ result: null, read: null, problems: [], started: false })).toBeNull();
    expect(pairsMethod.workspace.summarise({ result, read: null, problems: [], started: true })).toEqual(pairsSummary(result));
  });
});

describe('readPairsSummary', () => {
  test('a saved summary reads back as it was written (through JSON)', () => {
    const saved = JSON.parse(JSON.stringify(pairsSummary(result)));
    expect(readPairsSummary(saved)).toEqual(pairsSummary(result));
  });
  test('another method’s summary or a field of the wrong type gives null', () => {
    const saved = JSON.parse(JSON.stringify(pairsSummary(result)));
    expect(readPairsSummary({ ...saved, kind: 'evalue' })).toBeNull();
    expect(readPairsSummary({ ...saved, pValue: '0.01' })).toBeNull();
    expect(readPairsSummary({ ...saved, sensitivityStatus: 'maybe' })).toBeNull();
    expect(readPairsSummary({ ...saved, rangeAt: { gamma: 'x' } })).toBeNull();
    expect(readPairsSummary({ ...saved, amplification: [{ lambda: 2 }] })).toBeNull();
    expect(readPairsSummary(null)).toBeNull();
  });
});
