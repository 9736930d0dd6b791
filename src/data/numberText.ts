import { isMissingCell } from './missingCell';
import { printable } from './printable';
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

/**
 * What a typed field holds, which decides how its text is read:
 * - `whole`: a count, degrees of freedom, a sample size. Thousands separators are allowed ("1,200", "1 200",
 *   "1'200" and "1.200,0" all read 1200); the value must be a whole number.
 * - `decimal`: any number. A decimal point, or a decimal comma where it cannot be a thousands separator ("0,95",
 *   "1,5", "12,3456"). "1,200" could be 1.2 or 1200 and is refused with both readings; "1,200.5" and
 *   "1.200,5" are unambiguous.
 * - `fraction`: a share between 0 and 1, also typed as a percentage with a sign ("5%" is 0.05).
 * - `level`: a confidence level: "0.95", "95" or "95%" (a number above 1 and below 100 is a percentage).
 * Everywhere: empty text and the texts that mean missing in a CSV cell ("NA", "N/A", "NaN", ".", "NULL", "#N/A")
 * are missing (the field's own rule then says whether it is required); surrounding spaces are ignored, "−" (Unicode minus) is a minus sign, exponents ("2.5e-3") work,
 * and "Infinity" or words are not numbers.
 */
export type NumberKind = 'whole' | 'decimal' | 'fraction' | 'level';

/** The reading of one typed number: its value, or the rule it broke in words (without the field's name). */
export type TypedNumber =
  | { readonly ok: true; readonly value: number }
  | { readonly ok: false; readonly code: 'required' | 'not-a-number' | 'ambiguous-number' | 'not-whole'; readonly message: string };

/** The rule of the number reader in one sentence, for --help texts and the contributor guide. */
export const NUMBER_READING_RULE =
  'Numbers: a decimal point or an unambiguous decimal comma ("0,95"); thousands separators ("1,200", "1 200") only ' +
  'in whole-number fields (counts, df, n); a share may be typed as a percentage ("5%"), a confidence level as ' +
  '"95", "95%" or "0.95"; the Unicode minus "−" is a minus sign; "1,200" in a decimal field is refused as ambiguous.';

const GROUPED_COMMA = /^[+-]?\d{1,3}(,\d{3})+(\.\d*)?$/;
const GROUPED_POINT = /^[+-]?\d{1,3}(\.\d{3})+(,\d*)?$/;
const GROUPED_SPACE = /^[+-]?\d{1,3}([ '\u00a0\u202f\u2009]\d{3})+([.,]\d*)?$/;
const PLAIN = /^[+-]?(\d+\.?\d*|\.\d+)([eE][+-]?\d+)?$/;
const DECIMAL_COMMA = /^[+-]?(\d+,\d*|,\d+)([eE][+-]?\d+)?$/;

/**
 * Reads a number typed by a person into a field of the given kind (see {@link NumberKind}); the one reader
 * behind every form, command-line option, batch row, share link and appraisal file.
 */
export function readTypedNumber(text: string, kind: NumberKind = 'decimal'): TypedNumber {
  let s = text.trim().replace(/^\u2212/, '-').replace(/([eE])\u2212/, '$1-');
  // "NA", "N/A", "." … mean missing in a CSV cell; typed into a form or an option they mean the same.
  if (s === '' || isMissingCell(s)) return { ok: false, code: 'required', message: 'is required' };
  // Typed text is quoted back in messages: control characters escaped, very long text cut (see printable).
  const shown = printable(text.trim());
  let percent = false;
  if ((kind === 'fraction' || kind === 'level') && s.endsWith('%')) {
    percent = true;
    s = s.slice(0, -1).trim();
  }
  const notNumber = { ok: false, code: 'not-a-number', message: `must be a number, got "${shown}"` } as const;
  let value: number;
  if (PLAIN.test(s)) value = Number(s);
  else if (GROUPED_SPACE.test(s)) value = Number(s.replace(/[ '\u00a0\u202f\u2009]/g, '').replace(',', '.'));
  else if (GROUPED_COMMA.test(s)) {
    const grouped = Number(s.replace(/,/g, ''));
    const onlyOneComma = (s.match(/,/g) ?? []).length === 1 && !s.includes('.');
    if (onlyOneComma && kind !== 'whole') {
      const decimal = Number(s.replace(',', '.'));
      // "0,950" cannot be a thousands separator (a group never follows a leading 0).
      if (/^[+-]?0,/.test(s)) value = decimal;
      else {
        return {
          ok: false,
          code: 'ambiguous-number',
          message: `"${shown}" could be ${formatReading(decimal)} (decimal comma) or ${formatReading(grouped)} (thousands separator): type it with a decimal point, or without the separator`,
        };
      }
    } else value = grouped;
  } else if (GROUPED_POINT.test(s) && (s.includes(',') || kind === 'whole')) value = Number(s.replace(/\./g, '').replace(',', '.'));
  else if (DECIMAL_COMMA.test(s)) value = Number(s.replace(',', '.'));
  else return notNumber;
  if (!Number.isFinite(value)) return notNumber;
  if (percent) value /= 100;
  else if (kind === 'level' && value > 1 && value < 100) value /= 100;
  if (kind === 'whole' && !Number.isInteger(value)) {
    return { ok: false, code: 'not-whole', message: `must be a whole number, got "${shown}"` };
  }
  return { ok: true, value: Object.is(value, -0) ? 0 : value };
}

function formatReading(value: number): string {
  return String(value);
}
