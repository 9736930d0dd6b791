import { describe, expect, it } from 'vitest';
import { emptyOvbForm, evaluateOvbForm, normaliseOvbForm, ovbSummarySql, parseSummaryRow, type OvbFormInputs } from '../../../src/methods/regression/request';
import { regressionDataFromText } from '../../../src/methods/regression/regressionData';
import { ovbSpecFromRegressionData } from '../../../src/methods/regression/ovbRegressionData';
import { expectClose } from '../../support/expectClose';
import { readReferenceJson, readReferenceText } from '../../support/reference';

const ovb = readReferenceJson('ovb.json');
const swiss = ovb.swiss;
const form = (change: Partial<OvbFormInputs>): OvbFormInputs => ({ ...emptyOvbForm(), ...change });
const fields = (change: Partial<OvbFormInputs>) => evaluateOvbForm(form(change), null).problems.map((p) => `${p.field}:${p.code}`);

describe('the regression form', () => {
  it('gives the published example from typed text (decimal comma, df from n and coefficients)', () => {
    // Cinelli & Hazlett 2020, JRSS-B 82(1):39–67: t = 4.18, df = 783 → RV 13.9%
    const out = evaluateOvbForm(form({ estimate: '4,18', se: '1', dfBy: 'n', n: '790', parameters: '7' }), null);
    expect(out.problems).toEqual([]);
    expectClose(out.result!.rv, ovb.published_example.RV_1, { rel: 1e-12 });
  });

  it('reads covariate t-statistics, percentages for a chosen strength, k, q and α', () => {
    const b = swiss.benchmarks.Agriculture;
    const out = evaluateOvbForm(
      form({
        estimate: String(swiss.estimate),
        se: String(swiss.se),
        df: '41',
        covariateTs: [
          { name: 'Agriculture', outcomeT: String(b.t_in_main_model), treatmentT: String(b.t_in_D_model) },
          { name: '', outcomeT: '', treatmentT: '' },
        ],
        r2dz: '10%',
        r2yz: '0.2',
        k: '1; 2',
        q: '0.5',
        alpha: '0,1',
      }),
      null,
    );
    expect(out.problems).toEqual([]);
    const r = out.result!;
    expect(r.k).toEqual([1, 2]);
    expect(r.q).toBe(0.5);
    expect(r.alpha).toBe(0.1);
    expect(r.scenario!.r2dz).toBeCloseTo(0.1, 15);
    // R 4.2.2 on datasets::swiss (ovb.json): Agriculture, k = 1
    expectClose(r.benchmarks[0].r2dz, b.bounds[0].r2dz, { rel: 1e-12 });
  });

  it('names every bad field with the form’s own field names', () => {
    expect(fields({ estimate: 'abc', se: '1', df: '10' })).toEqual(['estimate:not-a-number']);
    expect(fields({ estimate: '1', se: '1', df: '1' })).toEqual(['df:too-small']);
    expect(fields({ estimate: '1', se: '', df: '10' })).toEqual(['se:required']);
    expect(fields({ estimate: '1', se: '1', df: '10', r2dz: '1', r2yz: '0.1' })).toEqual(['r2dz:outside-interval']);
    expect(fields({ estimate: '1', se: '1', df: '10', r2dz: '0.1' })).toEqual(['r2yz:required']);
    expect(fields({ estimate: '1', se: '1', df: '10', k: '1, x' })).toEqual(['k:not-a-number']);
    expect(fields({ estimate: '1', se: '1', df: '10', k: '1, -1' })).toEqual(['k:not-positive']);
    expect(fields({ estimate: '1', se: '1', df: '10', plotMax: '150%' })).toEqual(['plotMax:outside-interval']);
    expect(
      fields({
        estimate: '1',
        se: '1',
        df: '10',
        covariateTs: [
          { name: '', outcomeT: '', treatmentT: '' },
          { name: 'age', outcomeT: 'x', treatmentT: '' },
          { name: 'age', outcomeT: '2', treatmentT: '' },
          { name: 'age', outcomeT: '2', treatmentT: '' },
        ],
      }),
    ).toEqual(['covariateTs[1].outcomeT:not-a-number']);
    expect(
      fields({ estimate: '1', se: '1', df: '10', covariateTs: [{ name: 'age', outcomeT: '2', treatmentT: '' }, { name: 'age', outcomeT: '2', treatmentT: '' }] }),
    ).toEqual(['covariateTs[1].name:duplicate']);
    const empty = evaluateOvbForm(emptyOvbForm(), null);
    expect(empty.started).toBe(false);
    expect(empty.result).toBeNull();
  });

  it('analyses fitted file data and names columns in its problems', () => {
    const data = regressionDataFromText(readReferenceText('swiss.csv'), { outcome: 'Fertility', treatment: 'Education' });
    const fileData = { design: data.design, spec: ovbSpecFromRegressionData(data) };
    const out = evaluateOvbForm(form({ source: 'file', fileName: 'swiss.csv', outcome: 'Fertility', treatment: 'Education', benchmarks: 'Agriculture, Catholic+Examination' }), fileData);
    expect(out.problems).toEqual([]);
    // R 4.2.2 lm on datasets::swiss (ovb.json)
    expectClose(out.result!.rv, swiss.RV_1, { rel: 1e-9 });
    expect(out.result!.benchmarks.map((b) => b.covariate)).toEqual(['Agriculture', 'Agriculture', 'Agriculture', 'Catholic + Examination', 'Catholic + Examination', 'Catholic + Examination']);
    const bad = evaluateOvbForm(form({ source: 'file', fileName: 'swiss.csv', benchmarks: 'Age' }), fileData);
    expect(bad.problems.map((p) => `${p.field}:${p.code}`)).toEqual(['benchmarks:not-a-covariate']);
    expect(evaluateOvbForm(form({ source: 'file', fileName: 'swiss.csv' }), null).problems[0].field).toBe('file');
    const tiny = regressionDataFromText('y,d,x\n1,2,3\n2,1,1\n4,3,7\n3,5,2\n', { outcome: 'y', treatment: 'd' });
    const few = evaluateOvbForm(form({ source: 'file', fileName: 'tiny.csv' }), { design: tiny.design, spec: ovbSpecFromRegressionData(tiny) });
    expect(few.problems.map((p) => `${p.field}:${p.code}`)).toEqual(['file:too-few-rows']);
  });

  it('writes the SQL and reads the pasted result as JSON or CSV', () => {
    const f = form({ source: 'summary', summaryTable: 'research.visits', outcome: 'y', treatment: 'd', summaryColumns: 'a, b' });
    const { sql } = ovbSummarySql(f);
    expect(sql).toMatch(/FROM "research"\."visits"/);
    expect(sql).toMatch(/-- 1 = a\n-- 2 = b\n-- 3 = d\n-- 4 = y/);
    expect(ovbSummarySql({ ...f, summaryTable: '' }).problem?.field).toBe('summaryTable');
    expect(parseSummaryRow('n,s_1\n10,3\n')).toEqual({ n: '10', s_1: '3' });
    expect(parseSummaryRow('{"n": 10}')).toEqual({ n: 10 });
    expect(() => parseSummaryRow('{"n": ')).toThrow(/JSON/);
    expect(() => parseSummaryRow('n\n1\n2\n')).toThrow(/one result row/);
    const twice = evaluateOvbForm({ ...f, summaryColumns: 'a, d', summaryResult: '{}' }, null);
    expect(twice.problems.map((p) => `${p.field}:${p.code}`)).toEqual(['summaryColumns:chosen-twice']);
    const missing = evaluateOvbForm({ ...f, summaryResult: '{"n": 10}' }, null);
    // The centred summary query's first per-variable column is m_1 (the mean); the problem belongs to the pasted
    // result and names the column (a column "n" must not read as the option --n on the command line).
    expect(missing.problems[0].field).toBe('summaryResult');
    expect(missing.problems[0].message).toMatch(/^column "m_1" is missing/);
  });

  it('completes saved inputs from older or partial objects, keeping what was typed', () => {
    expect(normaliseOvbForm(null)).toEqual(emptyOvbForm());
    const restored = normaliseOvbForm({ estimate: '0,5', source: 'file', covariates: ['a', 3], direction: 'sideways', covariateTs: [{ name: 'x', outcomeT: 2 }] });
    expect(restored.estimate).toBe('0,5');
    expect(restored.source).toBe('file');
    expect(restored.covariates).toEqual(['a']);
    expect(restored.direction).toBe('toward-zero');
    expect(restored.covariateTs).toEqual([{ name: 'x', outcomeT: '2', treatmentT: '' }]);
    expect(Object.isFrozen(restored)).toBe(true);
  });
});
