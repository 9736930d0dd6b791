/**
 * A plot as plain data: everything needed to draw it (in pixel coordinates of its own viewBox), to export it,
 * and to read it without sight (the data table). Built by pure functions in src/plot/, drawn by
 * `renderSvgString` and the `<lurk-plot>` component.
 */
export interface PlotSpec {
  /** Stable name, used for export file names (e.g. `joint-strength`). */
  readonly id: string;
  readonly title: string;
  /** One or two sentences saying what the plot shows (the accessible description). */
  readonly description: string;
  readonly width: number;
  readonly height: number;
  readonly xAxis: AxisSpec;
  readonly yAxis: AxisSpec;
  /** The plotting area in pixels. */
  readonly inner: PlotArea;
  /** Drawn in order: the first is at the back. */
  readonly marks: readonly PlotMark[];
  readonly legend: readonly LegendItem[];
  /** The text alternative: the plotted numbers as a table. */
  readonly table: DataTable;
}

export interface PlotArea {
  readonly left: number;
  readonly top: number;
  readonly right: number;
  readonly bottom: number;
}

export interface AxisSpec {
  readonly label: string;
  readonly scale: 'linear' | 'log';
  /** Data values at the two ends of the axis. */
  readonly domain: readonly [number, number];
  /** Pixel positions of the two ends. */
  readonly range: readonly [number, number];
  readonly ticks: readonly Tick[];
}

export interface Tick {
  readonly value: number;
  /** Pixel position along the axis. */
  readonly position: number;
  readonly label: string;
}

export type PlotMark = PathMark | PointMark | TextMark | RuleMark;

export interface PathMark {
  readonly kind: 'path';
  /** SVG path data in pixels. */
  readonly d: string;
  readonly stroke?: string;
  readonly strokeWidth?: number;
  readonly dash?: string;
  readonly fill?: string;
  readonly fillOpacity?: number;
  /** What the path is, for the SVG <title>. */
  readonly label?: string;
}

/** Marker shapes; `ring` is an open circle, `hexagon` a filled hexagon (see svgString's markerPath). */
export type PointShape = 'circle' | 'ring' | 'square' | 'diamond' | 'triangle' | 'hexagon' | 'cross';

export interface PointMark {
  readonly kind: 'point';
  readonly x: number;
  readonly y: number;
  readonly shape: PointShape;
  readonly color: string;
  /** Radius-like size in pixels (default 5). */
  readonly size?: number;
  /** Text drawn beside the point. */
  readonly label?: string;
  /** Where the label goes relative to the point (default right). */
  readonly labelSide?: 'left' | 'right' | 'above' | 'below';
}

export interface TextMark {
  readonly kind: 'text';
  readonly x: number;
  readonly y: number;
  readonly text: string;
  readonly anchor?: 'start' | 'middle' | 'end';
  readonly color?: string;
  readonly size?: number;
  readonly weight?: 'normal' | 'bold';
  /** May be left out when the plot has no room for it (e.g. a contour line's level); other texts never are. */
  readonly droppable?: boolean;
}

export interface RuleMark {
  readonly kind: 'rule';
  readonly x1: number;
  readonly y1: number;
  readonly x2: number;
  readonly y2: number;
  readonly stroke: string;
  readonly strokeWidth?: number;
  readonly dash?: string;
  readonly label?: string;
}

export interface LegendItem {
  readonly label: string;
  readonly color: string;
  /** How the legend swatch looks: a line (optionally dashed), a filled area, or a point shape. */
  readonly swatch: 'line' | 'area' | PointShape;
  readonly dash?: string;
}

export interface DataTable {
  readonly caption: string;
  readonly columns: readonly string[];
  /** Cells already formatted for people. */
  readonly rows: ReadonlyArray<ReadonlyArray<string>>;
}
