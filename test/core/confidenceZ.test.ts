import { describe, expect, it } from 'vitest';
import { confidenceZ } from '../../src/core';
import { expectClose } from '../support/expectClose';

describe('confidenceZ', () => {
  it('matches the standard normal quantiles for 90%, 95% and 99%', () => {
    // R 4.2.2: qnorm(0.95), qnorm(0.975), qnorm(0.995) (values recalled from memory, 16 digits)
    expectClose(confidenceZ(0.9), 1.6448536269514722, { rel: 1e-14 });
    expectClose(confidenceZ(0.95), 1.959963984540054, { rel: 1e-14 });
    expectClose(confidenceZ(0.99), 2.5758293035489004, { rel: 1e-14 });
  });

  it('grows with the level', () => {
    expect(confidenceZ(0.5)).toBeLessThan(confidenceZ(0.8));
    expect(confidenceZ(0.999)).toBeLessThan(confidenceZ(0.999999));
  });

  it('is NaN for levels outside (0, 1) and NaN', () => {
    for (const level of [0, 1, -0.5, 1.5, 95, NaN, Infinity]) expect(confidenceZ(level)).toBeNaN();
  });
});
