/**
 * Tick labels in one format per axis: plain decimals when every tick can be written that way briefly
 * (0.0001 ≤ |value| < 1,000,000), otherwise powers of ten for every tick (10⁻⁸, 5×10⁻⁸, 10⁻⁷ …), so an axis
 * never shows "1.0e-8" beside "0.0000010".
 */
export function uniformTickLabels(values: readonly number[]): string[] {
  const finite = values.filter((v) => Number.isFinite(v) && v !== 0).map(Math.abs);
  const plain = finite.every((v) => v >= 1e-4 && v < 1e6);
  return values.map((v) => {
    if (!Number.isFinite(v)) return '';
    if (v === 0) return '0';
    return plain ? plainDecimal(v) : powerOfTen(v);
  });
}

/** Percent tick labels with the same number of decimals on every tick (as many as the step needs). */
export function uniformPercentLabels(values: readonly number[]): string[] {
  const finite = values.filter(Number.isFinite);
  let step = Infinity;
  for (let i = 1; i < finite.length; i++) step = Math.min(step, Math.abs(finite[i] - finite[i - 1]));
  const pctStep = Number.isFinite(step) && step > 0 ? step * 100 : 1;
  const digits = Math.max(0, Math.min(4, Math.ceil(-Math.log10(pctStep) - 1e-9)));
  return values.map((v) => (Number.isFinite(v) ? `${(v * 100).toFixed(digits).replace(/^-0(\.0+)?$/, '0$1')}%` : ''));
}

function plainDecimal(v: number): string {
  const s = String(Number(v.toPrecision(6)));
  return s.replace('-', '−');
}

const SUPERSCRIPT: Record<string, string> = { '-': '⁻', '0': '⁰', '1': '¹', '2': '²', '3': '³', '4': '⁴', '5': '⁵', '6': '⁶', '7': '⁷', '8': '⁸', '9': '⁹' };

function powerOfTen(v: number): string {
  const sign = v < 0 ? '−' : '';
  const abs = Math.abs(v);
  let exponent = Math.floor(Math.log10(abs));
  let mantissa = Number((abs / Math.pow(10, exponent)).toPrecision(3));
  if (mantissa >= 10) {
    mantissa /= 10;
    exponent += 1;
  }
  const power = `10${String(exponent).replace(/[-0-9]/g, (c) => SUPERSCRIPT[c])}`;
  return mantissa === 1 ? `${sign}${power}` : `${sign}${mantissa}×${power}`;
}
