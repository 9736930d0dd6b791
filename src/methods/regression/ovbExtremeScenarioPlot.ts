import type { OvbResult } from '../../core/ovbAnalysis';
import { EXTREME_SCENARIO_R2YZ } from '../../core/ovbAnalysis';
import { adjustForConfounder } from '../../core/confounderAdjustment';
import { formatNumber, formatPercent } from '../../format/formatNumber';
import { exposureLabel, outcomeLabel, unitsSuffix, type StudyLabels } from '../../format/studyLabels';
import { plainNumber } from './text';
import { createFrame } from '../../plot/frame';
import { framedPlotSpec } from '../../plot/framedPlotSpec';
import { markers, palette, seriesColors, seriesDashes } from '../../plot/palette';
import { percentTick, treatmentShareTitle } from './ovbContourPlot';
import { polylinePath } from '../../plot/pathData';
import type { LegendItem, PlotMark, PlotSpec } from '../../plot/plotSpec';

export interface OvbExtremeScenarioOptions {
  readonly width?: number;
  readonly height?: number;
  readonly study?: Partial<StudyLabels>;
  /** Upper end of the R²(D~Z|X) axis, in (0, 1); default: past the largest crossing and every benchmark. */
  readonly maxR2dz?: number;
}

const CURVE_POINTS = 200;

/**
 * Extreme scenarios: the adjusted estimate against the confounder's partial R² with the treatment,
 * R²(D~Z|X), if the confounder explained all (R²yz = 1), three quarters or half of the outcome's residual
 * variance. Where a curve crosses (1 − q)·estimate is marked; benchmark R²dz values (k = 1) are marked on the
 * axis for comparison.
 *
 * **Method.** adjusted estimate = sign(β̂)(|β̂| ∓ se·√df·√(R²yz·R²dz/(1 − R²dz))), traced at 200 values of
 * R²dz; the crossings are the closed form R²dz = f_q²/(R²yz + f_q²).
 *
 * **References.** Cinelli C, Hazlett C (2020). Making sense of sensitivity: extending omitted variable bias.
 * JRSS-B 82(1):39–67, §5 (extreme-scenario analysis).
 */
