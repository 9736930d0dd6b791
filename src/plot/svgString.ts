import type { LegendItem, PlotMark, PlotSpec, PointShape, TextMark } from './plotSpec';
import { palette } from './palette';
import { layoutFigure, type FigureLayout, type PlacedText } from './figureLayout';
import { FIGURE_FONT } from './textMeasure';
import { POINTS_PER_INCH, PRINT_SIZES, screenLayout, type PrintWidth } from './printSize';

export interface SvgOptions {
  /** Draw the title above the plot (for exported files; on the page the heading is HTML). */
  includeTitle?: boolean;
  /** Font family for all text (default: the font the layout measures, FIGURE_FONT). */
  fontFamily?: string;
  /** Width on screen in CSS pixels (default: the spec's own width). Ignored when `print` is set. */
  width?: number;
  /** Lay out for print at a journal width: the SVG is sized in inches and its units are points. */
  print?: PrintWidth;
}

/** The layout `renderSvgString` draws for these options. */
export function layoutFor(spec: PlotSpec, options: SvgOptions = {}): FigureLayout {
  if (options.print) return layoutFigure(spec, { ...PRINT_SIZES[options.print].layout, includeTitle: options.includeTitle ?? true });
  return layoutFigure(spec, { ...screenLayout(options.width ?? spec.width), includeTitle: options.includeTitle });
}

/** The height the rendered SVG takes (in its own units), including the legend, the key and the optional title. */
export function renderedHeight(spec: PlotSpec, options: SvgOptions = {}): number {
  return layoutFor(spec, options).height;
}

/**
 * Draws a PlotSpec as a standalone SVG document string, laid out by `layoutFigure` (no text over other text).
 * All text is escaped; marks are clipped to the plotting area; <title> and <desc> carry the accessible name
 * and description. For print, width and height are in inches and one unit of the viewBox is one point.
 */
export function renderSvgString(spec: PlotSpec, options: SvgOptions = {}): string {
  const layout = layoutFor(spec, options);
  const inches = options.print ? PRINT_SIZES[options.print].inches : null;
  return renderLayoutSvg(layout, { fontFamily: options.fontFamily, widthInches: inches });
}

/** Draws a laid-out figure; `widthInches` sizes it in physical units (height in proportion). */
export function renderLayoutSvg(layout: FigureLayout, options: { fontFamily?: string; widthInches?: number | null } = {}): string {
  const { spec, inner, width, height } = layout;
  const font = options.fontFamily ?? FIGURE_FONT;
  const id = `fig-${spec.id.replace(/[^\w-]/g, '')}`;
  const size = options.widthInches
    ? `width="${fmt(options.widthInches)}in" height="${fmt((options.widthInches * height) / width)}in"`
    : `width="${fmt(width)}" height="${fmt(height)}"`;
  const stroke = (w: number) => fmt(Math.max(layout.minLineWidth, w * layout.lineScale));
  const dash = (d: string | undefined) => (d ? d.split(/[\s,]+/).map((v) => fmt(Number(v) * Math.max(0.5, layout.lineScale))).join(' ') : undefined);
  const out: string[] = [];
  out.push(
    `<svg xmlns="http://www.w3.org/2000/svg" viewBox="0 0 ${fmt(width)} ${fmt(height)}" ${size} ` +
      `role="img" aria-labelledby="${id}-title ${id}-desc" font-family="${escapeXml(font)}" font-size="${fmt(layout.fontSize)}">`,
  );
  out.push(`<title id="${id}-title">${escapeXml(spec.title)}</title>`);
  out.push(`<desc id="${id}-desc">${escapeXml(spec.description)}</desc>`);
  out.push(`<rect x="0" y="0" width="${fmt(width)}" height="${fmt(height)}" fill="#ffffff"/>`);
  out.push(`<defs><clipPath id="${id}-clip"><rect x="${fmt(inner.left)}" y="${fmt(inner.top)}" width="${fmt(inner.right - inner.left)}" height="${fmt(inner.bottom - inner.top)}"/></clipPath></defs>`);

  const tick = 0.4 * layout.fontSize;
  for (const t of layout.xAxis.ticks) {
    out.push(line(t.position, inner.top, t.position, inner.bottom, palette.grid, stroke(1)));
    out.push(line(t.position, inner.bottom, t.position, inner.bottom + tick, palette.ink, stroke(1)));
  }
  for (const t of layout.yAxis.ticks) {
    out.push(line(inner.left, t.position, inner.right, t.position, palette.grid, stroke(1)));
    out.push(line(inner.left - tick, t.position, inner.left, t.position, palette.ink, stroke(1)));
  }
  out.push(`<g clip-path="url(#${id}-clip)">`);
  for (const mark of layout.marks) out.push(drawMark(mark, stroke, dash, layout.markerScale));
  out.push('</g>');
  out.push(`<rect x="${fmt(inner.left)}" y="${fmt(inner.top)}" width="${fmt(inner.right - inner.left)}" height="${fmt(inner.bottom - inner.top)}" fill="none" stroke="${palette.ink}" stroke-width="${stroke(1)}"/>`);
  for (const l of layout.leaders) out.push(line(l.x1, l.y1, l.x2, l.y2, palette.ink, stroke(1)));
  for (const s of layout.swatches) out.push(drawSwatch(s.item, s.x, s.cy, s.width, layout.fontSize, stroke, dash));
  for (const t of layout.texts) out.push(drawText(t));
  out.push('</svg>');
  return out.join('');
}

