import type { AxisSpec, LegendItem, PlotArea, PlotMark, PlotSpec, PointMark, TextMark, Tick } from './plotSpec';
import { palette } from './palette';
import { ASCENT, DESCENT, lineHeight, textWidth, wrapText } from './textMeasure';

/**
 * Lays a PlotSpec out for the width it gets: margins from the real tick-label and axis-title sizes, axis titles
 * wrapped, tick labels thinned until they do not touch, the legend in rows below, and every label in the plot
 * placed where it touches no other text (beside its point, further out with a leader line, or — when the
 * plot is too crowded — as a number with the full text in a numbered key below the figure). Pure: the same
 * spec and options always give the same layout, and `figureTextBoxes` lists every text box it draws.
 */
export interface FigureLayoutOptions {
  /** Width of the whole figure in drawing units (CSS pixels on screen, points in print). */
  readonly width: number;
  /** The size of every text but the title, in drawing units. */
  readonly fontSize: number;
  /** Draw the title above the plot (exported files). */
  readonly includeTitle?: boolean;
  /** Stroke widths of the spec are multiplied by this (default 1). */
  readonly lineScale?: number;
  /** No line is drawn thinner than this (drawing units; default 0). */
  readonly minLineWidth?: number;
  /** Height of the plotting area over its width (default: the spec's own, kept between 0.55 and 0.85). */
  readonly aspect?: number;
}

export type TextRole = 'title' | 'note' | 'tick' | 'axis-title' | 'legend' | 'label' | 'key-number' | 'key';

export interface PlacedText {
  readonly x: number;
  /** Baseline of the text. */
  readonly y: number;
  readonly text: string;
  readonly anchor: 'start' | 'middle' | 'end';
  readonly size: number;
  readonly weight: 'normal' | 'bold';
  readonly color: string;
  readonly role: TextRole;
  /** Turned a quarter to read upwards, about (x, y). */
  readonly upright?: boolean;
  /** Drawn with a white outline so it stays readable over lines. */
  readonly halo?: boolean;
}

export interface PlacedSwatch {
  readonly x: number;
  readonly cy: number;
  readonly width: number;
  readonly item: LegendItem;
}

export interface LeaderLine {
  readonly x1: number;
  readonly y1: number;
  readonly x2: number;
  readonly y2: number;
}

export interface TextBox {
  readonly left: number;
  readonly top: number;
  readonly right: number;
  readonly bottom: number;
}

export interface FigureLayout {
  readonly spec: PlotSpec;
  readonly width: number;
  readonly height: number;
  readonly fontSize: number;
  readonly inner: PlotArea;
  readonly xAxis: AxisSpec;
  readonly yAxis: AxisSpec;
  /** The spec's paths, rules and points, moved to this layout (text marks become `texts`). */
  readonly marks: readonly Exclude<PlotMark, TextMark>[];
  readonly texts: readonly PlacedText[];
  readonly swatches: readonly PlacedSwatch[];
  readonly leaders: readonly LeaderLine[];
  /** The numbered key's entries ("1: 2 × age: 0.31"), also for the caption. */
  readonly keyEntries: readonly string[];
  /** Notes drawn above the plot, for the caption. */
  readonly notes: readonly string[];
  readonly lineScale: number;
  readonly minLineWidth: number;
  /** Marker sizes are multiplied by this. */
  readonly markerScale: number;
}

/** The box a placed text covers (estimated from its font size and characters; see textMeasure). */
export function placedTextBox(t: PlacedText): TextBox {
  const w = textWidth(t.text, t.size, t.weight);
  const x0 = t.anchor === 'start' ? 0 : t.anchor === 'end' ? -w : -w / 2;
  if (t.upright) {
    // Rotated −90° about (x, y): the text runs upwards; its ascent lies to the left of the baseline.
    return { left: t.x - ASCENT * t.size, right: t.x + DESCENT * t.size, top: t.y - x0 - w, bottom: t.y - x0 };
  }
  return { left: t.x + x0, right: t.x + x0 + w, top: t.y - ASCENT * t.size, bottom: t.y + DESCENT * t.size };
}

