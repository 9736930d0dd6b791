import { describe, expect, it } from 'vitest';
import { analyseEValue } from '../../src/core/eValueAnalysis';
import { analyseOvb } from '../../src/core/ovbAnalysis';
import { analysePairs } from '../../src/core/pairsAnalysis';
import { createAppraisal, type Appraisal } from '../../src/workspace/appraisal';
import { buildBottomLine, type BottomLine } from '../../src/workspace/bottomLine';
import { buildRobustnessStatement, renderRobustnessStatement, type StatementFormat } from '../../src/workspace/robustnessStatement';
import { readReferenceJson } from '../support/reference';

// Reference values: test/reference/plain_words_cases.json, made by generators/plain_words_cases.R (R 4.2.2 base).
const ref = readReferenceJson('plain_words_cases.json');
const study = { finding: 'A fictional finding', exposure: 'cycling to work', outcome: 'blood pressure', units: '', source: 'invented' };
const dneg = [-1.2, -0.5, 0.3, -2.1, -0.8, -1.1, 0.2, -0.9, -1.5, -0.65];

/** One situation a decision-maker may meet, as the inputs a user would type. */
interface Case {
  readonly name: string;
  readonly calculators: Record<string, unknown>;
  /** Checks that each sentence agrees with its number, on the statement's plain paragraphs and the bottom line. */
  check(paragraphs: string, bottom: BottomLine): void;
}

