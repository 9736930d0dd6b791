import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { parseDecimalSpan } from '../../src/data/decimalSpan';

const read = (text: string, mark = 46) => parseDecimalSpan(text, 0, text.length, mark);

describe('parseDecimalSpan', () => {
  it('reads plain decimals exactly as JavaScript\'s Number does', () => {
    // ECMAScript Number() (correctly rounded decimal conversion) as the reference
    for (const text of ['0', '-0', '12', '+3.25', '-0.000123', '.5', '5.', '1e5', '2.5E-3', '123456789012345', '0.1', '9007199254740991', '3.14159265358979', '1e22', '1e-22']) {
      const expected = Number(text);
      if (Number.isNaN(read(text))) continue; // outside the fast path: the caller falls back
      expect(Object.is(read(text), expected), text).toBe(true);
    }
  });

  it('a decimal comma when asked', () => {
    expect(read('12,5', 44)).toBe(12.5);
    expect(read('12.5', 44)).toBeNaN();
  });

  it('refuses what is not a plain decimal (the caller falls back or reports)', () => {
    for (const text of ['', '-', '+', '.', 'e5', '1e', '1e+', ' 1', '1 ', '0x10', 'Infinity', 'NaN', '1,000', '1_0', '--1', '1.2.3']) {
      expect(read(text), JSON.stringify(text)).toBeNaN();
    }
  });

  it('leaves long mantissas and large exponents to the full parser', () => {
    expect(read('1234567890123456')).toBe(1234567890123456); // below 2^53: exact
    expect(read('12345678901234567')).toBeNaN(); // above 2^53
    expect(read('1e23')).toBeNaN();
    expect(read('1e-23')).toBeNaN();
    // Leading zeros are not significant.
    expect(read('0.000000000000123456789012345')).toBeNaN(); // exponent −27
    expect(read('000000000000000012')).toBe(12);
  });

  it('equals Number(text) whenever it answers (property)', () => {
    fc.assert(
      fc.property(fc.double({ noNaN: true, noDefaultInfinity: true }), fc.integer({ min: 0, max: 17 }), (x, digits) => {
        for (const text of [String(x), x.toFixed(Math.min(digits, 100)), x.toExponential(Math.min(digits, 100)), x.toPrecision(Math.max(1, digits))]) {
          const got = read(text);
          if (!Number.isNaN(got)) expect(Object.is(got, Number(text)), text).toBe(true);
        }
      }),
      { numRuns: 2000 },
    );
  });

  it('equals Number(text) on any digit string it answers for (property)', () => {
    fc.assert(
      fc.property(fc.stringMatching(/^[+-]?\d{0,17}(\.\d{0,17})?([eE][+-]?\d{1,3})?$/), (text) => {
        const got = read(text);
        if (!Number.isNaN(got)) expect(Object.is(got, Number(text)), text).toBe(true);
      }),
      { numRuns: 3000 },
    );
  });

  it('reads a span inside a longer text', () => {
    expect(parseDecimalSpan('a,12.5,b', 2, 6, 46)).toBe(12.5);
  });
});
