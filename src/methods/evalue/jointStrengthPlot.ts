import { boundingFactorPartner } from '../../core/boundingFactor';
import type { EValueResult } from '../../core/eValueAnalysis';
import type { ReferenceConfounderAssessment } from '../../core/referenceConfounder';
import { formatEValue, formatPlain } from './text';
import { exposureLabel, outcomeLabel } from '../../format/studyLabels';
import type { StudyLabels } from '../../format/studyLabels';
import { createFrame } from '../../plot/frame';
import { equalStrengthDiagonal } from '../../plot/equalStrengthDiagonal';
import { framedPlotSpec } from '../../plot/framedPlotSpec';
import type { Frame } from '../../plot/frame';
import { markers, palette } from '../../plot/palette';
import { polygonPath, polylinePath } from '../../plot/pathData';
import type { LegendItem, PlotMark, PlotSpec, PointMark } from '../../plot/plotSpec';

export interface JointStrengthPlotOptions {
  readonly width?: number;
  readonly height?: number;
  readonly study?: Partial<StudyLabels>;
  /** Reference confounders to mark, already assessed against the result. */
  readonly confounders?: readonly ReferenceConfounderAssessment[];
  /** The user's wider axis: both axes run to at least this risk ratio (> 1); default: fitted to what is shown. */
  readonly maxStrength?: number;
}

/** How many points trace each curve. */
const CURVE_POINTS = 160;

/**
 * The joint-strength plot of an E-value result: every pair of confounder strengths — risk ratio with the
 * exposure (RR_EU, x) and with the outcome (RR_UD, y) — that would just explain away the estimate, and the
 * interval limit, on logarithmic axes from 1.
 *
 * **Method.** The curve is B(RR_EU, RR_UD) = RR, i.e. RR_UD = RR·(RR_EU − 1)/(RR_EU − RR) for RR_EU > RR
 * (Ding & VanderWeele 2016, Epidemiology 27(3):368–377), traced in steps even in log(RR_EU − RR) so the steep
 * part near the asymptote is drawn smoothly. Pairs on or above the curve explain the estimate away (shaded);
 * the E-value is where the curve meets the diagonal RR_EU = RR_UD. RR is the risk-ratio-scale estimate over
 * the target, stated as ≥ 1.
 */
