import { describe, expect, test } from 'vitest';
import fc from 'fast-check';
import { decimalFraction } from '../../src/core/decimalFraction';

describe('decimalFraction', () => {
  test('takes a double as the decimal it prints as', () => {
    // ECMAScript Number::toString: 1.05 prints as "1.05", so Γ = 105/100 exactly
    expect(decimalFraction(1.05)).toEqual({ numerator: 105n, denominator: 100n });
    expect(decimalFraction(3)).toEqual({ numerator: 3n, denominator: 1n });
    expect(decimalFraction(0)).toEqual({ numerator: 0n, denominator: 1n });
    expect(decimalFraction(1e21)).toEqual({ numerator: 10n ** 21n, denominator: 1n });
    expect(decimalFraction(1.5e-7)).toEqual({ numerator: 15n, denominator: 10n ** 8n });
    expect(decimalFraction(0.1)).toEqual({ numerator: 1n, denominator: 10n });
  });
  test('refuses negative, NaN and infinite values', () => {
    expect(decimalFraction(-1)).toBeNull();
    expect(decimalFraction(NaN)).toBeNull();
    expect(decimalFraction(Infinity)).toBeNull();
  });
  test('the fraction reads back as the same double (fast-check)', () => {
    fc.assert(
      fc.property(fc.double({ min: 0, max: 1e300, noNaN: true }), (x) => {
        const f = decimalFraction(x)!;
        const digits = f.numerator.toString();
        const exponent = f.denominator.toString().length - 1;
        expect(Number(`${digits}e-${exponent}`)).toBe(x);
      }),
    );
  });
});