export function ovbExtremeScenarioPlot(result: OvbResult, options: OvbExtremeScenarioOptions = {}): PlotSpec {
  const width = options.width ?? 640;
  const height = options.height ?? 420;
  const exposure = exposureLabel(options.study);
  const outcome = outcomeLabel(options.study);
  const firstK = result.k[0];
  const benchmarks = result.benchmarks.filter((b) => b.unavailable === null && b.k === firstK);
  const crossings = result.extremeScenarios.map((e) => e.r2dzToReach).filter((v) => Number.isFinite(v));
  // Room for every crossing (with the curves running on past it) and every benchmark, not much more.
  const wanted = [...crossings.map((v) => Math.min(0.95, v * 2.5)), ...benchmarks.map((b) => b.r2dz * 1.25), 0.02];
  const maxX = options.maxR2dz !== undefined && options.maxR2dz > 0 && options.maxR2dz < 1 ? options.maxR2dz : roundUp(Math.max(...wanted));
  const reported = { estimate: result.estimate, se: result.se, df: result.df };
  const curves = EXTREME_SCENARIO_R2YZ.map((r2yz) => {
    const points: [number, number][] = [];
    for (let i = 0; i <= CURVE_POINTS; i++) {
      const b = (maxX * i) / CURVE_POINTS;
      points.push([b, adjustForConfounder(reported, { r2dz: b, r2yz }, result.direction).estimate]);
    }
    return { r2yz, points };
  });
  const ys = curves.flatMap((c) => c.points.map((p) => p[1])).filter(Number.isFinite);
  let lo = Math.min(0, result.threshold, ...ys);
  let hi = Math.max(0, result.threshold, ...ys);
  // Keep the reported estimate readable when a curve dives steeply near R²dz → 1.
  const spanLimit = Math.abs(result.estimate) * 4 || 1;
  lo = Math.max(lo, Math.min(0, result.threshold, result.estimate) - spanLimit);
  hi = Math.min(hi, Math.max(0, result.threshold, result.estimate) + spanLimit);
  if (!(hi > lo)) hi = lo + 1;
  const pad = (hi - lo) * 0.05;
  const frame = createFrame({
    width,
    height,
    margin: { left: 72, right: 24, top: 16, bottom: 56 },
    x: { domain: [0, maxX], label: treatmentShareTitle(exposure), tickFormat: percentTick },
    y: { domain: [lo - pad, hi + pad], label: `Adjusted estimate${unitsSuffix(options.study) ? ` (${unitsSuffix(options.study).trim()})` : ''}` },
  });
  const { inner } = frame;
  const marks: PlotMark[] = [];
  const legend: LegendItem[] = [];
  marks.push({ kind: 'rule', x1: inner.left, x2: inner.right, y1: frame.y(result.threshold), y2: frame.y(result.threshold), stroke: palette.threshold, strokeWidth: 1.5, dash: '4 3', label: `threshold ${formatNumber(result.threshold, { significant: 3 })}` });
  legend.push({ label: result.q === 1 ? 'zero' : `threshold (1 − q)·estimate = ${formatNumber(result.threshold, { significant: 3 })}`, color: palette.threshold, swatch: 'line', dash: '4 3' });
  curves.forEach((c, i) => {
    marks.push({
      kind: 'path',
      d: polylinePath(c.points.map(([b, y]) => [frame.x(b), frame.y(y)] as const)),
      stroke: seriesColors[i],
      strokeWidth: 2,
      dash: seriesDashes[i] || undefined,
      label: `Confounder explaining ${formatPercent(c.r2yz, 0)} of ${outcome}'s residual variance`,
    });
    legend.push({ label: `it explains ${c.r2yz === 1 ? 'all' : formatPercent(c.r2yz, 0)} of ${outcome}'s unexplained variance`, color: seriesColors[i], swatch: 'line', ...(seriesDashes[i] ? { dash: seriesDashes[i] } : {}) });
  });
  result.extremeScenarios.forEach((e, i) => {
    if (!(Number.isFinite(e.r2dzToReach) && e.r2dzToReach <= maxX)) return;
    marks.push({ kind: 'point', x: frame.x(e.r2dzToReach), y: frame.y(result.threshold), shape: markers.tippingEstimate.shape, color: seriesColors[i], size: 5, label: formatPercent(e.r2dzToReach), labelSide: i % 2 === 0 ? 'above' : 'below' });
  });
  for (const b of benchmarks) {
    if (b.r2dz > maxX) continue;
    marks.push({ kind: 'rule', x1: frame.x(b.r2dz), x2: frame.x(b.r2dz), y1: inner.bottom, y2: inner.bottom - 10, stroke: palette.reference, strokeWidth: 2, label: `${b.covariate}: R²(D~Xj) bound ${formatPercent(b.r2dz)}` });
    marks.push({ kind: 'text', x: frame.x(b.r2dz), y: inner.bottom - 14, text: b.covariate, anchor: 'middle', color: palette.reference, size: 10 });
  }
  if (benchmarks.some((b) => b.r2dz <= maxX)) {
    legend.push({ label: `share of ${exposure}'s variance of a confounder ${firstK === 1 ? 'as strong as' : `${plainNumber(firstK)} times`} a covariate (tick at the bottom)`, color: palette.reference, swatch: 'line' });
  }
  const rows: string[][] = result.extremeScenarios.map((e) => [formatPercent(e.r2yz, 0), 'crossing', Number.isFinite(e.r2dzToReach) ? formatPercent(e.r2dzToReach) : 'none', formatNumber(result.threshold, { significant: 3 })]);
  for (const c of curves) {
    for (let i = 0; i <= CURVE_POINTS; i += CURVE_POINTS / 10) rows.push([formatPercent(c.r2yz, 0), 'curve', formatPercent(c.points[i][0]), formatNumber(c.points[i][1], { significant: 4 })]);
  }
  return framedPlotSpec(frame, {
    id: 'ovb-extreme-scenarios',
    title: 'Adjusted estimate if the confounder explained much of the outcome',
    description: `The estimate adjusted for a hidden confounder that explains all, 75% or 50% of the residual variance of ${outcome}, by its partial R² with ${exposure}. ${result.extremeScenarios
      .filter((e) => Number.isFinite(e.r2dzToReach))
      .map((e) => `With ${formatPercent(e.r2yz, 0)} it must explain ${formatPercent(e.r2dzToReach)} of ${exposure} to reach ${formatNumber(result.threshold, { significant: 3 })}.`)
      .join(' ')}`,
    marks,
    legend,
    table: { caption: 'Adjusted estimate under extreme scenarios', columns: ['share of outcome variance (partial R²)', 'row', 'share of treatment variance (partial R²)', 'adjusted estimate'], rows },
  });
}

function roundUp(v: number): number {
  const step = v <= 0.1 ? 0.01 : v <= 0.5 ? 0.05 : 0.1;
  return Math.min(0.99, Math.max(step, Math.ceil(v / step - 1e-9) * step));
}
