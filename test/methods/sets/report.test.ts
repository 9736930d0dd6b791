import { describe, expect, test } from 'vitest';
import { analyseMatchedSets } from '../../../src/core/matchedSetsAnalysis';
import { analysePairs } from '../../../src/core/pairsAnalysis';
import { pairsReport } from '../../../src/methods/pairs/report';
import { setsAmplificationPlot, setsEstimatePlot, setsPValuePlot } from '../../../src/methods/sets/plots';
import { setsReport } from '../../../src/methods/sets/report';
import { setsTable } from '../../../src/methods/sets/text';
import { renderSvgString } from '../../../src/plot/svgString';
import { readReferenceJson } from '../../support/reference';

const reference = readReferenceJson('matched_sets.json');
const byName = (name: string) => [...reference.continuous, ...reference.binary].find((d: { name: string }) => d.name === name);
const analyse = (name: string, extra: Record<string, unknown> = {}) => {
  const ds = byName(name);
  return analyseMatchedSets({ setIds: ds.setIds, treated: ds.treated, outcomes: ds.outcomes, gammas: reference.gammas, alternative: ds.alternative, ...extra });
};

describe('JSON report', () => {
  test('has the shape of lurk pairs --json: the same keys in the same order, plus the matched-sets fields', () => {
    const pairsKeys = Object.keys(pairsReport(analysePairs({ data: { kind: 'differences', differences: [1, 2, 3, -1, 2.5] } })).json as object);
    const setsJson = setsReport(analyse('fictional_d_large_effect')).json as Record<string, unknown>;
    const shared = pairsKeys.filter((k) => k in setsJson);
    expect(shared).toEqual(
      ['method', 'alternative', 'alpha', 'tailMethod', 'statistic', 'pValue', 'sensitivityValue', 'sensitivityStatus', 'searchedUpTo', 'rows', 'estimate', 'conventions', 'intervalLevel', 'estimates', 'amplification', 'warnings', 'notes', 'references', 'reading', 'caution'],
    );
    expect(Object.keys(setsJson).filter((k) => pairsKeys.includes(k))).toEqual(shared);
    expect(Object.keys((setsJson.rows as object[])[0])).toEqual(['gamma', 'pUpper', 'pLower', 'expectation', 'variance']);
    expect(Object.keys((setsJson.estimates as object[])[0])).toEqual(['gamma', 'estimateLow', 'estimateHigh', 'intervalLow', 'intervalHigh']);
    expect(setsJson.conventions).toEqual(analyse('fictional_d_large_effect').conventions);
  });

  test('the reader’s notes come first among the warnings; the caution is included', () => {
    const json = setsReport(analyse('fictional_b_missing'), ['1 short row was padded.']).json as { warnings: string[]; caution: string };
    expect(json.warnings[0]).toBe('1 short row was padded.');
    expect(json.warnings.join(' ')).toMatch(/2 rows have no outcome/);
    expect(json.caution).toMatch(/does not prove causation/);
  });

  test('JSON never holds NaN or Infinity (unbounded interval ends are null)', () => {
    for (const name of ['fictional_a', 'fictional_binary_pairs']) {
      const text = JSON.stringify(setsReport(analyse(name, { gammas: [1, 2, 5, 20] })).json);
      expect(text).not.toMatch(/NaN|Infinity/);
    }
  });
});

describe('text report', () => {
  test('states every convention of the result, the references, the counts and the caution', () => {
    for (const name of ['fictional_d_large_effect', 'fictional_binary_mixed']) {
      const result = analyse(name);
      const { text } = setsReport(result);
      for (const convention of result.conventions) expect(text).toContain(convention.text);
      for (const ref of result.references) expect(text).toContain(ref);
      expect(text).toMatch(/does not prove causation/);
      expect(text).not.toMatch(/NaN|undefined|Infinity/);
    }
    expect(setsReport(analyse('fictional_d_large_effect')).text).toMatch(/14 matched sets \(1 to 4 controls each\), 52 units used/);
  });

  test('a result that is not significant at Γ = 1 says so first', () => {
    // fictional_a: p = 0.0644 at Γ = 1 in the R base reference, above α = 0.05
    const { text } = setsReport(analyse('fictional_a'));
    expect(text).toMatch(/Tipping Γ \(sensitivity value\): none \(not significant at Γ = 1\)/);
    expect(text).toMatch(/Even with no hidden bias/);
    expect(text).toMatch(/unbounded|to/);
  });

  test('the table has plain column names, with estimates only for a continuous outcome', () => {
    expect(setsTable(analyse('fictional_d_large_effect')).header).toEqual(['Γ', 'worst-case p', 'best-case p', 'smallest effect estimate', 'largest effect estimate', '95% interval']);
    expect(setsTable(analyse('fictional_binary_mixed')).header).toEqual(['Γ', 'worst-case p', 'best-case p']);
  });
});

describe('plots', () => {
  test('p-value bounds, estimate range and amplification for a continuous outcome; no estimate plot for a binary one', () => {
    // The default Γ grid runs to just past the tipping Γ, so the plot can mark it.
    const r = analyse('fictional_d_large_effect', { gammas: undefined });
    const p = setsPValuePlot(r);
    expect(p.id).toBe('sets-p-value-by-gamma');
    expect(p.marks.some((m) => m.kind === 'text' && m.text === 'tipping Γ = 8.804')).toBe(true);
    expect(setsEstimatePlot(r)!.id).toBe('sets-estimate-range');
    expect(setsAmplificationPlot(r)!.id).toBe('sets-amplification');
    const b = analyse('fictional_binary_mixed');
    expect(setsEstimatePlot(b)).toBeNull();
    for (const spec of [p, setsEstimatePlot(r)!, setsAmplificationPlot(r)!, setsPValuePlot(b)]) expect(renderSvgString(spec) + JSON.stringify(spec.table)).not.toMatch(/NaN|Infinity|undefined/);
  });

  test('unbounded interval ends are drawn to the edge and read "unbounded" in the table', () => {
    const r = analyse('fictional_a', { gammas: [1, 3, 10] });
    const spec = setsEstimatePlot(r)!;
    expect(JSON.stringify(spec.table.rows)).toMatch(/unbounded/);
    expect(renderSvgString(spec)).not.toMatch(/NaN|Infinity/);
  });
});
