import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { formatNumber, formatPercent, formatPValue, formatRatio } from '../../src/format/formatNumber';
import { parseNumberText, parseTypedNumber } from '../../src/data/numberText';

describe('formatNumber never shows NaN, undefined or Infinity', () => {
  it('writes non-finite and missing values as "not available"', () => {
    for (const v of [NaN, Infinity, -Infinity, null, undefined]) expect(formatNumber(v)).toBe('not available');
    expect(formatPercent(NaN)).toBe('not available');
    expect(formatPValue(Infinity)).toBe('not available');
    expect(formatRatio(undefined, 2, '—')).toBe('—');
  });

  it('writes −0 and tiny negatives rounded to zero without a sign', () => {
    expect(formatNumber(-0)).toBe('0');
    expect(formatNumber(-0.0001, { digits: 2 })).toBe('0.00');
  });

  it('uses 3 significant digits by default and scientific notation for extremes', () => {
    expect(formatNumber(7.263034344160047)).toBe('7.26');
    expect(formatNumber(0.0761111668962113)).toBe('0.0761');
    expect(formatNumber(1.5e12)).toBe('1.50e12');
    expect(formatNumber(Number.MAX_VALUE)).toBe('1.80e308');
    expect(formatNumber(2e-9)).toBe('2.00e-9');
  });

  it('formats percentages and p-values', () => {
    expect(formatPercent(0.1386397639516563)).toBe('13.9%');
    expect(formatPValue(0.017578125)).toBe('0.0176');
    expect(formatPValue(1e-7)).toBe('< 0.0001');
    expect(formatPValue(1)).toBe('> 0.9999');
  });

  it('never returns text containing NaN or Infinity for any double', () => {
    fc.assert(
      fc.property(fc.double(), fc.integer({ min: 0, max: 8 }), (x, digits) => {
        for (const s of [formatNumber(x), formatNumber(x, { digits }), formatPercent(x), formatPValue(x), formatRatio(x)]) {
          expect(s).not.toMatch(/NaN|Infinity|undefined/);
        }
      }),
    );
  });
});

describe('parseNumberText', () => {
  it('reads decimal points, exponents, signs and the typographic minus', () => {
    expect(parseNumberText(' 1.8 ')).toBe(1.8);
    expect(parseNumberText('+2e-3')).toBe(0.002);
    expect(parseNumberText('\u22120.5')).toBe(-0.5);
    expect(parseNumberText('.5')).toBe(0.5);
  });

  it('reads decimal commas and grouped thousands when told the file uses them', () => {
    expect(parseNumberText('1,5', true)).toBe(1.5);
    expect(parseNumberText('1.234,5', true)).toBe(1234.5);
  });

  it('refuses text, empty cells, Infinity and ambiguous forms', () => {
    for (const s of ['', 'abc', 'Infinity', '0x10', '1,000', '1.2.3', '--1']) expect(parseNumberText(s)).toBeNaN();
  });

  it('accepts a decimal comma typed into a form', () => {
    expect(parseTypedNumber('1,8')).toBe(1.8);
    expect(parseTypedNumber('3.9')).toBe(3.9);
    expect(parseTypedNumber('1,000.5')).toBeNaN();
  });
});

describe('p-value clauses, rounding noise and typed echoes', () => {
  it('writes "p < 0.0001", never "p = < 0.0001" (R: 2^-30 = 9.31e-10, exact signed-rank p of 30 positive pairs)', async () => {
    const { pValueClause } = await import('../../src/format/formatNumber');
    expect(pValueClause(9.313225746154793e-10)).toBe('p < 0.0001');
    expect(pValueClause(1)).toBe('p > 0.9999');
    expect(pValueClause(0.0123)).toBe('p = 0.0123');
    expect(pValueClause(NaN)).toBe('p not available');
  });
  it('never prints a p-value below 1 as "1.000" (0.9996 keeps four decimals)', () => {
    expect(formatPValue(0.9996)).toBe('0.9996');
    expect(formatPValue(0.9994)).toBe('0.999');
    expect(formatPValue(0.994)).toBe('0.994');
  });
  it('cleans rounding noise relative to the data’s scale: 5.55e-17 at scale 1.7 is 0, 1e-6 is kept', async () => {
    const { withoutRoundingNoise } = await import('../../src/format/formatNumber');
    expect(withoutRoundingNoise(5.551115123125783e-17, 1.7)).toBe(0);
    expect(withoutRoundingNoise(-4.440892098500626e-16, 2)).toBe(0);
    expect(withoutRoundingNoise(1e-6, 1)).toBe(1e-6);
    expect(withoutRoundingNoise(1e-20, 1e-15)).toBe(1e-20);
  });
  it('echoes a number with the precision typed ("1.10" stays "1.10"), else falls back', async () => {
    const { echoTyped } = await import('../../src/format/formatNumber');
    const fallback = (x: number | null | undefined) => formatNumber(x);
    expect(echoTyped(1.1, '1.10', fallback)).toBe('1.10');
    expect(echoTyped(1.1, ' +1.10 ', fallback)).toBe('1.10');
    // A decimal comma is not echoed (the report writes a decimal point): the formatted value is shown.
    expect(echoTyped(1.1, '1,10', fallback)).toBe(formatNumber(1.1));
    expect(echoTyped(2, '1.10', fallback)).toBe(formatNumber(2));
    expect(echoTyped(null, '1.10', fallback)).toBe('not available');
  });
});
