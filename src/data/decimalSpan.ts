/** Exact powers of ten representable in a double (10^0 … 10^22). */
const POWERS_OF_TEN = Array.from({ length: 23 }, (_, k) => Number(`1e${k}`));

/**
 * Reads a plain decimal number written in `text` between `start` and `end` (no string is made), correctly
 * rounded; NaN when the text is anything else, so the caller can fall back to a full parser.
 *
 * **Method.** Accepts `[+-]digits[.digits][(e|E)[+-]digits]` with `decimalCode` as the decimal mark. The
 * significant digits are gathered into an integer m; when m < 2^53 and the decimal exponent k satisfies
 * |k| ≤ 22, both m and 10^|k| are exact doubles, so the single multiplication or division m·10^k is
 * correctly rounded (Clinger's fast path). Longer mantissas or larger exponents return NaN (fall back).
 *
 * **References.** W. D. Clinger, "How to read floating point numbers accurately", Proc. ACM SIGPLAN '90
 * Conference on Programming Language Design and Implementation, 1990, pp. 92–101 (the fast path for short decimal inputs).
 *
 * **Special cases.** An empty span, spaces, thousands separators, "Infinity", hex and similar give NaN.
 * "-0" gives −0.
 *
 * @param decimalCode the decimal mark's character code: 46 (".") or 44 (",")
 */
export function parseDecimalSpan(text: string, start: number, end: number, decimalCode: number): number {
  let i = start;
  if (i >= end) return NaN;
  let c = text.charCodeAt(i);
  let negative = false;
  if (c === 45 || c === 43) {
    negative = c === 45;
    if (++i >= end) return NaN;
    c = text.charCodeAt(i);
  }
  // Digits accumulate exactly while the integer stays below 2^53 (checked once at the end).
  let mantissa = 0;
  let exponent = 0;
  const firstDigit = i;
  let d = c - 48;
  while (d >= 0 && d <= 9) {
    mantissa = mantissa * 10 + d;
    if (++i >= end) break;
    c = text.charCodeAt(i);
    d = c - 48;
  }
  let digits = i - firstDigit;
  if (i < end && c === decimalCode) {
    const fractionStart = ++i;
    while (i < end) {
      c = text.charCodeAt(i);
      d = c - 48;
      if (d < 0 || d > 9) break;
      mantissa = mantissa * 10 + d;
      i++;
    }
    exponent = fractionStart - i;
    digits += i - fractionStart;
  }
  if (digits === 0) return NaN;
  if (i < end) {
    if (c !== 101 && c !== 69) return NaN;
    i++;
    let expNegative = false;
    if (i < end) {
      c = text.charCodeAt(i);
      if (c === 45 || c === 43) {
        expNegative = c === 45;
        i++;
      }
    }
    let e = 0;
    const expStart = i;
    while (i < end) {
      d = text.charCodeAt(i) - 48;
      if (d < 0 || d > 9) return NaN;
      if (e < 10000) e = e * 10 + d;
      i++;
    }
    if (i === expStart) return NaN;
    exponent += expNegative ? -e : e;
  }
  // Clinger's fast path: an exact integer mantissa (< 2^53) and an exact power of ten (|k| ≤ 22).
  if (!(mantissa < 9007199254740992)) return NaN;
  let value: number;
  if (mantissa === 0 || exponent === 0) value = mantissa;
  else if (exponent > 0 && exponent <= 22) value = mantissa * POWERS_OF_TEN[exponent];
  else if (exponent < 0 && exponent >= -22) value = mantissa / POWERS_OF_TEN[-exponent];
  else return NaN;
  return negative ? -value : value;
}
