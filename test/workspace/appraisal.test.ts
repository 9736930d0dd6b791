import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import schema from '../../src/workspace/appraisal.schema.json';
import { createAppraisal, readAppraisal, type Appraisal } from '../../src/workspace/appraisal';
import { decodeShareFragment, encodeShareFragment, withoutRawData } from '../../src/workspace/shareLink';

const study = { finding: 'A fictional finding', exposure: 'cycling', outcome: 'blood pressure', units: 'mmHg', source: 'invented' };

function sample(): Appraisal {
  return createAppraisal(
    study,
    {
      evalue: { inputs: { measure: 'rr', estimate: '3,9', lower: '1.8', upper: '8.7' }, summary: { eValueEstimate: 7.26, eValueInterval: 3 } },
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

  it('names the field and rule for each problem, all at once', () => {
    const bad = { ...JSON.parse(JSON.stringify(sample())), savedAt: 'yesterday', extra: 1 };
    bad.study.exposure = 42;
    const read = readAppraisal(bad);
    expect(read.appraisal).toBeNull();
    expect(read.problems.map((p) => p.field)).toEqual(['savedAt', 'study.exposure', 'extra']);
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
