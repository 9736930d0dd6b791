import { METHODS } from '../../src/methods/registry';
import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import schema from '../../src/workspace/appraisal.schema.json';
import { createAppraisal, readAppraisal, type Appraisal, type Finding } from '../../src/workspace/appraisal';

const study = { finding: 'A fictional paper', exposure: 'cycling', outcome: 'blood pressure', units: 'mmHg', source: 'invented' };

// VanderWeele & Ding 2017 worked example (RR 3.9, 1.8–8.7): E-values 7.26 and 3.00, as a complete summary.
const EVALUE_SUMMARY = {
  kind: 'evalue',
  measure: 'rr',
  estimate: 3.9,
  lower: 1.8,
  upper: 8.7,
  level: 0.95,
  target: 1,
  targetIsNull: true,
  conversion: 'none',
  conversionNote: 'The risk ratio is used as it is.',
  eValueEstimate: 7.26,
  eValueInterval: 3,
  intervalLimitUsed: 'lower',
  references: [],
};

const FINDINGS: Finding[] = [
  { id: 'f1', method: 'evalue', name: 'Mortality, risk ratio', inputs: { measure: 'rr', estimate: '3,9', lower: '1.8', upper: '8.7' }, summary: EVALUE_SUMMARY },
  { id: 'f2', method: 'pairs', name: 'Blood pressure, matched pairs', inputs: { pasted: '1.2\n-0.4\n2.0', alpha: '0.05' }, summary: null },
  { id: 'f3', method: 'evalue', name: 'Readmission, hazard ratio', inputs: { measure: 'hr', estimate: '1.9', lower: '1.3', upper: '2.8', outcomePrevalence: 'rare' }, summary: null },
];

function sample(): Appraisal {
  return createAppraisal(study, FINDINGS, new Date('2026-01-02T03:04:05Z'), { text: 'label,measure,estimate\nx,rr,2\n', alpha: '0.05' });
}

/** A file as Lurk 1 saved it: one entry per calculator. */
function version1File(): Record<string, any> {
  return structuredClone({
    format: 'lurk-appraisal',
    version: 1,
    savedAt: '2026-01-02T03:04:05Z',
    study,
    calculators: {
      regression: { inputs: { source: 'reported', estimate: '4.18', se: '1', df: '783' }, summary: null },
      evalue: { inputs: { measure: 'rr', estimate: '3,9', lower: '1.8', upper: '8.7' }, summary: EVALUE_SUMMARY },
    },
  });
}

