import { contours } from 'd3-contour';
import { scaleLinear } from 'd3-scale';
import type { OvbResult } from '../../core/ovbAnalysis';
import { adjustForConfounder, adjustedGrid, type ConfounderStrength } from '../../core/confounderAdjustment';
import { estimateBoundaryR2yz, scaledPartialF, significanceInterval, significanceRegionStart } from '../../core/flipBoundary';
import { criticalF } from '../../core/robustnessValue';
import { formatNumber, formatPercent } from '../../format/formatNumber';
import { exposureLabel, outcomeLabel, type StudyLabels } from '../../format/studyLabels';
import { plainNumber } from './text';
import { createFrame } from '../../plot/frame';
import { framedPlotSpec } from '../../plot/framedPlotSpec';
import { boundaryColor, markers, palette } from '../../plot/palette';
import { uniformPercentLabels } from '../../plot/tickLabels';
import { polygonPath, polylinePath } from '../../plot/pathData';
import type { DataTable, LegendItem, PlotMark, PlotSpec } from '../../plot/plotSpec';

/** Which adjusted quantity the contours show. */
export type OvbContourKind = 'estimate' | 't';

export interface OvbContourOptions {
  readonly kind: OvbContourKind;
  readonly width?: number;
  readonly height?: number;
  readonly study?: Partial<StudyLabels>;
  /** Upper end of the R²(D~Z|X) axis, in (0, 1); default: room for the robustness value and every benchmark. */
  readonly maxR2dz?: number;
  /** Upper end of the R²(Y~Z|D,X) axis, in (0, 1]; default as for `maxR2dz`. */
  readonly maxR2yz?: number;
  /** Draw the t level lines by marching squares on a grid of this many points per axis instead of in closed form. */
  readonly gridSize?: number;
  /** A confounder strength to mark (e.g. the one the user chose). */
  readonly scenario?: ConfounderStrength | null;
}

/** Points along R²dz at which the exact flip boundary is evaluated (plus its exact ends and tip). */
const BOUNDARY_SAMPLES = 240;
/** The same for each level line of the adjusted estimate. */
const LEVEL_SAMPLES = 80;

/**
 * Contours of the adjusted estimate (or of the adjusted t-statistic) over the strength of a hidden confounder:
 * its partial R² with the treatment, R²(D~Z|X) (x), and with the outcome, R²(Y~Z|D,X) (y), both from 0.
 *
 * **Method.** Level lines in closed form along R²dz: for the adjusted estimate R²yz = g²(1 − R²dz)/R²dz, for
 * the adjusted t the roots of √b·sin θ ± ℓ·cos θ = c (see `tLevelLines`); with `gridSize` set, the t lines come
 * from marching squares (d3-contour) on a grid instead. The line where the
 * conclusion flips — the adjusted estimate reaching (1 − q)·estimate, or the adjusted t for that null value
 * reaching the critical value of t with df − 1 degrees of freedom — is not taken from the grid: it is
 * evaluated in closed form at each R²dz (see `estimateBoundaryR2yz` and `significanceInterval`), and the
 * region beyond it is shaded. Benchmarks (confounders some times as strong as a covariate) are labelled points.
 *
 * **References.** Cinelli C, Hazlett C (2020). Making sense of sensitivity: extending omitted variable bias.
 * JRSS-B 82(1):39–67, §4–6 (contour plots of the adjusted estimate and t over the two partial R²s, with
 * bounds from observed covariates).
 */
