import { describe, expect, test } from 'vitest';
import { figureTextBoxes, layoutFigure, overlappingTextPairs, placedTextBox } from '../../src/plot/figureLayout';
import { PRINT_SIZES, screenLayout } from '../../src/plot/printSize';
import { layoutFor, renderSvgString } from '../../src/plot/svgString';
import { figureCases } from '../support/figureCases';

const cases = figureCases();
const layouts = {
  'wide screen (640 px)': screenLayout(640),
  'phone (350 px)': screenLayout(350),
  'one column (3.5 in)': PRINT_SIZES.column.layout,
  'two columns (7 in)': PRINT_SIZES['two-columns'].layout,
} as const;

describe('layoutFigure', () => {
  test('the cases cover every figure of every calculator', () => {
    const ids = new Set(cases.map((c) => c.spec.id));
    for (const id of ['joint-strength', 'ovb-estimate-contours', 'ovb-t-contours', 'ovb-extreme-scenarios', 'pairs-p-value-by-gamma', 'pairs-estimate-range', 'pairs-amplification']) {
      expect(ids.has(id), id).toBe(true);
    }
  });

  for (const [sizeName, options] of Object.entries(layouts)) {
    describe(sizeName, () => {
      test.each(cases.map((c) => [c.name, c.spec] as const))('%s: no two text boxes intersect', (_name, spec) => {
        const layout = layoutFigure(spec, options);
        const boxes = figureTextBoxes(layout);
        const clashes = overlappingTextPairs(boxes).map(([a, b]) => `"${a.text}" (${a.role}) × "${b.text}" (${b.role})`);
        expect(clashes).toEqual([]);
      });

      test.each(cases.map((c) => [c.name, c.spec] as const))('%s: every text lies inside the figure', (_name, spec) => {
        const layout = layoutFigure(spec, options);
        for (const t of layout.texts) {
          const box = placedTextBox(t);
          expect(box.left, t.text).toBeGreaterThanOrEqual(-0.5);
          expect(box.right, t.text).toBeLessThanOrEqual(layout.width + 0.5);
          expect(box.top, t.text).toBeGreaterThanOrEqual(-0.5);
          expect(box.bottom, t.text).toBeLessThanOrEqual(layout.height + 0.5);
        }
      });
    });
  }

  test('each axis keeps one tick-label format', () => {
    for (const { spec } of cases) {
      for (const axis of [spec.xAxis, spec.yAxis]) {
        const powers = axis.ticks.filter((t) => /10[⁻⁰¹²³⁴⁵⁶⁷⁸⁹]/.test(t.label)).length;
        expect(powers === 0 || powers === axis.ticks.filter((t) => t.label !== '0').length, `${spec.id}: ${axis.ticks.map((t) => t.label).join(' ')}`).toBe(true);
        expect(axis.ticks.some((t) => /e[-+]?\d/.test(t.label))).toBe(false);
        const decimals = new Set(axis.ticks.filter((t) => t.label.endsWith('%')).map((t) => (t.label.split('.')[1] ?? '').length));
        expect(decimals.size, `${spec.id}: ${axis.ticks.map((t) => t.label).join(' ')}`).toBeLessThanOrEqual(1);
      }
    }
  });

  test('crowded labels go to a numbered key below the figure instead of piling up', () => {
    const crowded = cases.find((c) => c.name === 'regression estimate crowded')!.spec;
    const layout = layoutFigure(crowded, screenLayout(350));
    expect(layout.keyEntries.length).toBeGreaterThan(0);
    expect(layout.texts.filter((t) => t.role === 'key').length).toBeGreaterThanOrEqual(layout.keyEntries.length);
    expect(layout.keyEntries[0]).toMatch(/^1: /);
  });
});

