import { describe, expect, it } from 'vitest';
import { readAppraisal, createAppraisal, type Appraisal, type Finding } from '../../src/workspace/appraisal';
import { emptyEValueForm, evaluateEValueForm, type EValueFormInputs } from '../../src/methods/evalue/request';
import { emptyOvbForm, evaluateOvbForm, type OvbFormInputs } from '../../src/methods/regression/request';
import { formatNumber, formatPercent } from '../../src/format/formatNumber';
import { buildRobustnessStatement, renderRobustnessStatement } from '../../src/workspace/robustnessStatement';
import { escapeLatex as latex } from '../../src/format/markup';
import { eValueSummary } from '../../src/methods/evalue/summary';
import { analyseEValue } from '../../src/core/eValueAnalysis';
import { buildBottomLine } from '../../src/workspace/bottomLine';
import { readReferenceJson } from '../support/reference';

const rosenbaum = readReferenceJson('rosenbaum.json');
const study = { finding: 'A fictional finding', exposure: 'cycling to work', outcome: 'blood pressure', units: 'mmHg', source: 'invented' };

function appraisal(): Appraisal {
  // The statement is written from the inputs as typed (never from a stored summary).
  // VanderWeele & Ding 2017 worked example: RR 3.9 (95% CI 1.8–8.7) → E-values 7.26 and 3.00
  const e = { source: 'reported', measure: 'rr', estimate: '3.9', lower: '1.8', upper: '8.7' };
  // R 4.2.2 (rosenbaum.json, small_n15): signed-rank sensitivity value 1.6118… (exact), shown floored to 1.611
  const p = { source: 'pasted', pasted: rosenbaum.datasets.small_n15.differences.join('\n'), method: 'exact' };
  // Cinelli & Hazlett 2020 published example: t = 4.18, df = 783 → partial R² 2.2%, RV 13.9%, RV(α = 0.05) 7.6%
  const r = { source: 'reported', estimate: '4.18', se: '1', df: '783' };
  return createAppraisal(study, {
    evalue: { inputs: e, summary: null },
    pairs: { inputs: p, summary: null },
    regression: { inputs: r, summary: null },
  });
}

describe('buildRobustnessStatement', () => {
  const statement = buildRobustnessStatement(appraisal());
  const text = statement.paragraphs.join(' ');

  it('states the E-values, the tipping Γ and the robustness values computed from the inputs', () => {
    expect(text).toContain('E-value for the point estimate is 7.26');
    expect(text).toContain('the E-value is 3.00');
    expect(text).toContain('up to Γ = 1.611');
    expect(text).toContain('The robustness value is 13.9%');
    expect(text).toContain('at least 7.6% of both');
    expect(text).toContain('explains 2.2% of the residual variance');
  });

  it('uses the study labels and ends with the caution', () => {
    expect(text).toContain('between cycling to work and blood pressure');
    expect(statement.paragraphs.at(-1)).toMatch(/do not show that such confounding is absent/);
  });

  it('lists full references to each published method used, numbered as cited', () => {
    expect(statement.references[0]).toMatch(/^VanderWeele TJ, Ding P\. .*Annals of Internal Medicine\. 2017;167\(4\):268–274/);
    expect(statement.references.some((r) => r.includes('Rosenbaum PR. Observational Studies'))).toBe(true);
    expect(statement.references.some((r) => r.includes('Cinelli C, Hazlett C'))).toBe(true);
    expect(text).toContain('[1]');
  });

  it('never shows NaN, undefined or Infinity', () => {
    for (const format of ['md', 'tex', 'html'] as const) expect(renderRobustnessStatement(statement, format)).not.toMatch(/NaN|undefined|Infinity/);
  });

  it('is written from the inputs, never from a stale stored summary (empty forms say nothing)', () => {
    // A summary left over from earlier work (RR 3.9 → 7.26) beside empty inputs must not reach the statement.
    const stale = eValueSummary(analyseEValue({ measure: 'rr', estimate: 3.9, lower: 1.8, upper: 8.7 }));
    const appraisalWithStale = createAppraisal(study, { evalue: { inputs: {}, summary: stale } });
    expect(buildRobustnessStatement(appraisalWithStale).paragraphs.join(' ')).not.toContain('7.26');
    expect(buildBottomLine(appraisalWithStale).empty).toBe(true);
  });

  it('lists the assumptions and conventions of the analyses shown', () => {
    expect(statement.assumptions.length).toBeGreaterThan(0);
    expect(renderRobustnessStatement(statement, 'md')).toContain('### Assumptions and conventions');
  });

  it('says when nothing has been computed', () => {
    const empty = buildRobustnessStatement(createAppraisal(study, {}));
    expect(empty.paragraphs).toHaveLength(1);
    expect(empty.references).toEqual([]);
  });
});

