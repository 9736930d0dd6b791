import { describe, expect, it } from 'vitest';
import { analyseEValue, type EValueInput } from '../../../src/core/eValueAnalysis';
import { eValueStatement } from '../../../src/methods/evalue/statement';
import { eValueSummary, summariseEValue } from '../../../src/methods/evalue/summary';
import { emptyEValueForm, evaluateEValueForm } from '../../../src/methods/evalue/request';
import { createAppraisal } from '../../../src/workspace/appraisal';
import { buildRobustnessStatement } from '../../../src/workspace/robustnessStatement';

const study = { finding: 'A fictional finding', exposure: 'cycling to work', outcome: 'hypertension', units: '', source: 'invented' };

function statementOf(input: EValueInput) {
  const references: string[] = [];
  const cite = (r: string) => {
    if (!references.includes(r)) references.push(r);
    return `[${references.indexOf(r) + 1}]`;
  };
  return { part: eValueStatement(eValueSummary(analyseEValue(input)), study, cite), references };
}

describe('eValueStatement', () => {
  it('states the published example’s E-values with their references', () => {
    // VanderWeele & Ding 2017, Ann Intern Med 167:268–274: RR 3.9 (1.8 to 8.7) → 7.26 and 3.00
    const { part, references } = statementOf({ measure: 'rr', estimate: 3.9, lower: 1.8, upper: 8.7 });
    expect(part?.paragraph).toContain('E-value for the point estimate is 7.26');
    expect(part?.paragraph).toContain('the E-value is 3.00');
    expect(references[0]).toMatch(/^VanderWeele TJ, Ding P/);
    expect(part?.assumptions.length).toBeGreaterThan(0);
  });

  it('is the workspace statement’s E-value paragraph when the calculator has inputs', () => {
    const { part } = statementOf({ measure: 'rr', estimate: 3.9, lower: 1.8, upper: 8.7 });
    const statement = buildRobustnessStatement(createAppraisal(study, { evalue: { inputs: { source: 'reported', measure: 'rr', estimate: '3.9', lower: '1.8', upper: '8.7' }, summary: null } }));
    expect(statement.paragraphs[0]).toBe(part?.paragraph);
    for (const a of part?.assumptions ?? []) expect(statement.assumptions).toContain(a);
  });

  it('names the conversion as an assumption', () => {
    const { part } = statementOf({ measure: 'or', estimate: 2.5, outcomePrevalence: 'common' });
    expect(part?.assumptions.join(' ')).toMatch(/square root/);
  });

  it('is null without an E-value', () => {
    const summary = { ...eValueSummary(analyseEValue({ measure: 'rr', estimate: 2 })), eValueEstimate: null };
    expect(eValueStatement(summary, study, () => '[1]')).toBeNull();
  });
});

describe('eValueStatement: interval at the null, typed numbers and conventions', () => {
  const emptyStudy = { finding: '', exposure: '', outcome: '', units: '', source: '' };
  it('says first that the interval includes the null and claims nothing about what could not explain it (R: E = 1.43)', () => {
    const form = { ...emptyEValueForm(), measure: 'rr' as const, estimate: '1.10', lower: '0.90', upper: '1.35' };
    const summary = summariseEValue(evaluateEValueForm(form, null))!;
    const part = eValueStatement(summary, emptyStudy, () => '[1]');
    expect(part?.paragraph).toMatch(/^The confidence interval already includes the null \(no association\): even without unmeasured confounding/);
    expect(part?.paragraph).toContain('risk ratio 1.10, 95% confidence interval 0.90 to 1.35');
    expect(part?.paragraph).toContain('The E-value for the point estimate is 1.43');
    expect(part?.paragraph).not.toMatch(/could not/);
  });
  it('lists the result’s conventions among the assumptions, in the core’s words', () => {
    const result = analyseEValue({ measure: 'or', estimate: 2, lower: 1.2, upper: 3.3, outcomePrevalence: 'common' });
    const part = eValueStatement(eValueSummary(result), emptyStudy, () => '[1]');
    for (const c of result.conventions) expect(part?.assumptions).toContain(c.text);
  });
});
