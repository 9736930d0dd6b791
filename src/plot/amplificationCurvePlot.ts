import { amplificationDelta, amplificationSymmetricPoint, type AmplifiedPair } from '../core/amplification';
import { formatNumber } from '../format/formatNumber';
import { formatAsTyped, formatGamma } from '../format/gammaText';
import { createFrame } from './frame';
import { equalStrengthDiagonal } from './equalStrengthDiagonal';
import { framedPlotSpec } from './framedPlotSpec';
import { markers, palette } from './palette';
import { polylinePath } from './pathData';
import type { LegendItem, PlotMark, PlotSpec } from './plotSpec';
import type { SensitivityPlotOptions } from './pValueBoundsPlot';

/** What the amplification plot needs: the tipping Γ, the readable (Λ, Δ) pairs, and the direction. */
export interface AmplificationCurveData {
  readonly id: string;
  readonly sensitivityValue: number | null;
  readonly amplification: readonly AmplifiedPair[];
  readonly alternative: 'greater' | 'less';
}

const CURVE_POINTS = 160;

/**
 * Amplification of the tipping Γ (Rosenbaum & Silber 2009, JASA 104:1398–1405): every pair (Λ, Δ) with
 * Γ = (ΛΔ + 1)/(Λ + Δ) — a hidden covariate that raises the odds of treatment by Λ and the odds of a higher
 * outcome by Δ — on logarithmic axes, with the readable pairs given marked. Null when there is no
 * tipping Γ.
 */
export function amplificationCurvePlot(result: AmplificationCurveData, options: SensitivityPlotOptions = {}): PlotSpec | null {
  const gamma = result.sensitivityValue;
  if (gamma === null || !(gamma > 1) || !Number.isFinite(gamma)) return null;
  const width = options.width ?? 640;
  const height = options.height ?? 420;
  const symmetric = amplificationSymmetricPoint(gamma);
  const wanted = Math.max(symmetric * 6, ...result.amplification.map((p) => Math.max(p.lambda, p.delta) * 1.3));
  const magnitude = Math.pow(10, Math.floor(Math.log10(wanted)));
  const top = [1, 2, 5, 10].map((s) => s * magnitude).find((v) => v >= wanted) ?? 10 * magnitude;
  const frame = createFrame({
    width,
    height,
    x: { domain: [1, top], label: 'How much the hidden covariate multiplies the odds of treatment (Λ)', scale: 'log' },
    y: { domain: [1, top], label: `How much it multiplies the odds of a ${result.alternative === 'less' ? 'lower' : 'higher'} outcome (Δ)`, scale: 'log' },
  });
  // Trace Λ from where Δ = top down to Λ = top, evenly in log(Λ − Γ) so the steep end is smooth.
  const start = amplificationDelta(gamma, top);
  const from = Math.log(start - gamma);
  const to = Math.log(top - gamma);
  const points: [number, number][] = [];
  for (let i = 0; i <= CURVE_POINTS; i++) {
    const lambda = i === 0 ? start : i === CURVE_POINTS ? top : gamma + Math.exp(from + ((to - from) * i) / CURVE_POINTS);
    points.push([frame.x(lambda), frame.y(Math.min(top, amplificationDelta(gamma, lambda)))]);
  }
  const marks: PlotMark[] = [];
  const legend: LegendItem[] = [];
  marks.push(equalStrengthDiagonal(frame, top, 'Equal links to treatment and outcome'));
  marks.push({ kind: 'path', d: polylinePath(points), stroke: palette.estimate, strokeWidth: 2.5, label: `Pairs (Λ, Δ) equivalent to Γ = ${formatGamma(gamma)}` });
  legend.push({ label: `Γ = ${formatGamma(gamma)}`, color: palette.estimate, swatch: 'line' });
  for (const pair of result.amplification) {
    if (pair.lambda > top || pair.delta > top) continue;
    marks.push({
      kind: 'point',
      x: frame.x(pair.lambda),
      y: frame.y(pair.delta),
      ...markers.example,
      size: 5,
      label: `Λ = ${formatAsTyped(pair.lambda)}, Δ = ${formatAsTyped(Number(pair.delta.toPrecision(2)))}`,
      labelSide: frame.x(pair.lambda) > frame.inner.left + 0.6 * (frame.inner.right - frame.inner.left) ? 'above' : 'right',
    });
  }
  if (result.amplification.length > 0) legend.push({ label: 'examples in the text', color: markers.example.color, swatch: markers.example.shape });
  const tableLambdas = [1.25, 1.5, 2, 3, 4, 5, 6, 8, 10, 15, 20, 30, 50, 100, 200, 500, 1000].map((m) => m * Math.max(1, Math.pow(10, Math.floor(Math.log10(gamma)) - 1)));
  const rows = tableLambdas
    .filter((l) => l > gamma * 1.05 && l <= top)
    .map((l) => [formatAsTyped(l), formatNumber(amplificationDelta(gamma, l), { significant: 3 })]);
  return framedPlotSpec(frame, {
    id: result.id,
    title: `Ways a hidden covariate could produce bias Γ = ${formatGamma(gamma)}`,
    description: `Each point on the curve is a covariate strong enough to tip the finding: it multiplies the odds of treatment by Λ and the odds of a ${result.alternative === 'less' ? 'lower' : 'higher'} outcome by Δ. Where both are equal, Λ = Δ = ${formatNumber(symmetric, { significant: 3 })}.`,
    marks,
    legend,
    table: Object.freeze({ caption: `Pairs (Λ, Δ) equivalent to Γ = ${formatGamma(gamma)}`, columns: ['Λ (treatment)', 'Δ (outcome)'], rows }),
  });
}
