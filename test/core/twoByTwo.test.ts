import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { twoByTwoRatio, validateTwoByTwoCounts } from '../../src/core';
import { expectClose } from '../support/expectClose';

// R 4.2.2: qnorm(0.975) (recalled from memory)
const Z95 = 1.959963984540054;

describe('twoByTwoRatio: hand computations', () => {
  it('risk ratio with its log-scale Wald interval', () => {
    // hand computation: (10/100)/(5/100) = 2; SE(log RR) = √(1/10 − 1/100 + 1/5 − 1/100) = √0.28 (Rothman et al. 2008, ch. 14)
    const result = twoByTwoRatio({ a: 10, b: 90, c: 5, d: 95 }, 'rr');
    expectClose(result.estimate, 2, { rel: 1e-15 });
    expectClose(result.logSe, Math.sqrt(0.28), { rel: 1e-15 });
    expectClose(result.lower, 2 * Math.exp(-Z95 * Math.sqrt(0.28)), { rel: 1e-14 });
    expectClose(result.upper, 2 * Math.exp(Z95 * Math.sqrt(0.28)), { rel: 1e-14 });
    expect(result.zeroCellCorrection).toBe(false);
    expect(result.warnings).toEqual([]);
  });

  it('odds ratio with the Woolf interval', () => {
    // hand computation: (10·95)/(90·5) = 19/9; SE(log OR) = √(1/10 + 1/90 + 1/5 + 1/95) (Woolf 1955)
    const result = twoByTwoRatio({ a: 10, b: 90, c: 5, d: 95 }, 'or');
    const se = Math.sqrt(1 / 10 + 1 / 90 + 1 / 5 + 1 / 95);
    expectClose(result.estimate, 19 / 9, { rel: 1e-15 });
    expectClose(result.logSe, se, { rel: 1e-15 });
    expectClose(result.lower, (19 / 9) * Math.exp(-Z95 * se), { rel: 1e-14 });
    expectClose(result.upper, (19 / 9) * Math.exp(Z95 * se), { rel: 1e-14 });
  });

  it('a 90% level narrows the interval', () => {
    // R 4.2.2: qnorm(0.95) = 1.644853626951472 (recalled from memory)
    const result = twoByTwoRatio({ a: 10, b: 90, c: 5, d: 95 }, 'rr', 0.9);
    expectClose(result.lower, 2 * Math.exp(-1.644853626951472 * Math.sqrt(0.28)), { rel: 1e-13 });
    expect(result.level).toBe(0.9);
  });

  it('a zero cell adds 0.5 to every cell and says so', () => {
    // hand computation (Haldane 1956): cells 0.5, 20.5, 5.5, 15.5 → RR = (0.5/21)/(5.5/21) = 1/11
    const rr = twoByTwoRatio({ a: 0, b: 20, c: 5, d: 15 }, 'rr');
    expect(rr.zeroCellCorrection).toBe(true);
    expect(rr.countsUsed).toEqual({ a: 0.5, b: 20.5, c: 5.5, d: 15.5 });
    expect(rr.counts).toEqual({ a: 0, b: 20, c: 5, d: 15 });
    expectClose(rr.estimate, 1 / 11, { rel: 1e-15 });
    expectClose(rr.logSe, Math.sqrt(20.5 / (0.5 * 21) + 15.5 / (5.5 * 21)), { rel: 1e-15 });
    expect(rr.warnings).toHaveLength(1);
    expect(rr.warnings[0]).toMatch(/0\.5 was added to every cell/);
    // hand computation: (0.5·15.5)/(20.5·5.5)
    const or = twoByTwoRatio({ a: 0, b: 20, c: 5, d: 15 }, 'or');
    expectClose(or.estimate, (0.5 * 15.5) / (20.5 * 5.5), { rel: 1e-15 });
  });
});

