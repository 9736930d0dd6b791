import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { createAppraisal, type Appraisal, type Finding } from '../../src/workspace/appraisal';
import {
  decodeShareFragment,
  encodeShareFragment,
  fragmentOfJson,
  SHARE_LINK_LIMIT,
  sharedAppraisal,
  shareLinkLength,
} from '../../src/workspace/shareLink';
import { fictionalAppraisal, fictionalStudy } from '../../src/demo/fictionalStudy';
import { buildRobustnessStatement } from '../../src/workspace/robustnessStatement';
import { SHARE_LINK_DICTIONARY } from '../../src/workspace/shareLinkDictionary';
import { crc32 } from '../../src/data/crc32';
import { methodById } from '../../src/methods/registry';

const study = { finding: 'A fictional paper', exposure: 'cycling', outcome: 'blood pressure', units: 'mmHg', source: 'invented' };
const PAGE = 'http://127.0.0.1:5173/';

/** The matched-pairs summary of three pasted differences, as the page would save it. */
function pairsSummary(): Finding['summary'] {
  const pairs = methodById('pairs')!;
  return pairs.workspace.summaryFromForm(pairs.form.normalise({ source: 'pasted', pasted: '1.2\n-0.4\n2.0' })) as Finding['summary'];
}

function sample(): Appraisal {
  const findings: Finding[] = [
    // VanderWeele & Ding 2017 worked example: RR 3.9 (1.8–8.7)
    { id: 'f1', method: 'evalue', name: 'Mortality, risk ratio', inputs: { source: 'reported', measure: 'rr', estimate: '3,9', lower: '1.8', upper: '8.7' }, summary: null },
    { id: 'f2', method: 'pairs', name: 'Blood pressure, pairs', inputs: { source: 'pasted', pasted: '1.2\n-0.4\n2.0', alpha: '0.05' }, summary: pairsSummary() },
  ];
  return createAppraisal(study, findings, new Date('2026-01-02T03:04:05Z'), { text: 'label,measure,estimate\nx,rr,2\n', alpha: '0.05' });
}

/** The demo as Lurk 1 shared it: one entry per calculator with its inputs as the demo gives them and every summary, pasted rows left out. */
function demoVersion1Link(): string {
  const demo = fictionalStudy();
  const calculators = Object.fromEntries(
    Object.entries(demo.inputs).map(([id, inputs]) => {
      const method = methodById(id)!;
      const summary = method.workspace.summaryFromForm(method.form.normalise(inputs));
      const { pasted: _rows, ...kept } = inputs as Record<string, unknown>;
      return [id, { inputs: kept, summary }];
    }),
  );
  return PAGE + fragmentOfJson({ format: 'lurk-appraisal', version: 1, savedAt: '2026-01-02T03:04:05.000Z', study: demo.study, calculators }, 1);
}

