import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import {
  SMD_PUBLISHED_95_MULTIPLIER,
  confidenceZ,
  hazardRatioToRiskRatio,
  isRatioMeasure,
  nullValue,
  oddsRatioToRiskRatio,
  riskRatioConversion,
  smdIntervalMultiplier,
  smdToRiskRatio,
  toRiskRatioScale,
} from '../../src/core';
import { expectClose } from '../support/expectClose';
import { readReferenceJson } from '../support/reference';

interface ReferenceCase {
  id: string;
  measure: 'RR' | 'OR' | 'HR' | 'SMD';
  outcome: 'rare' | 'common' | null;
  estimate: number;
  lower: number | null;
  upper: number | null;
  rr_scale_estimate: number;
  rr_scale_lower: number | null;
  rr_scale_upper: number | null;
}
const reference = readReferenceJson<{ cases: ReferenceCase[] }>('evalues.json');

describe('conversions: hand computations', () => {
  it('a common-outcome odds ratio becomes its square root', () => {
    // VanderWeele 2017 (Epidemiology, square-root transform); hand computation: √2.5 = 1.5811388300841898
    expectClose(oddsRatioToRiskRatio(2.5, 'common'), 1.5811388300841898, { rel: 1e-15 });
    expect(oddsRatioToRiskRatio(2.5, 'rare')).toBe(2.5);
  });

  it('a common-outcome hazard ratio follows (1 − 0.5^√HR)/(1 − 0.5^√(1/HR))', () => {
    // VanderWeele 2020, Biometrics 76:746–752; hand computation for HR = 4: (1 − 0.5²)/(1 − 0.5^0.5) = 0.75/(1 − 1/√2)
    expectClose(hazardRatioToRiskRatio(4, 'common'), 0.75 / (1 - Math.SQRT1_2), { rel: 1e-14 });
    // HR = 1/4: (1 − 0.5^0.5)/(1 − 0.5²), the reciprocal
    expectClose(hazardRatioToRiskRatio(0.25, 'common'), (1 - Math.SQRT1_2) / 0.75, { rel: 1e-14 });
    expect(hazardRatioToRiskRatio(0.6, 'rare')).toBe(0.6);
  });

  it('a standardized mean difference becomes exp(0.91·d); a mean difference is divided by the SD first', () => {
    // VanderWeele & Ding 2017, Table 2; hand computation: exp(0.455) for d = 0.5
    expectClose(smdToRiskRatio(0.5), Math.exp(0.455), { rel: 1e-15 });
    // hand computation: MD 3 with SD 6 → d = 0.5
    expectClose(toRiskRatioScale(3, { measure: 'md', sd: 6 }), Math.exp(0.455), { rel: 1e-15 });
  });

  it('the SMD interval multiplier is 0.91·z at every level, 95% included (the printed 1.78 is 0.91 × 1.96 rounded)', () => {
    // VanderWeele & Ding 2017, Table 2: exp(0.91·d ± 1.78·SE) for a 95% interval, 1.78 printed to 2 decimals
    expectClose(smdIntervalMultiplier(0.95), SMD_PUBLISHED_95_MULTIPLIER, { abs: 0.005 });
    expectClose(smdIntervalMultiplier(0.95), 0.91 * confidenceZ(0.95), { rel: 1e-15 });
    // continuous in the level: no jump at exactly 0.95
    expectClose(smdIntervalMultiplier(0.9500001), smdIntervalMultiplier(0.95), { rel: 1e-5 });
    // R 4.2.2: 0.91*qnorm(0.995) = 2.344004666229499 (qnorm recalled from memory)
    expectClose(smdIntervalMultiplier(0.99), 0.91 * 2.5758293035489004, { rel: 1e-14 });
    expectClose(smdIntervalMultiplier(0.9), 0.91 * confidenceZ(0.9), { rel: 1e-15 });
    expect(smdIntervalMultiplier(1)).toBeNaN();
  });
});

describe('conversions: reference values (test/reference/evalues.json, R 4.2.2)', () => {
  for (const c of reference.cases.filter((c) => c.measure !== 'SMD')) {
    it(`${c.id}: estimate and limits on the risk-ratio scale`, () => {
      // R 4.2.2 closed forms (evalues.json, case ${c.id})
      const settings = { measure: c.measure.toLowerCase() as 'rr' | 'or' | 'hr', outcomePrevalence: c.outcome };
      expectClose(toRiskRatioScale(c.estimate, settings), c.rr_scale_estimate, { rel: 1e-14 });
      if (c.lower !== null) expectClose(toRiskRatioScale(c.lower, settings), c.rr_scale_lower as number, { rel: 1e-14 });
      if (c.upper !== null) expectClose(toRiskRatioScale(c.upper, settings), c.rr_scale_upper as number, { rel: 1e-14 });
    });
  }
  for (const c of reference.cases.filter((c) => c.measure === 'SMD')) {
    it(`${c.id}: exp(0.91·d)`, () => {
      // R 4.2.2: exp(0.91*d) (evalues.json, case ${c.id})
      expectClose(smdToRiskRatio(c.estimate), c.rr_scale_estimate, { rel: 1e-15 });
    });
  }
});

