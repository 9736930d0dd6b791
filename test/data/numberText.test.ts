import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { readTypedNumber, type NumberKind } from '../../src/data/numberText';

const value = (text: string, kind: NumberKind = 'decimal') => {
  const r = readTypedNumber(text, kind);
  return r.ok ? r.value : r.code;
};

describe('readTypedNumber: the one rule for typed numbers', () => {
  it('reads thousands separators in whole-number fields: "1,200" and "1 200" are 1200', () => {
    expect(value('1,200', 'whole')).toBe(1200);
    expect(value('1 200', 'whole')).toBe(1200);
    expect(value('1\u00a0200', 'whole')).toBe(1200);
    expect(value('1,234,567', 'whole')).toBe(1234567);
    expect(value('1200', 'whole')).toBe(1200);
  });

  it('refuses a non-whole number in a whole-number field', () => {
    expect(value('12.5', 'whole')).toBe('not-whole');
    expect(readTypedNumber('12.5', 'whole')).toMatchObject({ message: 'must be a whole number, got "12.5"' });
  });

  it('reads an unambiguous decimal comma ("0,95", "1,5", "12,3456")', () => {
    expect(value('0,95')).toBe(0.95);
    expect(value('1,5')).toBe(1.5);
    expect(value('12,3456')).toBe(12.3456);
    expect(value('-0,4')).toBe(-0.4);
  });

  it('refuses an ambiguous "1,200" in a decimal field and shows both readings', () => {
    const r = readTypedNumber('1,200', 'decimal');
    expect(r.ok).toBe(false);
    if (!r.ok) {
      expect(r.code).toBe('ambiguous-number');
      expect(r.message).toContain('1.2');
      expect(r.message).toContain('1200');
    }
  });

  it('reads grouped numbers with a decimal part either way ("1,200.5", "1.200,5")', () => {
    expect(value('1,200.5')).toBe(1200.5);
    expect(value('1.200,5')).toBe(1200.5);
  });

  it('reads percentages where a fraction is asked: "5%" is 0.05; a level as "95", "95%" or "0.95"', () => {
    expect(value('5%', 'fraction')).toBeCloseTo(0.05, 15);
    expect(value('0.05', 'fraction')).toBe(0.05);
    expect(value('95', 'level')).toBeCloseTo(0.95, 15);
    expect(value('95%', 'level')).toBeCloseTo(0.95, 15);
    expect(value('0.95', 'level')).toBe(0.95);
    expect(value('0,95', 'level')).toBe(0.95);
  });

  it('does not read a percentage sign in plain decimal fields', () => {
    expect(value('5%')).toBe('not-a-number');
  });

  it('reads the Unicode minus, spaces around, exponents and a leading plus', () => {
    expect(value('\u22121.2')).toBe(-1.2);
    expect(value(' 2.5 ')).toBe(2.5);
    expect(value('2.5e-3')).toBe(0.0025);
    expect(value('2.5e\u22123')).toBe(0.0025);
    expect(value('+3')).toBe(3);
  });

  it('treats empty text and the missing-cell texts (NA, N/A, .) as missing, and words and infinities as not numbers', () => {
    expect(value('')).toBe('required');
    expect(value('   ')).toBe('required');
    for (const text of ['NA', 'n/a', '.', 'NaN']) expect(value(text)).toBe('required');
    for (const text of ['abc', 'Infinity', '-Infinity', '0x10', '1e999', '1..2', '--1']) expect(value(text)).toBe('not-a-number');
  });

  it('never returns −0', () => {
    expect(Object.is(value('-0'), 0)).toBe(true);
  });

  it('reads every finite number JavaScript prints back to itself (fast-check)', () => {
    fc.assert(
      fc.property(fc.double({ noNaN: true, noDefaultInfinity: true }), (x) => {
        const r = readTypedNumber(String(x));
        return r.ok && (r.value === x || (x === 0 && r.value === 0));
      }),
    );
  });

  it('reads any whole number written with comma groups of three (fast-check)', () => {
    fc.assert(
      fc.property(fc.integer({ min: 0, max: 2 ** 52 }), (n) => {
        const grouped = n.toLocaleString('en-US');
        return value(grouped, 'whole') === n;
      }),
    );
  });
});

describe('readTypedNumber: typed text quoted in a message', () => {
  it('escapes terminal control characters and cuts very long text', () => {
    const read = readTypedNumber('\u001b[31m12\u001b[0m', 'decimal');
    expect(read.ok).toBe(false);
    if (read.ok) return;
    expect(read.message).not.toMatch(/\u001b/);
    expect(read.message).toContain('\\x1b[31m12');
    const long = readTypedNumber('x'.repeat(10_000), 'decimal');
    expect(long.ok ? '' : long.message.length).toBeLessThan(200);
  });
});
