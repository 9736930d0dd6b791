import { describe, expect, it } from 'vitest';
import { analyseEValue, assessReferenceConfounder } from '../../../src/core';
import { E_VALUE_CAUTION, describeEValue, describeReferenceConfounder, formatEValue, formatLevel } from '../../../src/methods/evalue/text';

// VanderWeele & Ding 2017 worked example: RR 3.9 (1.8 to 8.7) → 7.26 and 3.00
const published = analyseEValue({ measure: 'rr', estimate: 3.9, lower: 1.8, upper: 8.7 });
const study = { exposure: 'cycling to work', outcome: 'hypertension' };

describe('describeEValue', () => {
  it('reads the published example in plain words with the study labels', () => {
    const reading = describeEValue(published, study);
    expect(reading.estimate).toBe(
      'To explain away the estimate, a hidden confounder would need to be associated with both cycling to work and ' +
        'hypertension by a risk ratio of at least 7.26 each, beyond the measured covariates. Weaker confounding could not ' +
        'do it; a confounder weaker on one side would have to be stronger on the other.',
    );
    expect(reading.interval).toMatch(/To move the 95% interval so that it includes the null, .* at least 3\.00 each/);
    expect(reading.caution).toBe(E_VALUE_CAUTION);
    expect(reading.caution).toMatch(/does not prove causation/);
  });

  it('says when the interval already includes the null, and when there is no interval', () => {
    expect(describeEValue(analyseEValue({ measure: 'rr', estimate: 1.3, lower: 0.9, upper: 1.8 })).interval).toMatch(
      /already includes the null/,
    );
    expect(describeEValue(analyseEValue({ measure: 'rr', estimate: 1.3 })).interval).toBeNull();
  });

  it('names a target, an estimate at the null, and a 90% level', () => {
    const target = describeEValue(analyseEValue({ measure: 'md', estimate: 4, sd: 2, target: 1 }), { units: 'mmHg' });
    expect(target.estimate).toMatch(/^To move the estimate to 1 mmHg,/);
    expect(describeEValue(analyseEValue({ measure: 'rr', estimate: 1 })).estimate).toMatch(/already equals the null/);
    expect(describeEValue(analyseEValue({ measure: 'rr', estimate: 2, se: 0.1, level: 0.9 })).interval).toMatch(/90% interval/);
  });

  it('never reads NaN, undefined or Infinity, even for an E-value beyond the doubles', () => {
    const reading = describeEValue(analyseEValue({ measure: 'rr', estimate: Number.MAX_VALUE, lower: 1e300, upper: Number.MAX_VALUE }));
    const text = [reading.estimate, reading.interval].join(' ');
    expect(text).not.toMatch(/NaN|undefined|Infinity/);
    expect(formatLevel(0.9995)).toBe('99.95%');
    expect(formatLevel(0.95)).toBe('95%');
    expect(formatEValue(Infinity)).toBe('not available');
  });
});

describe('describeReferenceConfounder', () => {
  it('a confounder too weak for the estimate but strong enough for the interval', () => {
    const assessment = assessReferenceConfounder(published, { name: 'age', rrExposure: 4, rrOutcome: 4 });
    expect(describeReferenceConfounder(assessment, published, study)).toBe(
      'A hidden confounder as strong as age (risk ratio 4 with cycling to work and 4 with hypertension) could shift ' +
        'the risk ratio by a factor of at most 2.29: not enough to explain away the estimate (that takes 3.9), but enough ' +
        'to make the interval include the null (that takes 1.8).',
    );
  });

  it('a confounder strong enough for both, and one too weak for both', () => {
    const strong = assessReferenceConfounder(published, { name: 'income', rrExposure: 20, rrOutcome: 5 });
    expect(describeReferenceConfounder(strong, published)).toMatch(/: enough to explain away the estimate .*, and so also to make the interval include the null\.$/);
    const weak = assessReferenceConfounder(published, { name: 'sex', rrExposure: 1.2, rrOutcome: 0.8 });
    const text = describeReferenceConfounder(weak, published);
    expect(text).toMatch(/not enough to explain away the estimate .*, nor to make the interval include the null/);
    expect(text).toMatch(/protective associations are counted by their inverse/);
  });
});
