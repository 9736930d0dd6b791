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
