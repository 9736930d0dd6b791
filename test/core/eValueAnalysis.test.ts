import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import {
  InputError,
  analyseEValue,
  analyseEValueFromCounts,
  eValue,
  validateEValueCountsInput,
  validateEValueInput,
} from '../../src/core';
import type { EValueInput } from '../../src/core';
import { expectClose } from '../support/expectClose';
import { readReferenceJson } from '../support/reference';

interface ReferenceCase {
  id: string;
  measure: 'RR' | 'OR' | 'HR' | 'SMD';
  outcome: 'rare' | 'common' | null;
  estimate: number;
  lower: number | null;
  upper: number | null;
  smd_se: number | null;
  true_value: number;
  rr_scale_estimate: number;
  rr_scale_lower: number | null;
  rr_scale_upper: number | null;
  rr_scale_true: number;
  ratio_to_true_ge1: number;
  evalue_point: number;
  evalue_ci: number | null;
  ci_limit_used: string | null;
}
const reference = readReferenceJson<{ cases: ReferenceCase[] }>('evalues.json');

/** The reference case as our input; `true_value` is only a target for ratio measures (for d the null is 0). */
function referenceInput(c: ReferenceCase): EValueInput {
  const measure = c.measure.toLowerCase() as EValueInput['measure'];
  return {
    measure,
    estimate: c.estimate,
    lower: c.lower,
    upper: c.upper,
    se: c.smd_se,
    outcomePrevalence: c.outcome,
    target: measure === 'smd' ? null : c.true_value,
  };
}

function problemsOf(input: unknown): [string, string][] {
  return validateEValueInput(input as EValueInput).map((p) => [p.field, p.code]);
}

describe('analyseEValue: published example', () => {
  it('RR 3.9 (95% CI 1.8 to 8.7) gives E-values 7.26 and 3.00', () => {
    // VanderWeele & Ding 2017, Ann Intern Med 167:268–274: 7.26 for the estimate, 3.0 for the lower limit
    const result = analyseEValue({ measure: 'rr', estimate: 3.9, lower: 1.8, upper: 8.7 });
    expectClose(result.eValueEstimate, 7.26, { abs: 0.005 });
    expectClose(result.eValueInterval as number, 3.0, { abs: 0.005 });
    expect(result.intervalLimitUsed).toBe('lower');
    expect(result.direction).toBe('above-target');
  });
});

describe('analyseEValue: reference values (test/reference/evalues.json, R 4.2.2)', () => {
  it('holds all 23 cases', () => expect(reference.cases).toHaveLength(23));
  for (const c of reference.cases) {
    it(`${c.id}`, () => {
      // R 4.2.2 closed forms (evalues.json, case ${c.id}); conversions as in its description
      const result = analyseEValue(referenceInput(c));
      expectClose(result.riskRatioScale.estimate, c.rr_scale_estimate, { rel: 1e-14 }, 'RR-scale estimate');
      expectClose(result.riskRatioScale.target, c.rr_scale_true, { rel: 1e-15 }, 'RR-scale target');
      expectClose(result.ratioToTarget, c.ratio_to_true_ge1, { rel: 1e-14 }, 'ratio to target');
      expectClose(result.eValueEstimate, c.evalue_point, { rel: 1e-13 }, 'E-value, estimate');
      if (c.evalue_ci === null) {
        expect(result.eValueInterval).toBeNull();
        expect(result.intervalLimitUsed).toBeNull();
        expect(result.riskRatioScale.lower).toBeNull();
      } else {
        // The fixture's d intervals use the printed 95% multiplier 1.78 (3 significant digits); ours use
        // 0.91·z = 1.7836 (see smd_evalues.json), so for d they agree to the printed precision only.
        const rel = c.measure === 'SMD' && c.smd_se !== null ? 1e-3 : undefined;
        expectClose(result.riskRatioScale.lower as number, c.rr_scale_lower as number, { rel: rel ?? 1e-14 }, 'RR-scale lower');
        expectClose(result.riskRatioScale.upper as number, c.rr_scale_upper as number, { rel: rel ?? 1e-14 }, 'RR-scale upper');
        expectClose(result.eValueInterval as number, c.evalue_ci, { rel: rel ?? 1e-13 }, 'E-value, interval');
        expect(result.intervalLimitUsed).toBe(c.ci_limit_used?.startsWith('none') ? 'none' : c.ci_limit_used);
      }
    });
  }
});