export function ovbContourPlot(result: OvbResult, options: OvbContourOptions): PlotSpec {
  const kind = options.kind;
  const width = options.width ?? 640;
  const height = options.height ?? 480;
  const exposure = exposureLabel(options.study);
  const outcome = outcomeLabel(options.study);
  const scenario = options.scenario ?? result.scenario;
  const [maxX, maxY] = axisMaxima(result, options, scenario);
  const boundary = kind === 'estimate' ? estimateBoundary(result, maxX, maxY) : significanceBoundary(result, maxX, maxY);
  const frame = createFrame({
    width,
    height,
    // A note about the boundary goes above the plotting area, where it cannot cover lines or labels.
    margin: { left: 64, right: 24, top: boundary.note ? 30 : 16, bottom: 56 },
    x: { domain: [0, maxX], label: treatmentShareTitle(exposure), tickFormat: percentTick },
    y: { domain: [0, maxY], label: outcomeShareTitle(outcome), tickFormat: percentTick },
  });
  const { inner } = frame;
  const reported = { estimate: result.estimate, se: result.se, df: result.df };
  const value = (b: number, a: number): number => {
    const adj = adjustForConfounder(reported, { r2dz: b, r2yz: a }, result.direction);
    return kind === 'estimate' ? adj.estimate : (adj.estimate - result.threshold) / adj.se;
  };
  const unadjusted = kind === 'estimate' ? result.estimate : (result.estimate - result.threshold) / result.se;
  const flipLevel = kind === 'estimate' ? result.threshold : Math.sign(result.estimate || 1) * result.criticalT;
  const marks: PlotMark[] = [];
  const legend: LegendItem[] = [];

  // Shaded region beyond the flip boundary (at the back).
  for (const polygon of boundary.regions) {
    marks.push({
      kind: 'path',
      d: polygonPath(polygon.map(([b, a]) => [frame.x(b), frame.y(a)] as const)),
      fill: palette.overturned,
      fillOpacity: 0.28,
      label: kind === 'estimate' ? `Confounders that would ${goalPhrase(result)}` : 'Confounders that would leave the estimate no longer significant in its direction',
    });
  }
  if (boundary.regions.length > 0) {
    legend.push({ label: kind === 'estimate' ? `would ${goalPhrase(result)}` : 'no longer significant in the estimate’s direction', color: palette.overturned, swatch: 'area' });
  }

  // Level lines from the grid.
  const levels = contourLevels(result, kind, value, maxX, maxY, flipLevel);
  const gridValues = (bs: Float64Array, as: Float64Array) =>
    adjustedGrid(reported, result.direction, bs, as, kind, result.threshold);
  const lines =
    kind === 'estimate'
      ? estimateLevelLines(result, levels, maxX, maxY)
      : options.gridSize !== undefined
        ? levelLines(gridValues, levels, maxX, maxY, options.gridSize)
        : tLevelLines(result, levels, maxX, maxY);
  for (const line of lines) {
    for (const ring of line.rings) {
      marks.push({ kind: 'path', d: polylinePath(ring.map(([b, a]) => [frame.x(b), frame.y(a)] as const)), stroke: palette.contour, strokeWidth: 1, label: `${kindLabel(kind)} ${formatLevel(line.level, kind)}` });
    }
    if (line.labelAt) {
      marks.push({ kind: 'text', x: frame.x(line.labelAt[0]), y: frame.y(line.labelAt[1]) - 3, text: formatContourLabel(line.level), anchor: 'middle', color: palette.contour, size: 10, droppable: true });
    }
  }
  const tLabel = result.q === 1 ? 'adjusted t' : `adjusted t for the null value ${formatNumber(result.threshold, { significant: 3 })}`;
  if (levels.length > 0) legend.push({ label: kind === 'estimate' ? 'adjusted estimate' : tLabel, color: palette.contour, swatch: 'line' });

  // The exact flip boundary, on top of the level lines.
  for (const curve of boundary.curves) {
    marks.push({
      kind: 'path',
      d: polylinePath(curve.map(([b, a]) => [frame.x(b), frame.y(a)] as const)),
      stroke: boundaryColor,
      strokeWidth: 3,
      label: boundary.label,
    });
  }
  if (boundary.curves.length > 0) legend.push({ label: boundary.legend, color: boundaryColor, swatch: 'line' });
  if (boundary.note) {
    marks.push({ kind: 'text', x: inner.right, y: inner.top - 8, text: boundary.note, anchor: 'end', color: palette.ink, size: 11 });
  }

  // Points: the unadjusted estimate, the robustness value, benchmarks, the chosen strength.
  const inDomain = (b: number, a: number) => b >= 0 && b <= maxX && a >= 0 && a <= maxY;
  marks.push({ kind: 'point', x: frame.x(0), y: frame.y(0), ...markers.reported, size: 6, label: `as reported ${formatLevel(unadjusted, kind)}`, labelSide: 'right' });
  legend.push({ label: 'as reported (no confounder)', color: markers.reported.color, swatch: markers.reported.shape });
  // The robustness value's point: on the diagonal, except for RV_{q,α} when f_q·f* ≥ 1, where the cheapest
  // confounder has R²dz = RV_{q,α} and R²yz = RV_{q,α}/(RV_{q,α} + f*²) (below the diagonal).
  const rvPoint = kind === 'estimate' ? result.rv : result.rvAlpha;
  const fCritical = criticalF(result.df, result.alpha);
  const offDiagonal = kind === 't' && scaledPartialF(settingOf(result)) * fCritical >= 1;
  const rvY = offDiagonal ? rvPoint / (rvPoint + fCritical * fCritical) : rvPoint;
  if (result.direction === 'toward-zero' && rvPoint > 0 && inDomain(rvPoint, rvY)) {
    const rvMarker = kind === 'estimate' ? markers.tippingEstimate : markers.tippingInterval;
    marks.push({ kind: 'point', x: frame.x(rvPoint), y: frame.y(rvY), ...rvMarker, size: 6, label: `${kind === 'estimate' ? 'robustness value' : 'robustness value at α'} ${formatPercent(rvPoint)}`, labelSide: 'left' });
  }
  let benchmarkShown = false;
  const unshown: string[] = [];
  for (const row of result.benchmarks) {
    if (row.unavailable !== null) continue;
    if (!inDomain(row.r2dz, row.r2yz)) {
      unshown.push(benchmarkName(row.k, row.covariate));
      continue;
    }
    benchmarkShown = true;
    marks.push({
      kind: 'point',
      x: frame.x(row.r2dz),
      y: frame.y(row.r2yz),
      ...markers.benchmark,
      size: 5,
      label: `${benchmarkName(row.k, row.covariate)}: ${formatLevel(kind === 'estimate' ? row.correctedEstimate : value(row.r2dz, row.r2yz), kind)}`,
      labelSide: 'right',
    });
  }
  if (benchmarkShown) legend.push({ label: 'a confounder as strong as an observed covariate (or several times)', color: markers.benchmark.color, swatch: markers.benchmark.shape });
  if (scenario && inDomain(scenario.r2dz, scenario.r2yz)) {
    marks.push({ kind: 'point', x: frame.x(scenario.r2dz), y: frame.y(scenario.r2yz), ...markers.chosen, size: 6, label: `chosen: ${formatLevel(value(scenario.r2dz, scenario.r2yz), kind)}`, labelSide: 'above' });
    legend.push({ label: 'chosen strength', color: markers.chosen.color, swatch: markers.chosen.shape });
  }

  return framedPlotSpec(frame, {
    id: kind === 'estimate' ? 'ovb-estimate-contours' : 'ovb-t-contours',
    title: kind === 'estimate' ? 'Adjusted estimate by strength of a hidden confounder' : 'Adjusted t-statistic by strength of a hidden confounder',
    description: describe(result, kind, exposure, outcome, unshown),
    marks,
    legend,
    table: dataTable(result, kind, value, unadjusted, boundary.curves, scenario ?? null),
  });
}

