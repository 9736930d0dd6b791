/**
 * Text size estimates for figure layout, without a browser: advance widths of Arial / Liberation Sans (the
 * figures' first fonts; Liberation Sans is metric-compatible with Arial) in ems, rounded up a little so that
 * the estimate is never narrower than the drawn text. Box heights follow the font's ascent (0.905 em) and
 * descent (0.212 em), which is what a browser's getBBox() reports for a line of SVG text.
 */

/** The font stack every figure is drawn in (the widths below are this font's). */
export const FIGURE_FONT = 'Arial, "Liberation Sans", Helvetica, sans-serif';

const NARROW = new Set([...'ijlI|!.,:;\'`ı']);
const SLIM = new Set([...'ftr()[]{}-/ \\*"²³¹⁰⁴⁵⁶⁷⁸⁹⁻⁺']);
const WIDE = new Set([...'mwMW%@—…']);
const CAPITAL_WIDE = new Set([...'ABCDGHKNOQRUVXYΔΛΩ']);

/** Width in ems of one character (Arial's advance widths, grouped). */
function charWidth(c: string): number {
  if (NARROW.has(c)) return 0.28;
  if (SLIM.has(c)) return 0.34;
  if (WIDE.has(c)) return 0.9;
  if (CAPITAL_WIDE.has(c)) return 0.74;
  if (/[A-Z]/.test(c)) return 0.67;
  if (/[0-9]/.test(c)) return 0.56;
  if (c === 'Γ' || c === 'α' || c === 'β' || c === 'q' || c === 'k') return 0.58;
  if (/[a-z]/.test(c)) return 0.56;
  // CJK, Hangul, full-width forms and pictographs take a whole em (or more).
  if ((c.codePointAt(0) ?? 0) >= 0x2e80) return 1.05;
  return 0.62; // ×, −, ≥, ·, ~, letters of other scripts
}

/** Estimated width of one line of text at `size` (same units as `size`), rounded up by 4 %. */
export function textWidth(text: string, size: number, weight: 'normal' | 'bold' = 'normal'): number {
  let ems = 0;
  for (const c of text) ems += charWidth(c);
  return ems * size * (weight === 'bold' ? 1.1 : 1.04);
}

/** Distance from the baseline up to the top of the text box, and down to its bottom, at `size`. */
export const ASCENT = 0.91;
export const DESCENT = 0.22;

/** Height between successive lines of a wrapped text. */
export function lineHeight(size: number): number {
  return size * 1.2;
}

/** Breaks `text` at spaces into lines no wider than `maxWidth` (a single word wider than that gets its own line). */
export function wrapText(text: string, size: number, maxWidth: number, weight: 'normal' | 'bold' = 'normal'): string[] {
  const words = text.split(/\s+/).filter(Boolean);
  const lines: string[] = [];
  let current = '';
  for (const word of words) {
    const tried = current ? `${current} ${word}` : word;
    if (current && textWidth(tried, size, weight) > maxWidth) {
      lines.push(current);
      current = word;
    } else current = tried;
  }
  if (current) lines.push(current);
  return lines.length > 0 ? lines : [''];
}
