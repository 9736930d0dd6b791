import { describe, expect, test } from 'vitest';
import fc from 'fast-check';
import { dummyCode } from '../../src/core/dummyCode';

describe('reference values: R 4.2.2 factor levels and model.matrix in the C locale', () => {
  test('levels are ordered by character code, the first is the reference', () => {
    // R 4.2.2, LC_COLLATE = "C": levels(factor(c("b","B","a","10","9","Ä"))) is "10" "9" "B" "a" "b" "Ä"
    const coded = dummyCode([{ name: 'g', values: ['b', 'B', 'a', '10', '9', 'Ä'] }]);
    expect(coded.codings[0].levels).toEqual(['10', '9', 'B', 'a', 'b', 'Ä']);
    expect(coded.codings[0].reference).toBe('10');
    expect(coded.columns.map((c) => c.name)).toEqual(['g=9', 'g=B', 'g=a', 'g=b', 'g=Ä']);
  });
  test('indicator columns equal R\'s treatment contrasts', () => {
    // R 4.2.2: model.matrix(~s, data.frame(s = factor(c("north","east","west","east")))) → snorth 1 0 0 0, swest 0 0 1 0
    const coded = dummyCode([{ name: 's', values: ['north', 'east', 'west', 'east'] }]);
    expect(coded.columns).toEqual([
      { name: 's=north', values: [1, 0, 0, 0] },
      { name: 's=west', values: [0, 0, 1, 0] },
    ]);
  });
});

describe('special values', () => {
  test('numeric columns are copied; missing cells become NaN', () => {
    const coded = dummyCode([{ name: 'age', values: [30, null, 41, NaN] }]);
    expect(coded.columns[0].values).toEqual([30, NaN, 41, NaN]);
    expect(coded.codings[0]).toMatchObject({ kind: 'numeric', reference: null, outputColumns: ['age'] });
  });
  test('missing cells in a categorical column are NaN in every indicator', () => {
    const coded = dummyCode([{ name: 's', values: ['a', '', 'b', null, 'c'] }]);
    expect(coded.columns.map((c) => c.values[1])).toEqual([NaN, NaN]);
    expect(coded.columns.map((c) => c.values[3])).toEqual([NaN, NaN]);
  });
  test('a numeric column declared categorical is coded by the text of its numbers', () => {
    const coded = dummyCode([{ name: 'region', values: [2, 10, 2, 3] }], ['region']);
    expect(coded.codings[0].levels).toEqual(['10', '2', '3']);
    expect(coded.columns.map((c) => c.name)).toEqual(['region=2', 'region=3']);
  });
  test('a single level gives no indicator', () => {
    expect(dummyCode([{ name: 's', values: ['x', 'x'] }]).columns).toEqual([]);
  });
  test('surrounding blanks are ignored in text', () => {
    expect(dummyCode([{ name: 's', values: [' a', 'a ', 'b'] }]).codings[0].levels).toEqual(['a', 'b']);
  });
});

describe('invariants', () => {
  test('each non-missing row has at most one indicator set, and none exactly for the reference level', () => {
    fc.assert(
      fc.property(fc.array(fc.constantFrom('x', 'y', 'z', 'w', null), { minLength: 1, maxLength: 30 }), (values) => {
        const coded = dummyCode([{ name: 'c', values }]);
        const reference = coded.codings[0].reference;
        values.forEach((v, i) => {
          const sum = coded.columns.reduce((s, c) => s + c.values[i], 0);
          if (v === null) expect(Number.isNaN(sum) || coded.columns.length === 0).toBe(true);
          else expect(sum).toBe(v === reference ? 0 : 1);
        });
      }),
    );
  });
});

describe('validation', () => {
  test('columns of different lengths and unknown categorical names are refused', () => {
    expect(() => dummyCode([{ name: 'a', values: [1, 2] }, { name: 'b', values: [1] }])).toThrow(RangeError);
    expect(() => dummyCode([{ name: 'a', values: [1, 2] }], ['b'])).toThrow(RangeError);
  });
});

describe('non-mutation', () => {
  test('frozen columns are read, not written; the result is frozen', () => {
    const columns = Object.freeze([Object.freeze({ name: 's', values: Object.freeze(['b', 'a']) })]);
    const coded = dummyCode(columns);
    expect(columns[0].values).toEqual(['b', 'a']);
    expect(Object.isFrozen(coded.columns[0])).toBe(true);
  });
});
