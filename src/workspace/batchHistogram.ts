import { bin } from 'd3-array';
import { createFrame } from '../plot/frame';
import { palette } from '../plot/palette';
import type { PlotMark, PlotSpec } from '../plot/plotSpec';
import { formatNumber } from '../format/formatNumber';

export interface EValueHistogramOptions {
  readonly width?: number;
  readonly height?: number;
  /** Which E-value is counted: of the estimates or of the interval limits. */
  readonly which?: 'estimate' | 'interval';
}

/**
 * A histogram of many findings' E-values (batch appraisal), on a logarithmic axis since E-values are skewed:
 * bins of equal width in log E from 1 up to the largest E-value (d3-array's `bin` with log-spaced thresholds).
 * E-values of 1 (an interval that already includes the null) fall in the first bin.
 */
export function eValueHistogram(values: readonly (number | null)[], options: EValueHistogramOptions = {}): PlotSpec {
  const width = options.width ?? 560;
  const height = options.height ?? 300;
  const which = options.which ?? 'estimate';
  const finite = values.filter((v): v is number => v !== null && Number.isFinite(v) && v >= 1);
  const largest = Math.max(2, ...finite);
  const top = Math.pow(10, Math.ceil(Math.log10(largest) * 4) / 4);
  const binCount = Math.min(24, Math.max(6, Math.ceil(Math.sqrt(finite.length) * 2)));
  const logTop = Math.log(top);
  const thresholds = Array.from({ length: binCount - 1 }, (_, i) => Math.exp((logTop * (i + 1)) / binCount));
  const bins = bin<number, number>().domain([1, top]).thresholds(thresholds)(finite);
  const maxCount = Math.max(1, ...bins.map((b) => b.length));
  const label = which === 'estimate' ? 'E-value of the estimate' : 'E-value of the confidence limit';
  const frame = createFrame({
    width,
    height,
    x: { domain: [1, top], label, scale: 'log' },
    // Counts are whole numbers: ask for no more ticks than there are counts, so d3 picks integers.
    y: { domain: [0, Math.ceil(maxCount * 1.1)], label: 'Number of findings', tickCount: Math.min(maxCount, 6), tickFormat: (v) => (Number.isInteger(v) ? String(v) : '') },
  });
  const marks: PlotMark[] = bins
    .filter((b) => b.length > 0 && b.x0 !== undefined && b.x1 !== undefined)
    .map((b) => {
      const x0 = frame.x(b.x0 as number) + 0.5;
      const x1 = frame.x(b.x1 as number) - 0.5;
      const y0 = frame.y(0);
      const y1 = frame.y(b.length);
      return {
        kind: 'path' as const,
        d: `M${x0},${y0}V${y1}H${x1}V${y0}Z`,
        fill: palette.estimate,
        fillOpacity: 0.75,
        stroke: palette.estimate,
        strokeWidth: 1,
        label: `${b.length} ${b.length === 1 ? 'finding' : 'findings'} with ${label} from ${formatNumber(b.x0)} to ${formatNumber(b.x1)}`,
      };
    });
  return {
    id: `batch-${which}-evalues`,
    title: `How many findings have each ${label}`,
    description: `Histogram of ${finite.length} E-values on a logarithmic axis from 1 to ${formatNumber(top)}; taller bars mean more findings.`,
    width,
    height,
    xAxis: frame.xAxis,
    yAxis: frame.yAxis,
    inner: frame.inner,
    marks,
    legend: [],
    table: {
      caption: `${label}: counts per bin`,
      columns: ['From', 'To', 'Findings'],
      rows: bins.map((b) => [formatNumber(b.x0), formatNumber(b.x1), String(b.length)]),
    },
  };
}