interface Boundary {
  /** Polylines in data coordinates. */
  curves: [number, number][][];
  /** Closed polygons (data coordinates) of the overturned region, clipped to the axes. */
  regions: [number, number][][];
  label: string;
  legend: string;
  note: string;
}

/** The exact curve where the adjusted estimate reaches (1 − q)·estimate, and the region beyond it. */
function estimateBoundary(result: OvbResult, maxX: number, maxY: number): Boundary {
  const setting = settingOf(result);
  const label = `Where the adjusted estimate reaches ${formatNumber(result.threshold, { significant: 3 })}`;
  if (result.direction !== 'toward-zero') {
    return { curves: [], regions: [], label, legend: '', note: 'Confounding away from zero cannot bring the estimate to the threshold' };
  }
  const f2 = scaledPartialF(setting) ** 2;
  // The curve enters the plot where R²yz = maxY: R²dz = f²/(maxY + f²).
  const start = f2 / (maxY + f2);
  if (!(start < maxX)) return { curves: [], regions: [], label, legend: '', note: 'No confounder this weak can overturn the estimate' };
  const curve: [number, number][] = [];
  for (const b of sweep(start, maxX, [])) curve.push([b, Math.min(maxY, estimateBoundaryR2yz(setting, b))]);
  const region: [number, number][] = [...curve, [maxX, maxY], [start, maxY]];
  return { curves: [curve], regions: [region], label, legend: `adjusted estimate = ${formatNumber(result.threshold, { significant: 3 })} (exact)`, note: '' };
}

