import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { PRINTABLE_MAX_LENGTH, printable, printableList } from '../../src/data/printable';

// Control-character ranges: ECMA-48 / ISO 6429 (C0 = U+0000–U+001F, C1 = U+0080–U+009F), recalled from memory.
describe('printable', () => {
  it('escapes an ESC colour sequence instead of passing it to the terminal', () => {
    expect(printable('\u001b[31mred\u001b[0m')).toBe('\\x1b[31mred\\x1b[0m');
  });

  it('escapes C0, DEL and C1 controls, and bidirectional overrides', () => {
    expect(printable('a\u0000b\tc\r\nd\u007fe\u0085f\u009bg')).toBe('a\\x00b\\x09c\\x0d\\x0ad\\x7fe\\x85f\\x9bg');
    expect(printable('x\u202ey\u2066z')).toBe('x\\u{202e}y\\u{2066}z');
  });

  it('keeps ordinary text in any script, accents and emoji unchanged', () => {
    for (const name of ['Fertility', 'Säuglingssterblichkeit', '年齢', 'βάρος', 'score 😀', 'a "quoted" name', '']) {
      expect(printable(name)).toBe(name);
    }
  });

  it(`cuts a long name to ${PRINTABLE_MAX_LENGTH} characters ending in "…"`, () => {
    const out = printable('x'.repeat(5000));
    expect(out).toHaveLength(PRINTABLE_MAX_LENGTH);
    expect(out.endsWith('…')).toBe(true);
    expect(printable('x'.repeat(PRINTABLE_MAX_LENGTH))).toBe('x'.repeat(PRINTABLE_MAX_LENGTH));
  });

  it('never splits an escape or a surrogate pair when cutting', () => {
    expect(printable('\u001b'.repeat(100), 10)).toBe('\\x1b\\x1b…');
    expect(printable('😀'.repeat(100), 6)).toBe('😀😀…');
  });

  it('the result never holds a control character and is never longer than the limit (property)', () => {
    fc.assert(
      fc.property(fc.string({ unit: 'binary', maxLength: 300 }), fc.integer({ min: 2, max: 200 }), (text, max) => {
        const out = printable(text, max);
        expect(out.length).toBeLessThanOrEqual(max);
        expect(/[\u0000-\u001f\u007f-\u009f\u202a-\u202e\u2066-\u2069]/.test(out)).toBe(false);
      }),
    );
  });

  it('does not change its argument', () => {
    const text = 'a\u001bb';
    printable(text);
    expect(text).toBe('a\u001bb');
  });
});

describe('printableList', () => {
  it('quotes each name and says how many more there are', () => {
    const names = Array.from({ length: 100_000 }, (_, i) => `c${i}`);
    const list = printableList(names, 3);
    expect(list).toBe('"c0", "c1", "c2" and 99,997 more');
    expect(printableList(['a', '\u001bb'])).toBe('"a", "\\x1bb"');
  });
});
