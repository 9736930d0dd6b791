import type { WeightingResult } from '../../core/weightingAnalysis';
import { formatNumber } from '../../format/formatNumber';
import { createFrame } from '../../plot/frame';
import { framedPlotSpec } from '../../plot/framedPlotSpec';
import { palette } from '../../plot/palette';
import { polygonPath, polylinePath } from '../../plot/pathData';
import type { LegendItem, PlotMark, PlotSpec } from '../../plot/plotSpec';
import { coveragePercent, formatEffectValue, formatLambda } from './text';

export interface WeightingPlotOptions {
  readonly width?: number;
  readonly height?: number;
}

/**
 * The bounds on the weighted effect and the sensitivity interval against Λ (log axis), with no effect marked
 * and the tipping Λ of the point bounds and of the interval drawn as vertical rules.
 */
export function boundsByLambdaPlot(result: WeightingResult, options: WeightingPlotOptions = {}): PlotSpec {
  const width = options.width ?? 640;
  const height = options.height ?? 400;
  const rows = result.rows;
  const tips = [result.tippingLambdaPoint, result.tippingLambdaInterval].filter((t): t is number => t !== null && t > 1);
  const lambdaMax = Math.max(1.5, ...rows.map((r) => r.lambda), ...tips.map((t) => t * 1.1));
  const values = rows.flatMap((r) => [r.lowerBound, r.upperBound, r.intervalLower, r.intervalUpper]).filter((v): v is number => v !== null && Number.isFinite(v));
  let lo = Math.min(0, ...values);
  let hi = Math.max(0, ...values);
  if (hi - lo === 0) hi = lo + 1;
  const padY = (hi - lo) * 0.05;
  lo -= padY;
  hi += padY;
  const frame = createFrame({
    width,
    height,
    x: { domain: [1, lambdaMax], label: 'Λ: hidden factor may change the odds of treatment up to this factor (log scale)', scale: 'log' },
    y: { domain: [lo, hi], label: 'Effect (treated − control)' },
  });
  const marks: PlotMark[] = [];
  const legend: LegendItem[] = [];
  const sorted = [...rows].sort((a, b) => a.lambda - b.lambda);
  marks.push({ kind: 'rule', x1: frame.inner.left, x2: frame.inner.right, y1: frame.y(0), y2: frame.y(0), stroke: palette.threshold, strokeWidth: 1.5, dash: '4 4', label: 'No effect' });
  const withInterval = sorted.filter((r) => r.intervalLower !== null && r.intervalUpper !== null);
  if (withInterval.length > 0) {
    const band = [...withInterval.map((r) => [frame.x(r.lambda), frame.y(r.intervalUpper!)] as const), ...[...withInterval].reverse().map((r) => [frame.x(r.lambda), frame.y(r.intervalLower!)] as const)];
    marks.push({ kind: 'path', d: polygonPath(band), fill: palette.interval, fillOpacity: 0.15, label: 'Sensitivity interval' });
    for (const side of ['intervalLower', 'intervalUpper'] as const) {
      marks.push({ kind: 'path', d: polylinePath(withInterval.map((r) => [frame.x(r.lambda), frame.y(r[side]!)])), stroke: palette.interval, strokeWidth: 1.5, dash: '6 3', label: side === 'intervalLower' ? 'Interval low' : 'Interval high' });
    }
    legend.push({ label: `${coveragePercent(result.inputs.alpha)}% sensitivity interval`, color: palette.interval, swatch: 'line', dash: '6 3' });
  }
  for (const side of ['lowerBound', 'upperBound'] as const) {
    marks.push({ kind: 'path', d: polylinePath(sorted.map((r) => [frame.x(r.lambda), frame.y(r[side])])), stroke: palette.estimate, strokeWidth: 2.5, label: side === 'lowerBound' ? 'Lowest effect' : 'Highest effect' });
    for (const r of sorted) marks.push({ kind: 'point', x: frame.x(r.lambda), y: frame.y(r[side]), shape: 'circle', color: palette.estimate, size: 3.5 });
  }
  legend.push({ label: 'bounds on the effect', color: palette.estimate, swatch: 'line' });
  const tipping = [
    { value: result.tippingLambdaPoint, status: result.tippingPointStatus, name: 'tipping Λ (bounds)', dash: undefined },
    { value: result.tippingLambdaInterval, status: result.tippingIntervalStatus, name: 'tipping Λ (interval)', dash: '2 3' },
  ];
  let row = 0;
  for (const t of tipping) {
    if (t.status !== 'found' || t.value === null || t.value > lambdaMax) continue;
    const x = frame.x(t.value);
    marks.push({ kind: 'rule', x1: x, x2: x, y1: frame.inner.bottom, y2: frame.inner.top, stroke: palette.overturned, strokeWidth: 1.5, dash: t.dash, label: `${t.name} = ${formatLambda(t.value)}` });
    marks.push({ kind: 'point', x, y: frame.y(0), shape: 'diamond', color: palette.overturned, size: 6 });
    const right = x > (frame.inner.left + frame.inner.right) / 2;
    marks.push({ kind: 'text', x: right ? x - 6 : x + 6, y: frame.inner.top + 14 + 16 * row++, text: `${t.name} = ${formatLambda(t.value)}`, anchor: right ? 'end' : 'start', color: palette.ink, size: 12, weight: 'bold' });
  }
  if (row > 0) legend.push({ label: 'tipping Λ', color: palette.overturned, swatch: 'diamond' });
  const tipText =
    result.tippingPointStatus === 'found' ? `The bounds first include no effect at Λ = ${formatLambda(result.tippingLambdaPoint)}.` : result.tippingPointStatus === 'beyond-range' ? 'The bounds exclude no effect over the whole searched range.' : 'The estimate is no effect.';
  return framedPlotSpec(frame, {
    id: 'weighting-bounds-by-lambda',
    title: 'How far hidden confounding could move the weighted effect',
    description: `Lowest and highest weighted effect, and the sensitivity interval, for Λ from 1 to ${formatLambda(lambdaMax)}. ${tipText}`,
    marks,
    legend,
    table: Object.freeze({
      caption: 'Bounds and sensitivity interval by Λ',
      columns: ['Λ', 'lowest effect', 'highest effect', 'interval low', 'interval high'],
      rows: rows.map((r) => [formatLambda(r.lambda), formatEffectValue(r.lowerBound), formatEffectValue(r.upperBound), formatEffectValue(r.intervalLower), formatEffectValue(r.intervalUpper)]),
    }),
  });
}