describe('twoByTwoRatio: special values', () => {
  it('huge counts neither overflow nor lose the ratio', () => {
    // hand computation: every cell scaled by 1e150 keeps RR = 2 and OR = 19/9 and divides SE(log RR) by 1e75
    const result = twoByTwoRatio({ a: 1e151, b: 9e151, c: 5e150, d: 9.5e151 }, 'or');
    expectClose(result.estimate, 19 / 9, { rel: 1e-14 });
    const rr = twoByTwoRatio({ a: 1e151, b: 9e151, c: 5e150, d: 9.5e151 }, 'rr');
    expectClose(rr.estimate, 2, { rel: 1e-14 });
    expectClose(rr.logSe, Math.sqrt(0.28) * 1e-75, { rel: 1e-14 });
  });

  it('results are frozen', () => {
    const result = twoByTwoRatio({ a: 1, b: 2, c: 3, d: 4 }, 'rr');
    expect(Object.isFrozen(result)).toBe(true);
    expect(Object.isFrozen(result.countsUsed)).toBe(true);
  });
});

const count = fc.integer({ min: 1, max: 100000 });

describe('twoByTwoRatio: invariants', () => {
  it('the interval contains the estimate and is symmetric on the log scale', () => {
    fc.assert(
      fc.property(count, count, count, count, fc.constantFrom('rr' as const, 'or' as const), (a, b, c, d, measure) => {
        const r = twoByTwoRatio({ a, b, c, d }, measure);
        expect(r.lower).toBeLessThanOrEqual(r.estimate);
        expect(r.upper).toBeGreaterThanOrEqual(r.estimate);
        expectClose(Math.log(r.upper) - Math.log(r.estimate), Math.log(r.estimate) - Math.log(r.lower), { rel: 1e-9, abs: 1e-12 });
      }),
    );
  });

  it('swapping the exposure groups inverts the ratio', () => {
    fc.assert(
      fc.property(count, count, count, count, fc.constantFrom('rr' as const, 'or' as const), (a, b, c, d, measure) => {
        const forward = twoByTwoRatio({ a, b, c, d }, measure);
        const swapped = twoByTwoRatio({ a: c, b: d, c: a, d: b }, measure);
        expectClose(swapped.estimate, 1 / forward.estimate, { rel: 1e-13 });
        expectClose(swapped.logSe, forward.logSe, { rel: 1e-13 });
      }),
    );
  });
});

describe('validateTwoByTwoCounts', () => {
  it('accepts a usable table', () => {
    expect(validateTwoByTwoCounts({ a: 0, b: 3, c: 4, d: 0 })).toEqual([]);
  });

  it('names each bad cell: negative, fractional, infinite, not a number', () => {
    const problems = validateTwoByTwoCounts({ a: -1, b: 2.5, c: Infinity, d: NaN });
    expect(problems.map((p) => [p.field, p.code])).toEqual([
      ['counts.a', 'not-a-count'],
      ['counts.b', 'not-a-count'],
      ['counts.c', 'not-a-count'],
      ['counts.d', 'not-a-number'],
    ]);
    expect(problems[0].message).toMatch(/whole number/);
    expect(problems[0].value).toBe(-1);
  });

  it('rejects an empty exposure group and a table without outcomes or without non-outcomes', () => {
    expect(validateTwoByTwoCounts({ a: 0, b: 0, c: 4, d: 5 }).map((p) => p.code)).toEqual(['empty-group']);
    expect(validateTwoByTwoCounts({ a: 1, b: 2, c: 0, d: 0 }).map((p) => p.code)).toEqual(['empty-group']);
    expect(validateTwoByTwoCounts({ a: 0, b: 2, c: 0, d: 5 }).map((p) => p.code)).toEqual(['no-outcomes']);
    expect(validateTwoByTwoCounts({ a: 3, b: 0, c: 4, d: 0 }).map((p) => p.code)).toEqual(['all-outcomes']);
  });

  it('names the field given, and a missing table', () => {
    expect(validateTwoByTwoCounts({ a: 1, b: 2, c: 3, d: -4 }, 'table')[0].field).toBe('table.d');
    expect(validateTwoByTwoCounts(null)[0]).toMatchObject({ field: 'counts', code: 'required' });
    expect(validateTwoByTwoCounts({ a: '1', b: 2, c: 3, d: 4 } as never)[0]).toMatchObject({ field: 'counts.a', code: 'not-a-number' });
  });
});
