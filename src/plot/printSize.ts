import type { FigureLayoutOptions } from './figureLayout';

/** Where a figure goes: a journal's single column (3.5 in, 89 mm), both columns (7 in, 178 mm), or a screen. */
export type PrintWidth = 'column' | 'two-columns';

export interface PrintSize {
  readonly label: string;
  readonly inches: number;
  /** Layout options: one drawing unit is one typographic point (1/72 in). */
  readonly layout: FigureLayoutOptions;
}

/** Points per inch: the SVG's drawing units are points, so its viewBox is the print width × 72. */
export const POINTS_PER_INCH = 72;

/**
 * Journal figure sizes. Text is at least 7 pt and lines at least 0.5 pt at the printed size (common journal
 * artwork requirements, e.g. "at least 6–8 pt" and "no hairlines"; common practice, no single source).
 */
export const PRINT_SIZES: Readonly<Record<PrintWidth, PrintSize>> = Object.freeze({
  column: { label: 'one column (3.5 in)', inches: 3.5, layout: { width: 3.5 * POINTS_PER_INCH, fontSize: 7.5, lineScale: 0.55, minLineWidth: 0.5, includeTitle: true } },
  'two-columns': { label: 'two columns (7 in)', inches: 7, layout: { width: 7 * POINTS_PER_INCH, fontSize: 8.5, lineScale: 0.8, minLineWidth: 0.5, includeTitle: true } },
});

/** The smallest text a figure on screen uses, in CSS pixels. */
export const SCREEN_MIN_TEXT_PX = 11;

/** Layout options for a figure drawn `width` CSS pixels wide on a screen: 11 px text when narrow, 12 px otherwise. */
export function screenLayout(width: number): FigureLayoutOptions {
  return { width: Math.max(240, Math.round(width)), fontSize: width < 480 ? SCREEN_MIN_TEXT_PX : 12 };
}