describe('renderRobustnessStatement', () => {
  const statement = buildRobustnessStatement(appraisal());

  it('writes Markdown with a heading and a numbered reference list', () => {
    const md = renderRobustnessStatement(statement, 'md');
    expect(md.startsWith('## Sensitivity to unmeasured confounding: A fictional finding')).toBe(true);
    expect(md).toMatch(/### References\n\n1\. VanderWeele/);
  });

  it('writes LaTeX with special characters escaped and symbols in math mode', () => {
    const tex = renderRobustnessStatement(statement, 'tex');
    expect(tex).toContain('\\subsection*{');
    expect(tex).toContain('13.9\\%');
    expect(tex).toContain('$\\Gamma$ = 1.611');
    expect(tex).toContain('\\begin{enumerate}');
    expect(latex('a_b & 50% {x} R² ≥ 1')).toBe('a\\_b \\& 50\\% \\{x\\} R$^2$ $\\geq$ 1');
  });

  it('writes HTML with text escaped', () => {
    const withMarkup = buildRobustnessStatement(createAppraisal({ ...study, exposure: '<script>x</script>' }, appraisal().findings));
    const out = renderRobustnessStatement(withMarkup, 'html');
    expect(out).toContain('&lt;script&gt;x&lt;/script&gt;');
    expect(out).not.toContain('<script>');
    expect(out).toMatch(/<ol>\n {4}<li>VanderWeele/);
  });
});

describe('buildBottomLine', () => {
  it('says in plain words how strong a hidden factor would have to be, and the caution', () => {
    const line = buildBottomLine(appraisal());
    expect(line.empty).toBe(false);
    expect(line.howStrong[0]).toContain('at least 7.26 times as likely');
    expect(line.howStrong[1]).toContain('by more than 1.611 to 1');
    expect(line.howStrong[2]).toContain('at least 13.9%');
    expect(line.caution).toMatch(/does not prove/);
    expect(line.caution).toMatch(/domain experts, local guidance and licensed practice/);
  });

  it('is empty before any calculator has a result', () => {
    expect(buildBottomLine(createAppraisal(study, {})).empty).toBe(true);
  });
});

describe('an appraisal of several findings of different methods', () => {
  // Three findings of one fictional paper, each named by the reviewer.
  const findings: Finding[] = [
    { id: 'f1', method: 'evalue', name: 'Stroke, odds ratio', inputs: { source: 'reported', measure: 'or', estimate: '2.5', lower: '1.4', upper: '4.5', outcomePrevalence: 'rare' }, summary: null },
    { id: 'f2', method: 'evalue', name: 'Mortality, hazard ratio', inputs: { source: 'reported', measure: 'hr', estimate: '1.9', lower: '1.3', upper: '2.8', outcomePrevalence: 'rare' }, summary: null },
    { id: 'f3', method: 'regression', name: 'Blood pressure, regression coefficient', inputs: { source: 'reported', estimate: '4.18', se: '1', df: '783' }, summary: null },
  ];
  const several = createAppraisal(study, findings);
  const statement = buildRobustnessStatement(several);
  const line = buildBottomLine(several);
  const sectionOf = (id: string) => statement.sections.find((s) => s.findingId === id)!;
  const eValues = (inputs: Record<string, unknown>) => {
    const result = evaluateEValueForm({ ...emptyEValueForm(), ...inputs } as EValueFormInputs, null).result!;
    return [formatNumber(result.eValueEstimate, { digits: 2 }), formatNumber(result.eValueInterval, { digits: 2 })];
  };

  it('has a section per finding, named after it, in the order of the list', () => {
    expect(statement.sections.map((s) => s.heading)).toEqual(['Stroke, odds ratio', 'Mortality, hazard ratio', 'Blood pressure, regression coefficient']);
    const md = renderRobustnessStatement(statement, 'md');
    expect(md).toContain('### Stroke, odds ratio\n\n');
    expect(md.indexOf('### Mortality, hazard ratio')).toBeGreaterThan(md.indexOf('### Stroke, odds ratio'));
    expect(renderRobustnessStatement(statement, 'tex')).toContain('\\paragraph{Blood pressure, regression coefficient}');
    expect(renderRobustnessStatement(statement, 'html')).toContain('<h3>Mortality, hazard ratio</h3>');
  });

  it("gives each finding's own numbers, the same as its calculator's result", () => {
    // Rare outcome: OR ≈ RR; E = RR + √(RR(RR − 1)) (VanderWeele & Ding 2017, eq. for RR > 1), by hand:
    // 2.5 + √(2.5·1.5) = 4.44, and for the lower limit 1.4 + √(1.4·0.4) = 2.15.
    expect(eValues(findings[0].inputs)).toEqual(['4.44', '2.15']);
    expect(sectionOf('f1').paragraph).toContain('E-value for the point estimate is 4.44');
    expect(sectionOf('f1').paragraph).toContain('the E-value is 2.15');
    // Rare outcome: HR ≈ RR; 1.9 + √(1.9·0.9) = 3.21 and 1.3 + √(1.3·0.3) = 1.92 (by hand, same formula).
    expect(eValues(findings[1].inputs)).toEqual(['3.21', '1.92']);
    expect(sectionOf('f2').paragraph).toContain('E-value for the point estimate is 3.21');
    expect(sectionOf('f2').paragraph).toContain('the E-value is 1.92');
    // Cinelli & Hazlett 2020 published example: t = 4.18, df = 783 → partial R² 2.2%, RV 13.9%, RV(α = 0.05) 7.6%.
    const ovb = evaluateOvbForm({ ...emptyOvbForm(), ...findings[2].inputs } as OvbFormInputs, null).result!;
    expect(formatPercent(ovb.rv, 1)).toBe('13.9%');
    expect(sectionOf('f3').paragraph).toContain('The robustness value is 13.9%');
    expect(sectionOf('f3').paragraph).toContain('at least 7.6% of both');
    // No paragraph carries another finding's numbers.
    expect(sectionOf('f1').paragraph).not.toContain('3.21');
    expect(sectionOf('f2').paragraph).not.toContain('4.44');
  });

  it('gathers the assumptions and the references once', () => {
    expect(new Set(statement.assumptions).size).toBe(statement.assumptions.length);
    expect(new Set(statement.references).size).toBe(statement.references.length);
    expect(statement.references.filter((r) => r.startsWith('VanderWeele TJ, Ding P.'))).toHaveLength(1);
    expect(statement.references.some((r) => r.includes('Cinelli C, Hazlett C'))).toBe(true);
    expect(renderRobustnessStatement(statement, 'md').match(/### Assumptions and conventions/g)).toHaveLength(1);
  });

  it('gives the bottom line finding by finding, each sentence with its own numbers', () => {
    expect(line.findings.map((f) => f.heading)).toEqual(['Stroke, odds ratio', 'Mortality, hazard ratio', 'Blood pressure, regression coefficient']);
    expect(line.findings[0].howStrong.join(' ')).toContain('at least 4.44 times as likely');
    expect(line.findings[1].howStrong.join(' ')).toContain('at least 3.21 times as likely');
    expect(line.findings[2].howStrong.join(' ')).toContain('at least 13.9%');
    // The flat list (plain text) names the finding of each sentence.
    expect(line.howStrong[0].startsWith('Stroke, odds ratio: ')).toBe(true);
    expect(line.howStrong.some((s) => s.startsWith('Mortality, hazard ratio: ') && s.includes('3.21'))).toBe(true);
  });

  it('is computed from the inputs: a stale saved summary of a finding is ignored', () => {
    const stale = eValueSummary(analyseEValue({ measure: 'rr', estimate: 3.9, lower: 1.8, upper: 8.7 }));
    const edited = createAppraisal(study, [{ ...findings[1], summary: stale as Finding['summary'] }]);
    expect(buildRobustnessStatement(edited).sections[0].paragraph).toContain('3.21');
    expect(buildRobustnessStatement(edited).sections[0].paragraph).not.toContain('7.26');
  });

  it("speaks of each finding's own outcome and exposure where it has them, of the study's otherwise", () => {
    const own = createAppraisal(study, [
      { ...findings[0], labels: { outcome: 'stroke within 5 years' } },
      { ...findings[1], labels: { outcome: '', exposure: '  ' } },
    ]);
    const statementOwn = buildRobustnessStatement(own);
    expect(statementOwn.sections[0].paragraph).toContain('stroke within 5 years');
    expect(statementOwn.sections[0].paragraph).not.toContain(study.outcome);
    // Empty or blank own labels fall back to the study's.
    expect(statementOwn.sections[1].paragraph).toContain(study.outcome);
    expect(buildBottomLine(own).findings[0].howStrong.join(' ')).toContain('stroke within 5 years');
    // The labels survive a save and a reopen.
    const reread = readAppraisal(JSON.parse(JSON.stringify(own)));
    expect(reread.appraisal?.findings[0].labels).toEqual({ outcome: 'stroke within 5 years' });
  });

  it('names a finding without a name by its method and place', () => {
    const unnamed = buildRobustnessStatement(createAppraisal(study, [{ ...findings[2], name: '  ' }]));
    expect(unnamed.sections[0].heading).toBe('Finding 1 (regression)');
  });
});
