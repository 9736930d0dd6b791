/**
 * Numbers for people. Every function here returns a safe string: never "NaN", "undefined" or "Infinity".
 * Non-finite values read "not available" (or the caller's `missing` text); huge values switch to
 * scientific notation; −0 prints as 0.
 */

export interface NumberFormat {
  /** Digits after the decimal point (fixed notation). Default: chosen from `significant`. */
  digits?: number;
  /** Significant digits when `digits` is not given. Default 3. */
  significant?: number;
  /** Text for a non-finite or missing value. Default "not available". */
  missing?: string;
}

export const NOT_AVAILABLE = 'not available';

export function formatNumber(x: number | null | undefined, format: NumberFormat = {}): string {
  const missing = format.missing ?? NOT_AVAILABLE;
  if (x === null || x === undefined || !Number.isFinite(x)) return missing;
  if (Object.is(x, -0) || x === 0) return format.digits !== undefined ? (0).toFixed(format.digits) : '0';
  const abs = Math.abs(x);
  if (abs >= 1e9 || abs < 1e-6) return tidyExponent(x.toExponential(Math.max(0, (format.significant ?? 3) - 1)));
  let text: string;
  if (format.digits !== undefined) {
    text = x.toFixed(format.digits);
  } else {
    const significant = format.significant ?? 3;
    const magnitude = Math.floor(Math.log10(abs));
    const digits = Math.max(0, significant - 1 - magnitude);
    text = x.toFixed(Math.min(digits, 12));
  }
  // toFixed can round a tiny negative to "-0.00".
  if (/^-0(\.0*)?$/.test(text)) text = text.slice(1);
  return text;
}

/** A fraction as a percentage, e.g. 0.1386 → "13.9%". */
export function formatPercent(fraction: number | null | undefined, digits = 1, missing = NOT_AVAILABLE): string {
  if (fraction === null || fraction === undefined || !Number.isFinite(fraction)) return missing;
  return `${formatNumber(fraction * 100, { digits })}%`;
}

/** A p-value: 3 significant digits, "< 0.0001" below that, never 0 or 1 shown as certain. */
export function formatPValue(p: number | null | undefined, missing = NOT_AVAILABLE): string {
  if (p === null || p === undefined || !Number.isFinite(p)) return missing;
  if (p < 1e-4) return '< 0.0001';
  if (p > 0.9999) return '> 0.9999';
  const text = formatNumber(p, { significant: 3 });
  // 0.9996 would round to "1.000", which reads as certainty: keep four decimals there.
  return Number(text) >= 1 ? p.toFixed(4) : text;
}

/** A ratio such as an E-value or Γ with a fixed number of decimals (default 2). */
export function formatRatio(x: number | null | undefined, digits = 2, missing = NOT_AVAILABLE): string {
  return formatNumber(x, { digits, missing });
}

function tidyExponent(text: string): string {
  // "1.23e+10" → "1.23 × 10^10" reads better in prose; keep ASCII for CSV-safe output.
  const [mantissa, exponent] = text.split('e');
  return `${mantissa}e${Number(exponent)}`;
}

/**
 * A p-value as a clause of a sentence: "p = 0.0123", "p < 0.0001" or "p > 0.9999" (never "p = < 0.0001").
 * Every sentence that states a p-value writes it through here.
 */
export function pValueClause(p: number | null | undefined): string {
  const text = formatPValue(p);
  if (text.startsWith('<') || text.startsWith('>')) return `p ${text}`;
  return text === NOT_AVAILABLE ? 'p not available' : `p = ${text}`;
}

/**
 * A value with floating-point rounding noise removed: 0 when |x| is below 1e-12 times the data's scale (the
 * largest magnitude among the values it was computed from), so a zero difference computed as −4.44e-16 shows
 * as 0. Other values, and non-finite ones, are returned unchanged.
 */
export function withoutRoundingNoise(x: number, scale: number): number {
  if (!Number.isFinite(x) || !Number.isFinite(scale) || scale <= 0) return x;
  return Math.abs(x) <= 1e-12 * scale ? 0 : x;
}

/**
 * A number the user typed, echoed with the precision typed ("1.10" stays "1.10"): the typed text when it is a
 * plain decimal that reads back as exactly `value`, otherwise `fallback(value)`.
 */
export function echoTyped(value: number | null | undefined, typed: string | null | undefined, fallback: (x: number | null | undefined) => string): string {
  const text = String(typed ?? '').trim();
  if (value !== null && value !== undefined && Number.isFinite(value) && /^[-+]?\d+(\.\d+)?$/.test(text) && Number(text) === value) {
    return text.replace(/^\+/, '');
  }
  return fallback(value);
}
