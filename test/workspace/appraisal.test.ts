import { METHODS } from '../../src/methods/registry';
import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import schema from '../../src/workspace/appraisal.schema.json';
import { createAppraisal, readAppraisal, type Appraisal } from '../../src/workspace/appraisal';
import { decodeShareFragment, encodeShareFragment, withoutRawData } from '../../src/workspace/shareLink';

const study = { finding: 'A fictional finding', exposure: 'cycling', outcome: 'blood pressure', units: 'mmHg', source: 'invented' };

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

function sample(): Appraisal {
  return createAppraisal(
    study,
    {
      evalue: { inputs: { measure: 'rr', estimate: '3,9', lower: '1.8', upper: '8.7' }, summary: EVALUE_SUMMARY },
      pairs: { inputs: { pasted: '1.2\n-0.4\n2.0', alpha: '0.05' }, summary: null },
    },
    new Date('2026-01-02T03:04:05Z'),
  );
}

describe('appraisal files', () => {
  it('round-trips through JSON exactly', () => {
    const a = sample();
    const read = readAppraisal(JSON.parse(JSON.stringify(a)));
    expect(read.problems).toEqual([]);
    expect(read.appraisal).toEqual(a);
  });

  it('names the field and rule of the problem found (checked against the JSON Schema)', () => {
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
    expect(fieldOf((a) => (a.calculators.evalue.summary.references = {}))).toBe('calculators.evalue.summary.references: must be a list');
    expect(fieldOf((a) => delete a.calculators.evalue.summary.measure)).toBe('calculators.evalue.summary.measure: is missing');
    expect(fieldOf((a) => (a.calculators.evalue.inputs.confounders = [{ name: 'x', rrExposure: {} }]))).toBe(
      'calculators.evalue.inputs.confounders[0].rrExposure: must be text or a finite number or null',
    );
    // Fields of older versions are single values (ignored when read); anything else is refused.
    expect(fieldOf((a) => (a.calculators.evalue.inputs.colour = { red: 1 }))).toBe('calculators.evalue.inputs.colour: must be text or a finite number or true or false or null');
    expect(fieldOf((a) => (a.calculators.ghost = { inputs: {}, summary: null }))).toBe(`calculators.ghost: is not a calculator (calculators: ${METHODS.map((m) => m.id).join(', ')})`);
  });

  it('says plainly when a file is from another version or is not an appraisal', () => {
    expect(readAppraisal({ ...sample(), version: 2 }).problems[0].message).toMatch(/newer Lurk/);
    expect(readAppraisal({ hello: 1 }).problems[0].field).toBe('format');
    expect(readAppraisal([1, 2]).problems[0].code).toBe('not-an-object');
  });

  it('refuses non-finite numbers and unknown calculators', () => {
    const bad = JSON.parse(JSON.stringify(sample()));
    bad.calculators.evalue.summary.eValueEstimate = 'x';
    bad.calculators.other = { inputs: {}, summary: null };
    const read = readAppraisal(bad);
    expect(read.problems.map((p) => p.code)).toContain('unknown-calculator');
  });

  it('ships a JSON Schema that requires the same top-level fields', () => {
    expect(schema.required).toEqual(['format', 'version', 'savedAt', 'study', 'calculators']);
    expect(Object.keys(schema.properties.study.properties)).toEqual(['finding', 'exposure', 'outcome', 'units', 'source']);
    expect(Object.keys(schema.properties.calculators.properties)).toEqual(['evalue', 'pairs', 'sets', 'regression', 'weighting']);
  });
});

describe('share links', () => {
  it('round-trip the inputs exactly, without raw data rows', () => {
    const a = sample();
    const fragment = encodeShareFragment(a);
    const decoded = decodeShareFragment(fragment);
    expect(decoded.problems).toEqual([]);
    expect(decoded.appraisal).toEqual(withoutRawData(a));
    expect(decoded.appraisal?.calculators.pairs?.inputs).toEqual({ alpha: '0.05' });
    expect(fragment).not.toContain('1.2');
  });

  it('refuse a link edited by hand, cut short, or from another version, with a message', () => {
    const fragment = encodeShareFragment(sample());
    const [head, payload, check] = fragment.split('.');
    const flipped = payload.slice(0, 10) + (payload[10] === 'A' ? 'B' : 'A') + payload.slice(11);
    expect(decodeShareFragment(`${head}.${flipped}.${check}`).problems[0].code).toBe('tampered');
    expect(decodeShareFragment(fragment.slice(0, fragment.length - 20)).problems[0].code).toMatch(/tampered|damaged/);
    expect(decodeShareFragment(fragment.replace('#appraisal=1.', '#appraisal=7.')).problems[0].message).toMatch(/newer Lurk/);
    expect(decodeShareFragment('#appraisal=1.@@@.00000000').problems[0].code).toBe('damaged');
  });

  it('round-trip any study labels, including non-ASCII text', () => {
    fc.assert(
      fc.property(fc.record({ finding: fc.string(), exposure: fc.string(), outcome: fc.string({ unit: 'binary' }), units: fc.string(), source: fc.string() }), (labels) => {
        const a = createAppraisal(labels, {}, new Date(0));
        expect(decodeShareFragment(encodeShareFragment(a)).appraisal).toEqual(a);
      }),
    );
  });
});
