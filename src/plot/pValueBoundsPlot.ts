import type { TippingGamma } from '../core/tippingGamma';
import { formatPValue } from '../format/formatNumber';
import { formatAsTyped, formatGamma, formatGammaValue } from '../format/gammaText';
import type { StudyLabels } from '../format/studyLabels';
import { createFrame } from './frame';
import { framedPlotSpec } from './framedPlotSpec';
import { markers, palette } from './palette';
import { polylinePath } from './pathData';
import type { LegendItem, PlotMark, PlotSpec } from './plotSpec';

/** Size and labels of a sensitivity plot. */
export interface SensitivityPlotOptions {
  /** The user's wider Γ axis (p-value plot): it runs to at least this Γ (> 1); default: fitted to the curve. */
  readonly maxGamma?: number;
  readonly width?: number;
  readonly height?: number;
  readonly study?: Partial<StudyLabels>;
}

/** One Γ with its bounds on the one-sided p-value. */
export interface PValueBoundsRow {
  readonly gamma: number;
  readonly pUpper: number;
  readonly pLower: number;
}

/** What the p-value-by-Γ plot needs from any Rosenbaum-bounds result (matched pairs, matched sets). */
export interface PValueBoundsData {
  /** The figure's id (`pairs-p-value-by-gamma`, …). */
  readonly id: string;
  readonly title: string;
  readonly gammaAxisLabel: string;
  readonly tableCaption: string;
  readonly alpha: number;
  /** The tabulated rows (marked as points and listed in the table). */
  readonly rows: readonly PValueBoundsRow[];
  /** A finer grid for the curves; empty to draw through `rows`. */
  readonly curve: readonly PValueBoundsRow[];
  readonly sensitivityValue: number | null;
  readonly sensitivityStatus: TippingGamma['status'];
}

/**
 * The p-value bounds of a Rosenbaum-bounds result against the hidden bias Γ: the upper bound (the one that
 * matters for the finding) and the lower bound, on a logarithmic p axis, with α marked and the tipping Γ
 * labelled where the upper bound reaches α (Rosenbaum 2002, Observational Studies, §4.3).
 */
export function pValueBoundsPlot(result: PValueBoundsData, options: SensitivityPlotOptions = {}): PlotSpec {
  const width = options.width ?? 640;
  const height = options.height ?? 400;
  const curve = result.curve.length > 0 ? result.curve : result.rows;
  const fittedMax = Math.max(1.5, ...curve.map((r) => r.gamma), ...result.rows.map((r) => r.gamma));
  // The user may widen the Γ axis (never narrow it below what is drawn).
  const gammaMax = options.maxGamma !== undefined && Number.isFinite(options.maxGamma) && options.maxGamma > fittedMax && options.maxGamma <= 1e6 ? options.maxGamma : fittedMax;
  const smallest = Math.min(result.alpha, ...curve.map((r) => r.pUpper).filter((p) => p > 0));
  const yMin = Math.max(1e-12, Math.pow(10, Math.floor(Math.log10(smallest)) - 1));
  const frame = createFrame({
    width,
    height,
    x: { domain: [1, gammaMax], label: result.gammaAxisLabel },
    y: { domain: [yMin, 1], label: 'One-sided p-value, worst and best case (log scale)', scale: 'log' },
  });
  const inside = (p: number) => (p >= yMin && p <= 1 ? frame.y(p) : NaN);
  const marks: PlotMark[] = [];
  const legend: LegendItem[] = [];

  marks.push({
    kind: 'rule',
    x1: frame.inner.left,
    x2: frame.inner.right,
    y1: frame.y(result.alpha),
    y2: frame.y(result.alpha),
    stroke: palette.threshold,
    strokeWidth: 1.5,
    dash: '4 4',
    label: `α = ${formatAsTyped(result.alpha)}`,
  });
  marks.push({
    kind: 'text',
    x: frame.inner.left + 6,
    y: frame.y(result.alpha) - 6,
    text: `α = ${formatAsTyped(result.alpha)}`,
    anchor: 'start',
    color: palette.threshold,
    size: 12,
  });
  marks.push({
    kind: 'path',
    d: polylinePath(curve.map((r) => [frame.x(r.gamma), inside(r.pLower)])),
    stroke: palette.second,
    strokeWidth: 2,
    dash: '6 3',
    label: 'Lower bound on the p-value',
  });
  legend.push({ label: 'best-case p', color: palette.second, swatch: 'line', dash: '6 3' });
  marks.push({
    kind: 'path',
    d: polylinePath(curve.map((r) => [frame.x(r.gamma), inside(r.pUpper)])),
    stroke: palette.estimate,
    strokeWidth: 2.5,
    label: 'Upper bound on the p-value',
  });
  legend.push({ label: 'worst-case p', color: palette.estimate, swatch: 'line' });
  for (const row of result.rows) {
    if (!(row.pUpper >= yMin) || row.gamma > gammaMax) continue;
    marks.push({ kind: 'point', x: frame.x(row.gamma), y: frame.y(row.pUpper), shape: 'circle', color: palette.estimate, size: 3.5 });
  }
  if (result.sensitivityValue !== null && result.sensitivityValue <= gammaMax) {
    const x = frame.x(result.sensitivityValue);
    marks.push({
      kind: 'rule',
      x1: x,
      x2: x,
      y1: frame.inner.bottom,
      y2: frame.y(result.alpha),
      stroke: markers.tippingEstimate.color,
      dash: '1 3',
      strokeWidth: 1.5,
      label: `Tipping Γ = ${formatGamma(result.sensitivityValue)}`,
    });
    marks.push({ kind: 'point', x, y: frame.y(result.alpha), ...markers.tippingEstimate, size: 6 });
    const rightHalf = x > (frame.inner.left + frame.inner.right) / 2;
    marks.push({
      kind: 'text',
      x: rightHalf ? x - 6 : x + 6,
      y: frame.inner.bottom - 10,
      text: `tipping Γ = ${formatGamma(result.sensitivityValue)}`,
      anchor: rightHalf ? 'end' : 'start',
      color: palette.ink,
      size: 13,
      weight: 'bold',
    });
    legend.push({ label: 'tipping Γ', color: markers.tippingEstimate.color, swatch: markers.tippingEstimate.shape });
  }

  const tipping =
    result.sensitivityStatus === 'found'
      ? `The upper bound reaches α = ${formatAsTyped(result.alpha)} at Γ = ${formatGamma(result.sensitivityValue)}.`
      : result.sensitivityStatus === 'not-significant'
        ? `The p-value is above α = ${formatAsTyped(result.alpha)} already at Γ = 1.`
        : `The upper bound stays below α over the whole searched range.`;
  return framedPlotSpec(frame, {
    id: result.id,
    title: result.title,
    description: `Upper and lower bounds on the one-sided p-value for Γ from 1 to ${formatGammaValue(gammaMax)}. ${tipping}`,
    marks,
    legend,
    table: Object.freeze({
      caption: result.tableCaption,
      columns: ['Γ', 'worst-case p', 'best-case p'],
      rows: result.rows.map((r) => [formatGammaValue(r.gamma), formatPValue(r.pUpper), formatPValue(r.pLower)]),
    }),
  });
}