const cases: Case[] = [
  {
    name: 'an interval that includes the null (RR 1.10, 0.90 to 1.35)',
    calculators: { evalue: { inputs: { source: 'reported', measure: 'rr', estimate: '1.10', lower: '0.90', upper: '1.35' }, summary: null } },
    check(paragraphs, bottom) {
      // Said first, in plain words; E-value 1.43 (R: 1.1 + sqrt(1.1 · 0.1) = 1.4317, VanderWeele & Ding 2017).
      expect(paragraphs).toMatch(/^The confidence interval already includes the null \(no association\)/);
      expect(ref.evalue_includes_null.eValueEstimate.toFixed(2)).toBe('1.43');
      expect(paragraphs).toContain('The E-value for the point estimate is 1.43');
      expect(paragraphs).toContain('risk ratio 1.10, 95% confidence interval 0.90 to 1.35');
      expect(paragraphs).not.toMatch(/could not/);
      expect(bottom.howStrong[0]).toMatch(/^The reported range of plausible values already includes no link/);
      expect(bottom.wouldNotChange).toEqual([]);
      expect(allBottom(bottom)).not.toMatch(/could not/);
    },
  },
  {
    name: 'an estimate at the null (RR 1, 0.8 to 1.25)',
    calculators: { evalue: { inputs: { source: 'reported', measure: 'rr', estimate: '1', lower: '0.8', upper: '1.25' }, summary: null } },
    check(paragraphs, bottom) {
      // E-value of RR 1 is 1 + sqrt(1 · 0) = 1 (VanderWeele & Ding 2017): nothing to explain away.
      expect(paragraphs).toMatch(/^The estimate equals the null \(no association\), so there is no association for unmeasured confounding to explain away\./);
      expect(paragraphs).not.toContain('E-value for the point estimate');
      expect(bottom.howStrong[0]).toMatch(/nothing for a hidden factor to explain away/);
      expect(allBottom(bottom)).not.toMatch(/at least 1\.00 times|could not/);
    },
  },
  {
    name: 'a regression estimate not significant before adjustment (0.3, SE 0.2, df 100)',
    calculators: {
      regression: { inputs: { source: 'reported', estimate: '0.3', se: '0.2', df: '100', covariateTs: [{ name: 'age', outcomeT: '1.5', treatmentT: '2' }] }, summary: null },
    },
    check(paragraphs, bottom) {
      // t = 1.5 < t*(99) = 1.984 (R qt(0.975, 99)); RV 13.9% (R: 0.13917, Cinelli & Hazlett 2020).
      expect(Math.abs(ref.ovb_not_significant.t)).toBeLessThan(ref.ovb_not_significant.criticalT);
      expect(paragraphs).toMatch(/^The regression estimate is not statistically significant at α = 0\.05 even before any adjustment for unmeasured confounding \(t = 1\.5\)/);
      expect(paragraphs).toContain(`The robustness value is ${(ref.ovb_not_significant.rv * 100).toFixed(1)}%`);
      expect(paragraphs).not.toMatch(/could not|lose significance/);
      expect(paragraphs).toMatch(/the estimate was not significant to begin with/);
      expect(bottom.howStrong[0]).toMatch(/^The regression estimate is not statistically significant even before allowing for any hidden factor/);
      expect(bottom.wouldNotChange).toEqual([]);
      expect(bottom.wouldChange).toEqual([]);
    },
  },
  {
    name: 'a matched comparison whose tipping Γ is not reached: not significant at Γ = 1, data pointing the other way',
    calculators: { pairs: { inputs: { source: 'pasted', pasted: dneg.join('\n'), method: 'exact', alternative: 'greater' }, summary: null } },
    check(paragraphs, bottom) {
      // R wilcox.test(d, alternative = "greater", exact = TRUE): p = 0.99707; Hodges–Lehmann (median of Walsh averages) −0.85.
      expect(ref.pairs_other_way.pGreater).toBeCloseTo(0.99707, 5);
      expect(paragraphs).toMatch(/^The data point the other way: the Hodges–Lehmann estimate, -0\.85, is opposite in sign to the hypothesis that cycling to work raises blood pressure/);
      expect(paragraphs).toContain('p = 0.997');
      expect(paragraphs).not.toMatch(/holds unless|stays at or below/);
      expect(bottom.howStrong[0]).toMatch(/the data point the other way/);
      expect(bottom.howStrong[0]).toMatch(/cycling to work lowers blood pressure instead/);
      expect(bottom.wouldChange).toEqual([]);
    },
  },
  {
    name: 'a capped benchmark bound (income, k_D = 3, k_Y = 30)',
    calculators: {
      regression: {
        inputs: { source: 'reported', estimate: '0.5', se: '0.2', df: '100', covariateTs: [{ name: 'income', outcomeT: '4', treatmentT: '1' }], k: '3', kOutcome: '30' },
        summary: null,
      },
    },
    check(paragraphs, bottom) {
      // Uncapped R²yz = 4.83 > 1 (R, Cinelli & Hazlett 2020 Section 6.1 with k_Y = 30): the bound is not informative.
      expect(ref.ovb_capped.r2yzUncapped).toBeGreaterThan(1);
      expect(paragraphs).toContain('the strongest measured covariate is income');
      expect(paragraphs).toMatch(/would give a bound that is not informative: a confounder this strong could account for all of the outcome’s remaining variation/);
      expect(paragraphs).not.toMatch(/adjusted estimate of [^.]*\(t = /);
      expect(bottom.comparedWithMeasured.join(' ')).toMatch(/not informative/);
      expect(allBottom(bottom)).not.toMatch(/standard error 0|t not available/);
    },
  },
  {
    name: 'protective estimates: E-value (RR 0.5, 0.35 to 0.71), matched pairs (lowers), regression (−0.5)',
    calculators: {
      evalue: { inputs: { source: 'reported', measure: 'rr', estimate: '0.5', lower: '0.35', upper: '0.71' }, summary: null },
      pairs: { inputs: { source: 'pasted', pasted: dneg.join('\n'), method: 'exact', alternative: 'less' }, summary: null },
      regression: { inputs: { source: 'reported', estimate: '-0.5', se: '0.2', df: '100', covariateTs: [{ name: 'age', outcomeT: '1.5', treatmentT: '2' }], k: '3' }, summary: null },
    },
    check(paragraphs, bottom) {
      // E-values 3.41 and 2.17 (R: 1/0.5 and 1/0.71 through the closed form, VanderWeele & Ding 2017).
      expect(paragraphs).toContain(`The E-value for the point estimate is ${ref.evalue_protective.eValueEstimate.toFixed(2)}`);
      expect(paragraphs).toContain(`the E-value is ${ref.evalue_protective.eValueInterval.toFixed(2)}`);
      // R wilcox.test(d, alternative = "less", exact = TRUE): p = 0.00488.
      expect(paragraphs).toContain(`gave p = ${ref.pairs_other_way.pLess.toPrecision(3)} in the absence of hidden bias`);
      expect(paragraphs).not.toMatch(/data point the other way/);
      // Regression k = 3 for age: adjusted −0.301 with t = −1.46, inside ±1.984 (R): significance lost, said so.
      expect(paragraphs).toMatch(/leave an adjusted estimate of -0\.301, with t = -1\.46, at or below the 1\.98 needed for significance/);
      expect(bottom.howStrong.length).toBe(3);
    },
  },
];

function allBottom(b: BottomLine): string {
  return [...b.howStrong, ...b.comparedWithMeasured, ...b.wouldChange, ...b.wouldNotChange].join(' ');
}

function appraisalOf(c: Case): Appraisal {
  return createAppraisal(study, c.calculators as Parameters<typeof createAppraisal>[1]);
}

const FORMATS: StatementFormat[] = ['md', 'tex', 'html'];
/** A number that failed to format, in prose: strict for the paragraphs and the bottom line. */
const BROKEN = /NaN|undefined|Infinity|not available|p = <|p = >/;
/** The rendered statement also carries the core's convention texts verbatim (one says "the adjusted t is not available" of capped bounds). */
const BROKEN_RENDERED = /NaN|undefined|Infinity|= not available|: not available|p = <|p = >/;

describe('bottom line and statement, case by case', () => {
  for (const c of cases) {
    describe(c.name, () => {
      const appraisal = appraisalOf(c);
      const statement = buildRobustnessStatement(appraisal);
      const bottom = buildBottomLine(appraisal);
      for (const format of FORMATS) {
        it(`the ${format} statement has no NaN, undefined, Infinity or "not available" in a sentence`, () => {
          const text = renderRobustnessStatement(statement, format);
          expect(text).not.toMatch(BROKEN_RENDERED);
          expect(statement.paragraphs.join(' ')).not.toMatch(BROKEN);
          expect(text.length).toBeGreaterThan(200);
        });
      }
      it('the bottom line has no NaN, undefined, Infinity or "not available" in a sentence', () => {
        expect(bottom.empty).toBe(false);
        expect(allBottom(bottom)).not.toMatch(BROKEN);
      });
      it('each sentence agrees with its number', () => {
        c.check(statement.paragraphs.slice(0, -1).join(' '), bottom);
      });
    });
  }
});

describe('the statement’s assumptions list each convention that applies', () => {
  it('E-value: every convention of the result, in the core’s words', () => {
    const c = cases[0];
    const result = analyseEValue({ measure: 'rr', estimate: 1.1, lower: 0.9, upper: 1.35 });
    const assumptions = buildRobustnessStatement(appraisalOf(c)).assumptions;
    for (const convention of result.conventions) expect(assumptions).toContain(convention.text);
  });
  it('matched pairs: every convention of the result, zero rule and tail method included', () => {
    const result = analysePairs({ data: { kind: 'differences', differences: dneg }, method: 'exact', alternative: 'less' });
    const assumptions = buildRobustnessStatement(appraisalOf(cases[5])).assumptions;
    for (const convention of result.conventions) expect(assumptions).toContain(convention.text);
  });
  it('regression: every convention of the result, the strongest-covariate rule and capped bounds included', () => {
    const result = analyseOvb({ estimate: 0.5, se: 0.2, df: 100, benchmarks: [{ covariate: 'income', outcomeT: 4, treatmentT: 1 }], k: [3], kOutcome: [30] });
    const ids = result.conventions.map((x) => x.id);
    expect(ids).toEqual(expect.arrayContaining(['strongest-covariate', 'capped-bounds', 'benchmark-multiples']));
    const assumptions = buildRobustnessStatement(appraisalOf(cases[4])).assumptions;
    for (const convention of result.conventions) expect(assumptions).toContain(convention.text);
  });
  it('an E-value for a target beyond the estimate lists the target-direction convention', () => {
    const result = analyseEValue({ measure: 'rr', estimate: 1.5, target: 2 });
    const target = result.conventions.find((x) => x.id === 'target-direction');
    expect(target?.text).toMatch(/toward the null/);
    const appraisal = createAppraisal(study, { evalue: { inputs: { source: 'reported', measure: 'rr', estimate: '1.5', target: '2' }, summary: null } } as Parameters<typeof createAppraisal>[1]);
    expect(buildRobustnessStatement(appraisal).assumptions).toContain(target?.text);
  });
});

describe('a regression analysed for confounding away from zero', () => {
  it('says the robustness values describe the other direction, in the statement and the bottom line', () => {
    const appraisal = createAppraisal(study, {
      regression: { inputs: { source: 'reported', estimate: '4.18', se: '1', df: '783', direction: 'away-from-zero' }, summary: null },
    } as Parameters<typeof createAppraisal>[1]);
    // Cinelli & Hazlett 2020 published example: RV 13.9% (t = 4.18, df = 783).
    const paragraphs = buildRobustnessStatement(appraisal).paragraphs.join(' ');
    expect(paragraphs).toContain('The robustness value is 13.9%');
    expect(paragraphs).toMatch(/the robustness values above describe confounding in the other direction/);
    expect(buildBottomLine(appraisal).howStrong.join(' ')).toMatch(/the analysis assumed the opposite/);
  });
});
