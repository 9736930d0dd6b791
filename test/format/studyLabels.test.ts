import { describe, expect, it } from 'vitest';
import { exposureLabel, exposureNoun, outcomeLabel, outcomeNoun } from '../../src/format/studyLabels';

describe('study labels in prose', () => {
  it('a bare outcome noun after "a higher" is "outcome" when no label was given (never "a higher the outcome")', () => {
    expect(`the odds of a higher ${outcomeNoun({ outcome: '' })}`).toBe('the odds of a higher outcome');
    expect(`the odds of a higher ${outcomeNoun({ outcome: '  systolic pressure ' })}`).toBe('the odds of a higher systolic pressure');
    expect(exposureNoun(undefined)).toBe('treatment');
  });
  it('the labels with their article stay as they were', () => {
    expect(outcomeLabel({})).toBe('the outcome');
    expect(exposureLabel({ exposure: 'cycling' })).toBe('cycling');
  });
});