/** The exact curve(s) where the adjusted t reaches the critical value, and the region between them. */
function significanceBoundary(result: OvbResult, maxX: number, maxY: number): Boundary {
  const fqValue = scaledPartialF(settingOf(result));
  const fCritical = criticalF(result.df, result.alpha);
  const label = `Where the adjusted t reaches the critical value ${formatNumber(result.criticalT, { digits: 2 })}`;
  const startAt = significanceRegionStart(fqValue, fCritical, result.direction);
  if (!(startAt < maxX)) {
    return { curves: [], regions: [], label, legend: '', note: 'No confounder this weak can make the estimate lose significance' };
  }
  const lower: [number, number][] = [];
  const upper: [number, number][] = [];
  for (const b of sweep(startAt, maxX, [])) {
    const interval = significanceInterval(fqValue, fCritical, b, result.direction);
    if (interval.empty) continue;
    lower.push([b, Math.min(interval.lower, maxY)]);
    upper.push([b, Math.min(interval.upper, maxY)]);
  }
  if (lower.length === 0) return { curves: [], regions: [], label, legend: '', note: '' };
  // The boundary is the lower curve, then (if it comes into view) the upper one; joined at the tip.
  const curves: [number, number][][] = [];
  const visibleUpper = upper.some(([, a]) => a < maxY);
  curves.push(visibleUpper ? [...upper.slice().reverse(), ...lower] : lower);
  const region: [number, number][] = [...lower, ...upper.slice().reverse()];
  return {
    curves,
    regions: [region],
    label,
    legend: `adjusted t = ${formatNumber(Math.sign(result.estimate || 1) * result.criticalT, { digits: 2 })} (exact)`,
    note: '',
  };
}

/**
 * Values from `from` to `to` for tracing a curve: evenly spaced and quadratically spaced (denser near `from`,
 * where the curves bend), merged in order, plus extra points.
 */
function sweep(from: number, to: number, extra: readonly number[], samples = BOUNDARY_SAMPLES): number[] {
  const values: number[] = [from, to, ...extra.filter((v) => v > from && v < to)];
  for (let i = 1; i < samples; i++) {
    const u = i / samples;
    values.push(from + (to - from) * u * u, from + (to - from) * u);
  }
  return Float64Array.from(values).sort() as unknown as number[];
}

interface LevelLine {
  level: number;
  rings: [number, number][][];
  labelAt: [number, number] | null;
}

/** Level lines of `value` on a gridSize × gridSize grid over [0, maxX] × [0, maxY] (d3-contour). */
function levelLines(
  gridValues: (r2dz: Float64Array, r2yz: Float64Array) => Float64Array,
  levels: readonly number[],
  maxX: number,
  maxY: number,
  gridSize: number,
): LevelLine[] {
  const n = Math.max(8, Math.round(gridSize));
  if (levels.length === 0) return [];
  const bs = new Float64Array(n);
  const as = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    bs[i] = (maxX * i) / (n - 1);
    as[i] = (maxY * i) / (n - 1);
  }
  const grid = gridValues(bs, as);
  for (let k = 0; k < grid.length; k++) {
    const v = grid[k];
    if (!Number.isFinite(v)) grid[k] = v > 0 ? 1e300 : -1e300;
  }
  // d3-contour puts value i at the centre of cell [i, i + 1]; map back so grid point i is R² = i·step.
  const toData = (gx: number, gy: number): [number, number] => [((gx - 0.5) * maxX) / (n - 1), ((gy - 0.5) * maxY) / (n - 1)];
  const generator = contours().size([n, n]).thresholds([...levels]);
  const lines: LevelLine[] = [];
  for (const polygon of generator(grid as unknown as number[])) {
    const rings: [number, number][][] = [];
    const inside: [number, number][] = [];
    for (const poly of polygon.coordinates) {
      for (const ring of poly) {
        // Keep only the parts of the ring inside the grid: the grid's border is not a level line.
        let part: [number, number][] = [];
        for (const [gx, gy] of ring) {
          const onBorder = gx <= 0.5 || gy <= 0.5 || gx >= n - 0.5 || gy >= n - 0.5;
          if (onBorder) {
            if (part.length > 1) rings.push(part);
            part = [];
            continue;
          }
          const p = toData(gx, gy);
          part.push(p);
          inside.push(p);
        }
        if (part.length > 1) rings.push(part);
      }
    }
    // label where the line is furthest up and right, but not at the very edge
    if (rings.length > 0) lines.push({ level: polygon.value, rings, labelAt: labelPosition(inside, maxX, maxY) });
  }
  return lines;
}