/** Every text box of a laid-out figure, in drawing order. */
export function figureTextBoxes(layout: FigureLayout): (TextBox & { text: string; role: TextRole; size: number })[] {
  return layout.texts.map((t) => ({ ...placedTextBox(t), text: t.text, role: t.role, size: t.size }));
}

/** Pairs of text boxes that overlap by more than `tolerance` in both directions. */
export function overlappingTextPairs<T extends TextBox>(boxes: readonly T[], tolerance = 0.01): [T, T][] {
  const pairs: [T, T][] = [];
  for (let i = 0; i < boxes.length; i++) {
    for (let j = i + 1; j < boxes.length; j++) if (intersects(boxes[i], boxes[j], -tolerance)) pairs.push([boxes[i], boxes[j]]);
  }
  return pairs;
}

function intersects(a: TextBox, b: TextBox, gap: number): boolean {
  return a.left < b.right + gap && b.left < a.right + gap && a.top < b.bottom + gap && b.top < a.bottom + gap;
}

/** Lays `spec` out at `options.width` (see the module comment). */
export function layoutFigure(spec: PlotSpec, options: FigureLayoutOptions): FigureLayout {
  const W = options.width;
  const f = options.fontSize;
  const lh = lineHeight(f);
  const pad = Math.max(2, 0.4 * f);
  const tickLength = 0.4 * f;
  const titleSize = f * 1.15;
  const si = spec.inner;
  const siW = Math.max(1, si.right - si.left);
  const siH = Math.max(1, si.bottom - si.top);
  const narrow = W < 480;
  const aspect = options.aspect ?? Math.max(narrow ? 0.75 : 0.55, Math.min(0.85, siH / siW));
  const texts: PlacedText[] = [];
  const text = (t: Omit<PlacedText, 'weight' | 'color' | 'anchor'> & Partial<PlacedText>) =>
    texts.push({ anchor: 'start', weight: 'normal', color: palette.ink, ...t });

  // Above the plot: the title and the notes (text marks the spec put above its plotting area).
  let y = pad;
  if (options.includeTitle) {
    for (const line of wrapText(spec.title, titleSize, W - 2 * pad, 'bold')) {
      text({ x: pad, y: y + ASCENT * titleSize, text: line, size: titleSize, weight: 'bold', role: 'title' });
      y += lineHeight(titleSize);
    }
    y += 0.2 * f;
  }
  const notes = spec.marks.filter((m): m is TextMark => m.kind === 'text' && m.y < si.top - 1).map((m) => m.text);
  for (const note of notes) {
    for (const line of wrapText(note, f, W - 2 * pad)) {
      text({ x: pad, y: y + ASCENT * f, text: line, size: f, role: 'note' });
      y += lh;
    }
  }
  const innerTop = y + 0.5 * f;

  // Left and right: y tick labels and the (wrapped) y title; half of the last x tick label.
  const yTickWidth = Math.max(0, ...spec.yAxis.ticks.map((t) => textWidth(t.label, f)));
  const xTicks = spec.xAxis.ticks.filter((t) => t.position >= si.left - 0.5 && t.position <= si.right + 0.5);
  const lastX = xTicks.length > 0 ? xTicks.reduce((a, b) => (a.position > b.position ? a : b)) : null;
  const rightOverhang = lastX && (lastX.position - si.left) / siW > 0.9 ? textWidth(lastX.label, f) / 2 : 0;
  const right = W - pad - Math.max(0.6 * f, rightOverhang);
  let yTitleLines = [spec.yAxis.label];
  let left = 0;
  let innerH = 0;
  for (let pass = 0; pass < 3; pass++) {
    left = pad + yTitleLines.length * lh + 0.3 * f + yTickWidth + 0.25 * f + tickLength;
    innerH = Math.max(4 * f, (right - left) * aspect);
    const wrapped = wrapText(spec.yAxis.label, f, innerH);
    if (wrapped.length === yTitleLines.length && pass > 0) break;
    yTitleLines = wrapped;
  }
  const inner: PlotArea = { left, top: innerTop, right: Math.max(left + 4 * f, right), bottom: innerTop + innerH };
  const kx = (inner.right - inner.left) / siW;
  const ky = (inner.bottom - inner.top) / siH;
  const sx = (v: number) => inner.left + (v - si.left) * kx;
  const sy = (v: number) => inner.top + (v - si.top) * ky;

  // Axes: ticks moved and thinned until their labels keep apart.
  const xAxis = moveAxis(spec.xAxis, sx, [inner.left, inner.right], (t) => textWidth(t.label, f), 0.8 * f);
  const yAxis = moveAxis(spec.yAxis, sy, [inner.bottom, inner.top], () => (ASCENT + DESCENT) * f, 0.3 * f);
  const xTickBaseline = inner.bottom + tickLength + 0.2 * f + ASCENT * f;
  for (const t of xAxis.ticks) text({ x: t.position, y: xTickBaseline, text: t.label, size: f, anchor: 'middle', role: 'tick' });
  for (const t of yAxis.ticks) {
    text({ x: inner.left - tickLength - 0.25 * f, y: t.position + (ASCENT - DESCENT) * f * 0.5, text: t.label, size: f, anchor: 'end', role: 'tick' });
  }
  y = xTickBaseline + DESCENT * f + 0.35 * f;
  const xMid = (inner.left + inner.right) / 2;
  for (const line of wrapText(spec.xAxis.label, f, 2 * Math.min(xMid - pad, W - pad - xMid))) {
    text({ x: xMid, y: y + ASCENT * f, text: line, size: f, anchor: 'middle', role: 'axis-title' });
    y += lh;
  }
  const yMid = (inner.top + inner.bottom) / 2;
  yTitleLines.forEach((line, i) => {
    text({ x: pad + ASCENT * f + i * lh, y: yMid, text: line, size: f, anchor: 'middle', role: 'axis-title', upright: true });
  });

  // Marks: moved; their labels placed clear of every other text.
  const lineScale = options.lineScale ?? 1;
  const markerScale = f / 12;
  const marks: Exclude<PlotMark, TextMark>[] = [];
  const labels: LabelRequest[] = [];
  for (const m of spec.marks) {
    if (m.kind === 'path') marks.push({ ...m, d: movePath(m.d, sx, sy) });
    else if (m.kind === 'rule') marks.push({ ...m, x1: sx(m.x1), x2: sx(m.x2), y1: sy(m.y1), y2: sy(m.y2) });
    else if (m.kind === 'point') {
      const { label, ...point } = m;
      const moved: PointMark = { ...point, x: sx(m.x), y: sy(m.y) };
      marks.push(moved);
      const inside = moved.x >= inner.left - 0.5 && moved.x <= inner.right + 0.5 && moved.y >= inner.top - 0.5 && moved.y <= inner.bottom + 0.5;
      if (label && inside) {
        labels.push({ text: label, x: moved.x, y: moved.y, r: (m.size ?? 5) * markerScale, side: m.labelSide ?? 'right', weight: 'normal', color: palette.ink, droppable: false, asIs: null });
      }
    } else if (m.y >= si.top - 1) {
      labels.push({
        text: m.text,
        x: sx(m.x),
        y: sy(m.y),
        r: 0,
        side: 'right',
        weight: m.weight ?? 'normal',
        color: m.color ?? palette.ink,
        droppable: m.droppable === true,
        asIs: m.anchor ?? 'start',
      });
    }
  }
  const markerBoxes: (TextBox & { x: number; y: number })[] = marks
    .filter((m): m is PointMark => m.kind === 'point')
    .map((m) => {
      const r = (m.size ?? 5) * markerScale * 1.35 + 1;
      return { x: m.x, y: m.y, left: m.x - r, right: m.x + r, top: m.y - r, bottom: m.y + r };
    });
  const grouped = groupCoincidentLabels(labels, f);
  const ordered = [...grouped.filter((l) => !l.droppable), ...grouped.filter((l) => l.droppable)];
  const placed = placeLabels(ordered, texts.map(placedTextBox), markerBoxes, inner, f);
  texts.push(...placed.texts);

  // Below: the legend in rows, then the numbered key.
  y += 0.4 * f;
  const swatches: PlacedSwatch[] = [];
  const swatchWidth = 1.8 * f;
  let x = pad;
  let rowHeight = 0;
  for (const item of spec.legend) {
    const room = W - 2 * pad - swatchWidth - 0.4 * f;
    const lines = textWidth(item.label, f) > room ? wrapText(item.label, f, room) : [item.label];
    const itemWidth = swatchWidth + 0.4 * f + Math.max(...lines.map((l) => textWidth(l, f)));
    if (x > pad && x + itemWidth > W - pad) {
      y += rowHeight;
      x = pad;
      rowHeight = 0;
    }
    swatches.push({ x, cy: y + (ASCENT - DESCENT) * f * 0.5 + 0.05 * f, width: swatchWidth, item });
    lines.forEach((line, i) => text({ x: x + swatchWidth + 0.4 * f, y: y + ASCENT * f + i * lh, text: line, size: f, role: 'legend' }));
    rowHeight = Math.max(rowHeight, lines.length * lh + 0.15 * f);
    x += itemWidth + 1.1 * f;
  }
  y += rowHeight;
  if (placed.keyEntries.length > 0) {
    y += 0.3 * f;
    for (const entry of placed.keyEntries) {
      for (const line of wrapText(entry, f, W - 2 * pad)) {
        text({ x: pad, y: y + ASCENT * f, text: line, size: f, role: 'key' });
        y += lh;
      }
    }
  }
  return {
    spec,
    width: W,
    height: Math.ceil(y + pad),
    fontSize: f,
    inner,
    xAxis,
    yAxis,
    marks,
    texts,
    swatches,
    leaders: placed.leaders,
    keyEntries: placed.keyEntries,
    notes,
    lineScale,
    minLineWidth: options.minLineWidth ?? 0,
    markerScale,
  };
}