/** The estimated propensity scores by group: treated counts above the axis, controls mirrored below. */
export function propensityOverlapPlot(result: WeightingResult, options: WeightingPlotOptions = {}): PlotSpec {
  const width = options.width ?? 640;
  const height = options.height ?? 400;
  const bins = result.overlap.bins;
  const top = Math.max(1, ...bins.map((b) => b.treated));
  const bottom = Math.max(1, ...bins.map((b) => b.control));
  const frame = createFrame({
    width,
    height,
    x: { domain: [0, 1], label: 'Estimated propensity score (chance of treatment given the covariates)' },
    y: { domain: [-bottom * 1.05, top * 1.05], label: 'People (treated above, control below)', tickFormat: (v) => String(Math.abs(Number(v.toPrecision(6)))) }, // counts: 30, not 30.0
  });
  const marks: PlotMark[] = [];
  for (const b of bins) {
    const x0 = frame.x(b.from);
    const x1 = frame.x(b.to);
    if (b.treated > 0) marks.push({ kind: 'path', d: polygonPath([[x0, frame.y(0)], [x0, frame.y(b.treated)], [x1, frame.y(b.treated)], [x1, frame.y(0)]]), fill: palette.estimate, fillOpacity: 0.8, stroke: '#ffffff', strokeWidth: 0.5, label: `Treated, ${b.from}–${b.to}: ${b.treated}` });
    if (b.control > 0) marks.push({ kind: 'path', d: polygonPath([[x0, frame.y(0)], [x0, frame.y(-b.control)], [x1, frame.y(-b.control)], [x1, frame.y(0)]]), fill: palette.second, fillOpacity: 0.8, stroke: '#ffffff', strokeWidth: 0.5, label: `Control, ${b.from}–${b.to}: ${b.control}` });
  }
  marks.push({ kind: 'rule', x1: frame.inner.left, x2: frame.inner.right, y1: frame.y(0), y2: frame.y(0), stroke: palette.ink, strokeWidth: 1 });
  for (const t of [result.overlap.lowThreshold, result.overlap.highThreshold]) {
    marks.push({ kind: 'rule', x1: frame.x(t), x2: frame.x(t), y1: frame.inner.bottom, y2: frame.inner.top, stroke: palette.threshold, strokeWidth: 1, dash: '4 4', label: `Extreme-propensity threshold ${t}` });
  }
  const o = result.overlap;
  return framedPlotSpec(frame, {
    id: 'weighting-propensity-overlap',
    title: 'Overlap of the estimated propensity scores',
    description: `Histogram of estimated propensity scores: treated above the axis, controls below. ${o.belowLow} people are below ${o.lowThreshold} and ${o.aboveHigh} above ${o.highThreshold} (dashed lines).`,
    marks,
    legend: [
      { label: 'treated', color: palette.estimate, swatch: 'area' },
      { label: 'control', color: palette.second, swatch: 'area' },
    ],
    table: Object.freeze({
      caption: 'People by estimated propensity score',
      columns: ['from', 'to', 'treated', 'control'],
      rows: bins.map((b) => [formatNumber(b.from, { digits: 2 }), formatNumber(b.to, { digits: 2 }), String(b.treated), String(b.control)]),
    }),
  });
}

