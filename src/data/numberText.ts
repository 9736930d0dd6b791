/**
 * Reads a number typed by a person or written in a CSV cell.
 *
 * Accepts a decimal point, or a decimal comma when `decimalComma` is set ("1,8" → 1.8; then "." is read as a
 * thousands separator only in the grouped form "1.234,5"), exponents ("1e-3"), a leading "+", surrounding
 * spaces and a non-breaking space or thin space as thousands separators. Returns NaN for anything else
 * (including empty text), so the caller decides which message to show.
 */
export function parseNumberText(text: string, decimalComma = false): number {
  let s = text.trim().replace(/[\u00a0\u202f\u2009]/g, '');
  if (s === '') return NaN;
  // A typographic minus sign is a minus sign.
  s = s.replace(/^\u2212/, '-');
  if (decimalComma) {
    if (/^[+-]?\d{1,3}(\.\d{3})+(,\d*)?$/.test(s)) s = s.replace(/\./g, '');
    s = s.replace(',', '.');
  }
  if (!/^[+-]?(\d+\.?\d*|\.\d+)([eE][+-]?\d+)?$/.test(s)) {
    // Infinity, hex, "1,000" without the decimal-comma setting and other forms are not accepted.
    return NaN;
  }
  return Number(s);
}

/** Typed form fields accept either "1.8" or "1,8": a single comma and no point is a decimal comma. */
export function parseTypedNumber(text: string): number {
  const trimmed = text.trim();
  const decimalComma = /^[+\-\u2212]?\d*,\d+([eE][+-]?\d+)?$/.test(trimmed);
  return parseNumberText(trimmed, decimalComma);
}
