import { describe, expect, it } from 'vitest';
import { readCsvText } from '../../../src/data/csv';
import { emptyEValueForm, evaluateEValueForm, normaliseEValueForm, parseLevel } from '../../../src/methods/evalue/request';
import type { EValueFormInputs } from '../../../src/methods/evalue/request';
import type { EValueCountsResult } from '../../../src/core/eValueAnalysis';
import { expectClose } from '../../support/expectClose';

const form = (changes: Partial<EValueFormInputs>): EValueFormInputs => ({ ...emptyEValueForm(), ...changes });
const fields = (outcome: ReturnType<typeof evaluateEValueForm>) => outcome.problems.map((p) => [p.field, p.code]);

describe('evaluateEValueForm', () => {
  it('reads the published example as typed, with a decimal comma', () => {
    // VanderWeele & Ding 2017: RR 3.9 (1.8 to 8.7) → 7.26 and 3.0
    const outcome = evaluateEValueForm(form({ estimate: '3,9', lower: '1.8', upper: ' 8.7 ' }), null);
    expect(outcome.problems).toEqual([]);
    expectClose(outcome.result?.eValueEstimate as number, 7.26, { abs: 0.005 });
    expect(outcome.result?.eValueInterval).toBe(3);
    expect(outcome.started).toBe(true);
  });

  it('an empty form is not started and has only a required estimate', () => {
    const outcome = evaluateEValueForm(emptyEValueForm(), null);
    expect(outcome.started).toBe(false);
    expect(fields(outcome)).toEqual([['estimate', 'required']]);
    expect(outcome.result).toBeNull();
  });

  it('names text where a number belongs, keeping the rules for the other fields', () => {
    const outcome = evaluateEValueForm(form({ estimate: 'abc', lower: '3', upper: '1' }), null);
    expect(fields(outcome)).toEqual([
      ['estimate', 'not-a-number'],
      ['lower', 'reversed-limits'],
    ]);
    expect(outcome.problems[0].message).toBe('must be a number, got "abc"');
  });

  it('uses the SE or the limits, whichever is chosen, and reads the level as a percentage or a fraction', () => {
    const bySe = evaluateEValueForm(form({ estimate: '2', intervalBy: 'se', se: '0.2', lower: 'ignored', level: '90' }), null);
    expect(bySe.problems).toEqual([]);
    expect(bySe.result?.level).toBe(0.9);
    expect(bySe.result?.interval?.source).toBe('standard-error');
    expect(parseLevel(95)).toBe(0.95);
    expect(parseLevel(0.99)).toBe(0.99);
    expect(parseLevel(100)).toBe(100);
    expect(parseLevel(null)).toBeNull();
  });

  it('asks for the outcome prevalence for odds and hazard ratios, and the SD for a mean difference', () => {
    expect(fields(evaluateEValueForm(form({ measure: 'or', estimate: '2' }), null))).toEqual([['outcomePrevalence', 'required']]);
    expect(fields(evaluateEValueForm(form({ measure: 'md', estimate: '2' }), null))).toEqual([['sd', 'required']]);
    // Settings hidden for the chosen measure are not used.
    const rr = evaluateEValueForm(form({ measure: 'rr', estimate: '2', sd: 'x', outcomePrevalence: 'common' }), null);
    expect(rr.problems).toEqual([]);
    expect(rr.result?.warnings).toEqual([]);
  });

  it('reads a 2×2 table typed in', () => {
    // hand computation: (10/100)/(5/100) = 2
    const outcome = evaluateEValueForm(form({ source: 'counts', counts: { a: '10', b: '90', c: '5', d: '95' } }), null);
    expectClose(outcome.result?.riskRatioScale.estimate as number, 2, { rel: 1e-15 });
    const bad = evaluateEValueForm(form({ source: 'counts', counts: { a: '-1', b: '2.5', c: 'x', d: '' } }), null);
    // Counts are read as whole numbers, so "2.5" is refused while reading; the cells that were read are still
    // checked against the rules ("-1" is not a count).
    expect(fields(bad)).toEqual([
      ['counts.b', 'not-whole'],
      ['counts.c', 'not-a-number'],
      ['counts.d', 'required'],
      ['counts.a', 'not-a-count'],
    ]);
    const negative = evaluateEValueForm(form({ source: 'counts', counts: { a: '-1', b: '2.5', c: '3', d: '4' } }), null);
    expect(fields(negative)).toEqual([
      ['counts.b', 'not-whole'],
      ['counts.a', 'not-a-count'],
    ]);
    // Thousands separators are fine in a count.
    const grouped = evaluateEValueForm(form({ source: 'counts', counts: { a: '1,200', b: '8 800', c: '600', d: '9,400' } }), null);
    expect((grouped.result as EValueCountsResult | null)?.table.counts).toEqual({ a: 1200, b: 8800, c: 600, d: 9400 });
    expect(negative.started).toBe(true);
  });

  it('counts a table from a loaded CSV', () => {
    const table = readCsvText('smoker,cancer\n1,1\n1,1\n1,0\n0,1\n0,0\n0,0\nNA,1\n');
    const missing = evaluateEValueForm(form({ source: 'file' }), null);
    expect(fields(missing)).toEqual([['file', 'required']]);
    expect(missing.started).toBe(false);
    const unpicked = evaluateEValueForm(form({ source: 'file' }), table);
    expect(fields(unpicked)).toEqual([
      ['exposure', 'required'],
      ['outcome', 'required'],
    ]);
    const outcome = evaluateEValueForm(form({ source: 'file', exposureColumn: 'smoker', outcomeColumn: 'cancer' }), table);
    expect(outcome.csv?.counts).toEqual({ a: 2, b: 1, c: 1, d: 2 });
    expectClose(outcome.result?.riskRatioScale.estimate as number, 2, { rel: 1e-14 });
    expect(outcome.result?.warnings).toEqual(['1 row was left out because the exposure or the outcome was missing.']);
  });

  it('assesses each valid reference confounder and names the problems of the others', () => {
    const outcome = evaluateEValueForm(
      form({
        estimate: '3.9',
        lower: '1.8',
        upper: '8.7',
        confounders: [
          { name: 'age', rrExposure: '4', rrOutcome: '4' },
          { name: '', rrExposure: 'x', rrOutcome: '0' },
        ],
      }),
      null,
    );
    expect(outcome.result).not.toBeNull();
    expect(outcome.confounders[0]?.explainsEstimate).toBe(false);
    expect(outcome.confounders[1]).toBeNull();
    expect(fields(outcome)).toEqual([
      ['confounders[1].rrExposure', 'not-a-number'],
      ['confounders[1].name', 'required'],
      ['confounders[1].rrOutcome', 'not-positive'],
    ]);
  });
});

