import { statementCitation } from '../../../src/format/citation';
import { describe, expect, test } from 'vitest';
import { analyseMatchedSets } from '../../../src/core/matchedSetsAnalysis';
import { setsBottomLine } from '../../../src/methods/sets/bottomLine';
import { setsStatement } from '../../../src/methods/sets/statement';
import { readSetsSummary, setsSummary } from '../../../src/methods/sets/summary';
import { readReferenceJson } from '../../support/reference';

const reference = readReferenceJson('matched_sets.json');
const byName = (name: string) => [...reference.continuous, ...reference.binary].find((d: { name: string }) => d.name === name);
const study = { finding: 'A fictional finding', exposure: 'the garden programme', outcome: 'wellbeing score', units: 'points', source: 'invented' };
const analyse = (name: string, extra: Record<string, unknown> = {}) => {
  const ds = byName(name);
  return analyseMatchedSets({ setIds: ds.setIds, treated: ds.treated, outcomes: ds.outcomes, alternative: ds.alternative, ...extra });
};
const citing = () => {
  const cited: string[] = [];
  return { cited, cite: (r: string) => (cited.includes(r) ? `[${cited.indexOf(r) + 1}]` : (cited.push(r), `[${cited.length}]`)) };
};

describe('setsStatement', () => {
  // fictional_d_large_effect: sensitivity value 8.8041… in the R base reference (matched_sets.json), shown floored
  const result = analyse('fictional_d_large_effect');
  const { cited, cite } = citing();
  const part = setsStatement(setsSummary(result), study, cite)!;

  test('states the sets, the test, the tipping Γ and the m-estimate', () => {
    expect(part.paragraph).toContain('In 14 matched sets, each with one treated unit and 1 to 4 controls, a one-sided m-statistic test with Huber’s ψ');
    expect(part.paragraph).toContain('up to Γ = 8.804');
    expect(part.paragraph).toContain('The m-estimate of the effect is 3.87 points');
    expect(part.paragraph).toMatch(/By amplification \[\d\]/);
  });

  test('cites the result’s own references, and only those', () => {
    // In the statement's reference style (src/format/citation.ts), built from the core's own list.
    expect([...cited].sort()).toEqual(result.references.map(statementCitation).sort());
  });

  test('its assumptions are the result’s conventions', () => {
    expect(part.assumptions).toEqual(result.conventions.map((c) => c.text));
  });

  test('a binary outcome names the event-count test and its tails; no estimate', () => {
    const b = setsStatement(setsSummary(analyse('fictional_binary_mixed')), study, citing().cite)!;
    expect(b.paragraph).toContain('the number of treated units with the event (exact tails)');
    expect(b.paragraph).not.toContain('m-estimate');
  });

  test('not significant at Γ = 1: says so and reports no sensitivity value', () => {
    // fictional_a: p = 0.0644 at Γ = 1 in the R base reference, above α = 0.05
    const p = setsStatement(setsSummary(analyse('fictional_a')), study, citing().cite)!;
    expect(p.paragraph).toContain('The finding is not significant at α = 0.05 even without hidden bias, so no sensitivity value is reported.');
    expect(p.paragraph).not.toMatch(/NaN|undefined|Infinity/);
  });
});

describe('setsBottomLine', () => {
  test('a tipping Γ: how strong, what would and what would not change it', () => {
    const line = setsBottomLine(setsSummary(analyse('fictional_d_large_effect')), study);
    expect(line.howStrong[0]).toMatch(/by more than 8\.804 to 1 \(Γ = 8\.804\)/);
    expect(line.wouldChange[0]).toMatch(/more than 8\.804-fold/);
    expect(line.wouldNotChange[0]).toMatch(/smaller than 8\.804-fold .* could not make the matched finding lose significance/);
  });

  test('not significant at Γ = 1: said first, and nothing about what could not explain it away', () => {
    const line = setsBottomLine(setsSummary(analyse('fictional_a')), study);
    expect(line.howStrong[0]).toMatch(/^The matched-sets comparison is not statistically significant even without any hidden bias/);
    expect([...line.howStrong, ...line.wouldChange, ...line.wouldNotChange].join(' ')).not.toMatch(/could not/);
    expect(line.wouldNotChange).toEqual([]);
    expect(line.wouldChange).toEqual([]);
  });
});

describe('summary', () => {
  test('round-trips through JSON and is refused when it is not a matched-sets summary', () => {
    const s = setsSummary(analyse('fictional_d_large_effect'));
    expect(readSetsSummary(JSON.parse(JSON.stringify(s)))).toEqual(s);
    expect(readSetsSummary({ ...s, kind: 'pairs' })).toBeNull();
    expect(readSetsSummary({ ...s, pValue: 'small' })).toBeNull();
    expect(readSetsSummary({ ...s, conventions: [1] })).toBeNull();
  });

  test('the range is taken at the largest tabulated Γ at or below the tipping Γ', () => {
    const s = setsSummary(analyse('fictional_d_large_effect', { gammas: [1, 2, 3, 12] }));
    expect(s.rangeAt?.gamma).toBe(3);
    expect(s.controlsLow).toBe(1);
    expect(s.controlsHigh).toBe(4);
  });
});