describe('print sizes', () => {
  // Journal artwork guidance: text at least 7 pt and lines at least 0.5 pt at the printed size (common
  // practice across journals' author instructions, no single source).
  test.each(cases.map((c) => [c.name, c.spec] as const))('%s: SVG in inches, text ≥ 7 pt, lines ≥ 0.5 pt', (_name, spec) => {
    for (const print of ['column', 'two-columns'] as const) {
      const svg = renderSvgString(spec, { print });
      const inches = PRINT_SIZES[print].inches;
      expect(svg).toMatch(new RegExp(`^<svg[^>]* width="${inches}in"`));
      const viewBoxWidth = Number(/viewBox="0 0 ([\d.]+) /.exec(svg)![1]);
      const pointsPerUnit = (inches * 72) / viewBoxWidth;
      const sizes = [...svg.matchAll(/<text[^>]* font-size="([\d.]+)"/g)].map((m) => Number(m[1]) * pointsPerUnit);
      expect(sizes.length).toBeGreaterThan(5);
      expect(Math.min(...sizes)).toBeGreaterThanOrEqual(7);
      const strokes = [...svg.matchAll(/<(?:line|path|rect)[^>]* stroke-width="([\d.]+)"/g)].map((m) => Number(m[1]) * pointsPerUnit);
      expect(Math.min(...strokes)).toBeGreaterThanOrEqual(0.5);
    }
  });

  test('screen layouts never use text under 11 CSS px', () => {
    for (const { spec } of cases) {
      for (const w of [300, 350, 640, 900]) expect(Math.min(...layoutFor(spec, { width: w }).texts.map((t) => t.size))).toBeGreaterThanOrEqual(11);
    }
  });
});

describe('axes fit what is shown, and the user can widen them', () => {
  test('the extreme-scenario axis ends near its crossings, not at a fixed 10 %', () => {
    const { spec } = cases.find((c) => c.name === 'regression extreme demo')!;
    expect(spec.xAxis.domain[1]).toBeLessThan(0.1);
  });

  test('a wider range asked for is honoured; a narrower one is not', async () => {
    const { analyseEValue } = await import('../../src/core/eValueAnalysis');
    const { jointStrengthPlot } = await import('../../src/methods/evalue/jointStrengthPlot');
    const { analysePairs } = await import('../../src/core/pairsAnalysis');
    const { pValueByGammaPlot } = await import('../../src/methods/pairs/pValueByGammaPlot');
    const e = analyseEValue({ measure: 'rr', estimate: 0.72, lower: 0.61, upper: 0.85 });
    expect(jointStrengthPlot(e, { maxStrength: 50 }).xAxis.domain[1]).toBe(50);
    expect(jointStrengthPlot(e, { maxStrength: 1.2 }).xAxis.domain[1]).toBe(jointStrengthPlot(e).xAxis.domain[1]);
    const p = analysePairs({ data: { kind: 'differences', differences: [1, 2, 3, -1, 4, 5, 2, 3, 6, 1.5, 2.5] } });
    expect(pValueByGammaPlot(p, { maxGamma: 20 }).xAxis.domain[1]).toBe(20);
  });
});

describe('no overlapping text for any input (property)', () => {
  test('regression and E-value figures with random benchmarks, at phone and one-column widths', async () => {
    const fc = (await import('fast-check')).default;
    const { analyseOvb } = await import('../../src/core/ovbAnalysis');
    const { ovbContourPlot } = await import('../../src/methods/regression/ovbContourPlot');
    const { analyseEValue } = await import('../../src/core/eValueAnalysis');
    const { assessReferenceConfounder } = await import('../../src/core/referenceConfounder');
    const { jointStrengthPlot } = await import('../../src/methods/evalue/jointStrengthPlot');
    const benchmark = fc.record({ outcomeT: fc.double({ min: -12, max: 12, noNaN: true }), treatmentT: fc.double({ min: -6, max: 6, noNaN: true }), name: fc.string({ minLength: 1, maxLength: 30 }) });
    fc.assert(
      fc.property(fc.double({ min: 0.5, max: 20, noNaN: true }), fc.array(benchmark, { maxLength: 12 }), fc.array(fc.tuple(fc.double({ min: 1.01, max: 30, noNaN: true }), fc.double({ min: 1.01, max: 30, noNaN: true })), { maxLength: 10 }), (t, benchmarks, confounders) => {
        const ovb = analyseOvb({ estimate: t, se: 1, df: 500, benchmarks: benchmarks.map((b, i) => ({ covariate: `${b.name}${i}`, outcomeT: b.outcomeT, treatmentT: b.treatmentT })) });
        const e = analyseEValue({ measure: 'rr', estimate: 1 + t / 5, lower: 1 + t / 10, upper: 1 + t / 2 });
        const specs = [ovbContourPlot(ovb, { kind: 'estimate' }), ovbContourPlot(ovb, { kind: 't' }), jointStrengthPlot(e, { confounders: confounders.map(([a, b], i) => assessReferenceConfounder(e, { name: `reference ${i}`, rrExposure: a, rrOutcome: b })) })];
        for (const spec of specs) {
          for (const options of [screenLayout(350), PRINT_SIZES.column.layout]) {
            expect(overlappingTextPairs(figureTextBoxes(layoutFigure(spec, options)))).toEqual([]);
          }
        }
      }),
      { numRuns: 40 },
    );
  }, 120_000);
});
