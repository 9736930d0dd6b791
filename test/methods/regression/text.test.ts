import { describe, expect, it } from 'vitest';
import { analyseOvb } from '../../../src/core/ovbAnalysis';
import { ovbGoalText, ovbJson, ovbReading, ovbReport, plainNumber, strongestBenchmark } from '../../../src/methods/regression/text';
import { readReferenceJson } from '../../support/reference';
import { expectClose } from '../../support/expectClose';

const swiss = readReferenceJson('ovb.json').swiss;
const input = {
  estimate: swiss.estimate,
  se: swiss.se,
  df: swiss.df,
  benchmarks: Object.entries<any>(swiss.benchmarks).map(([covariate, b]) => ({ covariate, outcomeT: b.t_in_main_model, treatmentT: b.t_in_D_model })),
};

describe('omitted-variable-bias text', () => {
  it('reads the published example in plain language', () => {
    // Cinelli & Hazlett 2020: t = 4.18, df = 783 → 13.9% and 7.6%
    const r = analyseOvb({ estimate: 4.18, se: 1, df: 783 });
    const reading = ovbReading(r, { exposure: 'the program', outcome: 'earnings' });
    expect(reading[1]).toBe(
      'A hidden confounder would have to explain at least 13.9% of the residual variance of both the program and earnings to bring the estimate to zero, and at least 7.6% of both to make it lose statistical significance at the 5% level.',
    );
  });

  it('names the strongest covariate and the multiple that would overturn the estimate', () => {
    const r = analyseOvb(input);
    expect(strongestBenchmark(r)?.covariate).toBe('Catholic');
    const text = ovbReading(r, { exposure: 'Education', outcome: 'Fertility' }).join(' ');
    expect(text).toMatch(/The strongest measured covariate, Catholic, explains 21\.6% of the residual variance of Education and 17\.5% of that of Fertility\./);
    expect(text).toMatch(/A confounder 2 times as strong as Catholic would be enough to bring the estimate to zero/);
    expect(ovbReading(analyseOvb({ ...input, k: [1] })).join(' ')).toMatch(/Even a confounder as strong as Catholic would leave/);
  });

  it('words q, the direction, and a non-significant estimate', () => {
    expect(ovbGoalText(1)).toBe('bring the estimate to zero');
    expect(ovbGoalText(0.5)).toBe('reduce the estimate by 50%');
    expect(ovbGoalText(1.5)).toBe('push the estimate past zero, to -0.5 times itself');
    // Not significant before adjustment: said first, in plain words (t = 1 < t*(29) = 2.045, qt(0.975, 29) in base R).
    expect(ovbReading(analyseOvb({ estimate: 1, se: 1, df: 30 }))[0]).toMatch(/^Even before any adjustment for hidden confounding, the estimate is not statistically significant at the 5% level \(t = 1\.00, threshold 2\.05\)/);
    expect(ovbReading(analyseOvb({ estimate: 1, se: 0.2, df: 30, direction: 'away-from-zero' })).join(' ')).toMatch(/away from zero/);
    expect(plainNumber(0.05)).toBe('0.05');
    expect(plainNumber(2)).toBe('2');
    expect(plainNumber(1.5)).toBe('1.5');
  });

  it('never shows NaN, undefined or Infinity, and ends the report with the caution', () => {
    const r = analyseOvb({ ...input, scenario: { r2dz: 0.2, r2yz: 0.999 } });
    const report = ovbReport(r);
    expect(report).not.toMatch(/NaN|undefined|Infinity/);
    expect(report.trim().endsWith('licensed practice.')).toBe(true);
    const json = JSON.parse(ovbJson(r));
    const capped = json.benchmarks.find((b: any) => b.covariate === 'Catholic' && b.k === 3);
    expect(capped.correctedT).toBeNull(); // ±Infinity is not JSON: written as null
    expect(json.benchmarks.find((b: any) => b.covariate === 'Examination' && b.k === 2).r2dz).toBeNull();
  });
});