interface SmdCase {
  d: number;
  se: number;
  level: number;
  multiplier: number;
  rr_estimate: number;
  rr_lower: number;
  rr_upper: number;
  evalue_point: number;
  evalue_ci: number;
}
const smdReference = readReferenceJson<{ cases: SmdCase[] }>('smd_evalues.json');

describe('analyseEValue: standardized mean difference with 0.91·z·SE at every level', () => {
  it('the 95% interval multiplier agrees with the published 1.78 to the printed precision', () => {
    // VanderWeele & Ding 2017, Ann Intern Med 167:268–274, Table 2: exp(0.91·d ± 1.78·SE), 1.78 printed to 2 decimals
    const result = analyseEValue({ measure: 'smd', estimate: 0.5, se: 0.1 });
    const halfWidth = Math.log(result.riskRatioScale.upper as number) - 0.91 * 0.5;
    expectClose(halfWidth / 0.1, 1.78, { abs: 0.005 });
  });

  for (const c of smdReference.cases) {
    it(`d ${c.d}, SE ${c.se}, level ${c.level}`, () => {
      // R 4.2.2 base: exp(0.91*d -/+ 0.91*qnorm(1 - (1 - level)/2)*se) (test/reference/smd_evalues.json)
      const result = analyseEValue({ measure: 'smd', estimate: c.d, se: c.se, level: c.level });
      expectClose(result.riskRatioScale.lower as number, c.rr_lower, { rel: 1e-14 }, 'RR-scale lower');
      expectClose(result.riskRatioScale.upper as number, c.rr_upper, { rel: 1e-14 }, 'RR-scale upper');
      expectClose(result.eValueEstimate, c.evalue_point, { rel: 1e-13 }, 'E-value, estimate');
      expectClose(result.eValueInterval as number, c.evalue_ci, { rel: 1e-13 }, 'E-value, interval');
    });
  }

  it('the interval E-value does not jump between the levels 0.95 and 0.9500001', () => {
    // The old 1.78 at exactly 95% made these differ by about 0.3%; continuity in the level: they now differ by
    // about the derivative times 1e-7 (common practice, no source, for the tolerance).
    const at = (level: number) => analyseEValue({ measure: 'smd', estimate: 0.5, se: 0.1, level }).eValueInterval as number;
    expectClose(at(0.9500001), at(0.95), { rel: 1e-5 });
    expectClose(at(0.9499999), at(0.95), { rel: 1e-5 });
  });
});

