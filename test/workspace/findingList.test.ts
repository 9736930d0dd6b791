import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { createAppraisal, type Finding } from '../../src/workspace/appraisal';
import { appraisalFileName, defaultFindingName, fileNamePart, nextFindingId, withFindingChanged, withNewFinding, withoutFinding } from '../../src/workspace/findingList';

const study = { finding: '', exposure: '', outcome: '', units: '', source: '' };
const f = (id: string, method: string, name: string): Finding => ({ id, method, name, inputs: {}, summary: null });

describe('the list of findings', () => {
  it('gives each new finding an id never used before, even after a removal', () => {
    const { findings: one } = withNewFinding([], 'evalue');
    const { findings: two } = withNewFinding(one, 'regression');
    expect(two.map((x) => x.id)).toEqual(['f1', 'f2']);
    expect(nextFindingId(withoutFinding(two, 'f1'))).toBe('f3');
    expect(nextFindingId([f('evalue', 'evalue', 'x')])).toBe('f2');
  });

  it('names a new finding after its method until the reviewer names it', () => {
    expect(defaultFindingName([], 'evalue')).toBe('Reported estimate');
    expect(defaultFindingName([f('f1', 'evalue', 'Reported estimate')], 'evalue')).toBe('Reported estimate 2');
  });

  it('renames and removes by id, leaving the old list as it was', () => {
    const list = Object.freeze([f('f1', 'evalue', 'A'), f('f2', 'pairs', 'B')]);
    expect(withFindingChanged(list, 'f2', { name: 'Mortality, hazard ratio' }).map((x) => x.name)).toEqual(['A', 'Mortality, hazard ratio']);
    expect(withoutFinding(list, 'f1').map((x) => x.id)).toEqual(['f2']);
    expect(list.map((x) => x.name)).toEqual(['A', 'B']);
  });
});

describe('file names', () => {
  it('are made of safe characters only, named after the study or the only finding', () => {
    expect(appraisalFileName(createAppraisal({ ...study, finding: 'Café & mortality: 5/10 "years"' }, []))).toBe('lurk-cafe-mortality-5-10-years.json');
    expect(appraisalFileName(createAppraisal(study, [f('f1', 'evalue', 'Mortality, hazard ratio')]))).toBe('lurk-mortality-hazard-ratio.json');
    expect(appraisalFileName(createAppraisal(study, []))).toBe('lurk-appraisal.json');
    expect(fileNamePart('../../etc/passwd', 'x')).toBe('etc-passwd');
  });

  it('never hold a character outside letters, digits and "-" for any text', () => {
    fc.assert(fc.property(fc.string({ unit: 'binary' }), (text) => /^[a-z0-9]+(-[a-z0-9]+)*$/.test(fileNamePart(text, 'appraisal'))));
  });
});
