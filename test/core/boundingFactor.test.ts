import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { boundingFactor, boundingFactorPartner, eValue } from '../../src/core';
import { expectClose } from '../support/expectClose';
import { readReferenceJson } from '../support/reference';

const reference = readReferenceJson<{ bounding_factor: { grid: { rr_eu: number; rr_ud: number; B: number }[] } }>('evalues.json');

describe('boundingFactor: reference values', () => {
  it('matches the 81-point grid of B(RR_EU, RR_UD) in evalues.json', () => {
    // R 4.2.2: RR_EU*RR_UD/(RR_EU+RR_UD-1), Ding & VanderWeele 2016 (test/reference/evalues.json, bounding_factor.grid)
    expect(reference.bounding_factor.grid).toHaveLength(81);
    for (const { rr_eu, rr_ud, B } of reference.bounding_factor.grid) {
      expectClose(boundingFactor(rr_eu, rr_ud), B, { rel: 1e-15 }, `B(${rr_eu}, ${rr_ud})`);
    }
  });

  it('B(2, 3) equals 6/4', () => {
    // hand computation: 2·3/(2 + 3 − 1)
    expect(boundingFactor(2, 3)).toBe(1.5);
  });
});

describe('boundingFactor: special values', () => {
  it('is 1 when either strength is 1, even against an infinite partner', () => {
    expect(boundingFactor(1, 1)).toBe(1);
    expect(boundingFactor(1, 1e300)).toBe(1);
    expect(boundingFactor(1, Infinity)).toBe(1);
    expect(boundingFactor(Infinity, 1)).toBe(1);
  });

  it('an infinite strength leaves the other; both infinite give +Infinity', () => {
    expect(boundingFactor(Infinity, 4)).toBe(4);
    expect(boundingFactor(4, Infinity)).toBe(4);
    expect(boundingFactor(Infinity, Infinity)).toBe(Infinity);
  });

  it('huge strengths do not overflow: B(M, M) is about M/2', () => {
    // hand computation: M²/(2M − 1) = M/(2 − 1/M)
    expectClose(boundingFactor(Number.MAX_VALUE, Number.MAX_VALUE), Number.MAX_VALUE / 2, { rel: 1e-15 });
    expectClose(boundingFactor(1e200, 1e200), 5e199, { rel: 1e-15 });
  });

  it('strengths below 1 and NaN give NaN', () => {
    expect(boundingFactor(0.5, 2)).toBeNaN();
    expect(boundingFactor(2, 0.99)).toBeNaN();
    expect(boundingFactor(NaN, 2)).toBeNaN();
    expect(boundingFactor(2, NaN)).toBeNaN();
    expect(boundingFactor(-0, 2)).toBeNaN();
  });
});

describe('boundingFactorPartner', () => {
  it('solves B(RR_EU, partner) = RR', () => {
    // hand computation: RR = 2, RR_EU = 3 → 2·2/(3 − 2) = 4; B(3, 4) = 12/6 = 2
    expect(boundingFactorPartner(2, 3)).toBe(4);
    expect(boundingFactor(3, 4)).toBe(2);
  });

  it('is infinite when the given strength does not exceed RR, and RR for an infinite strength', () => {
    expect(boundingFactorPartner(2, 2)).toBe(Infinity);
    expect(boundingFactorPartner(2, 1.5)).toBe(Infinity);
    expect(boundingFactorPartner(2, Infinity)).toBe(2);
  });

  it('is 1 for RR = 1 and NaN outside the domain', () => {
    expect(boundingFactorPartner(1, 1)).toBe(1);
    expect(boundingFactorPartner(1, 5)).toBe(1);
    expect(boundingFactorPartner(0.5, 5)).toBeNaN();
    expect(boundingFactorPartner(2, 0.5)).toBeNaN();
    expect(boundingFactorPartner(Infinity, 5)).toBeNaN();
    expect(boundingFactorPartner(NaN, 5)).toBeNaN();
  });

  it('meets the diagonal at the E-value', () => {
    // VanderWeele & Ding 2017: the E-value is the point of the curve with RR_EU = RR_UD
    const e = eValue(3.9);
    expectClose(boundingFactorPartner(3.9, e), e, { rel: 1e-13 });
  });
});

const strength = fc.double({ min: 0, max: 25, noNaN: true }).map(Math.exp);

describe('boundingFactor: invariants', () => {
  it('is symmetric, at least 1 and at most the smaller strength', () => {
    fc.assert(
      fc.property(strength, strength, (a, b) => {
        const factor = boundingFactor(a, b);
        expect(factor).toBe(boundingFactor(b, a));
        expect(factor).toBeGreaterThanOrEqual(1);
        expect(factor).toBeLessThanOrEqual(Math.min(a, b) * (1 + 1e-15));
      }),
    );
  });

  it('grows with each strength', () => {
    fc.assert(
      fc.property(strength, strength, strength, (a, b, c) => {
        const [low, high] = b <= c ? [b, c] : [c, b];
        expect(boundingFactor(a, low)).toBeLessThanOrEqual(boundingFactor(a, high));
      }),
    );
  });

  it('the partner lands back on the curve: B(s, partner(RR, s)) = RR', () => {
    fc.assert(
      fc.property(fc.double({ min: 0.001, max: 10, noNaN: true }), fc.double({ min: 0.001, max: 10, noNaN: true }), (u, extra) => {
        const rr = Math.exp(u);
        const s = rr * Math.exp(extra);
        expectClose(boundingFactor(s, boundingFactorPartner(rr, s)), rr, { rel: 1e-9 });
      }),
    );
  });
});