/** Moves an axis to new pixel positions and keeps the largest evenly spaced set of ticks whose labels keep apart. */
function moveAxis(axis: AxisSpec, move: (v: number) => number, range: [number, number], extent: (t: Tick) => number, gap: number): AxisSpec {
  const lo = Math.min(...range) - 0.5;
  const hi = Math.max(...range) + 0.5;
  const all = axis.ticks.map((t) => ({ ...t, position: move(t.position) })).filter((t) => t.position >= lo && t.position <= hi);
  const apart = (ticks: Tick[]) => {
    const sorted = [...ticks].sort((a, b) => a.position - b.position);
    for (let i = 1; i < sorted.length; i++) {
      if (sorted[i].position - extent(sorted[i]) / 2 < sorted[i - 1].position + extent(sorted[i - 1]) / 2 + gap) return false;
    }
    return true;
  };
  const candidates: Tick[][] = [];
  if (axis.scale === 'log') {
    const decades = all.filter((t) => Math.abs(Math.log10(t.value) - Math.round(Math.log10(t.value))) < 1e-9);
    // Over three decades or more, 2× and 5× ticks only crowd the axis: decades alone read best.
    if (decades.length < 4) candidates.push(all);
    for (let step = 1; step <= Math.max(1, decades.length); step++) candidates.push(decades.filter((_, i) => i % step === 0));
  }
  candidates.push(all);
  for (let step = 2; step <= all.length; step++) {
    for (let offset = 0; offset < step; offset++) candidates.push(all.filter((_, i) => i % step === offset));
  }
  const chosen = candidates.find((c) => c.length >= 2 && apart(c)) ?? all.slice(0, 1);
  return { ...axis, range: [range[0], range[1]], ticks: chosen };
}

