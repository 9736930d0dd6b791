import { formatAsTyped, formatEffect, formatGammaValue } from '../format/gammaText';
import { outcomeLabel } from '../format/studyLabels';
import { createFrame } from './frame';
import { framedPlotSpec } from './framedPlotSpec';
import { markers, palette } from './palette';
import { polygonPath, polylinePath } from './pathData';
import type { LegendItem, PlotMark, PlotSpec } from './plotSpec';
import type { SensitivityPlotOptions } from './pValueBoundsPlot';

/** One Γ with the range of effect estimates and the sensitivity interval it allows (±Infinity: unbounded). */
export interface EstimateBandsRow {
  readonly gamma: number;
  readonly estimateLow: number;
  readonly estimateHigh: number;
  readonly intervalLow: number;
  readonly intervalHigh: number;
}

/** What the estimate-range plot needs from any result with effect estimates under hidden bias. */
export interface EstimateBandsData {
  readonly id: string;
  /** The estimate's name in the text: "Hodges–Lehmann estimate", "m-estimate". */
  readonly estimateName: string;
  /** The estimate with no hidden bias (null: no plot). */
  readonly estimate: number | null;
  readonly intervalLevel: number;
  readonly estimates: readonly EstimateBandsRow[];
}

/**
 * The effect estimate under hidden bias: for each tabulated Γ, the range of estimates and the sensitivity
 * interval (Rosenbaum 1993, JASA 88:1250–1253; Rosenbaum 2007, Biometrics 63:456–464), as two nested bands
 * over Γ, with the no-effect line. Null when there are no estimates (sign test, binary outcome). Unbounded
 * interval limits are drawn to the edge of the plot and say so in the table.
 */
export function estimateBandsPlot(result: EstimateBandsData, options: SensitivityPlotOptions = {}): PlotSpec | null {
  if (result.estimates.length === 0 || result.estimate === null || !Number.isFinite(result.estimate)) return null;
  const width = options.width ?? 640;
  const height = options.height ?? 400;
  const rows = [...result.estimates].sort((a, b) => a.gamma - b.gamma);
  const finite = rows.flatMap((e) => [e.estimateLow, e.estimateHigh, e.intervalLow, e.intervalHigh]).filter(Number.isFinite);
  let lo = Math.min(0, ...finite);
  let hi = Math.max(0, ...finite);
  // A degenerate span (all estimates equal, or subnormal magnitudes) would give the scale no room.
  if (!(hi - lo > 1e-290)) {
    lo -= 1;
    hi += 1;
  }
  const pad = (hi - lo) * 0.08;
  lo -= pad;
  hi += pad;
  const gammaMax = Math.max(rows[rows.length - 1].gamma, 1 + 1e-9);
  const frame = createFrame({
    width,
    height,
    x: { domain: [1, rows.length > 1 ? gammaMax : 2], label: 'Hidden bias Γ: how far the odds of treatment may differ within a matched pair or set' },
    y: { domain: [lo, hi], label: `Effect on ${outcomeLabel(options.study)} (treated − control)` },
  });
  const clamp = (v: number) => frame.y(Math.min(hi, Math.max(lo, v)));
  const marks: PlotMark[] = [];
  const legend: LegendItem[] = [];
  const band = (low: (i: number) => number, high: (i: number) => number) => {
    const top: [number, number][] = rows.map((e, i) => [frame.x(e.gamma), clamp(high(i))]);
    const bottom: [number, number][] = rows.map((e, i) => [frame.x(e.gamma), clamp(low(i))]).reverse() as [number, number][];
    return polygonPath([...top, ...bottom]);
  };
  const level = `${formatAsTyped(result.intervalLevel * 100)}%`;
  if (rows.length > 1) {
    marks.push({
      kind: 'path',
      d: band((i) => rows[i].intervalLow, (i) => rows[i].intervalHigh),
      fill: palette.interval,
      fillOpacity: 0.16,
      label: `${level} sensitivity interval`,
    });
    marks.push({
      kind: 'path',
      d: band((i) => rows[i].estimateLow, (i) => rows[i].estimateHigh),
      fill: palette.estimate,
      fillOpacity: 0.35,
      label: `Range of ${result.estimateName}s`,
    });
  }
  legend.push({ label: `${level} sensitivity interval`, color: palette.interval, swatch: 'area' });
  legend.push({ label: 'smallest to largest effect estimate', color: palette.estimate, swatch: 'area' });
  for (const [key, dash] of [
    ['intervalLow', '2 3'],
    ['intervalHigh', '2 3'],
  ] as const) {
    marks.push({
      kind: 'path',
      d: polylinePath(rows.map((e) => [frame.x(e.gamma), clamp(e[key])])),
      stroke: palette.interval,
      strokeWidth: 1.5,
      dash,
    });
  }
  if (lo < 0 && hi > 0) {
    marks.push({
      kind: 'rule',
      x1: frame.inner.left,
      x2: frame.inner.right,
      y1: frame.y(0),
      y2: frame.y(0),
      stroke: palette.threshold,
      strokeWidth: 1.5,
      dash: '4 4',
      label: 'No effect',
    });
    // At the left end: the bands widen to the right, where they reach no effect and would cross the label.
    marks.push({ kind: 'text', x: frame.inner.left + 4, y: frame.y(0) - 6, text: 'no effect', anchor: 'start', color: palette.threshold, size: 12 });
  }
  marks.push({
    kind: 'point',
    x: frame.x(1),
    y: frame.y(result.estimate),
    ...markers.reported,
    size: 6,
    label: `estimate ${formatEffect(result.estimate, options.study)}`,
    labelSide: 'right',
  });
  const last = rows[rows.length - 1];
  return framedPlotSpec(frame, {
    id: result.id,
    title: 'How far the effect estimate could move under hidden bias',
    description: `The ${result.estimateName} is ${formatEffect(result.estimate, options.study)} with no hidden bias; at Γ = ${formatGammaValue(last.gamma)} the estimates range from ${formatEffect(last.estimateLow, options.study)} to ${formatEffect(last.estimateHigh, options.study)} and the ${level} sensitivity interval runs from ${formatEffect(last.intervalLow, options.study)} to ${formatEffect(last.intervalHigh, options.study)}.`,
    marks,
    legend,
    table: Object.freeze({
      caption: `Estimate range and ${level} sensitivity interval by Γ`,
      columns: ['Γ', 'smallest effect estimate', 'largest effect estimate', 'interval low', 'interval high'],
      rows: rows.map((e) => [
        formatGammaValue(e.gamma),
        formatEffect(e.estimateLow, options.study),
        formatEffect(e.estimateHigh, options.study),
        formatEffect(e.intervalLow, options.study),
        formatEffect(e.intervalHigh, options.study),
      ]),
    }),
  });
}