function drawMark(mark: Exclude<PlotMark, TextMark>, stroke: (w: number) => string, dash: (d?: string) => string | undefined, markerScale: number): string {
  switch (mark.kind) {
    case 'path': {
      const dashed = dash(mark.dash);
      const attrs = [
        `d="${mark.d}"`,
        `fill="${mark.fill ?? 'none'}"`,
        mark.fillOpacity !== undefined ? `fill-opacity="${mark.fillOpacity}"` : '',
        `stroke="${mark.stroke ?? 'none'}"`,
        `stroke-width="${stroke(mark.strokeWidth ?? 2)}"`,
        dashed ? `stroke-dasharray="${dashed}"` : '',
        'stroke-linejoin="round"',
      ].filter(Boolean);
      const title = mark.label ? `<title>${escapeXml(mark.label)}</title>` : '';
      return `<path ${attrs.join(' ')}>${title}</path>`;
    }
    case 'rule': {
      const dashed = dash(mark.dash);
      const title = mark.label ? `<title>${escapeXml(mark.label)}</title>` : '';
      return `<line x1="${fmt(mark.x1)}" y1="${fmt(mark.y1)}" x2="${fmt(mark.x2)}" y2="${fmt(mark.y2)}" stroke="${mark.stroke}" stroke-width="${stroke(mark.strokeWidth ?? 1.5)}"${dashed ? ` stroke-dasharray="${dashed}"` : ''}>${title}</line>`;
    }
    case 'point':
      return markerPath(mark.shape, mark.x, mark.y, (mark.size ?? 5) * markerScale, mark.color, stroke(1));
  }
}

/**
 * A marker: filled shapes with a white rim; the ring and the plus are drawn as thick outlines so that they
 * read apart from the filled shapes without colour.
 */
function markerPath(shape: PointShape, x: number, y: number, r: number, color: string, rim: string): string {
  if (shape === 'ring') return `<circle cx="${fmt(x)}" cy="${fmt(y)}" r="${fmt(r * 0.85)}" fill="#ffffff" stroke="${color}" stroke-width="${fmt(Math.max(1, r * 0.45))}"/>`;
  return `<path d="${shapePath(shape, x, y, r)}" fill="${color}" stroke="#ffffff" stroke-width="${rim}"/>`;
}