/** Moves every "x,y" pair of absolute path data (as polylinePath and polygonPath write it). */
function movePath(d: string, sx: (v: number) => number, sy: (v: number) => number): string {
  const r = (v: number) => Math.round(v * 100) / 100;
  return d.replace(/(-?\d*\.?\d+(?:e[-+]?\d+)?),(-?\d*\.?\d+(?:e[-+]?\d+)?)/gi, (_, a: string, b: string) => `${r(sx(Number(a)))},${r(sy(Number(b)))}`);
}

type Side = NonNullable<PointMark['labelSide']>;

interface LabelRequest {
  readonly text: string;
  /** The point (or, for a free text, its anchor) the label belongs to. */
  readonly x: number;
  readonly y: number;
  /** The point's radius (0 for a free text). */
  readonly r: number;
  readonly side: Side;
  readonly weight: 'normal' | 'bold';
  readonly color: string;
  /** May be left out when there is no room (contour levels). */
  readonly droppable: boolean;
  /** A free text's own anchor, tried first; null for a point's label. */
  readonly asIs: 'start' | 'middle' | 'end' | null;
}

const SIDES: Side[] = ['right', 'left', 'above', 'below'];
const DIAGONALS = [
  [1, -1],
  [-1, -1],
  [1, 1],
  [-1, 1],
] as const;

