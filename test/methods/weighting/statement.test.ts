import { describe, expect, test } from 'vitest';
import { emptyStudy } from '../../../src/format/studyLabels';
import { weightingBottomLine } from '../../../src/methods/weighting/bottomLine';
import { weightingStatement } from '../../../src/methods/weighting/statement';
import { readWeightingSummary, type WeightingSummary } from '../../../src/methods/weighting/summary';

const cite = (r: string) => `[${r.slice(0, 3)}]`;
const study = { ...emptyStudy, exposure: 'the programme', outcome: 'earnings', units: 'dollars' };
const found: WeightingSummary = {
  kind: 'weighting', estimand: 'ate', alpha: 0.05, used: 150, treated: 60, control: 90, effect: 2.1,
  intervalLowAtOne: 0.8, intervalHighAtOne: 3.4, tippingLambdaPoint: 3.2, tippingPointStatus: 'found',
  tippingLambdaInterval: 1.6, tippingIntervalStatus: 'found', searchedUpTo: 100, bootstrap: 1000,
};

describe('statement', () => {
  test('names the estimate, the interval, the model and both tipping values', () => {
    const part = weightingStatement(found, study, cite)!;
    expect(part.paragraph).toContain('estimated the average effect of the programme on earnings as 2.1 dollars (95% bootstrap interval 0.8 to 3.4 dollars)');
    expect(part.paragraph).toContain('marginal sensitivity model');
    expect(part.paragraph).toContain('first include no effect at Λ = 3.2, and the 95% sensitivity interval at Λ = 1.6');
    expect(part.assumptions[0]).toMatch(/propensity model/);
  });
  test('says first when the interval at Λ = 1 already includes no effect', () => {
    const s: WeightingSummary = { ...found, intervalLowAtOne: -0.4, tippingLambdaInterval: 1, tippingIntervalStatus: 'includes-zero-at-one' };
    const part = weightingStatement(s, study, cite)!;
    expect(part.paragraph.startsWith('Even before allowing for hidden confounding, the 95% interval')).toBe(true);
    expect(part.paragraph).toContain('-0.4 to 3.4 dollars');
    const bottom = weightingBottomLine(s, study);
    expect(bottom.howStrong[0]).toMatch(/inconclusive even without hidden bias/);
  });
  test('no estimate, no paragraph', () => {
    expect(weightingStatement({ ...found, effect: null }, study, cite)).toBeNull();
  });
});

describe('bottom line', () => {
  test('in words: a hidden factor that changed some people\'s odds of treatment by more than Λ-fold', () => {
    const b = weightingBottomLine(found, study);
    expect(b.howStrong[0]).toBe("In the weighted comparison, the finding holds unless a hidden factor changed some people's odds of the programme by more than 1.6-fold.");
    expect(b.wouldChange).toHaveLength(1);
    expect(b.wouldNotChange).toHaveLength(1);
  });
  test('beyond the searched range', () => {
    const b = weightingBottomLine({ ...found, tippingPointStatus: 'beyond-range', tippingLambdaPoint: null, tippingIntervalStatus: 'beyond-range', tippingLambdaInterval: null }, study);
    expect(b.howStrong.join(' ')).toContain('up to 100-fold');
  });
});

describe('summary read back', () => {
  test('round-trips through JSON and refuses other kinds or bad fields', () => {
    expect(readWeightingSummary(JSON.parse(JSON.stringify(found)))).toEqual(found);
    expect(readWeightingSummary({ ...found, kind: 'pairs' })).toBeNull();
    expect(readWeightingSummary({ ...found, effect: 'big' })).toBeNull();
    expect(readWeightingSummary({ ...found, tippingPointStatus: 'maybe' })).toBeNull();
  });
});