describe('analyseEValue: intervals from a standard error, hand computations', () => {
  it('a ratio with an SE gets estimate·exp(±z·SE)', () => {
    // hand computation: z = qnorm(0.975) = 1.959963984540054 (recalled from memory); lower = 2·exp(−z·0.2)
    const z = 1.959963984540054;
    const result = analyseEValue({ measure: 'rr', estimate: 2, se: 0.2 });
    expectClose(result.interval?.lower as number, 2 * Math.exp(-z * 0.2), { rel: 1e-14 });
    expectClose(result.interval?.upper as number, 2 * Math.exp(z * 0.2), { rel: 1e-14 });
    expect(result.interval?.source).toBe('standard-error');
    expectClose(result.eValueInterval as number, eValue(2 * Math.exp(-z * 0.2)), { rel: 1e-14 });
  });

  it('a common-outcome odds ratio with an SE converts each limit with √', () => {
    // hand computation: limits 2.5·exp(±z·0.1), each square-rooted (VanderWeele 2017)
    const z = 1.959963984540054;
    const result = analyseEValue({ measure: 'or', estimate: 2.5, se: 0.1, outcomePrevalence: 'common' });
    expectClose(result.riskRatioScale.lower as number, Math.sqrt(2.5 * Math.exp(-z * 0.1)), { rel: 1e-14 });
    expectClose(result.riskRatioScale.upper as number, Math.sqrt(2.5 * Math.exp(z * 0.1)), { rel: 1e-14 });
  });

  it('a standardized mean difference at 99% uses 0.91·z', () => {
    // hand computation: exp(0.91·0.5 − 0.91·qnorm(0.995)·0.1), qnorm(0.995) = 2.5758293035489004 (recalled from memory)
    const result = analyseEValue({ measure: 'smd', estimate: 0.5, se: 0.1, level: 0.99 });
    expectClose(result.riskRatioScale.lower as number, Math.exp(0.455 - 0.91 * 2.5758293035489004 * 0.1), { rel: 1e-14 });
    expectClose(result.riskRatioScale.upper as number, Math.exp(0.455 + 0.91 * 2.5758293035489004 * 0.1), { rel: 1e-14 });
    expect(result.conversion.note).toMatch(/0\.91·z/);
  });

  it('a standardized mean difference with interval limits converts each limit', () => {
    // hand computation: d limits 0.3 and 0.7 → exp(0.273) and exp(0.637)
    const result = analyseEValue({ measure: 'smd', estimate: 0.5, lower: 0.3, upper: 0.7 });
    expectClose(result.riskRatioScale.lower as number, Math.exp(0.273), { rel: 1e-14 });
    expectClose(result.riskRatioScale.upper as number, Math.exp(0.637), { rel: 1e-14 });
  });

  it('a mean difference is divided by the SD, its SE too', () => {
    // hand computation: MD 2.5 with SD 5 and SE 0.5 → d = 0.5 with SE 0.1, the smd_0.5_se_0.1 reference case
    const result = analyseEValue({ measure: 'md', estimate: 2.5, se: 0.5, sd: 5 });
    const smd = smdReference.cases.find((c) => c.d === 0.5 && c.se === 0.1 && c.level === 0.95) as SmdCase;
    // R 4.2.2 base (smd_evalues.json, d 0.5, SE 0.1, level 0.95)
    expectClose(result.eValueEstimate, smd.evalue_point, { rel: 1e-13 });
    expectClose(result.eValueInterval as number, smd.evalue_ci, { rel: 1e-13 });
    expect(result.conversion.kind).toBe('mean-difference-via-sd');
    // hand computation: the interval on the MD's own scale is 2.5 ± z·0.5
    expectClose(result.interval?.lower as number, 2.5 - 1.959963984540054 * 0.5, { rel: 1e-14 });
  });

  it('a named target is converted like the estimate', () => {
    // hand computation: OR 2.5 against target OR 1.44, common outcome → RR 1.5811… against √1.44 = 1.2
    const result = analyseEValue({ measure: 'or', estimate: 2.5, lower: 1.6, upper: 3.9, outcomePrevalence: 'common', target: 1.44 });
    expectClose(result.riskRatioScale.target, 1.2, { rel: 1e-15 });
    expectClose(result.eValueEstimate, eValue(Math.sqrt(2.5) / 1.2), { rel: 1e-14 });
    // √1.6 = 1.2649 > 1.2, so the lower limit is used
    expect(result.intervalLimitUsed).toBe('lower');
    expectClose(result.eValueInterval as number, eValue(Math.sqrt(1.6) / 1.2), { rel: 1e-13 });
    expect(result.targetIsNull).toBe(false);
  });

  it('a target for a mean difference is on the difference scale', () => {
    // hand computation: MD 4, target MD 1, SD 2 → d 2 against d 0.5 → RR exp(1.82)/exp(0.455) = exp(1.365)
    const result = analyseEValue({ measure: 'md', estimate: 4, sd: 2, target: 1 });
    expectClose(result.ratioToTarget, Math.exp(1.365), { rel: 1e-14 });
  });
});

describe('analyseEValue: special values', () => {
  it('an estimate at the null gives 1 for both E-values and the direction at-target', () => {
    const result = analyseEValue({ measure: 'smd', estimate: 0, lower: -0.2, upper: 0.2 });
    expect(result.eValueEstimate).toBe(1);
    expect(result.eValueInterval).toBe(1);
    expect(result.direction).toBe('at-target');
    expect(result.intervalRatioToTarget).toBe(1);
  });

  it('a protective estimate reports the direction and the upper limit', () => {
    const result = analyseEValue({ measure: 'hr', estimate: 0.6, lower: 0.45, upper: 0.8, outcomePrevalence: 'rare' });
    expect(result.direction).toBe('below-target');
    expect(result.intervalLimitUsed).toBe('upper');
    expectClose(result.intervalRatioToTarget as number, 1.25, { rel: 1e-15 });
  });

  it('extreme but representable ratios work; a ratio whose E-value overflows says so', () => {
    const huge = analyseEValue({ measure: 'rr', estimate: 1e300, lower: 1e299, upper: 1e301 });
    expectClose(huge.eValueEstimate, 2e300, { rel: 1e-15 });
    const beyond = analyseEValue({ measure: 'rr', estimate: Number.MAX_VALUE });
    expect(beyond.eValueEstimate).toBe(Infinity);
    expect(beyond.warnings.join(' ')).toMatch(/larger than the largest number/);
  });

  it('results are deeply frozen and self-describing', () => {
    const result = analyseEValue({ measure: 'or', estimate: 2.5, lower: 1.6, upper: 3.9, outcomePrevalence: 'common' });
    expect(Object.isFrozen(result)).toBe(true);
    expect(Object.isFrozen(result.riskRatioScale)).toBe(true);
    expect(Object.isFrozen(result.references)).toBe(true);
    expect(Object.isFrozen(result.input)).toBe(true);
    expect(result.method).toMatch(/odds ratio/);
    expect(result.references.join(' ')).toMatch(/VanderWeele TJ \(2017\)\. On a square-root/);
    expect(result.conversion.kind).toBe('odds-ratio-square-root');
    expect(result.warnings).toEqual([]);
  });

  it('settings that do not apply are reported as warnings, not dropped silently', () => {
    const result = analyseEValue({ measure: 'rr', estimate: 2, outcomePrevalence: 'common', sd: 3 });
    expect(result.warnings).toHaveLength(2);
    expect(result.conversion.kind).toBe('none');
  });
});