export function jointStrengthPlot(result: EValueResult, options: JointStrengthPlotOptions = {}): PlotSpec {
  const width = options.width ?? 640;
  const height = options.height ?? 460;
  const confounders = options.confounders ?? [];
  const exposure = exposureLabel(options.study);
  const outcome = outcomeLabel(options.study);
  const estimateRatio = result.ratioToTarget;
  const intervalRatio = result.intervalRatioToTarget;
  const eEstimate = result.eValueEstimate;
  const eInterval = result.eValueInterval;
  const goal = result.targetIsNull ? 'explain away' : 'move to the target';

  const fitted = axisTop(eEstimate, confounders);
  const wider = options.maxStrength;
  const top = wider !== undefined && Number.isFinite(wider) && wider > fitted && wider <= 1e12 ? wider : fitted;
  const frame = createFrame({
    width,
    height,
    margin: { left: 64, right: 24, top: 16, bottom: 56 },
    x: { domain: [1, top], label: `How much more common the hidden confounder is with ${exposure} (risk ratio)`, scale: 'log' },
    y: { domain: [1, top], label: `How much it raises the risk of ${outcome} (risk ratio)`, scale: 'log' },
  });
  const { inner } = frame;

  const marks: PlotMark[] = [];
  const legend: LegendItem[] = [];
  const drawable = (ratio: number) => ratio > 1 && Number.isFinite(ratio) && eValueFits(ratio, top);

  // Shaded regions first (at the back): the interval's region lighter, the estimate's on top of it.
  if (intervalRatio !== null && drawable(intervalRatio) && intervalRatio < estimateRatio) {
    marks.push(region(frame, intervalRatio, top, palette.interval, 0.12, `Pairs that would make the interval include ${result.targetIsNull ? 'the null' : 'the target'}`));
    legend.push({ label: 'would reach the interval limit', color: palette.interval, swatch: 'area' });
  }
  if (drawable(estimateRatio)) {
    marks.push(region(frame, estimateRatio, top, palette.overturned, 0.3, `Pairs that would ${goal} the estimate`));
    legend.push({ label: `would ${goal} the estimate`, color: palette.overturned, swatch: 'area' });
  } else if (estimateRatio <= 1) {
    marks.push({
      kind: 'path',
      d: polygonPath([
        [inner.left, inner.bottom],
        [inner.right, inner.bottom],
        [inner.right, inner.top],
        [inner.left, inner.top],
      ]),
      fill: palette.overturned,
      fillOpacity: 0.3,
      label: 'The estimate is at the target: every pair explains it away',
    });
  }

  // The diagonal of equal strengths, where the E-values lie.
  marks.push(equalStrengthDiagonal(frame, top, 'Equal strengths with exposure and outcome'));

  if (drawable(estimateRatio)) {
    marks.push({
      kind: 'path',
      d: polylinePath(curvePixels(frame, estimateRatio, top)),
      stroke: palette.estimate,
      strokeWidth: 2.5,
      label: `Pairs that would just ${goal} the estimate`,
    });
    legend.push({ label: 'estimate', color: palette.estimate, swatch: 'line' });
  }
  if (intervalRatio !== null && drawable(intervalRatio)) {
    marks.push({
      kind: 'path',
      d: polylinePath(curvePixels(frame, intervalRatio, top)),
      stroke: palette.interval,
      strokeWidth: 2.5,
      dash: '2 3',
      label: 'Pairs that would just make the interval include the target',
    });
    legend.push({ label: 'interval limit', color: palette.interval, swatch: 'line', dash: '2 3' });
  }

  const points: PointMark[] = [];
  if (Number.isFinite(eEstimate) && eEstimate > 1 && eEstimate <= top) {
    points.push({
      kind: 'point',
      x: frame.x(eEstimate),
      y: frame.y(eEstimate),
      ...markers.tippingEstimate,
      size: 6,
      label: `E-value ${formatEValue(eEstimate)}`,
      labelSide: 'left',
    });
  }
  if (eInterval !== null && Number.isFinite(eInterval) && eInterval > 1 && eInterval <= top) {
    points.push({
      kind: 'point',
      x: frame.x(eInterval),
      y: frame.y(eInterval),
      ...markers.tippingInterval,
      size: 5,
      label: `interval ${formatEValue(eInterval)}`,
      labelSide: 'right',
    });
  }
  for (const c of confounders) {
    if (!(Number.isFinite(c.strengthExposure) && Number.isFinite(c.strengthOutcome))) continue;
    points.push({
      kind: 'point',
      x: frame.x(c.strengthExposure),
      y: frame.y(c.strengthOutcome),
      ...markers.benchmark,
      size: 5,
      label: c.name,
      labelSide: 'above',
    });
  }
  marks.push(...points);
  if (points.some((p) => p.shape === markers.tippingEstimate.shape)) legend.push({ label: 'E-value of the estimate', color: markers.tippingEstimate.color, swatch: markers.tippingEstimate.shape });
  if (points.some((p) => p.shape === markers.tippingInterval.shape)) legend.push({ label: 'E-value of the interval limit', color: markers.tippingInterval.color, swatch: markers.tippingInterval.shape });
  if (confounders.length > 0) legend.push({ label: 'reference confounder', color: markers.benchmark.color, swatch: markers.benchmark.shape });

  return framedPlotSpec(frame, {
    id: 'joint-strength',
    title: `Confounder strengths that would ${goal} the estimate`,
    description: describePlot(result, exposure, outcome),
    marks,
    legend,
    table: dataTable(result, confounders, top),
  });
}

/** The top of both axes: room past the E-value and every reference point, on a round value. */
function axisTop(eEstimate: number, confounders: readonly ReferenceConfounderAssessment[]): number {
  let top = Number.isFinite(eEstimate) ? Math.max(3, eEstimate * 2.5) : 3;
  for (const c of confounders) {
    for (const s of [c.strengthExposure, c.strengthOutcome]) if (Number.isFinite(s)) top = Math.max(top, s * 1.5);
  }
  top = Math.min(top, 1e12);
  // Round values close together, so that rounding up does not double the range (6.4 → 8, not 10).
  const magnitude = Math.pow(10, Math.floor(Math.log10(top)));
  for (const step of [1, 1.5, 2, 3, 4, 5, 6, 8, 10]) if (step * magnitude >= top) return step * magnitude;
  return 10 * magnitude;
}