describe('appraisal files (version 2: a list of findings)', () => {
  it('round-trips through JSON exactly, with the batch text', () => {
    const a = sample();
    expect(a.version).toBe(2);
    const read = readAppraisal(JSON.parse(JSON.stringify(a)));
    expect(read.problems).toEqual([]);
    expect(read.appraisal).toEqual(a);
    expect(read.appraisal?.batch?.text).toContain('x,rr,2');
  });

  it('round-trips any list of findings (names, ids, methods and typed text of any kind)', () => {
    const finding = fc.record({
      id: fc.stringMatching(/^[A-Za-z0-9_-]{1,12}$/),
      method: fc.constantFrom(...METHODS.map((m) => m.id)),
      name: fc.string({ maxLength: 40 }),
      inputs: fc.dictionary(fc.constantFrom('estimate', 'lower', 'upper', 'se', 'df', 'alpha', 'level'), fc.oneof(fc.string({ maxLength: 12 }), fc.constant(null))),
      summary: fc.constant(null),
    });
    const uniqueById = fc.uniqueArray(finding, { selector: (f) => f.id, maxLength: 6 });
    fc.assert(
      fc.property(uniqueById, fc.string({ maxLength: 30 }), (findings, text) => {
        const a = createAppraisal(study, findings, new Date(0), { text, alpha: '0.05' });
        const read = readAppraisal(JSON.parse(JSON.stringify(a)));
        expect(read.problems).toEqual([]);
        expect(read.appraisal).toEqual(a);
      }),
    );
  });

  it('names the field and rule of the problem found by its path in the list (checked against the JSON Schema)', () => {
    const fieldOf = (edit: (a: any) => void) => {
      const bad = JSON.parse(JSON.stringify(sample()));
      edit(bad);
      const read = readAppraisal(bad);
      expect(read.appraisal).toBeNull();
      expect(read.problems).toHaveLength(1);
      return `${read.problems[0].field}: ${read.problems[0].message}`;
    };
    expect(fieldOf((a) => (a.savedAt = 'yesterday'))).toBe('savedAt: must be a date and time in ISO 8601 form');
    expect(fieldOf((a) => (a.study.exposure = 42))).toBe('study.exposure: must be text');
    expect(fieldOf((a) => (a.extra = 1))).toBe('extra: is not part of a Lurk appraisal');
    expect(fieldOf((a) => (a.findings[2].inputs.estimate = { x: 1 }))).toBe('findings[2].inputs.estimate: must be text or a finite number or null');
    expect(fieldOf((a) => (a.findings[0].summary.references = {}))).toBe('findings[0].summary.references: must be a list');
    expect(fieldOf((a) => delete a.findings[0].summary.measure)).toBe('findings[0].summary.measure: is missing');
    expect(fieldOf((a) => (a.findings[0].inputs.confounders = [{ name: 'x', rrExposure: {} }]))).toBe(
      'findings[0].inputs.confounders[0].rrExposure: must be text or a finite number or null',
    );
    // Fields of older versions are single values (ignored when read); anything else is refused.
    expect(fieldOf((a) => (a.findings[1].inputs.colour = { red: 1 }))).toBe('findings[1].inputs.colour: must be text or a finite number or true or false or null');
    expect(fieldOf((a) => (a.findings[1].method = 'ghost'))).toBe(`findings[1].method: is not a method of this Lurk (methods: ${METHODS.map((m) => m.id).join(', ')})`);
    expect(fieldOf((a) => delete a.findings[1].name)).toBe('findings[1].name: is missing');
    expect(fieldOf((a) => (a.findings[1].colour = 'red'))).toBe('findings[1].colour: is not a field of a finding (id, method, name, inputs, summary)');
    expect(fieldOf((a) => (a.findings[2].id = 'f1'))).toBe('findings[2].id: is also the id of findings[0]; each finding needs its own id');
    expect(fieldOf((a) => (a.findings[2].id = 'a b'))).toBe('findings[2].id: must be letters, digits, - and _ only');
    expect(fieldOf((a) => (a.findings = {}))).toBe('findings: must be a list');
    expect(fieldOf((a) => (a.batch = { text: 1, alpha: '0.05' }))).toBe('batch.text: must be text');
  });

  it('says plainly when a file is from a newer version, or is not an appraisal', () => {
    const newer = readAppraisal({ ...sample(), version: 3 }).problems[0];
    expect(newer.field).toBe('version');
    expect(newer.message).toBe('is 3, made by a newer Lurk; this Lurk reads versions 1 and 2: open it with a newer Lurk');
    expect(readAppraisal({ ...sample(), version: 0 }).problems[0].message).toBe('is 0; this Lurk reads versions 1 and 2');
    expect(readAppraisal({ hello: 1 }).problems[0].field).toBe('format');
    expect(readAppraisal([1, 2]).problems[0].code).toBe('not-an-object');
  });

  it('ships a JSON Schema that requires the same top-level fields', () => {
    const v2 = schema.$defs.version2;
    expect(v2.required).toEqual(['format', 'version', 'savedAt', 'study', 'findings']);
    expect(Object.keys(schema.$defs.study.properties)).toEqual(['finding', 'exposure', 'outcome', 'units', 'source']);
    expect(schema.$defs.finding.properties.method.enum).toEqual(['evalue', 'pairs', 'sets', 'regression', 'weighting']);
  });
});

describe('appraisal files of version 1 (one entry per calculator) keep opening', () => {
  it('reads each calculator entry as one finding, in registry order, named after its method', () => {
    const read = readAppraisal(version1File());
    expect(read.problems).toEqual([]);
    expect(read.appraisal?.version).toBe(2);
    expect(read.appraisal?.study).toEqual(study);
    expect(read.appraisal?.findings).toEqual([
      { id: 'evalue', method: 'evalue', name: 'Reported estimate', inputs: version1File().calculators.evalue.inputs, summary: EVALUE_SUMMARY },
      { id: 'regression', method: 'regression', name: 'Regression', inputs: version1File().calculators.regression.inputs, summary: null },
    ]);
  });

  it('names the problems of a version-1 file by its own paths', () => {
    const fieldOf = (edit: (a: any) => void) => {
      const bad = version1File();
      edit(bad);
      const p = readAppraisal(bad).problems[0];
      return `${p.field}: ${p.message}`;
    };
    expect(fieldOf((a) => (a.calculators.evalue.summary.references = {}))).toBe('calculators.evalue.summary.references: must be a list');
    expect(fieldOf((a) => delete a.calculators.evalue.summary.measure)).toBe('calculators.evalue.summary.measure: is missing');
    expect(fieldOf((a) => (a.calculators.ghost = { inputs: {}, summary: null }))).toBe(`calculators.ghost: is not a calculator (calculators: ${METHODS.map((m) => m.id).join(', ')})`);
    expect(fieldOf((a) => (a.calculators.evalue.extra = 1))).toBe('calculators.evalue.extra: is not a field of calculators.evalue');
    expect(fieldOf((a) => (a.findings = []))).toBe('findings: is not part of a Lurk appraisal');
  });

  it('refuses non-finite numbers and unknown calculators', () => {
    const bad = version1File();
    bad.calculators.evalue.summary.eValueEstimate = 'x';
    bad.calculators.other = { inputs: {}, summary: null };
    const read = readAppraisal(bad);
    expect(read.appraisal).toBeNull();
  });
});
