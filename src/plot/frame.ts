import { scaleLinear, scaleLog } from 'd3-scale';
import type { AxisSpec, PlotArea, Tick } from './plotSpec';
import { formatNumber } from '../format/formatNumber';
import { uniformTickLabels } from './tickLabels';

/** Tick values are round numbers: write them without float noise or trailing zeros (0.30000000000000004 → 0.3). */
export function defaultTickLabel(value: number): string {
  if (!Number.isFinite(value)) return formatNumber(value);
  const abs = Math.abs(value);
  if (abs !== 0 && (abs >= 1e7 || abs < 1e-5)) return formatNumber(value, { significant: 2 });
  return String(Number(value.toPrecision(6)));
}

export interface AxisOptions {
  /** Data values at the two ends; for `log`, both must be positive. */
  domain: readonly [number, number];
  label: string;
  scale?: 'linear' | 'log';
  /** Approximate number of ticks (d3's tick algorithm chooses round values). */
  tickCount?: number;
  /**
   * How tick values are written; receives every tick value of the axis as well, so that one format can be
   * chosen for the whole axis (default: `uniformTickLabels`).
   */
  tickFormat?: (value: number, values: readonly number[]) => string;
}

export interface FrameOptions {
  width: number;
  height: number;
  /** Space for axes and labels around the plotting area. */
  margin?: Partial<{ top: number; right: number; bottom: number; left: number }>;
  x: AxisOptions;
  y: AxisOptions;
}

/** Pixel mapping and axes for one plot. */
export interface Frame {
  readonly width: number;
  readonly height: number;
  readonly inner: PlotArea;
  /** Data → pixel. Values outside the domain map outside the plotting area (clip when drawing). */
  x(value: number): number;
  y(value: number): number;
  /** Pixel → data (for pointer read-outs). */
  invertX(pixel: number): number;
  invertY(pixel: number): number;
  readonly xAxis: AxisSpec;
  readonly yAxis: AxisSpec;
}

const DEFAULT_MARGIN = { top: 16, right: 20, bottom: 52, left: 64 };

/**
 * Scales and ticks for a plot (d3-scale: linear or logarithmic, "nice" round ticks).
 * The y axis grows upwards. Tick labels never show NaN or Infinity.
 */
export function createFrame(options: FrameOptions): Frame {
  const margin = { ...DEFAULT_MARGIN, ...options.margin };
  const inner: PlotArea = {
    left: margin.left,
    top: margin.top,
    right: options.width - margin.right,
    bottom: options.height - margin.bottom,
  };
  const xScale = makeScale(options.x, [inner.left, inner.right]);
  const yScale = makeScale(options.y, [inner.bottom, inner.top]);
  return {
    width: options.width,
    height: options.height,
    inner,
    x: (v) => xScale(v),
    y: (v) => yScale(v),
    invertX: (p) => xScale.invert(p),
    invertY: (p) => yScale.invert(p),
    xAxis: axisSpec(options.x, xScale, [inner.left, inner.right]),
    yAxis: axisSpec(options.y, yScale, [inner.bottom, inner.top]),
  };
}

type Scale = ((v: number) => number) & { invert(p: number): number; ticks(count?: number): number[] };

function makeScale(axis: AxisOptions, range: [number, number]): Scale {
  const [a, b] = axis.domain;
  if (axis.scale === 'log') {
    const lo = a > 0 && Number.isFinite(a) ? a : 1e-6;
    const hi = b > lo && Number.isFinite(b) ? b : lo * 10;
    return scaleLog().domain([lo, hi]).range(range) as unknown as Scale;
  }
  const lo = Number.isFinite(a) ? a : 0;
  const hi = Number.isFinite(b) && b !== lo ? b : lo + 1;
  return scaleLinear().domain([lo, hi]).range(range) as unknown as Scale;
}

function axisSpec(axis: AxisOptions, scale: Scale, range: [number, number]): AxisSpec {
  let values = scale.ticks(axis.tickCount ?? 6);
  if (axis.scale === 'log' && values.length > 7) values = thinLogTicks(values);
  values = values.filter(Number.isFinite);
  const uniform = uniformTickLabels(values);
  const format = axis.tickFormat;
  const ticks: Tick[] = values.map((value, i) => ({ value, position: scale(value), label: format ? format(value, values) : uniform[i] }));
  return {
    label: axis.label,
    scale: axis.scale ?? 'linear',
    domain: [axis.domain[0], axis.domain[1]],
    range,
    ticks,
  };
}

/** On a log axis d3 returns every 1–9 multiple; keep the 1, 2 and 5 multiples so labels do not overlap. */
function thinLogTicks(values: number[]): number[] {
  const kept = values.filter((v) => {
    const leading = Math.round(v / Math.pow(10, Math.floor(Math.log10(v) + 1e-9)));
    return leading === 1 || leading === 2 || leading === 5;
  });
  return kept.length >= 2 ? kept : values;
}