describe('normaliseEValueForm', () => {
  it('fills what is missing and drops what has the wrong type', () => {
    const restored = normaliseEValueForm({ estimate: '2', measure: 'weird', counts: { a: 3 }, confounders: [{ name: 'age' }, 5], exposedValues: ['yes', 1] });
    expect(restored.estimate).toBe('2');
    expect(restored.measure).toBe('rr');
    // A number where text was expected is taken as its text.
    expect(restored.counts).toEqual({ a: '3', b: '', c: '', d: '' });
    expect(restored.confounders).toEqual([{ name: 'age', rrExposure: '', rrOutcome: '' }]);
    expect(restored.exposedValues).toEqual(['yes', '1']);
    expect(normaliseEValueForm(null)).toEqual(emptyEValueForm());
    expect(normaliseEValueForm({ estimate: 3.9, measure: 'OR', outcomePrevalence: 'Rare' })).toMatchObject({ estimate: '3.9', measure: 'or', outcomePrevalence: 'rare' });
  });

  it('keeps a full form exactly', () => {
    const full = form({ estimate: '3.9', lower: '1,8', source: 'counts', counts: { a: '1', b: '2', c: '3', d: '4' }, confounders: [{ name: 'a', rrExposure: '2', rrOutcome: '3' }] });
    expect(normaliseEValueForm(JSON.parse(JSON.stringify(full)))).toEqual(full);
  });
});