/**
 * Level lines of the adjusted estimate in closed form (no grid): the estimate equals L where the bias is
 * B = |β̂| − sign(β̂)·L (toward zero) or sign(β̂)·L − |β̂| (away), i.e. R²yz = g²(1 − R²dz)/R²dz with
 * g = B/(se·√df) — the same curve as the flip boundary with g in place of f_q.
 */
function estimateLevelLines(result: OvbResult, levels: readonly number[], maxX: number, maxY: number): LevelLine[] {
  const sign = result.estimate < 0 ? -1 : 1;
  const scale = result.se * Math.sqrt(result.df);
  const lines: LevelLine[] = [];
  for (const level of levels) {
    const bias = result.direction === 'toward-zero' ? Math.abs(result.estimate) - sign * level : sign * level - Math.abs(result.estimate);
    if (!(bias > 0) || !(scale > 0)) continue;
    const g2 = (bias / scale) ** 2;
    const start = g2 / (maxY + g2);
    if (!(start < maxX)) continue;
    const ring: [number, number][] = [];
    for (const b of sweep(start, maxX, [], LEVEL_SAMPLES)) ring.push([b, Math.min(maxY, (g2 * (1 - b)) / b)]);
    lines.push({ level, rings: [ring], labelAt: labelPosition(ring, maxX, maxY) });
  }
  return lines;
}

/**
 * Level lines of the adjusted t (for the null value (1 − q)·β̂) in closed form along R²dz. With b = R²dz,
 * R²yz = sin²θ, ℓ = sign(β̂)·τ/√(df − 1) and c = f_q·√(1 − b), the adjusted t equals τ where
 * √b·sin θ + ℓ·cos θ = c (toward zero; two roots, joined at the tip R²dz = (f_q² − ℓ²)/(1 + f_q²)) or
 * ℓ·cos θ − √b·sin θ = c (away from zero; one root).
 */
function tLevelLines(result: OvbResult, levels: readonly number[], maxX: number, maxY: number): LevelLine[] {
  const sign = result.estimate < 0 ? -1 : 1;
  const fqValue = scaledPartialF(settingOf(result));
  const lines: LevelLine[] = [];
  const half = Math.PI / 2;
  const toR2 = (theta: number) => (theta >= 0 && theta <= half ? Math.sin(theta) ** 2 : NaN);
  for (const level of levels) {
    const ell = (sign * level) / Math.sqrt(result.df - 1);
    const tip = ((fqValue - ell) * (fqValue + ell)) / (1 + fqValue * fqValue);
    const low: [number, number][] = [];
    const high: [number, number][] = [];
    for (const b of sweep(0, maxX, [tip], LEVEL_SAMPLES)) {
      if (!(b < 1)) continue;
      const c = fqValue * Math.sqrt(1 - b);
      const radius = Math.hypot(Math.sqrt(b), ell);
      let first = NaN;
      let second = NaN;
      if (result.direction === 'toward-zero') {
        if (c <= radius * (1 + 1e-12)) {
          const phi = Math.atan2(ell, Math.sqrt(b));
          const s = Math.asin(Math.min(1, c / radius));
          first = toR2(s - phi);
          second = toR2(Math.PI - s - phi);
        }
      } else if (ell > 0 && c <= radius) {
        first = toR2(Math.acos(Math.min(1, c / radius)) - Math.atan2(Math.sqrt(b), ell));
      }
      low.push([b, first <= maxY ? first : NaN]);
      high.push([b, second <= maxY ? second : NaN]);
    }
    // One polyline: the upper root from right to left, then the lower root from left to right (they meet at
    // the tip); NaN points break it where a root leaves the plot.
    const ring: [number, number][] = [...high.slice().reverse(), ...low];
    if (!ring.some(([, a]) => Number.isFinite(a))) continue;
    lines.push({ level, rings: [ring], labelAt: labelPosition(ring, maxX, maxY) });
  }
  return lines;
}