/** Candidate spots for a text near (x, y): baseline position and anchor, and how far out (0 = beside it). */
function spots(req: LabelRequest, text: string, f: number, rings: number): { x: number; y: number; anchor: 'start' | 'middle' | 'end'; ring: number }[] {
  const out: { x: number; y: number; anchor: 'start' | 'middle' | 'end'; ring: number }[] = [];
  const mid = (ASCENT - DESCENT) * f * 0.5;
  if (req.asIs) {
    const h = (ASCENT + DESCENT) * f + 0.2 * f;
    for (const dy of [0, -h, h, -2 * h, 2 * h, -3 * h, 3 * h]) {
      for (const anchor of [req.asIs, ...(['start', 'middle', 'end'] as const).filter((a) => a !== req.asIs)]) out.push({ x: req.x, y: req.y + dy, anchor, ring: 0 });
    }
    return out;
  }
  for (let ring = 0; ring < rings; ring++) {
    const g = req.r + 0.3 * f + ring * 1.6 * f;
    const order = [req.side, ...SIDES.filter((s) => s !== req.side)];
    for (const side of order) {
      if (side === 'right') out.push({ x: req.x + g, y: req.y + mid, anchor: 'start', ring });
      if (side === 'left') out.push({ x: req.x - g, y: req.y + mid, anchor: 'end', ring });
      if (side === 'above') out.push({ x: req.x, y: req.y - g - DESCENT * f, anchor: 'middle', ring });
      if (side === 'below') out.push({ x: req.x, y: req.y + g + ASCENT * f, anchor: 'middle', ring });
    }
    for (const [dx, dy] of DIAGONALS) {
      const gd = g * 0.75;
      out.push({ x: req.x + dx * gd, y: req.y + dy * gd + (dy < 0 ? -DESCENT * f : ASCENT * f), anchor: dx > 0 ? 'start' : 'end', ring });
    }
  }
  void text;
  return out;
}

