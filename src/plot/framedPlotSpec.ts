import type { Frame } from './frame';
import type { DataTable, LegendItem, PlotMark, PlotSpec } from './plotSpec';

/** What a plot builder decides; the frame supplies the size, the axes and the plotting area. */
export interface PlotContent {
  readonly id: string;
  readonly title: string;
  readonly description: string;
  readonly marks: PlotMark[];
  readonly legend: LegendItem[];
  readonly table: DataTable;
}

/**
 * A frozen PlotSpec of `content` drawn in `frame`: its width, height, axes and plotting area. The marks and
 * the legend are frozen; the table is kept as given (each builder freezes its own rows).
 */
export function framedPlotSpec(frame: Frame, content: PlotContent): PlotSpec {
  return Object.freeze({
    id: content.id,
    title: content.title,
    description: content.description,
    width: frame.width,
    height: frame.height,
    xAxis: frame.xAxis,
    yAxis: frame.yAxis,
    inner: frame.inner,
    marks: Object.freeze(content.marks),
    legend: Object.freeze(content.legend),
    table: content.table,
  });
}
