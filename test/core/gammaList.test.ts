import { describe, expect, it } from 'vitest';
import { gammaListProblems } from '../../src/core/gammaList';

describe('gammaListProblems', () => {
  it('accepts values of 1 or more', () => expect(gammaListProblems([1, 1.5, 2])).toEqual([]));
  it('names an empty list, a value below 1 and a non-finite value by field', () => {
    expect(gammaListProblems([]).map((p) => p.field)).toEqual(['gammas']);
    expect(gammaListProblems([1, 0.5, Infinity]).map((p) => `${p.field}:${p.code}`)).toEqual(['gammas[1]:below-one', 'gammas[2]:not-finite']);
  });
});