const logRatio = fc.double({ min: -8, max: 8, noNaN: true });
const halfWidth = fc.double({ min: 0, max: 4, noNaN: true });

describe('analyseEValue: invariants', () => {
  it('the interval E-value never exceeds the estimate E-value, for every measure', () => {
    fc.assert(
      fc.property(
        fc.constantFrom('rr', 'or', 'hr', 'smd', 'md') as fc.Arbitrary<EValueInput['measure']>,
        fc.constantFrom('rare', 'common') as fc.Arbitrary<'rare' | 'common'>,
        logRatio,
        halfWidth,
        halfWidth,
        (measure, outcomePrevalence, u, down, up) => {
          const ratio = measure === 'rr' || measure === 'or' || measure === 'hr';
          const input: EValueInput = ratio
            ? { measure, estimate: Math.exp(u), lower: Math.exp(u - down), upper: Math.exp(u + up), outcomePrevalence }
            : { measure, estimate: u / 2, lower: (u - down) / 2, upper: (u + up) / 2, sd: measure === 'md' ? 1 : null };
          const result = analyseEValue(input);
          expect(result.eValueInterval as number).toBeLessThanOrEqual(result.eValueEstimate);
          expect(result.eValueInterval as number).toBeGreaterThanOrEqual(1);
        },
      ),
    );
  });

  it('inverting a ratio estimate and its interval leaves both E-values unchanged', () => {
    fc.assert(
      fc.property(logRatio, halfWidth, halfWidth, (u, down, up) => {
        const forward = analyseEValue({ measure: 'rr', estimate: Math.exp(u), lower: Math.exp(u - down), upper: Math.exp(u + up) });
        const inverted = analyseEValue({ measure: 'rr', estimate: Math.exp(-u), lower: Math.exp(-u - up), upper: Math.exp(-u + down) });
        expectClose(inverted.eValueEstimate, forward.eValueEstimate, { rel: 1e-12, abs: 1e-7 });
        expectClose(inverted.eValueInterval as number, forward.eValueInterval as number, { rel: 1e-12, abs: 1e-7 });
      }),
    );
  });
});