/**
 * Where a level line's label goes: its point farthest towards the top right (by x/maxX + y/maxY) that keeps
 * clear of the plot's edges; null when no point does. Points with no value (NaN) are skipped.
 */
function labelPosition(ring: readonly [number, number][], maxX: number, maxY: number): [number, number] | null {
  let labelAt: [number, number] | null = null;
  let best = -Infinity;
  for (const p of ring) {
    if (!Number.isFinite(p[1])) continue;
    const score = p[0] / maxX + p[1] / maxY;
    if (p[0] < 0.93 * maxX && p[1] < 0.95 * maxY && p[0] > 0.05 * maxX && score > best) {
      best = score;
      labelAt = p;
    }
  }
  return labelAt;
}

/** About eight round levels across the values shown, leaving out the flip level (drawn exactly). */
function contourLevels(result: OvbResult, kind: OvbContourKind, value: (b: number, a: number) => number, maxX: number, maxY: number, flip: number): number[] {
  const corners = [value(0, 0), value(maxX, 0), value(0, maxY), value(maxX, maxY), value(maxX / 2, maxY / 2)].filter(Number.isFinite);
  if (corners.length === 0) return [];
  let lo = Math.min(...corners);
  let hi = Math.max(...corners);
  if (kind === 't') {
    // t runs to ±∞ as R²yz → 1; keep the levels to a readable range around the reported t.
    const span = Math.max(Math.abs(result.t), result.criticalT) * 2;
    lo = Math.max(lo, -span);
    hi = Math.min(hi, span);
  } else {
    // From the estimate to as far beyond the threshold as the estimate is before it.
    const reach = Math.abs(result.estimate - result.threshold) || Math.abs(result.estimate) || 1;
    lo = Math.max(lo, Math.min(result.estimate, result.threshold) - reach);
    hi = Math.min(hi, Math.max(result.estimate, result.threshold) + reach);
  }
  // (a span near the smallest doubles has no round ticks)
  if (!(hi - lo > 1e-280) || !Number.isFinite(hi - lo)) return [];
  const tolerance = (hi - lo) * 1e-9;
  return scaleLinear().domain([lo, hi]).ticks(8).filter((v) => Math.abs(v - flip) > tolerance && v > lo && v < hi);
}

function axisMaxima(result: OvbResult, options: OvbContourOptions, scenario: ConfounderStrength | null | undefined): [number, number] {
  const wanted: number[] = [result.rv, result.rvAlpha];
  for (const row of result.benchmarks) if (row.unavailable === null) wanted.push(row.r2dz, row.r2yz);
  if (scenario) wanted.push(scenario.r2dz, scenario.r2yz);
  const top = roundUp(Math.max(0.05, ...wanted.filter((v) => Number.isFinite(v) && v < 1).map((v) => v * 1.25)));
  const clampX = (v: number | undefined) => (v !== undefined && v > 0 && v < 1 ? v : Math.min(top, 0.95));
  const clampY = (v: number | undefined) => (v !== undefined && v > 0 && v <= 1 ? v : Math.min(top, 0.95));
  return [clampX(options.maxR2dz), clampY(options.maxR2yz)];
}

function roundUp(v: number): number {
  const step = v <= 0.1 ? 0.01 : v <= 0.5 ? 0.05 : 0.1;
  return Math.min(0.95, Math.ceil(v / step - 1e-9) * step);
}

function settingOf(result: OvbResult) {
  return { t: result.t, df: result.df, q: result.q, alpha: result.alpha, direction: result.direction };
}

function goalPhrase(result: OvbResult): string {
  return result.q === 1 ? 'bring the estimate to zero' : `bring the estimate to ${formatNumber(result.threshold, { significant: 3 })}`;
}

function kindLabel(kind: OvbContourKind): string {
  return kind === 'estimate' ? 'Adjusted estimate' : 'Adjusted t';
}