/** SVG path data for a marker shape centred at (x, y). */
export function shapePath(shape: PointShape, x: number, y: number, r: number): string {
  switch (shape) {
    case 'circle':
    case 'ring':
      return `M${fmt(x - r)},${fmt(y)}a${fmt(r)},${fmt(r)} 0 1,0 ${fmt(2 * r)},0a${fmt(r)},${fmt(r)} 0 1,0 ${fmt(-2 * r)},0Z`;
    case 'square':
      return `M${fmt(x - r)},${fmt(y - r)}h${fmt(2 * r)}v${fmt(2 * r)}h${fmt(-2 * r)}Z`;
    case 'diamond': {
      const d = r * 1.35;
      return `M${fmt(x)},${fmt(y - d)}L${fmt(x + d)},${fmt(y)}L${fmt(x)},${fmt(y + d)}L${fmt(x - d)},${fmt(y)}Z`;
    }
    case 'triangle': {
      const d = r * 1.3;
      return `M${fmt(x)},${fmt(y - d)}L${fmt(x + d)},${fmt(y + d * 0.8)}L${fmt(x - d)},${fmt(y + d * 0.8)}Z`;
    }
    case 'hexagon': {
      const d = r * 1.15;
      const pts = [0, 1, 2, 3, 4, 5].map((i) => [x + d * Math.cos((Math.PI / 3) * i), y + d * Math.sin((Math.PI / 3) * i)]);
      return `M${pts.map(([a, b]) => `${fmt(a)},${fmt(b)}`).join('L')}Z`;
    }
    case 'cross': {
      const a = r * 0.45;
      return (
        `M${fmt(x - a)},${fmt(y - r)}h${fmt(2 * a)}v${fmt(r - a)}h${fmt(r - a)}v${fmt(2 * a)}h${fmt(a - r)}v${fmt(r - a)}h${fmt(-2 * a)}` +
        `v${fmt(a - r)}h${fmt(a - r)}v${fmt(-2 * a)}h${fmt(r - a)}Z`
      );
    }
  }
}

function drawSwatch(item: LegendItem, x: number, cy: number, width: number, f: number, stroke: (w: number) => string, dash: (d?: string) => string | undefined): string {
  if (item.swatch === 'line') return line(x, cy, x + width, cy, item.color, stroke(2.5), dash(item.dash));
  if (item.swatch === 'area') {
    const h = f * 0.8;
    return `<rect x="${fmt(x)}" y="${fmt(cy - h / 2)}" width="${fmt(width)}" height="${fmt(h)}" fill="${item.color}" fill-opacity="0.35" stroke="${item.color}" stroke-width="${stroke(1)}"/>`;
  }
  return markerPath(item.swatch, x + width / 2, cy, f * 0.4, item.color, stroke(1));
}

function drawText(t: PlacedText): string {
  const halo = t.halo ? ` stroke="#ffffff" stroke-width="${fmt(t.size * 0.28)}" paint-order="stroke" stroke-linejoin="round"` : '';
  const weight = t.weight === 'bold' ? ' font-weight="bold"' : '';
  const position = t.upright ? `transform="translate(${fmt(t.x)} ${fmt(t.y)}) rotate(-90)"` : `x="${fmt(t.x)}" y="${fmt(t.y)}"`;
  return `<text ${position} text-anchor="${t.anchor}" fill="${t.color}" font-size="${fmt(t.size)}" data-role="${t.role}"${weight}${halo}>${escapeXml(t.text)}</text>`;
}

function line(x1: number, y1: number, x2: number, y2: number, strokeColor: string, width: string, dash?: string): string {
  const dashAttr = dash ? ` stroke-dasharray="${dash}"` : '';
  return `<line x1="${fmt(x1)}" y1="${fmt(y1)}" x2="${fmt(x2)}" y2="${fmt(y2)}" stroke="${strokeColor}" stroke-width="${width}"${dashAttr}/>`;
}

/** Numbers with two decimals at most; non-finite values (which a spec should never hold) become 0. */
function fmt(v: number): string {
  return Number.isFinite(v) ? String(Math.round(v * 100) / 100) : '0';
}

export function escapeXml(s: string): string {
  return s.replace(/[&<>"']/g, (c) => ({ '&': '&amp;', '<': '&lt;', '>': '&gt;', '"': '&quot;', "'": '&#39;' })[c] as string);
}

export { POINTS_PER_INCH };
