import { describe, expect, test } from 'vitest';
import fc from 'fast-check';
import { mkdirSync, writeFileSync } from 'node:fs';
import { fileURLToPath } from 'node:url';
import { analyseOvb, type OvbInput } from '../../../src/core/ovbAnalysis';
import { adjustForConfounder } from '../../../src/core/confounderAdjustment';
import { ovbContourPlot } from '../../../src/methods/regression/ovbContourPlot';
import { ovbExtremeScenarioPlot } from '../../../src/methods/regression/ovbExtremeScenarioPlot';
import { renderSvgString } from '../../../src/plot/svgString';
import { createFrame } from '../../../src/plot/frame';
import { boundaryColor, markers } from '../../../src/plot/palette';
import { readReferenceJson } from '../../support/reference';
import { expectClose } from '../../support/expectClose';

const swiss = readReferenceJson('ovb.json').swiss;
const artifacts = fileURLToPath(new URL('../../artifacts/', import.meta.url));
const swissInput: OvbInput = {
  estimate: swiss.estimate,
  se: swiss.se,
  df: swiss.df,
  benchmarks: Object.entries<any>(swiss.benchmarks).map(([covariate, b]) => ({ covariate, outcomeT: b.t_in_main_model, treatmentT: b.t_in_D_model })),
};
const study = { exposure: 'Education', outcome: 'Fertility' };

/** Pixel → data with the plot's own axes. */
function toData(spec: ReturnType<typeof ovbContourPlot>, px: number, py: number): [number, number] {
  const x = spec.xAxis;
  const y = spec.yAxis;
  return [
    x.domain[0] + ((px - x.range[0]) / (x.range[1] - x.range[0])) * (x.domain[1] - x.domain[0]),
    y.domain[0] + ((py - y.range[0]) / (y.range[1] - y.range[0])) * (y.domain[1] - y.domain[0]),
  ];
}

function boundaryPoints(spec: ReturnType<typeof ovbContourPlot>): [number, number][] {
  const path = spec.marks.find((m) => m.kind === 'path' && m.stroke === boundaryColor);
  expect(path).toBeDefined();
  const d = (path as { d: string }).d;
  return [...d.matchAll(/([\d.]+),([\d.]+)/g)].map((m) => toData(spec, Number(m[1]), Number(m[2])));
}