function formatLevel(v: number, kind: OvbContourKind): string {
  return kind === 'estimate' ? formatNumber(v, { significant: 3 }) : formatNumber(v, { digits: 2 });
}

/** Contour-line labels: round levels without trailing zeros (−0.5, 2). */
function formatContourLabel(v: number): string {
  return plainNumber(Number(v.toPrecision(6)));
}

/** Percent ticks with as many decimals as the step needs, the same on every tick of the axis. */
export function percentTick(v: number, values: readonly number[]): string {
  const labels = uniformPercentLabels(values);
  const i = values.indexOf(v);
  return i >= 0 ? labels[i] : formatPercent(v);
}

/** The x-axis title of the regression figures, in plain words. */
export function treatmentShareTitle(exposure: string): string {
  return `Confounder's share of the unexplained variance of ${exposure} (partial R²)`;
}

/** The y-axis title of the contour figures, in plain words. */
export function outcomeShareTitle(outcome: string): string {
  return `Confounder's share of the unexplained variance of ${outcome} (partial R²)`;
}

/** "as strong as age" for k = 1, "2 times age" otherwise. */
export function benchmarkName(k: number, covariate: string): string {
  return k === 1 ? `as strong as ${covariate}` : `${plainNumber(k)} times ${covariate}`;
}

function describe(result: OvbResult, kind: OvbContourKind, exposure: string, outcome: string, unshown: readonly string[]): string {
  const what = kind === 'estimate' ? 'the estimate adjusted' : `the t-statistic (for the null value ${formatNumber(result.threshold, { significant: 3 })}) adjusted`;
  const rv = kind === 'estimate' ? `The robustness value is ${formatPercent(result.rv)}.` : `The robustness value at α = ${plainNumber(result.alpha)} is ${formatPercent(result.rvAlpha)}.`;
  const away = unshown.length > 0 ? ` Outside the axes: ${unshown.join(', ')}.` : '';
  return `Contour lines of ${what} for a hidden confounder, by its partial R² with ${exposure} (across) and with ${outcome} (up). The shaded region holds the confounders that would overturn the conclusion; its edge is computed exactly. ${rv}${away}`;
}

function dataTable(
  result: OvbResult,
  kind: OvbContourKind,
  value: (b: number, a: number) => number,
  unadjusted: number,
  curves: readonly [number, number][][],
  scenario: ConfounderStrength | null,
): DataTable {
  const rows: string[][] = [];
  const pct = (v: number) => formatPercent(v, 1);
  rows.push(['as reported', pct(0), pct(0), formatLevel(unadjusted, kind)]);
  if (kind === 'estimate') rows.push(['robustness value RV', pct(result.rv), pct(result.rv), formatLevel(value(result.rv, result.rv), kind)]);
  else rows.push(['robustness value at α', pct(result.rvAlpha), pct(result.rvAlpha), formatLevel(value(result.rvAlpha, result.rvAlpha), kind)]);
  for (const row of result.benchmarks) {
    const name = benchmarkName(row.k, row.covariate);
    if (row.unavailable !== null) rows.push([name, 'not available', 'not available', row.unavailable]);
    else rows.push([name, pct(row.r2dz), pct(row.r2yz), formatLevel(value(row.r2dz, row.r2yz), kind)]);
  }
  if (scenario) rows.push(['chosen strength', pct(scenario.r2dz), pct(scenario.r2yz), formatLevel(value(scenario.r2dz, scenario.r2yz), kind)]);
  // The boundary at about ten places, as the text alternative of the curve.
  for (const curve of curves) {
    const step = Math.max(1, Math.floor(curve.length / 10));
    for (let i = 0; i < curve.length; i += step) rows.push(['flip boundary', pct(curve[i][0]), pct(curve[i][1]), formatLevel(value(curve[i][0], curve[i][1]), kind)]);
  }
  return {
    caption: kind === 'estimate' ? 'Adjusted estimate at marked confounder strengths and along the flip boundary' : 'Adjusted t at marked confounder strengths and along the flip boundary',
    columns: ['point', 'share of treatment variance (partial R²)', 'share of outcome variance (partial R²)', kind === 'estimate' ? 'adjusted estimate' : 'adjusted t'],
    rows,
  };
}
