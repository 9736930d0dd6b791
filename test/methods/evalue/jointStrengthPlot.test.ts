import { describe, expect, it } from 'vitest';
import { analyseEValue, assessReferenceConfounder, boundingFactor } from '../../../src/core';
import { invertAxis } from '../../../src/plot/invertAxis';
import { jointStrengthPlot } from '../../../src/methods/evalue/jointStrengthPlot';
import type { PathMark, PointMark } from '../../../src/plot/plotSpec';
import { renderSvgString } from '../../../src/plot/svgString';
import { expectClose } from '../../support/expectClose';
import { markers } from '../../../src/plot/palette';
import { figureTextBoxes, layoutFigure, overlappingTextPairs } from '../../../src/plot/figureLayout';
import { PRINT_SIZES, screenLayout } from '../../../src/plot/printSize';

// VanderWeele & Ding 2017 worked example: RR 3.9 (1.8 to 8.7) → E-values 7.26 and 3.00
const published = analyseEValue({ measure: 'rr', estimate: 3.9, lower: 1.8, upper: 8.7 });

function pathPoints(d: string): [number, number][] {
  return [...d.matchAll(/[ML]([-\d.]+),([-\d.]+)/g)].map((m) => [Number(m[1]), Number(m[2])]);
}

describe('jointStrengthPlot', () => {
  const confounders = [
    assessReferenceConfounder(published, { name: 'age', rrExposure: 2, rrOutcome: 3 }),
    assessReferenceConfounder(published, { name: 'income', rrExposure: 20, rrOutcome: 5 }),
  ];
  const spec = jointStrengthPlot(published, { confounders, study: { exposure: 'cycling', outcome: 'hypertension' } });

  it('traces the curve B(RR_EU, RR_UD) = RR on log axes from 1', () => {
    expect(spec.xAxis.scale).toBe('log');
    expect(spec.xAxis.domain[0]).toBe(1);
    expect(spec.xAxis.label).toMatch(/with cycling/);
    const curve = spec.marks.find((m) => m.kind === 'path' && m.label?.startsWith('Pairs that would just explain away')) as PathMark;
    const points = pathPoints(curve.d);
    expect(points.length).toBeGreaterThan(100);
    for (const [px, py] of points) {
      const x = invertAxis(spec.xAxis, px);
      const y = invertAxis(spec.yAxis, py);
      // Ding & VanderWeele 2016: points of the curve have bounding factor RR (pixels are rounded to 0.01)
      expectClose(boundingFactor(x, y), 3.9, { rel: 2e-3 });
    }
  });

  it('marks the E-values on the diagonal and the reference confounders by name', () => {
    const points = spec.marks.filter((m): m is PointMark => m.kind === 'point');
    const e = points.find((p) => p.label === 'E-value 7.26') as PointMark;
    expectClose(invertAxis(spec.xAxis, e.x), 7.263034344160047, { rel: 1e-9 });
    expectClose(invertAxis(spec.yAxis, e.y), 7.263034344160047, { rel: 1e-9 });
    expect(points.some((p) => p.label === 'interval 3.00')).toBe(true);
    expect(points.filter((p) => p.shape === markers.benchmark.shape).map((p) => p.label)).toEqual(['age', 'income']);
  });

  it('shades the regions that would explain away the estimate and the interval', () => {
    const shaded = spec.marks.filter((m): m is PathMark => m.kind === 'path' && m.fill !== undefined && m.fill !== 'none');
    expect(shaded).toHaveLength(2);
    expect(spec.legend.map((l) => l.label)).toEqual(['would reach the interval limit', 'would explain away the estimate', 'estimate', 'interval limit', 'E-value of the estimate', 'E-value of the interval limit', 'reference confounder']);
  });

  it('extends the axes to every reference confounder', () => {
    expect(spec.xAxis.domain[1]).toBeGreaterThanOrEqual(30);
  });

  it('has a data table and renders without NaN, undefined or Infinity', () => {
    expect(spec.table.rows[0]).toEqual(['E-value for the estimate', '7.26', '7.26', 'just']);
    expect(spec.table.rows.some((r) => r[0] === 'reference: income' && r[3] === 'yes')).toBe(true);
    const svg = renderSvgString(spec);
    expect(svg).toMatch(/^<svg/);
    expect(svg).not.toMatch(/NaN|undefined|Infinity/);
    expect(JSON.stringify(spec)).not.toMatch(/NaN|:null|Infinity/);
  });

  it('an estimate at the null shades everything and draws no curve', () => {
    const atNull = jointStrengthPlot(analyseEValue({ measure: 'rr', estimate: 1, lower: 0.8, upper: 1.25 }));
    expect(atNull.marks.filter((m) => m.kind === 'path' && m.stroke)).toHaveLength(0);
    expect(atNull.description).toMatch(/already equals the null/);
    expect(renderSvgString(atNull)).not.toMatch(/NaN|undefined|Infinity/);
  });

  it('a protective estimate and a huge one are drawn from their folded ratios', () => {
    const protective = jointStrengthPlot(analyseEValue({ measure: 'rr', estimate: 0.8, lower: 0.71, upper: 0.91 }));
    expect(protective.marks.some((m) => m.kind === 'point' && m.label === 'E-value 1.81')).toBe(true);
    const huge = jointStrengthPlot(analyseEValue({ measure: 'rr', estimate: 1e6, lower: 1e5, upper: 1e7 }));
    expect(renderSvgString(huge)).not.toMatch(/NaN|undefined|Infinity/);
    const beyond = jointStrengthPlot(analyseEValue({ measure: 'rr', estimate: Number.MAX_VALUE }));
    expect(renderSvgString(beyond)).not.toMatch(/NaN|undefined|Infinity/);
    expect(JSON.stringify(beyond.table)).not.toMatch(/NaN|Infinity/);
  });
});

describe('jointStrengthPlot: labels', () => {
  it('draws no label over another one, at screen and print sizes', () => {
    // The demo's protective estimate: the interval E-value (1.63) sits next to a reference point at (1.8, 1.5).
    const result = analyseEValue({ measure: 'rr', estimate: 0.72, lower: 0.61, upper: 0.85 });
    const confounders = [
      assessReferenceConfounder(result, { name: 'leisure-time exercise', rrExposure: 1.8, rrOutcome: 1.5 }),
      assessReferenceConfounder(result, { name: 'smoking', rrExposure: 1.3, rrOutcome: 1.6 }),
    ];
    const spec = jointStrengthPlot(result, { confounders });
    for (const options of [screenLayout(640), screenLayout(340), PRINT_SIZES.column.layout]) {
      const layout = layoutFigure(spec, options);
      expect(overlappingTextPairs(figureTextBoxes(layout))).toEqual([]);
      expect(layout.texts.some((t) => t.text === 'leisure-time exercise' || layout.keyEntries.some((k) => k.endsWith('leisure-time exercise')))).toBe(true);
    }
  });
});