describe('omitted-variable-bias plots', () => {
  const result = analyseOvb({ ...swissInput, scenario: { r2dz: 0.1, r2yz: 0.3 } });

  test('estimate contours: exact boundary where the adjusted estimate is zero, benchmarks labelled', () => {
    const spec = ovbContourPlot(result, { kind: 'estimate', study });
    mkdirSync(artifacts, { recursive: true });
    writeFileSync(artifacts + 'ovb-estimate.svg', renderSvgString(spec));
    // every drawn boundary vertex (pixel-rounded) has an adjusted estimate of about 0
    const points = boundaryPoints(spec);
    expect(points.length).toBeGreaterThan(50);
    for (const [b, a] of points) {
      if (a >= spec.yAxis.domain[1] - 1e-3) continue; // clipped at the top edge
      const adj = adjustForConfounder(swissInput as any, { r2dz: b, r2yz: a });
      expect(Math.abs(adj.estimate)).toBeLessThan(0.02 * Math.abs(swiss.estimate));
    }
    const labels = spec.marks.flatMap((m) => (m.kind === 'text' ? [m.text] : m.kind === 'point' && m.label ? [m.label] : []));
    expect(labels.some((l) => l.startsWith('as strong as Agriculture'))).toBe(true);
    expect(labels.some((l) => l.startsWith('as reported -0.871'))).toBe(true);
    expect(labels.some((l) => l.startsWith('robustness value 51.7%'))).toBe(true);
    expect(spec.table.rows.some((r) => r[0] === '2 times Examination' && r[1] === 'not available')).toBe(true);
    // the estimate's level lines are exact too: every vertex of the −0.4 line has an adjusted estimate of −0.4
    const level = spec.marks.find((m) => m.kind === 'path' && (m as { label?: string }).label === 'Adjusted estimate -0.400') as { d: string };
    const vertices = [...level.d.matchAll(/([\d.]+),([\d.]+)/g)].map((m) => toData(spec, Number(m[1]), Number(m[2])));
    for (const [b, a] of vertices) {
      if (a >= spec.yAxis.domain[1] - 1e-3) continue;
      expect(Math.abs(adjustForConfounder(swissInput as any, { r2dz: b, r2yz: a }).estimate + 0.4)).toBeLessThan(0.01);
    }
    expect(JSON.stringify(spec)).not.toMatch(/NaN|Infinity|undefined/);
  });

  test('t contours: exact boundary at the critical value of t with df − 1', () => {
    const spec = ovbContourPlot(result, { kind: 't', study });
    writeFileSync(artifacts + 'ovb-t.svg', renderSvgString(spec));
    const critical = result.criticalT;
    for (const [b, a] of boundaryPoints(spec)) {
      if (a >= spec.yAxis.domain[1] - 1e-3 || a <= 1e-3) continue;
      const adj = adjustForConfounder(swissInput as any, { r2dz: b, r2yz: a });
      // pixel rounding (0.01 px) moves the point slightly; the t there is still within 2% of t*
      expect(Math.abs(Math.abs(adj.t) - critical)).toBeLessThan(0.02 * critical);
    }
    expect(spec.description).toMatch(/robustness value at α = 0.05 is 34.3%/);
    // the t level lines are exact as well, toward and away from zero, and agree with the grid version's levels
    for (const direction of ['toward-zero', 'away-from-zero'] as const) {
      const r = analyseOvb({ ...swissInput, direction });
      const exact = ovbContourPlot(r, { kind: 't' });
      const grid = ovbContourPlot(r, { kind: 't', gridSize: 41 });
      const labels = (p: typeof exact) => p.marks.filter((m) => m.kind === 'path' && m.stroke === '#6b7785').map((m) => (m as { label?: string }).label).sort();
      expect(new Set(labels(exact))).toEqual(new Set(labels(grid)));
      const line = exact.marks.find((m) => m.kind === 'path' && (m as { label?: string }).label === 'Adjusted t -4.00') as { d: string };
      const vertices = [...line.d.matchAll(/([\d.]+),([\d.]+)/g)].map((m) => toData(exact, Number(m[1]), Number(m[2])));
      expect(vertices.length).toBeGreaterThan(20);
      for (const [b, a] of vertices) {
        if (a >= exact.yAxis.domain[1] - 1e-3 || a < 1e-3) continue;
        const adj = adjustForConfounder(swissInput as any, { r2dz: b, r2yz: a }, direction);
        expect(Math.abs(adj.t + 4)).toBeLessThan(0.05);
      }
    }
  });

  test('other settings: away from zero, q < 1, a non-significant estimate, chosen axes', () => {
    const away = analyseOvb({ ...swissInput, direction: 'away-from-zero' });
    const e = ovbContourPlot(away, { kind: 'estimate' });
    expect(e.marks.some((m) => m.kind === 'text' && /cannot bring/.test(m.text))).toBe(true);
    const t = ovbContourPlot(away, { kind: 't', maxR2dz: 0.99, maxR2yz: 0.5 });
    expect(t.xAxis.domain[1]).toBe(0.99);
    const weak = analyseOvb({ estimate: 1, se: 1, df: 30, q: 0.5 });
    for (const kind of ['estimate', 't'] as const) {
      const spec = ovbContourPlot(weak, { kind });
      expect(JSON.stringify(spec)).not.toMatch(/NaN|Infinity|undefined/);
    }
    writeFileSync(artifacts + 'ovb-t-away.svg', renderSvgString(t));
  });

  test('the RV at α point sits on the exact boundary, also off the diagonal', () => {
    // t = 30, df = 100: f_q·f* ≥ 1, so RV_{1,0.05} = (f_q² − f*²)/(1 + f_q²) is reached below the diagonal
    for (const t of [4.18, 30]) {
      const r = analyseOvb({ estimate: t, se: 1, df: 100 });
      const spec = ovbContourPlot(r, { kind: 't', maxR2dz: 0.95, maxR2yz: 0.95 });
      expect(spec.marks.some((m) => m.kind === 'point' && (m.label ?? '').startsWith('robustness value at α'))).toBe(true);
      const point = spec.marks.find((m) => m.kind === 'point' && m.shape === markers.tippingInterval.shape) as { x: number; y: number };
      const [b, a] = toData(spec, point.x, point.y);
      expectClose(b, r.rvAlpha, { rel: 1e-9 });
      const adj = adjustForConfounder({ estimate: t, se: 1, df: 100 }, { r2dz: b, r2yz: a });
      expectClose(adj.t, r.criticalT, { rel: 1e-6 });
    }
  });

  test('extreme scenarios: curves cross the threshold at the reported R²dz', () => {
    const spec = ovbExtremeScenarioPlot(result, { study });
    writeFileSync(artifacts + 'ovb-extreme.svg', renderSvgString(spec));
    expect(spec.table.rows.length).toBeGreaterThan(3);
    const crossing = spec.marks.filter((m) => m.kind === 'point');
    expect(crossing).toHaveLength(3);
    expect(JSON.stringify(spec)).not.toMatch(/NaN|Infinity|undefined/);
  });

  test('never draws NaN for any input (fast-check)', () => {
    fc.assert(
      fc.property(
        fc.double({ min: -50, max: 50, noNaN: true }),
        fc.integer({ min: 2, max: 100000 }),
        fc.double({ min: 0.1, max: 2, noNaN: true }),
        fc.constantFrom('toward-zero' as const, 'away-from-zero' as const),
        fc.constantFrom('estimate' as const, 't' as const),
        fc.boolean(),
        (t, df, q, direction, kind, grid) => {
          const r = analyseOvb({ estimate: t, se: 1, df, q, direction });
          const spec = ovbContourPlot(r, grid ? { kind, gridSize: 21 } : { kind });
          expect(renderSvgString(spec)).not.toMatch(/NaN|Infinity|undefined/);
        },
      ),
      { numRuns: 120 },
    );
  });

  test('a frame round-trips data coordinates (used for pointer read-outs)', () => {
    const frame = createFrame({ width: 640, height: 480, x: { domain: [0, 0.6], label: '' }, y: { domain: [0, 0.6], label: '' } });
    expectClose(frame.invertX(frame.x(0.3)), 0.3, { rel: 1e-12 });
  });
});
