import type { LegendItem, PlotMark, PlotSpec, PointShape } from './plotSpec';
import { palette } from './palette';

export interface SvgOptions {
  /** Draw the title above the plot (for exported files; on the page the heading is HTML). */
  includeTitle?: boolean;
  /** Font family for all text. */
  fontFamily?: string;
}

const LEGEND_ROW = 18;
const TITLE_BAND = 26;

/** The height the rendered SVG takes, including the legend rows and the optional title band. */
export function renderedHeight(spec: PlotSpec, options: SvgOptions = {}): number {
  return spec.height + legendHeight(spec, spec.legend) + (options.includeTitle ? TITLE_BAND : 0);
}

/**
 * Draws a PlotSpec as a standalone SVG document string. All text is escaped; marks are clipped to the plotting
 * area; the legend sits below the x-axis label; <title> and <desc> carry the accessible name and description.
 */
export function renderSvgString(spec: PlotSpec, options: SvgOptions = {}): string {
  const font = options.fontFamily ?? 'system-ui, -apple-system, "Segoe UI", Roboto, Arial, sans-serif';
  const top = options.includeTitle ? TITLE_BAND : 0;
  const height = renderedHeight(spec, options);
  const clipId = `clip-${spec.id.replace(/[^\w-]/g, '')}`;
  const { inner } = spec;
  const out: string[] = [];
  out.push(
    `<svg xmlns="http://www.w3.org/2000/svg" viewBox="0 0 ${spec.width} ${height}" width="${spec.width}" height="${height}" ` +
      `role="img" aria-labelledby="${clipId}-title ${clipId}-desc" font-family="${escapeXml(font)}" font-size="12">`,
  );
  out.push(`<title id="${clipId}-title">${escapeXml(spec.title)}</title>`);
  out.push(`<desc id="${clipId}-desc">${escapeXml(spec.description)}</desc>`);
  out.push(`<rect x="0" y="0" width="${spec.width}" height="${height}" fill="#ffffff"/>`);
  if (options.includeTitle) {
    out.push(`<text x="${inner.left}" y="18" font-size="14" font-weight="bold" fill="${palette.ink}">${escapeXml(spec.title)}</text>`);
  }
  out.push(`<g transform="translate(0 ${top})">`);
  out.push(`<defs><clipPath id="${clipId}"><rect x="${inner.left}" y="${inner.top}" width="${inner.right - inner.left}" height="${inner.bottom - inner.top}"/></clipPath></defs>`);

  // Grid and axes.
  for (const tick of spec.xAxis.ticks) {
    if (!within(tick.position, inner.left, inner.right)) continue;
    out.push(line(tick.position, inner.top, tick.position, inner.bottom, palette.grid, 1));
    out.push(line(tick.position, inner.bottom, tick.position, inner.bottom + 5, palette.ink, 1));
    out.push(text(tick.position, inner.bottom + 18, tick.label, 'middle', palette.ink, 11));
  }
  for (const tick of spec.yAxis.ticks) {
    if (!within(tick.position, inner.top, inner.bottom)) continue;
    out.push(line(inner.left, tick.position, inner.right, tick.position, palette.grid, 1));
    out.push(line(inner.left - 5, tick.position, inner.left, tick.position, palette.ink, 1));
    out.push(text(inner.left - 8, tick.position + 4, tick.label, 'end', palette.ink, 11));
  }
  out.push(`<rect x="${inner.left}" y="${inner.top}" width="${inner.right - inner.left}" height="${inner.bottom - inner.top}" fill="none" stroke="${palette.ink}" stroke-width="1"/>`);
  out.push(text((inner.left + inner.right) / 2, inner.bottom + 38, spec.xAxis.label, 'middle', palette.ink, 12));
  const yMid = (inner.top + inner.bottom) / 2;
  out.push(
    `<text transform="translate(16 ${fmt(yMid)}) rotate(-90)" text-anchor="middle" fill="${palette.ink}" font-size="12">${escapeXml(spec.yAxis.label)}</text>`,
  );

  // Marks: shapes clipped to the plotting area; text and point labels drawn unclipped on top.
  out.push(`<g clip-path="url(#${clipId})">`);
  for (const mark of spec.marks) if (mark.kind !== 'text') out.push(drawMark(mark));
  out.push('</g>');
  for (const mark of spec.marks) {
    if (mark.kind === 'text') out.push(text(mark.x, mark.y, mark.text, mark.anchor ?? 'start', mark.color ?? palette.ink, mark.size ?? 11, mark.weight, true));
    if (mark.kind === 'point' && mark.label && within(mark.x, inner.left, inner.right) && within(mark.y, inner.top, inner.bottom)) {
      out.push(pointLabel(mark.x, mark.y, mark.label, mark.labelSide ?? 'right', mark.size ?? 5));
    }
  }
  out.push(drawLegend(spec, spec.legend));
  out.push('</g></svg>');
  return out.join('');
}