describe('share links (link format 2: compressed)', () => {
  it('round-trip the inputs exactly, without raw data rows and without the summaries the inputs give again', () => {
    const a = sample();
    const fragment = encodeShareFragment(a);
    expect(fragment.startsWith('#appraisal=2.')).toBe(true);
    const decoded = decodeShareFragment(fragment);
    expect(decoded.problems).toEqual([]);
    expect(decoded.appraisal).toEqual(sharedAppraisal(a));
    // The pasted rows stay behind, so the pairs finding keeps its saved summary; the E-value's is computed again.
    expect(decoded.appraisal?.findings[1].inputs).toEqual({ source: 'pasted', alpha: '0.05' });
    expect(decoded.appraisal?.findings[1].summary).toEqual(pairsSummary());
    expect(decoded.appraisal?.findings[0].summary).toBeNull();
    expect(decoded.appraisal?.batch).toEqual(a.batch);
    expect(decoded.appraisal?.findings.map((f) => f.name)).toEqual(['Mortality, risk ratio', 'Blood pressure, pairs']);
  });

  it('give the same statement as the appraisal they were made from', () => {
    const demo = fictionalAppraisal(true);
    const decoded = decodeShareFragment(encodeShareFragment(demo)).appraisal!;
    const shown = (a: Appraisal) => buildRobustnessStatement(a).sections.filter((s) => s.findingId !== 'f2');
    expect(shown(decoded)).toEqual(shown(demo));
  });

  it('keep reading links of format 1 (plain JSON of a version-1 appraisal)', () => {
    const v1 = {
      format: 'lurk-appraisal',
      version: 1,
      savedAt: '2026-01-02T03:04:05Z',
      study,
      calculators: { evalue: { inputs: { measure: 'rr', estimate: '3.9', lower: '1.8', upper: '8.7' }, summary: null } },
    };
    const fragment = fragmentOfJson(v1, 1);
    expect(fragment.startsWith('#appraisal=1.')).toBe(true);
    const decoded = decodeShareFragment(fragment);
    expect(decoded.problems).toEqual([]);
    expect(decoded.appraisal?.findings).toEqual([{ id: 'evalue', method: 'evalue', name: 'Reported estimate', inputs: v1.calculators.evalue.inputs, summary: null }]);
    // VanderWeele & Ding 2017 worked example: RR 3.9 (1.8–8.7) → E-value 7.26
    expect(buildRobustnessStatement(decoded.appraisal!).sections[0].paragraph).toContain('7.26');
  });

  it('are read with the frozen dictionary they were made with (its CRC-32 never changes)', () => {
    expect(crc32(new TextEncoder().encode(SHARE_LINK_DICTIONARY)).toString(16).padStart(8, '0')).toBe('ec468f43');
  });

  it('refuse a link edited by hand, cut short, or from a newer Lurk, with a message', () => {
    const fragment = encodeShareFragment(sample());
    const [head, payload, check] = fragment.split('.');
    const flipped = payload.slice(0, 10) + (payload[10] === 'A' ? 'B' : 'A') + payload.slice(11);
    expect(decodeShareFragment(`${head}.${flipped}.${check}`).problems[0].code).toBe('tampered');
    expect(decodeShareFragment(fragment.slice(0, fragment.length - 20)).problems[0].code).toMatch(/tampered|damaged/);
    expect(decodeShareFragment(fragment.replace('#appraisal=2.', '#appraisal=7.')).problems[0].message).toMatch(/^was made by a newer version of Lurk/);
    expect(decodeShareFragment('#appraisal=2.@@@.00000000').problems[0].code).toBe('damaged');
    // Valid check digits over bytes that are not a DEFLATE stream: damaged, not a crash.
    expect(decodeShareFragment('#appraisal=2.AAAA.00000000').problems[0].code).toMatch(/tampered|damaged/);
  });

  it("round-trip any study labels, finding names and findings' own labels, including non-ASCII text", () => {
    const labels = fc.record({ finding: fc.string(), exposure: fc.string(), outcome: fc.string({ unit: 'binary' }), units: fc.string(), source: fc.string() });
    fc.assert(
      fc.property(labels, fc.array(fc.string({ unit: 'binary', maxLength: 30 }), { maxLength: 4 }), fc.string({ unit: 'binary', maxLength: 20 }), (study, names, outcome) => {
        const findings: Finding[] = names.map((name, i) => ({
          id: `f${i + 1}`,
          method: 'evalue',
          name,
          ...(i % 2 === 1 ? { labels: { outcome } } : {}),
          inputs: { estimate: String(i + 2) },
          summary: null,
        }));
        const a = createAppraisal(study, findings, new Date(0));
        expect(decodeShareFragment(encodeShareFragment(a)).appraisal).toEqual(a);
      }),
    );
  });
});

describe('share link length', () => {
  it(`the demo's link fits in ${SHARE_LINK_LIMIT} characters, far shorter than the format-1 link`, () => {
    const before = demoVersion1Link().length;
    const after = (PAGE + encodeShareFragment(fictionalAppraisal(true))).length;
    // Measured when link format 2 was made (page address of 22 characters): 10,731 characters before, 1,311 after.
    console.info(`demo share link: ${before} characters in link format 1, ${after} in link format 2`);
    expect(before).toBeGreaterThan(4000);
    expect(after).toBeLessThanOrEqual(SHARE_LINK_LIMIT);
    expect(after).toBeLessThan(before / 2);
    expect(shareLinkLength(PAGE + encodeShareFragment(fictionalAppraisal(true))).tooLong).toBe(false);
  });

  it('says plainly when a link is too long for e-mail and chat, and suggests a file', () => {
    // A long batch table (invented rows of pseudo-random numbers, which compress poorly) makes a long link.
    let seed = 7;
    const random = () => ((seed = (Math.imul(seed, 1664525) + 1013904223) >>> 0) / 2 ** 32).toFixed(6);
    const rows = Array.from({ length: 200 }, (_, i) => `Fictional finding ${i},rr,${1 + Number(random())},${random()},${2 + Number(random())}`);
    const a = createAppraisal(study, [], new Date(0), { text: `label,measure,estimate,lower,upper\n${rows.join('\n')}\n`, alpha: '0.05' });
    const url = PAGE + encodeShareFragment(a);
    const verdict = shareLinkLength(url);
    expect(verdict.tooLong).toBe(true);
    expect(verdict.length).toBe(url.length);
    expect(verdict.message).toContain(`more than the ${SHARE_LINK_LIMIT.toLocaleString('en')}`);
    expect(verdict.message).toContain('Save the appraisal as a file');
    expect(decodeShareFragment(url.slice(PAGE.length)).appraisal).toEqual(a);
    expect(shareLinkLength('x'.repeat(SHARE_LINK_LIMIT))).toEqual({ length: SHARE_LINK_LIMIT, tooLong: false, message: '' });
  });
});