describe('validateEValueInput', () => {
  it('accepts a usable input', () => {
    expect(problemsOf({ measure: 'rr', estimate: 2, lower: 1.5, upper: 3 })).toEqual([]);
  });

  it('an estimate outside its interval', () => {
    expect(problemsOf({ measure: 'rr', estimate: 4, lower: 1.5, upper: 3 })).toEqual([['estimate', 'outside-interval']]);
  });

  it('reversed limits', () => {
    expect(problemsOf({ measure: 'rr', estimate: 2, lower: 3, upper: 1.5 })).toEqual([['lower', 'reversed-limits']]);
  });

  it('non-positive ratios: estimate, limits and target', () => {
    expect(problemsOf({ measure: 'or', estimate: 0, lower: -1, upper: 2, outcomePrevalence: 'rare', target: 0 })).toEqual([
      ['estimate', 'not-positive'],
      ['lower', 'not-positive'],
      ['target', 'not-positive'],
    ]);
  });

  it('text or NaN where a number belongs, and infinities', () => {
    expect(problemsOf({ measure: 'rr', estimate: 'two' })).toEqual([['estimate', 'not-a-number']]);
    expect(problemsOf({ measure: 'rr', estimate: NaN })).toEqual([['estimate', 'not-a-number']]);
    expect(problemsOf({ measure: 'rr', estimate: Infinity })).toEqual([['estimate', 'not-finite']]);
    expect(problemsOf({ measure: 'rr', estimate: 2, se: '0.1' })).toEqual([['se', 'not-a-number']]);
  });

  it('a missing estimate, one limit alone, and limits with an SE', () => {
    expect(problemsOf({ measure: 'rr' })).toEqual([['estimate', 'required']]);
    expect(problemsOf({ measure: 'rr', estimate: 2, lower: 1.5 })).toEqual([['upper', 'required']]);
    expect(problemsOf({ measure: 'rr', estimate: 2, upper: 3 })).toEqual([['lower', 'required']]);
    expect(problemsOf({ measure: 'rr', estimate: 2, lower: 1, upper: 3, se: 0.2 })).toEqual([['se', 'interval-and-se']]);
  });

  it('a non-positive SE, an SD or level out of range', () => {
    expect(problemsOf({ measure: 'rr', estimate: 2, se: 0 })).toEqual([['se', 'not-positive']]);
    expect(problemsOf({ measure: 'rr', estimate: 2, se: 0.1, level: 95 })).toEqual([['level', 'outside-range']]);
    expect(problemsOf({ measure: 'rr', estimate: 2, level: 0 })).toEqual([['level', 'outside-range']]);
    expect(problemsOf({ measure: 'md', estimate: 2, sd: -1 })).toEqual([['sd', 'not-positive']]);
  });

  it('a missing SD for a mean difference', () => {
    const problems = validateEValueInput({ measure: 'md', estimate: 2 });
    expect(problems.map((p) => [p.field, p.code])).toEqual([['sd', 'required']]);
  });

  it('a missing or unknown outcome prevalence for odds and hazard ratios', () => {
    const problems = validateEValueInput({ measure: 'or', estimate: 2 });
    expect(problems.map((p) => [p.field, p.code])).toEqual([['outcomePrevalence', 'required']]);
    expect(problems[0].message).toMatch(/rare .*or common/);
    expect(problemsOf({ measure: 'hr', estimate: 2 })).toEqual([['outcomePrevalence', 'required']]);
    expect(problemsOf({ measure: 'hr', estimate: 2, outcomePrevalence: 'sometimes' })).toEqual([['outcomePrevalence', 'unknown-choice']]);
  });

  it('an unknown measure', () => {
    expect(problemsOf({ measure: 'ratio', estimate: 2 })).toEqual([['measure', 'unknown-choice']]);
    expect(problemsOf(null)).toEqual([['input', 'required']]);
  });

  it('differences may be negative; ratios may not', () => {
    expect(problemsOf({ measure: 'smd', estimate: -0.4, lower: -0.7, upper: -0.1 })).toEqual([]);
    expect(problemsOf({ measure: 'rr', estimate: -0.4 })).toEqual([['estimate', 'not-positive']]);
  });

  it('values that cannot be put on the risk-ratio scale', () => {
    expect(problemsOf({ measure: 'smd', estimate: 900 })).toEqual([['estimate', 'too-extreme']]);
    expect(problemsOf({ measure: 'rr', estimate: 2, se: 400 })).toEqual([['se', 'too-extreme']]);
    expect(problemsOf({ measure: 'smd', estimate: 0, target: -1000 })).toEqual([['target', 'too-extreme']]);
  });

  it('reports every problem at once', () => {
    expect(problemsOf({ measure: 'hr', estimate: -1, lower: 2, upper: 1, level: 2 })).toEqual([
      ['estimate', 'not-positive'],
      ['level', 'outside-range'],
      ['lower', 'reversed-limits'],
      ['outcomePrevalence', 'required'],
    ]);
  });

  it('analyseEValue throws an InputError carrying the problems', () => {
    try {
      analyseEValue({ measure: 'rr', estimate: 4, lower: 1.5, upper: 3 });
      expect.unreachable();
    } catch (error) {
      expect(error).toBeInstanceOf(InputError);
      expect((error as InputError).problems[0].field).toBe('estimate');
      expect((error as InputError).message).toMatch(/^estimate: must lie within its interval/);
    }
  });
});