function placeLabels(requests: readonly LabelRequest[], fixed: readonly TextBox[], markers: readonly (TextBox & { x: number; y: number })[], inner: PlotArea, f: number) {
  const texts: PlacedText[] = [];
  const leaders: LeaderLine[] = [];
  const keyEntries: string[] = [];
  const unnumbered: string[] = [];
  const taken: TextBox[] = [...fixed];
  const gap = 0.15 * f;
  const insideBox: TextBox = { left: inner.left + 1, top: inner.top + 1, right: inner.right - 1, bottom: inner.bottom - 1 };
  const tryPlace = (req: LabelRequest, content: string, weight: 'normal' | 'bold', rings: number, avoidMarkers: boolean) => {
    for (const spot of spots(req, content, f, rings)) {
      const candidate: PlacedText = { x: spot.x, y: spot.y, text: content, anchor: spot.anchor, size: f, weight, color: req.color, role: 'label', halo: true };
      const moved = clampInto(candidate, insideBox);
      if (!moved) continue;
      const box = placedTextBox(moved);
      if (taken.some((b) => intersects(b, box, gap))) continue;
      if (avoidMarkers && markers.some((m) => !(Math.abs(m.x - req.x) < 0.01 && Math.abs(m.y - req.y) < 0.01) && intersects(m, box, 0))) continue;
      if (req.r > 0 && intersects({ left: req.x - req.r, right: req.x + req.r, top: req.y - req.r, bottom: req.y + req.r }, box, 0)) continue;
      return { text: moved, box, ring: spot.ring };
    }
    return null;
  };
  for (const req of requests) {
    const full = tryPlace(req, req.text, req.weight, req.asIs ? 1 : 2, true);
    if (full) {
      taken.push(full.box);
      texts.push(full.text);
      if (full.ring > 0) leaders.push(leaderTo(req, full.box));
      continue;
    }
    if (req.droppable) continue;
    // Crowded: a number beside the point, the full text in the key below the figure.
    const n = String(keyEntries.length + 1);
    const numbered = tryPlace({ ...req, asIs: null, side: req.side }, n, 'bold', 4, true) ?? tryPlace({ ...req, asIs: null }, n, 'bold', 4, false);
    if (numbered) {
      keyEntries.push(`${n}: ${req.text}`);
      taken.push(numbered.box);
      texts.push({ ...numbered.text, role: 'key-number' });
      if (numbered.ring > 0) leaders.push(leaderTo(req, numbered.box));
    } else unnumbered.push(req.text);
  }
  if (unnumbered.length > 0) keyEntries.push(`Too close together to number (see the data table): ${unnumbered.join('; ')}`);
  return { texts, leaders, keyEntries };
}

/**
 * Points that (nearly) coincide share one label: their texts joined by "; " (which, being long, usually goes to
 * the numbered key as a single entry rather than as a pile of numbers).
 */
function groupCoincidentLabels(labels: readonly LabelRequest[], f: number): LabelRequest[] {
  const out: LabelRequest[] = [];
  const groups: { first: LabelRequest; texts: string[] }[] = [];
  for (const l of labels) {
    if (l.asIs) {
      out.push(l);
      continue;
    }
    const near = groups.find((g) => Math.hypot(g.first.x - l.x, g.first.y - l.y) < Math.max(g.first.r + l.r, 0.6 * f));
    if (near) near.texts.push(l.text);
    else groups.push({ first: l, texts: [l.text] });
  }
  for (const g of groups) out.push(g.texts.length === 1 ? g.first : { ...g.first, text: g.texts.join('; ') });
  return out;
}

/** Shifts a text inside `area` when it sticks out; null when it is larger than the area. */
function clampInto(t: PlacedText, area: TextBox): PlacedText | null {
  const box = placedTextBox(t);
  if (box.right - box.left > area.right - area.left || box.bottom - box.top > area.bottom - area.top) return null;
  const dx = box.left < area.left ? area.left - box.left : box.right > area.right ? area.right - box.right : 0;
  const dy = box.top < area.top ? area.top - box.top : box.bottom > area.bottom ? area.bottom - box.bottom : 0;
  return dx === 0 && dy === 0 ? t : { ...t, x: t.x + dx, y: t.y + dy };
}

/** A leader from the point's edge to the nearest edge of its label. */
function leaderTo(req: LabelRequest, box: TextBox): LeaderLine {
  const x2 = Math.max(box.left, Math.min(req.x, box.right));
  const y2 = Math.max(box.top, Math.min(req.y, box.bottom));
  const d = Math.hypot(x2 - req.x, y2 - req.y) || 1;
  return { x1: req.x + ((x2 - req.x) / d) * req.r, y1: req.y + ((y2 - req.y) / d) * req.r, x2, y2 };
}
