import { describe, expect, it } from 'vitest';
import { analyseOvb } from '../../../src/core/ovbAnalysis';
import { ovbGoalText, ovbJson, ovbReading, ovbReport, plainNumber, strongestBenchmark } from '../../../src/methods/regression/text';
import { readReferenceJson } from '../../support/reference';

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