describe('conversions: special values', () => {
  it('conversions keep 1 at 1, 0 at 0 and +Infinity at +Infinity', () => {
    for (const prevalence of ['rare', 'common'] as const) {
      expect(hazardRatioToRiskRatio(1, prevalence)).toBe(1);
      expect(hazardRatioToRiskRatio(0, prevalence)).toBe(0);
      expect(hazardRatioToRiskRatio(Infinity, prevalence)).toBe(Infinity);
      expect(oddsRatioToRiskRatio(1, prevalence)).toBe(1);
      expect(oddsRatioToRiskRatio(Infinity, prevalence)).toBe(Infinity);
    }
    expect(smdToRiskRatio(0)).toBe(1);
    expect(smdToRiskRatio(-0)).toBe(1);
  });

  it('the common-outcome hazard conversion stays finite and accurate for huge and tiny ratios', () => {
    // hand computation: for large HR, 1 − 0.5^(1/√HR) ≈ ln2/√HR, so RR ≈ √HR/ln2
    expectClose(hazardRatioToRiskRatio(1e300, 'common'), 1e150 / Math.LN2, { rel: 1e-14 });
    expectClose(hazardRatioToRiskRatio(1e-300, 'common'), 1e-150 * Math.LN2, { rel: 1e-14 });
    // hand computation: the derivative of the conversion at HR = 1 is ln 2, so RR(1 + ε) ≈ 1 + ε·ln 2
    expectClose(hazardRatioToRiskRatio(1 + 2 ** -30, 'common') - 1, 2 ** -30 * Math.LN2, { rel: 1e-8 });
  });

  it('NaN, negative ratios and missing settings give NaN', () => {
    expect(oddsRatioToRiskRatio(NaN, 'rare')).toBeNaN();
    expect(oddsRatioToRiskRatio(-1, 'common')).toBeNaN();
    expect(hazardRatioToRiskRatio(-1, 'common')).toBeNaN();
    expect(toRiskRatioScale(-1, { measure: 'rr' })).toBeNaN();
    expect(toRiskRatioScale(2, { measure: 'or' })).toBeNaN();
    expect(toRiskRatioScale(2, { measure: 'hr', outcomePrevalence: null })).toBeNaN();
    expect(toRiskRatioScale(2, { measure: 'md' })).toBeNaN();
    expect(toRiskRatioScale(2, { measure: 'md', sd: 0 })).toBeNaN();
  });

  it('names each conversion and the null of each measure', () => {
    expect(riskRatioConversion({ measure: 'rr' })).toBe('none');
    expect(riskRatioConversion({ measure: 'or', outcomePrevalence: 'common' })).toBe('odds-ratio-square-root');
    expect(riskRatioConversion({ measure: 'or', outcomePrevalence: 'rare' })).toBe('odds-ratio-rare-outcome');
    expect(riskRatioConversion({ measure: 'hr', outcomePrevalence: 'common' })).toBe('hazard-ratio-common-outcome');
    expect(riskRatioConversion({ measure: 'hr', outcomePrevalence: 'rare' })).toBe('hazard-ratio-rare-outcome');
    expect(riskRatioConversion({ measure: 'smd' })).toBe('standardized-mean-difference');
    expect(riskRatioConversion({ measure: 'md', sd: 2 })).toBe('mean-difference-via-sd');
    expect([nullValue('rr'), nullValue('or'), nullValue('hr'), nullValue('smd'), nullValue('md')]).toEqual([1, 1, 1, 0, 0]);
    expect(isRatioMeasure('hr')).toBe(true);
    expect(isRatioMeasure('smd')).toBe(false);
  });
});

const logRatio = fc.double({ min: -20, max: 20, noNaN: true });

describe('conversions: invariants', () => {
  it('the common-outcome hazard conversion is symmetric on the log scale: RR(1/HR) = 1/RR(HR)', () => {
    fc.assert(
      fc.property(logRatio, (u) => {
        expectClose(hazardRatioToRiskRatio(Math.exp(-u), 'common'), 1 / hazardRatioToRiskRatio(Math.exp(u), 'common'), { rel: 1e-13 });
      }),
    );
  });

  it('every conversion is increasing and keeps the side of the null', () => {
    fc.assert(
      fc.property(logRatio, logRatio, (u, v) => {
        const [a, b] = u <= v ? [Math.exp(u), Math.exp(v)] : [Math.exp(v), Math.exp(u)];
        for (const prevalence of ['rare', 'common'] as const) {
          expect(hazardRatioToRiskRatio(a, prevalence)).toBeLessThanOrEqual(hazardRatioToRiskRatio(b, prevalence));
          expect(oddsRatioToRiskRatio(a, prevalence)).toBeLessThanOrEqual(oddsRatioToRiskRatio(b, prevalence));
          // Within a few units in the last place of 1 the converted ratio rounds to exactly 1: the side of the null
          // is defined only beyond rounding (found by fast-check: HR = 1 + 2.2e-16 converts to 1).
          if (Math.abs(Math.log(b)) > 1e-12) expect(Math.sign(Math.log(hazardRatioToRiskRatio(b, prevalence)))).toBe(Math.sign(Math.log(b)));
        }
      }),
    );
  });

  it('the common-outcome conversions pull the ratio toward 1', () => {
    fc.assert(
      fc.property(logRatio, (u) => {
        const ratio = Math.exp(u);
        expect(Math.abs(Math.log(oddsRatioToRiskRatio(ratio, 'common')))).toBeLessThanOrEqual(Math.abs(u) + 1e-12);
        expect(Math.abs(Math.log(hazardRatioToRiskRatio(ratio, 'common')))).toBeLessThanOrEqual(Math.abs(u) + 1e-12);
      }),
    );
  });
});