describe('analyseEValueFromCounts', () => {
  it('a 2×2 table gives the risk ratio, its interval and their E-values', () => {
    // hand computation: RR = 2, SE(log RR) = √0.28, lower = 2·exp(−1.959963984540054·√0.28)
    const result = analyseEValueFromCounts({ counts: { a: 10, b: 90, c: 5, d: 95 }, measure: 'rr' });
    expectClose(result.riskRatioScale.estimate, 2, { rel: 1e-15 });
    expectClose(result.eValueEstimate, 2 + Math.SQRT2, { rel: 1e-15 });
    expectClose(result.riskRatioScale.lower as number, 2 * Math.exp(-1.959963984540054 * Math.sqrt(0.28)), { rel: 1e-14 });
    expect(result.table.measure).toBe('rr');
    expect(result.method).toMatch(/2×2 table/);
  });

  it('an odds ratio from a table needs the outcome prevalence and uses it', () => {
    expect(validateEValueCountsInput({ counts: { a: 10, b: 90, c: 5, d: 95 }, measure: 'or' }).map((p) => p.field)).toEqual([
      'outcomePrevalence',
    ]);
    // hand computation: OR = 19/9; a case-control table with a common outcome → √(19/9) (VanderWeele 2017, Epidemiology 28(6):e58–e60)
    const result = analyseEValueFromCounts({ counts: { a: 10, b: 90, c: 5, d: 95 }, measure: 'or', outcomePrevalence: 'common', design: 'case-control' });
    expectClose(result.riskRatioScale.estimate, Math.sqrt(19 / 9), { rel: 1e-15 });
    expect(result.design).toBe('case-control');
    expect(result.table.measure).toBe('or');
    expect(result.conventions.find((c) => c.id === 'study-design')!.text).toMatch(/only its odds ratio is meaningful/);
    // rare outcome: the odds ratio is used as it is, whatever the design
    const rare = analyseEValueFromCounts({ counts: { a: 10, b: 90, c: 5, d: 95 }, measure: 'or', outcomePrevalence: 'rare', design: 'case-control' });
    expectClose(rare.riskRatioScale.estimate, 19 / 9, { rel: 1e-15 });
  });

  it('a cohort table with a common outcome uses its own risk ratio, not √OR of its odds ratio', () => {
    // hand computation: RR = (10/100)/(5/100) = 2; √OR = √(19/9) = 1.453 would understate it
    // (VanderWeele 2017: √OR approximates the risk ratio only when the risk ratio cannot be computed)
    const result = analyseEValueFromCounts({ counts: { a: 10, b: 90, c: 5, d: 95 }, measure: 'or', outcomePrevalence: 'common' });
    expect(result.design).toBe('cohort');
    expect(result.requestedMeasure).toBe('or');
    expect(result.measure).toBe('rr');
    expect(result.table.measure).toBe('rr');
    expectClose(result.riskRatioScale.estimate, 2, { rel: 1e-15 });
    expectClose(result.eValueEstimate, 2 + Math.SQRT2, { rel: 1e-15 });
    expect(result.warnings.join(' ')).toMatch(/own risk ratio was used rather than converting its odds ratio by √OR/);
    expect(result.warnings.join(' ')).not.toMatch(/prevalence applies only/);
    expect(result.conventions.find((c) => c.id === 'study-design')!.text).toMatch(/not the √OR approximation/);
  });

  it('a case-control table refuses the risk ratio, on the field design', () => {
    const problems = validateEValueCountsInput({ counts: { a: 10, b: 90, c: 5, d: 95 }, measure: 'rr', design: 'case-control' });
    expect(problems.map((p) => [p.field, p.code])).toEqual([['design', 'risk-ratio-case-control']]);
    expect(problems[0].message).toMatch(/odds ratio/);
    expect(() => analyseEValueFromCounts({ counts: { a: 10, b: 90, c: 5, d: 95 }, measure: 'rr', design: 'case-control' })).toThrow(InputError);
    expect(validateEValueCountsInput({ counts: { a: 1, b: 2, c: 3, d: 4 }, measure: 'rr', design: 'trial' as never }).map((p) => [p.field, p.code])).toEqual([
      ['design', 'unknown-choice'],
    ]);
  });

  it('a zero cell carries the correction warning into the result', () => {
    const result = analyseEValueFromCounts({ counts: { a: 0, b: 20, c: 5, d: 15 }, measure: 'rr' });
    expect(result.table.zeroCellCorrection).toBe(true);
    expect(result.warnings.join(' ')).toMatch(/0\.5 was added to every cell/);
    expect(result.direction).toBe('below-target');
  });

  it('bad counts are named by cell', () => {
    const problems = validateEValueCountsInput({ counts: { a: -1, b: 2.5, c: 3, d: 4 }, measure: 'rr' });
    expect(problems.map((p) => [p.field, p.code])).toEqual([
      ['counts.a', 'not-a-count'],
      ['counts.b', 'not-a-count'],
    ]);
    expect(validateEValueCountsInput({ counts: { a: 1, b: 2, c: 3, d: 4 }, measure: 'hr' as 'rr' }).map((p) => p.field)).toEqual(['measure']);
    expect(() => analyseEValueFromCounts({ counts: { a: 1, b: 2, c: 3, d: 4 }, measure: 'rr', level: 1.2 })).toThrow(InputError);
  });
});

