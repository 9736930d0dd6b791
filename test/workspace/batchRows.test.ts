import { describe, expect, it } from 'vitest';
import { expectClose } from '../support/expectClose';
import { appraiseBatchCsv } from '../../src/workspace/batchFindings';
import { batchCellsOfFinding, findingOfBatchRow, withBatchRow } from '../../src/workspace/batchRows';
import { emptyEValueForm, evaluateEValueForm, type EValueFormInputs } from '../../src/methods/evalue/request';
import { emptyOvbForm, evaluateOvbForm, type OvbFormInputs } from '../../src/methods/regression/request';

const oddsRatio = { ...emptyEValueForm(), source: 'reported', measure: 'or', estimate: '2.5', lower: '1.4', upper: '4.5', outcomePrevalence: 'rare' } as EValueFormInputs;
const coefficient = { ...emptyOvbForm(), source: 'reported', estimate: '4.18', se: '1', dfBy: 'df', df: '783' } as OvbFormInputs;

describe('a finding as a row of the batch table', () => {
  it('starts a new table with a header, quoting a name that holds a comma', () => {
    const made = withBatchRow('', 'evalue', 'Stroke, odds ratio', oddsRatio);
    expect('text' in made && made.text).toBe('label,measure,estimate,lower,upper,se,df,level,outcome_prevalence,sd,target\n"Stroke, odds ratio",or,2.5,1.4,4.5,,,95,rare,,\n');
  });

  it("gives the same E-value and robustness value in the table as in the finding's calculator", () => {
    let text = '';
    for (const [method, name, inputs] of [['evalue', 'Stroke, odds ratio', oddsRatio], ['regression', 'Blood pressure', coefficient]] as const) {
      const made = withBatchRow(text, method, name, inputs);
      if ('reason' in made) throw new Error(made.reason);
      text = made.text;
    }
    const rows = appraiseBatchCsv(text).rows;
    expect(rows[0].eValueEstimate).toBe(evaluateEValueForm(oddsRatio, null).result!.eValueEstimate);
    expect(rows[0].eValueInterval).toBe(evaluateEValueForm(oddsRatio, null).result!.eValueInterval);
    expect(rows[1].rv).toBe(evaluateOvbForm(coefficient, null).result!.rv);
  });

  it("follows the table's own columns, and refuses a finding that needs a column the table lacks", () => {
    const made = withBatchRow('measure,estimate,label,lower,upper,outcome_prevalence,level\nrr,2,x,1.1,3,,95\n', 'evalue', 'Stroke', oddsRatio);
    expect('text' in made && made.text.split('\n')[2]).toBe('or,2.5,Stroke,1.4,4.5,rare,95');
    expect(withBatchRow('label,measure,estimate\nx,rr,2\n', 'regression', 'BP', coefficient)).toEqual({ reason: 'the table has no se, df column; add them to its first line first' });
  });

  it('says why a finding that is not a reported estimate cannot be a row', () => {
    expect(batchCellsOfFinding('pairs', 'x', {})).toEqual({ reason: 'the table holds reported estimates (E-values) and regression coefficients (robustness values) only' });
    expect('reason' in batchCellsOfFinding('evalue', 'x', { ...oddsRatio, source: 'counts' })).toBe(true);
    expect('reason' in batchCellsOfFinding('regression', 'x', { ...coefficient, dfBy: 'n' })).toBe(true);
  });
});

describe('a batch row as a finding', () => {
  it('opens a ratio row in the E-value calculator and a coef row in the regression calculator, with the same numbers', () => {
    const text = 'label,measure,estimate,lower,upper,se,df,outcome_prevalence\n"Stroke, odds ratio",or,2.5,1.4,4.5,,,rare\nBP,coef,4.18,,,1,783,\nodd,xyz,1,,,,,\n';
    const stroke = findingOfBatchRow(text, 1)!;
    expect(stroke.method).toBe('evalue');
    expect(stroke.name).toBe('Stroke, odds ratio');
    expect(evaluateEValueForm(stroke.inputs as EValueFormInputs, null).result!.eValueEstimate).toBe(appraiseBatchCsv(text).rows[0].eValueEstimate);
    const bp = findingOfBatchRow(text, 2, '0.05')!;
    expect(bp.method).toBe('regression');
    // Cinelli & Hazlett 2020 published example: t = 4.18, df = 783 → RV 13.9%
    expectClose(evaluateOvbForm(bp.inputs as OvbFormInputs, null).result!.rv, 0.139, { abs: 0.0005 });
    expect(findingOfBatchRow(text, 3)).toBeNull();
    expect(findingOfBatchRow(text, 9)).toBeNull();
  });
});
