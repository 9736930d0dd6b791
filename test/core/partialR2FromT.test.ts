import { describe, expect, it } from 'vitest';
import { partialR2FromT } from '../../src/core/linearModel';
import { expectClose } from '../support/expectClose';
import { readReferenceJson } from '../support/reference';

describe('partialR2FromT', () => {
  it('gives t²/(t² + df): the published example', () => {
    // Cinelli & Hazlett 2020: t = 4.18, df = 783 → 2.2%; exact value from R 4.2.2 in ovb.json
    expectClose(partialR2FromT(4.18, 783), readReferenceJson('ovb.json').published_example.R2yd, { rel: 1e-15 });
  });

  it('stays finite and right for |t| beyond 1e154, where t² overflows', () => {
    expect(partialR2FromT(1e200, 100)).toBe(1);
    expect(partialR2FromT(-1e160, 1e10)).toBe(1);
    expectClose(partialR2FromT(1e-200, 10), 1e-401 > 0 ? 1e-401 : 0, { abs: 1e-300 });
  });

  it('handles 0, ±Infinity and NaN', () => {
    expect(partialR2FromT(0, 10)).toBe(0);
    expect(partialR2FromT(-0, 10)).toBe(0);
    expect(partialR2FromT(Infinity, 10)).toBe(1);
    expect(partialR2FromT(-Infinity, 10)).toBe(1);
    expect(partialR2FromT(NaN, 10)).toBeNaN();
  });
});