describe('non-mutation', () => {
  it('analyseEValue and analyseEValueFromCounts accept frozen inputs and leave them as they were', () => {
    const input = Object.freeze({ measure: 'or', estimate: 2.5, lower: 1.6, upper: 3.9, outcomePrevalence: 'common' } as const);
    const copy = { ...input };
    analyseEValue(input);
    expect(input).toEqual(copy);
    const counts = Object.freeze({ a: 0, b: 20, c: 5, d: 15 });
    const tableInput = Object.freeze({ counts, measure: 'rr' } as const);
    analyseEValueFromCounts(tableInput);
    expect(counts).toEqual({ a: 0, b: 20, c: 5, d: 15 });
  });
});

describe('analyseEValue: the direction of the target and the conventions', () => {
  it('a target beyond the estimate refers to confounding that pushed the estimate toward the null', () => {
    // VanderWeele & Ding 2017: E-values against a non-null true value; the direction is ours, stated in words
    const beyond = analyseEValue({ measure: 'rr', estimate: 1.5, lower: 1.2, upper: 1.9, target: 2 });
    expect(beyond.targetDirection).toBe('away-from-null');
    expect(beyond.conventions.find((c) => c.id === 'target-direction')!.text).toMatch(/pushed the estimate toward the null/);
    const between = analyseEValue({ measure: 'rr', estimate: 2, lower: 1.5, upper: 2.6, target: 1.2 });
    expect(between.targetDirection).toBe('toward-null');
    expect(between.conventions.find((c) => c.id === 'target-direction')!.text).toMatch(/pushed the estimate away from the null/);
    expect(analyseEValue({ measure: 'rr', estimate: 0.5 }).targetDirection).toBe('toward-null');
    expect(analyseEValue({ measure: 'rr', estimate: 0.8, target: 0.5 }).targetDirection).toBe('away-from-null');
    expect(analyseEValue({ measure: 'rr', estimate: 1, target: 1.5 }).targetDirection).toBe('away-from-null');
    expect(analyseEValue({ measure: 'rr', estimate: 2, target: 0.5 }).targetDirection).toBe('toward-null');
    const at = analyseEValue({ measure: 'rr', estimate: 1.5, target: 1.5 });
    expect(at.targetDirection).toBeNull();
    expect(at.conventions.map((c) => c.id)).not.toContain('target-direction');
  });

  it('names the conversion conventions: 0.91·d with 0.91·z·SE, √OR for a common outcome', () => {
    const smd = analyseEValue({ measure: 'smd', estimate: 0.5, se: 0.1 });
    expect(smd.conventions.map((c) => c.id)).toEqual(['confounder-strength', 'interval-limit', 'target-direction', 'standardized-mean-difference']);
    expect(smd.conventions[3].text).toMatch(/exp\(0\.91·d\).*0\.91·z·SE\) at every level/);
    const or = analyseEValue({ measure: 'or', estimate: 2.5, lower: 1.6, upper: 3.9, outcomePrevalence: 'common' });
    expect(or.conventions.find((c) => c.id === 'odds-ratio-square-root')!.text).toMatch(/RR ≈ √OR/);
    expect(or.references.join(' ')).toMatch(/square-root transformation of the odds ratio.*Epidemiology 28\(6\):e58–e60/);
    expect(Object.isFrozen(or.conventions)).toBe(true);
    for (const r of [smd, or]) for (const c of r.conventions) expect(c.text).not.toMatch(/NaN|undefined|Infinity/);
  });
});
