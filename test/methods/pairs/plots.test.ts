import { describe, expect, test } from 'vitest';
import fc from 'fast-check';
import { mkdirSync, writeFileSync } from 'node:fs';
import { fileURLToPath } from 'node:url';
import { analysePairs } from '../../../src/core/pairsAnalysis';
import { pValueByGammaPlot } from '../../../src/methods/pairs/pValueByGammaPlot';
import { estimateRangePlot } from '../../../src/methods/pairs/estimateRangePlot';
import { amplificationPlot } from '../../../src/methods/pairs/amplificationPlot';
import { renderSvgString } from '../../../src/plot/svgString';
import { readReferenceJson } from '../../support/reference';

const reference = readReferenceJson('rosenbaum.json');
const artifacts = fileURLToPath(new URL('../../artifacts/', import.meta.url));

describe('matched-pairs plots', () => {
  const result = analysePairs({ data: { kind: 'differences', differences: reference.datasets.small_n15.differences } });

  test('p-value plot: α line, tipping Γ marked, table of the rows', () => {
    const spec = pValueByGammaPlot(result);
    expect(spec.marks.some((m) => m.kind === 'text' && m.text === 'tipping Γ = 1.611')).toBe(true);
    expect(spec.marks.some((m) => m.kind === 'rule' && m.label === 'α = 0.05')).toBe(true);
    expect(spec.table.rows).toHaveLength(result.rows.length);
    expect(spec.yAxis.scale).toBe('log');
    mkdirSync(artifacts, { recursive: true });
    writeFileSync(artifacts + 'pairs-p-value.svg', renderSvgString(spec));
  });

  test('estimate plot: bands, estimate point, no-effect line', () => {
    const spec = estimateRangePlot(result)!;
    expect(spec.marks.filter((m) => m.kind === 'path' && m.fill).length).toBe(2);
    expect(spec.table.rows[0][1]).toBe('0.715');
    writeFileSync(artifacts + 'pairs-estimate.svg', renderSvgString(spec));
  });

  test('amplification plot: the curve maps back to Γ and marks the readable pairs', () => {
    const spec = amplificationPlot(result)!;
    expect(spec.marks.filter((m) => m.kind === 'point')).toHaveLength(result.amplification.filter((p) => p.delta < 1000).length);
    writeFileSync(artifacts + 'pairs-amplification.svg', renderSvgString(spec));
  });

  test('no estimate or amplification plot without estimates or tipping Γ', () => {
    const sign = analysePairs({ data: { kind: 'discordant', treatedOnly: 4, controlOnly: 3 } });
    expect(estimateRangePlot(sign)).toBeNull();
    expect(amplificationPlot(sign)).toBeNull();
    expect(renderSvgString(pValueByGammaPlot(sign))).not.toMatch(/NaN|Infinity|undefined/);
  });

  test('no plot ever carries NaN, Infinity or undefined (any data)', () => {
    fc.assert(
      fc.property(fc.array(fc.oneof(fc.double({ min: -50, max: 80, noNaN: true }), fc.constantFrom(5e-324, -5e-324, 1e300, -1e300, 0)), { minLength: 2, maxLength: 30 }).filter((d) => d.filter((x) => x !== 0).length >= 2), (d) => {
        const r = analysePairs({ data: { kind: 'differences', differences: d } });
        for (const spec of [pValueByGammaPlot(r), estimateRangePlot(r), amplificationPlot(r)]) {
          if (spec) expect(renderSvgString(spec) + JSON.stringify(spec.table)).not.toMatch(/NaN|Infinity|undefined/);
        }
      }),
      { numRuns: Number(process.env.PAIRS_RUNS ?? 60) },
    );
  }, 120_000);
});