describe('omitted-variable-bias words that agree with their numbers', () => {
  const plainWords = readReferenceJson('plain_words_cases.json');
  const age = { covariate: 'age', outcomeT: 1.5, treatmentT: 2 };
  it('a benchmark t below the threshold says significance is lost (R: adjusted 0.301, t 1.46 < t*(99) 1.984)', () => {
    const r = analyseOvb({ estimate: 0.5, se: 0.2, df: 100, benchmarks: [age], k: [3] });
    expectClose(r.benchmarks[0].correctedEstimate, plainWords.ovb_t_below.adjusted, { rel: 1e-10 });
    expectClose(r.benchmarks[0].correctedT, plainWords.ovb_t_below.adjustedT, { rel: 1e-10 });
    expectClose(r.criticalT, plainWords.ovb_t_below.criticalT, { rel: 1e-10 });
    expect(ovbReading(r).join(' ')).toMatch(/A confounder 3 times as strong as age would leave an adjusted estimate of 0\.301, but with t = 1\.46, at or below the 1\.98 needed at the 5% level: the estimate would no longer be statistically significant\./);
    expect(ovbReading(r).join(' ')).not.toMatch(/Even a confounder 3 times/);
  });
  it('a capped bound is said in words, not "adjusted SE 0, t not available" (R: uncapped R²yz 4.83 > 1)', () => {
    const r = analyseOvb({ estimate: 0.5, se: 0.2, df: 100, benchmarks: [{ covariate: 'income', outcomeT: 4, treatmentT: 1 }], k: [3], kOutcome: [30] });
    expect(plainWords.ovb_capped.r2yzUncapped).toBeGreaterThan(1);
    expect(r.benchmarks[0].informative).toBe(false);
    const reading = ovbReading(r).join(' ');
    expect(reading).toMatch(/this bound is not informative: a confounder this strong could account for all of the outcome’s remaining variation/);
    expect(reading).not.toMatch(/standard error (is )?0[^.]|not available/);
    const report = ovbReport(r);
    expect(report.split('Conventions:')[0]).not.toMatch(/standard error (is )?0[^.]|t (is )?not available/);
    expect(report).toMatch(/income +3:30 .*\(capped\) .* — +—/);
    expect(report).toMatch(/income \(3:30\): this bound is not informative/);
    expect(JSON.parse(ovbJson(r)).benchmarks[0]).toMatchObject({ informative: false, kTreatment: 3, kOutcome: 30 });
  });
  it('the strongest measured covariate is the core’s strongestCovariate in the reading, the report and the JSON', () => {
    // Project rule STRONGEST_COVARIATE_RULE (largest bias at k = 1), no outside source; swiss data from ovb.json (R base lm).
    const r = analyseOvb(input);
    expect(strongestBenchmark(r)?.covariate).toBe(r.strongestCovariate);
    expect(ovbReading(r).join(' ')).toContain(`The strongest measured covariate, ${r.strongestCovariate},`);
    expect(ovbReport(r)).toContain(`Strongest measured covariate: ${r.strongestCovariate}`);
    expect(JSON.parse(ovbJson(r)).strongestCovariate).toBe(r.strongestCovariate);
  });
  it('an estimate not significant before adjustment is said first, and no benchmark claims to take significance away', () => {
    const r = analyseOvb({ estimate: 0.3, se: 0.2, df: 100, benchmarks: [age], k: [3] });
    const reading = ovbReading(r);
    expect(reading[0]).toMatch(/^Even before any adjustment for hidden confounding, the estimate is not statistically significant/);
    expect(reading.join(' ')).toMatch(/the estimate was not statistically significant at the 5% level to begin with/);
    expect(reading.join(' ')).not.toMatch(/no longer statistically significant|lose statistical significance/);
  });
  it('with a robust SE, adjusted t-values are not used in sentences or the table, and the warning is shown', () => {
    const r = analyseOvb({ estimate: 0.5, se: 0.2, df: 100, benchmarks: [age], k: [3], seKind: 'robust' });
    expect(ovbReading(r).join(' ')).toMatch(/its t is not shown, because the standard error is robust/);
    const report = ovbReport(r);
    expect(report).toMatch(/Note: The standard error is robust/);
    expect(report).toMatch(/Adjusted SE and t are not shown/);
  });
  it('the text and JSON reports list the conventions', () => {
    const r = analyseOvb(input);
    const report = ovbReport(r);
    for (const c of r.conventions) expect(report).toContain(c.text);
    expect(JSON.parse(ovbJson(r)).conventions).toEqual(r.conventions);
  });
});

describe('typed numbers in the regression report', () => {
  it('echoes the estimate and SE as typed ("0.50", "0.200"), not re-formatted ("0.500000")', () => {
    const r = analyseOvb({ estimate: 0.5, se: 0.2, df: 100 });
    const report = ovbReport(r, { typed: { estimate: '0.50', se: '0.200' } });
    expect(report).toMatch(/ estimate +0\.50\n/);
    expect(report).toMatch(/ standard error +0\.200\n/);
    expect(ovbReport(r)).toMatch(/ estimate +0\.500000\n/);
  });
});