function drawMark(mark: Exclude<PlotMark, { kind: 'text' }>): string {
  switch (mark.kind) {
    case 'path': {
      const attrs = [
        `d="${mark.d}"`,
        `fill="${mark.fill ?? 'none'}"`,
        mark.fillOpacity !== undefined ? `fill-opacity="${mark.fillOpacity}"` : '',
        `stroke="${mark.stroke ?? 'none'}"`,
        `stroke-width="${mark.strokeWidth ?? 2}"`,
        mark.dash ? `stroke-dasharray="${mark.dash}"` : '',
        'stroke-linejoin="round"',
      ].filter(Boolean);
      const title = mark.label ? `<title>${escapeXml(mark.label)}</title>` : '';
      return `<path ${attrs.join(' ')}>${title}</path>`;
    }
    case 'rule': {
      const dash = mark.dash ? ` stroke-dasharray="${mark.dash}"` : '';
      const title = mark.label ? `<title>${escapeXml(mark.label)}</title>` : '';
      return `<line x1="${fmt(mark.x1)}" y1="${fmt(mark.y1)}" x2="${fmt(mark.x2)}" y2="${fmt(mark.y2)}" stroke="${mark.stroke}" stroke-width="${mark.strokeWidth ?? 1.5}"${dash}>${title}</line>`;
    }
    case 'point': {
      const title = mark.label ? `<title>${escapeXml(mark.label)}</title>` : '';
      return `<path d="${shapePath(mark.shape, mark.x, mark.y, mark.size ?? 5)}" fill="${mark.color}" stroke="#ffffff" stroke-width="1.2">${title}</path>`;
    }
  }
}

/** SVG path data for a marker shape centred at (x, y). */
export function shapePath(shape: PointShape, x: number, y: number, r: number): string {
  switch (shape) {
    case 'circle':
      return `M${fmt(x - r)},${fmt(y)}a${r},${r} 0 1,0 ${2 * r},0a${r},${r} 0 1,0 ${-2 * r},0Z`;
    case 'square':
      return `M${fmt(x - r)},${fmt(y - r)}h${2 * r}v${2 * r}h${-2 * r}Z`;
    case 'diamond': {
      const d = r * 1.35;
      return `M${fmt(x)},${fmt(y - d)}L${fmt(x + d)},${fmt(y)}L${fmt(x)},${fmt(y + d)}L${fmt(x - d)},${fmt(y)}Z`;
    }
    case 'triangle': {
      const d = r * 1.3;
      return `M${fmt(x)},${fmt(y - d)}L${fmt(x + d)},${fmt(y + d * 0.8)}L${fmt(x - d)},${fmt(y + d * 0.8)}Z`;
    }
    case 'cross': {
      const a = r * 0.45;
      return (
        `M${fmt(x - a)},${fmt(y - r)}h${2 * a}v${r - a}h${r - a}v${2 * a}h${a - r}v${r - a}h${-2 * a}` +
        `v${a - r}h${a - r}v${-2 * a}h${r - a}Z`
      );
    }
  }
}

function legendHeight(spec: PlotSpec, legend: readonly LegendItem[]): number {
  if (legend.length === 0) return 0;
  return legendRows(spec, legend).length * LEGEND_ROW + 6;
}

