import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { analyseEValue, assessReferenceConfounder, eValue, validateReferenceConfounder } from '../../src/core';
import { expectClose } from '../support/expectClose';

// VanderWeele & Ding 2017 worked example: RR 3.9 (1.8 to 8.7), E-values 7.26 and 3.0
const published = analyseEValue({ measure: 'rr', estimate: 3.9, lower: 1.8, upper: 8.7 });

describe('assessReferenceConfounder', () => {
  it('a confounder with strengths 4 and 4 cannot explain away RR 3.9 but can explain away the lower limit 1.8', () => {
    // hand computation: B(4, 4) = 16/7 = 2.2857 < 3.9, and ≥ 1.8 (Ding & VanderWeele 2016, bounding factor)
    const assessment = assessReferenceConfounder(published, { name: 'age', rrExposure: 4, rrOutcome: 4 });
    expectClose(assessment.boundingFactor, 16 / 7, { rel: 1e-15 });
    expect(assessment.explainsEstimate).toBe(false);
    expect(assessment.explainsInterval).toBe(true);
  });

  it('a confounder exactly at the E-value suffices, as the definition says', () => {
    // VanderWeele & Ding 2017: B(E, E) = RR
    const e = published.eValueEstimate;
    const assessment = assessReferenceConfounder(published, { name: 'at E', rrExposure: e, rrOutcome: e });
    expect(assessment.explainsEstimate).toBe(true);
  });

  it('a lopsided confounder can suffice: strengths 20 and 5', () => {
    // hand computation: B(20, 5) = 100/24 = 4.1667 ≥ 3.9
    const assessment = assessReferenceConfounder(published, { name: 'smoking', rrExposure: 20, rrOutcome: 5 });
    expectClose(assessment.boundingFactor, 100 / 24, { rel: 1e-15 });
    expect(assessment.explainsEstimate).toBe(true);
  });

  it('reads protective associations by their inverse and says so', () => {
    const assessment = assessReferenceConfounder(published, { name: 'exercise', rrExposure: 0.25, rrOutcome: 4 });
    expect(assessment.strengthExposure).toBe(4);
    expect(assessment.inverted).toEqual({ exposure: true, outcome: false });
  });

  it('has no interval verdict without an interval; an interval containing the null is explained by anything', () => {
    const pointOnly = analyseEValue({ measure: 'rr', estimate: 3.9 });
    expect(assessReferenceConfounder(pointOnly, { name: 'x', rrExposure: 2, rrOutcome: 2 }).explainsInterval).toBeNull();
    const crossing = analyseEValue({ measure: 'rr', estimate: 1.3, lower: 0.9, upper: 1.8 });
    expect(assessReferenceConfounder(crossing, { name: 'x', rrExposure: 1, rrOutcome: 1 }).explainsInterval).toBe(true);
  });

  it('agrees with the E-value: strengths (s, s) suffice exactly when s ≥ E', () => {
    fc.assert(
      fc.property(fc.double({ min: 0.01, max: 10, noNaN: true }), fc.double({ min: 0.5, max: 2, noNaN: true }), (u, factor) => {
        const rr = Math.exp(u);
        const s = Math.max(1, eValue(rr) * factor);
        const verdict = assessReferenceConfounder({ ratioToTarget: rr, intervalRatioToTarget: null }, { name: 'u', rrExposure: s, rrOutcome: s });
        if (factor >= 1 + 1e-9) expect(verdict.explainsEstimate).toBe(true);
        if (factor <= 1 - 1e-9) expect(verdict.explainsEstimate).toBe(false);
      }),
    );
  });
});

describe('validateReferenceConfounder', () => {
  it('accepts a named confounder with two positive ratios', () => {
    expect(validateReferenceConfounder({ name: 'age', rrExposure: 2, rrOutcome: 0.5 })).toEqual([]);
  });

  it('names each bad field', () => {
    const problems = validateReferenceConfounder({ name: ' ', rrExposure: 0, rrOutcome: NaN }, 'confounders[1]');
    expect(problems.map((p) => [p.field, p.code])).toEqual([
      ['confounders[1].name', 'required'],
      ['confounders[1].rrExposure', 'not-positive'],
      ['confounders[1].rrOutcome', 'not-a-number'],
    ]);
    expect(validateReferenceConfounder({ name: 'a', rrExposure: Infinity, rrOutcome: 2 })[0].code).toBe('not-finite');
  });

  it('does not change a frozen confounder', () => {
    const confounder = Object.freeze({ name: 'age', rrExposure: 0.5, rrOutcome: 3 });
    assessReferenceConfounder(published, confounder);
    expect(confounder).toEqual({ name: 'age', rrExposure: 0.5, rrOutcome: 3 });
  });
});