/** Whether the curve for `ratio` crosses the plotted square (its E-value lies inside it). */
function eValueFits(ratio: number, top: number): boolean {
  return boundingFactorPartner(ratio, top) < top;
}

/** Pixel points of the curve B(x, y) = ratio from where it enters at the top edge to the right edge. */
function curvePixels(frame: Frame, ratio: number, top: number): [number, number][] {
  const xStart = boundingFactorPartner(ratio, top); // where the curve crosses y = top
  const from = Math.log(xStart - ratio);
  const to = Math.log(top - ratio);
  const points: [number, number][] = [];
  for (let i = 0; i <= CURVE_POINTS; i++) {
    const x = i === 0 ? xStart : i === CURVE_POINTS ? top : ratio + Math.exp(from + ((to - from) * i) / CURVE_POINTS);
    const y = i === 0 ? top : boundingFactorPartner(ratio, x);
    points.push([frame.x(x), frame.y(y)]);
  }
  return points;
}

/** The region on and above the curve, closed along the top and right edges. */
function region(frame: Frame, ratio: number, top: number, color: string, opacity: number, label: string): PlotMark {
  const curve = curvePixels(frame, ratio, top);
  const corner: [number, number] = [frame.x(top), frame.y(top)];
  return { kind: 'path', d: polygonPath([...curve, corner]), fill: color, fillOpacity: opacity, label };
}

function describePlot(result: EValueResult, exposure: string, outcome: string): string {
  const what = result.targetIsNull ? 'explain away the estimate' : 'move the estimate to the target';
  if (result.ratioToTarget <= 1) {
    return `The estimate already equals the ${result.targetIsNull ? 'null' : 'target'}, so every confounder, however weak, is enough.`;
  }
  return (
    `Each point of the solid curve is a pair of risk ratios — of a hidden confounder with ${exposure} and with ${outcome} — ` +
    `that would just ${what}; pairs above and to the right of it (shaded) would do so. The curve meets the diagonal of ` +
    `equal strengths at the E-value, ${formatEValue(result.eValueEstimate)}.` +
    (result.eValueInterval !== null && result.intervalRatioToTarget !== null && result.intervalRatioToTarget > 1
      ? ` The dashed curve does the same for the interval limit (E-value ${formatEValue(result.eValueInterval)}).`
      : '')
  );
}

function dataTable(result: EValueResult, confounders: readonly ReferenceConfounderAssessment[], top: number) {
  const yesNo = (b: boolean | null) => (b === null ? 'no interval' : b ? 'yes' : 'no');
  const rows: string[][] = [];
  rows.push(['E-value for the estimate', formatEValue(result.eValueEstimate), formatEValue(result.eValueEstimate), 'just']);
  if (result.eValueInterval !== null) {
    rows.push(['E-value for the interval', formatEValue(result.eValueInterval), formatEValue(result.eValueInterval), result.eValueInterval <= 1 ? 'the interval already includes it' : 'no (explains the interval)']);
  }
  // A few points along the estimate's curve, at round strengths with the exposure.
  if (result.ratioToTarget > 1) {
    for (const x of [1.5, 2, 3, 5, 10, 20, 50, 100, 1000]) {
      if (x <= result.ratioToTarget || x > top) continue;
      rows.push(['on the estimate curve', formatPlain(x), formatPlain(boundingFactorPartner(result.ratioToTarget, x)), 'just']);
    }
  }
  for (const c of confounders) {
    rows.push([`reference: ${c.name}`, formatPlain(c.strengthExposure), formatPlain(c.strengthOutcome), yesNo(c.explainsEstimate)]);
  }
  return Object.freeze({
    caption: 'Confounder strengths (risk ratios) that would explain away the estimate, and the reference confounders',
    columns: Object.freeze(['Point', 'RR with exposure', 'RR with outcome', 'Explains away the estimate?']),
    rows: Object.freeze(rows.map((row) => Object.freeze(row))),
  });
}