/** Lays legend items left to right, wrapping to new rows at the plot's width. */
function legendRows(spec: PlotSpec, legend: readonly LegendItem[]): LegendItem[][] {
  const rows: LegendItem[][] = [[]];
  let x = spec.inner.left;
  for (const item of legend) {
    const w = 28 + item.label.length * 6.4 + 16;
    if (x + w > spec.width - 4 && rows[rows.length - 1].length > 0) {
      rows.push([]);
      x = spec.inner.left;
    }
    rows[rows.length - 1].push(item);
    x += w;
  }
  return rows;
}

function drawLegend(spec: PlotSpec, legend: readonly LegendItem[]): string {
  if (legend.length === 0) return '';
  const out: string[] = [];
  let y = spec.height + 4;
  for (const row of legendRows(spec, legend)) {
    let x = spec.inner.left;
    for (const item of row) {
      const cy = y + LEGEND_ROW / 2;
      if (item.swatch === 'line') {
        out.push(line(x, cy, x + 22, cy, item.color, 2.5, item.dash));
      } else if (item.swatch === 'area') {
        out.push(`<rect x="${x}" y="${fmt(cy - 6)}" width="22" height="12" fill="${item.color}" fill-opacity="0.35" stroke="${item.color}"/>`);
      } else {
        out.push(`<path d="${shapePath(item.swatch, x + 11, cy, 5)}" fill="${item.color}"/>`);
      }
      out.push(text(x + 28, cy + 4, item.label, 'start', palette.ink, 11));
      x += 28 + item.label.length * 6.4 + 16;
    }
    y += LEGEND_ROW;
  }
  return out.join('');
}

function pointLabel(x: number, y: number, label: string, side: 'left' | 'right' | 'above' | 'below', r: number): string {
  const gap = r + 4;
  const at = {
    right: { x: x + gap, y: y + 4, anchor: 'start' as const },
    left: { x: x - gap, y: y + 4, anchor: 'end' as const },
    above: { x, y: y - gap, anchor: 'middle' as const },
    below: { x, y: y + gap + 9, anchor: 'middle' as const },
  }[side];
  return text(at.x, at.y, label, at.anchor, palette.ink, 11, 'normal', true);
}

function line(x1: number, y1: number, x2: number, y2: number, stroke: string, width: number, dash?: string): string {
  const dashAttr = dash ? ` stroke-dasharray="${dash}"` : '';
  return `<line x1="${fmt(x1)}" y1="${fmt(y1)}" x2="${fmt(x2)}" y2="${fmt(y2)}" stroke="${stroke}" stroke-width="${width}"${dashAttr}/>`;
}

function text(
  x: number,
  y: number,
  content: string,
  anchor: 'start' | 'middle' | 'end',
  color: string,
  size: number,
  weight: 'normal' | 'bold' = 'normal',
  halo = false,
): string {
  const haloAttrs = halo ? ' stroke="#ffffff" stroke-width="3" paint-order="stroke" stroke-linejoin="round"' : '';
  const weightAttr = weight === 'bold' ? ' font-weight="bold"' : '';
  return `<text x="${fmt(x)}" y="${fmt(y)}" text-anchor="${anchor}" fill="${color}" font-size="${size}"${weightAttr}${haloAttrs}>${escapeXml(content)}</text>`;
}

function within(v: number, a: number, b: number): boolean {
  return Number.isFinite(v) && v >= Math.min(a, b) - 0.5 && v <= Math.max(a, b) + 0.5;
}

/** Pixel numbers with two decimals at most; non-finite values (which a spec should never hold) become 0. */
function fmt(v: number): string {
  return Number.isFinite(v) ? String(Math.round(v * 100) / 100) : '0';
}

export function escapeXml(s: string): string {
  return s.replace(/[&<>"']/g, (c) => ({ '&': '&amp;', '<': '&lt;', '>': '&gt;', '"': '&quot;', "'": '&#39;' })[c] as string);
}
