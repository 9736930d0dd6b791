import { describe, expect, it } from 'vitest';
import { analyseEValue } from '../../../src/core/eValueAnalysis';
import { assessReferenceConfounder } from '../../../src/core/referenceConfounder';
import { eValueBottomLine } from '../../../src/methods/evalue/bottomLine';
import { eValueSummary } from '../../../src/methods/evalue/summary';
import { createAppraisal } from '../../../src/workspace/appraisal';
import { buildBottomLine } from '../../../src/workspace/bottomLine';

const study = { finding: 'A fictional finding', exposure: 'cycling to work', outcome: 'hypertension', units: '', source: 'invented' };

describe('eValueBottomLine', () => {
  // VanderWeele & Ding 2017, Ann Intern Med 167:268–274: RR 3.9 (1.8 to 8.7) → 7.26 and 3.00
  const result = analyseEValue({ measure: 'rr', estimate: 3.9, lower: 1.8, upper: 8.7 });
  const summary = eValueSummary(result, [assessReferenceConfounder(result, { name: 'age', rrExposure: 4, rrOutcome: 4 })]);

  it('says how strong a hidden factor would have to be, in the published example’s numbers', () => {
    const part = eValueBottomLine(summary, study);
    expect(part.howStrong[0]).toContain('at least 7.26 times as likely');
    expect(part.wouldChange[0]).toContain('at least 3.00 times as likely');
    expect(part.comparedWithMeasured[0]).toMatch(/^age .*could not explain the link away/);
  });

  it('reaches the workspace bottom line when the E-value calculator has inputs', () => {
    const part = eValueBottomLine(summary, study);
    const line = buildBottomLine(createAppraisal(study, { evalue: { inputs: { source: 'reported', measure: 'rr', estimate: '3.9', lower: '1.8', upper: '8.7' }, summary: null } }));
    expect(line.howStrong).toEqual(part.howStrong);
  });

  it('is empty without an E-value', () => {
    const part = eValueBottomLine({ ...summary, eValueEstimate: null }, study);
    expect([...part.howStrong, ...part.wouldChange, ...part.wouldNotChange, ...part.comparedWithMeasured]).toEqual([]);
  });
});