/** The weights of each group at Λ = 1: smallest, mean and largest on a log axis. */
export function weightSummaryPlot(result: WeightingResult, options: WeightingPlotOptions = {}): PlotSpec {
  const width = options.width ?? 640;
  const height = options.height ?? 260;
  const groups = [
    { name: 'treated', w: result.weights.treated, at: 2 },
    { name: 'control', w: result.weights.control, at: 1 },
  ];
  const lo = Math.min(...groups.map((g) => g.w.smallest));
  const hi = Math.max(...groups.map((g) => g.w.largest));
  const min = Math.pow(10, Math.floor(Math.log10(Math.max(lo, 1e-12))));
  const max = Math.max(min * 10, Math.pow(10, Math.ceil(Math.log10(Math.max(hi, 1e-12)))));
  const frame = createFrame({
    width,
    height,
    margin: { left: 80 },
    x: { domain: [min, max], label: 'Weight before normalising (log scale)', scale: 'log' },
    y: { domain: [0.4, 2.6], label: '', tickCount: 2, tickFormat: (v) => (v === 2 ? 'treated' : v === 1 ? 'control' : '') },
  });
  const marks: PlotMark[] = [];
  for (const g of groups) {
    const y = frame.y(g.at);
    marks.push({ kind: 'rule', x1: frame.x(g.w.smallest), x2: frame.x(g.w.largest), y1: y, y2: y, stroke: palette.contour, strokeWidth: 3, label: `${g.name}: weights from ${formatNumber(g.w.smallest)} to ${formatNumber(g.w.largest)}` });
    marks.push({ kind: 'point', x: frame.x(g.w.smallest), y, shape: 'circle', color: palette.estimate, size: 5 });
    marks.push({ kind: 'point', x: frame.x(g.w.mean), y, shape: 'diamond', color: palette.reference, size: 6 });
    marks.push({ kind: 'point', x: frame.x(g.w.largest), y, shape: 'square', color: palette.interval, size: 5, label: `effective size ${formatNumber(g.w.effectiveSize, { significant: 3 })} of ${g.w.people}`, labelSide: 'above' });
  }
  return framedPlotSpec(frame, {
    id: 'weighting-weights',
    title: 'Spread of the weights by group',
    description: `Smallest, mean and largest weight at Λ = 1 in each group. Effective sizes: treated ${formatNumber(result.weights.treated.effectiveSize, { significant: 3 })} of ${result.weights.treated.people}, control ${formatNumber(result.weights.control.effectiveSize, { significant: 3 })} of ${result.weights.control.people}.`,
    marks,
    legend: [
      { label: 'smallest', color: palette.estimate, swatch: 'circle' },
      { label: 'mean', color: palette.reference, swatch: 'diamond' },
      { label: 'largest', color: palette.interval, swatch: 'square' },
    ],
    table: Object.freeze({
      caption: 'Weights by group at Λ = 1',
      columns: ['group', 'people', 'smallest', 'mean', 'largest', 'effective size', 'largest share'],
      rows: groups.map((g) => [g.name, String(g.w.people), formatNumber(g.w.smallest), formatNumber(g.w.mean), formatNumber(g.w.largest), formatNumber(g.w.effectiveSize, { significant: 4 }), `${formatNumber(g.w.largestShare * 100, { significant: 2 })}%`]),
    }),
  });
}

/** The three plots of a result. */
export function weightingPlots(result: WeightingResult, options: WeightingPlotOptions = {}): { bounds: PlotSpec; overlap: PlotSpec; weights: PlotSpec } {
  return { bounds: boundsByLambdaPlot(result, options), overlap: propensityOverlapPlot(result, options), weights: weightSummaryPlot(result, options) };
}
