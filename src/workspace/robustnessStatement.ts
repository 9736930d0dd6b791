import type { Appraisal } from './appraisal';
import type { EValueSummary, OvbSummary, PairsSummary } from './calculatorSummaries';
import { formatNumber, formatPercent, formatPValue } from '../format/formatNumber';
import { exposureLabel, outcomeLabel } from '../format/studyLabels';
import { formatGamma } from '../methods/pairs/text';

/**
 * The robustness statement: a paragraph per calculator used, ready to paste into the sensitivity-analysis
 * section of a paper, with the numbers, the assumptions each method makes, and full references.
 * Built once as plain Unicode text, then written as Markdown, LaTeX or HTML.
 */
export interface RobustnessStatement {
  readonly title: string;
  readonly paragraphs: readonly string[];
  readonly references: readonly string[];
}

export type StatementFormat = 'md' | 'tex' | 'html';

const REFERENCES = {
  evalue: 'VanderWeele TJ, Ding P. Sensitivity analysis in observational research: introducing the E-value. Annals of Internal Medicine. 2017;167(4):268–274.',
  bounding: 'Ding P, VanderWeele TJ. Sensitivity analysis without assumptions. Epidemiology. 2016;27(3):368–377.',
  orCommon: 'VanderWeele TJ. On a square-root transformation of the odds ratio for a common outcome. Epidemiology. 2017;28(6):e58–e60.',
  hrCommon: 'VanderWeele TJ. Optimal approximate conversions of odds ratios and hazard ratios to risk ratios. Biometrics. 2020;76(3):746–752.',
  rosenbaum: 'Rosenbaum PR. Observational Studies. 2nd ed. New York: Springer; 2002. Chapter 4.',
  hodgesLehmann: 'Rosenbaum PR. Hodges–Lehmann point estimates of treatment effect in observational studies. Journal of the American Statistical Association. 1993;88(424):1250–1253.',
  amplification: 'Rosenbaum PR, Silber JH. Amplification of sensitivity analysis in matched observational studies. Journal of the American Statistical Association. 2009;104(488):1398–1405.',
  ovb: 'Cinelli C, Hazlett C. Making sense of sensitivity: extending omitted variable bias. Journal of the Royal Statistical Society, Series B. 2020;82(1):39–67.',
} as const;

const MEASURE_NAMES: Record<string, string> = {
  rr: 'risk ratio',
  or: 'odds ratio',
  hr: 'hazard ratio',
  smd: 'standardized mean difference',
  md: 'mean difference',
};

/** Writes the statement from an appraisal's summaries; calculators without a result are left out. */
export function buildRobustnessStatement(appraisal: Appraisal): RobustnessStatement {
  const study = appraisal.study;
  const references: string[] = [];
  const cite = (ref: string) => {
    if (!references.includes(ref)) references.push(ref);
    return `[${references.indexOf(ref) + 1}]`;
  };
  const paragraphs: string[] = [];
  const exposure = exposureLabel(study);
  const outcome = outcomeLabel(study);

  const e = appraisal.calculators.evalue?.summary as EValueSummary | null | undefined;
  if (e && e.kind === 'evalue' && e.eValueEstimate !== null) paragraphs.push(eValueParagraph(e, exposure, outcome, study.units, cite));
  const p = appraisal.calculators.pairs?.summary as PairsSummary | null | undefined;
  if (p && p.kind === 'pairs' && p.pValue !== null) paragraphs.push(pairsParagraph(p, exposure, outcome, study.units, cite));
  const r = appraisal.calculators.regression?.summary as OvbSummary | null | undefined;
  if (r && r.kind === 'regression' && r.rv !== null) paragraphs.push(ovbParagraph(r, exposure, outcome, cite));

  if (paragraphs.length === 0) {
    paragraphs.push('No sensitivity analysis has been computed yet: fill in at least one calculator.');
  } else {
    paragraphs.push(
      'These analyses bound how strong unmeasured confounding would have to be to change the conclusions; they do not ' +
        'show that such confounding is absent, nor do they address other sources of bias such as selection, measurement ' +
        'error or model misspecification. Whether a confounder of the strength described is plausible is a judgement for ' +
        'subject-matter experts.',
    );
  }
  const finding = study.finding.trim();
  return Object.freeze({
    title: finding ? `Sensitivity to unmeasured confounding: ${finding}` : 'Sensitivity to unmeasured confounding',
    paragraphs: Object.freeze(paragraphs),
    references: Object.freeze(references),
  });
}

function eValueParagraph(e: EValueSummary, exposure: string, outcome: string, units: string, cite: (r: string) => string): string {
  const measure = MEASURE_NAMES[e.measure] ?? e.measure;
  const unit = e.measure === 'md' && units.trim() ? ` ${units.trim()}` : '';
  const interval =
    e.lower !== null && e.upper !== null && e.level !== null
      ? `, ${num(e.level * 100)}% confidence interval ${num(e.lower)} to ${num(e.upper)}${unit}`
      : '';
  const goal = e.targetIsNull ? 'explain away the observed association' : `shift the estimate to ${num(e.target)}${unit}`;
  const parts = [
    `We assessed the sensitivity of the association between ${exposure} and ${outcome} (${measure} ${num(e.estimate)}${unit}${interval}) ` +
      `to unmeasured confounding with the E-value ${cite(REFERENCES.evalue)}, which builds on the bounding factor of Ding and VanderWeele ${cite(REFERENCES.bounding)}.`,
  ];
  if (e.conversion === 'odds-ratio-square-root') parts.push(`The odds ratio was converted to the risk-ratio scale by its square root because the outcome is common ${cite(REFERENCES.orCommon)}.`);
  else if (e.conversion === 'hazard-ratio-common-outcome') parts.push(`The hazard ratio was converted to the risk-ratio scale with the approximation for a common outcome ${cite(REFERENCES.hrCommon)}.`);
  else if (e.conversion === 'standardized-mean-difference' || e.conversion === 'mean-difference-via-sd') parts.push(`The ${measure} was converted to an approximate risk ratio as exp(0.91·d) ${cite(REFERENCES.evalue)}.`);
  else if (e.conversion === 'odds-ratio-rare-outcome' || e.conversion === 'hazard-ratio-rare-outcome') parts.push(`Because the outcome is rare, the ${measure} was used as an approximate risk ratio.`);
  parts.push(
    `The E-value for the point estimate is ${ratio(e.eValueEstimate)}: to ${goal}, an unmeasured confounder would have to be associated with both ` +
      `${exposure} and ${outcome} by a risk ratio of at least ${ratio(e.eValueEstimate)} each, above and beyond the measured covariates; weaker confounding could not do so.`,
  );
  if (e.eValueInterval !== null) {
    parts.push(
      e.eValueInterval === 1
        ? `The confidence interval already includes ${e.targetIsNull ? 'the null' : 'the target value'}, so its E-value is 1.`
        : `For the confidence limit closest to ${e.targetIsNull ? 'the null' : 'the target'}, the E-value is ${ratio(e.eValueInterval)}.`,
    );
  }
  for (const r of e.references ?? []) {
    parts.push(
      `A confounder as strongly related to the exposure and outcome as ${r.name} (risk ratios ${ratio(r.rrExposure)} and ${ratio(r.rrOutcome)}) ` +
        `${r.explainsEstimate ? 'could' : 'could not'} explain away the estimate${r.explainsInterval === null ? '' : ` and ${r.explainsInterval ? 'could' : 'could not'} move the confidence interval to include the null`}.`,
    );
  }
  parts.push(
    'The E-value makes no assumption about the number, type or prevalence of unmeasured confounders; it is the minimum joint strength, on the risk-ratio scale, that a confounder would need.',
  );
  return parts.join(' ');
}

function pairsParagraph(p: PairsSummary, exposure: string, outcome: string, units: string, cite: (r: string) => string): string {
  const testName = p.test === 'sign' ? 'sign test' : 'Wilcoxon signed-rank test';
  const direction = p.alternative === 'less' ? 'lowers' : 'raises';
  const parts = [
    `In ${int(p.n)} matched pairs, a one-sided ${testName} of the hypothesis that ${exposure} ${direction} ${outcome} gave p = ${formatPValue(p.pValue)} in the absence of hidden bias.`,
    `Following Rosenbaum ${cite(REFERENCES.rosenbaum)}, we bounded the p-value under hidden bias Γ, the largest factor by which an unmeasured covariate could make two matched units differ in their odds of ${exposure}.`,
  ];
  if (p.sensitivityValue !== null) {
    parts.push(
      `The upper bound on the p-value stays at or below α = ${num(p.alpha)} up to Γ = ${gamma(p.sensitivityValue)} (${p.tailMethod === 'exact' ? 'exact bounding distribution' : 'normal approximation'}): ` +
        `the conclusion would hold unless such a covariate changed the odds of ${exposure} within pairs by a factor of more than ${gamma(p.sensitivityValue)}.`,
    );
    const amp = p.amplification?.find((a) => a.lambda !== null && a.delta !== null);
    if (amp) {
      parts.push(
        `By amplification ${cite(REFERENCES.amplification)}, Γ = ${gamma(p.sensitivityValue)} is equivalent, for example, to an unobserved covariate that multiplies the odds of ${exposure} by ${num(amp.lambda)} and the odds of a ${p.alternative === 'less' ? 'lower' : 'higher'} ${outcome} by ${num(amp.delta)}.`,
      );
    }
  } else if (p.sensitivityStatus === 'beyond-range') {
    parts.push(`The upper bound on the p-value stays at or below α = ${num(p.alpha)} for every Γ up to ${gamma(p.searchedUpTo)}, the largest value examined.`);
  } else {
    parts.push(`The finding is not significant at α = ${num(p.alpha)} even without hidden bias, so no sensitivity value is reported.`);
  }
  const unit = units.trim() ? ` ${units.trim()}` : '';
  if (p.estimate !== null) {
    let sentence = `The Hodges–Lehmann estimate of the effect is ${num(p.estimate)}${unit}`;
    if (p.rangeAt && p.rangeAt.gamma !== null && p.rangeAt.gamma > 1) {
      sentence += `; under hidden bias up to Γ = ${num(p.rangeAt.gamma)} the possible estimates range from ${num(p.rangeAt.estimateLow)} to ${num(p.rangeAt.estimateHigh)}${unit}`;
      if (p.rangeAt.intervalLow !== null && p.rangeAt.intervalHigh !== null) {
        sentence += `, and the ${num((1 - (p.alpha ?? 0.05)) * 100)}% sensitivity interval is ${num(p.rangeAt.intervalLow)} to ${num(p.rangeAt.intervalHigh)}${unit}`;
      }
    }
    parts.push(`${sentence} ${cite(REFERENCES.hodgesLehmann)}.`);
  }
  parts.push(
    'The analysis assumes that pairs were matched on the measured covariates and that, within pairs, only an unmeasured covariate could change the odds of treatment; the estimates further assume an additive, constant effect.',
  );
  return parts.join(' ');
}

function ovbParagraph(r: OvbSummary, exposure: string, outcome: string, cite: (ref: string) => string): string {
  const q = r.q ?? 1;
  const goal = q === 1 ? 'bring the estimate to zero' : `reduce the estimate by ${formatPercent(q, 0)}`;
  const parts = [
    `For the linear regression of ${outcome} on ${exposure} and the measured covariates (estimate ${num(r.estimate)}, standard error ${num(r.se)}, t = ${num(r.t)}, ${int(r.df)} residual degrees of freedom), ` +
      `we used the omitted-variable-bias framework of Cinelli and Hazlett ${cite(REFERENCES.ovb)}.`,
    `${capitalise(exposure)} explains ${formatPercent(r.partialR2)} of the residual variance of ${outcome} (partial R²).`,
    `The robustness value is ${formatPercent(r.rv)}: an unmeasured confounder explaining at least ${formatPercent(r.rv)} of the residual variance of both ${exposure} and ${outcome} would be strong enough to ${goal}, while one explaining less of each could not.`,
  ];
  if (r.rvAlpha !== null) {
    parts.push(
      r.rvAlpha === 0
        ? `The estimate is not significant at α = ${num(r.alpha)} even without confounding (robustness value at that level: 0%).`
        : `A confounder explaining at least ${formatPercent(r.rvAlpha)} of both would make the estimate lose significance at α = ${num(r.alpha)}.`,
    );
  }
  const first = r.benchmarks?.find((b) => b.k === 1) ?? r.benchmarks?.[0];
  if (first) {
    const times = first.k === 1 ? 'as strong as' : `${num(first.k)} times as strong as`;
    parts.push(
      `For comparison, a confounder ${times} ${first.covariate} would explain ${formatPercent(first.r2dz)} of the residual variance of ${exposure} and ${formatPercent(first.r2yz)} of ${outcome}, ` +
        `and would leave an adjusted estimate of ${num(first.correctedEstimate)} (t = ${num(first.correctedT)}).`,
    );
  }
  parts.push(
    'The bounds assume a linear model and consider the combined linear effect of the omitted confounders; benchmark comparisons assume the confounder is related to the treatment and outcome no more strongly, relative to the named covariate, than the stated multiple.',
  );
  return parts.join(' ');
}

/** Writes the statement as Markdown, LaTeX or HTML. */
export function renderRobustnessStatement(statement: RobustnessStatement, format: StatementFormat): string {
  switch (format) {
    case 'md':
      return [
        `## ${escapeMarkdown(statement.title)}`,
        '',
        ...statement.paragraphs.flatMap((p) => [escapeMarkdown(p), '']),
        ...(statement.references.length ? ['### References', '', ...statement.references.map((r, i) => `${i + 1}. ${escapeMarkdown(r)}`), ''] : []),
      ].join('\n');
    case 'tex':
      return [
        `\\subsection*{${latex(statement.title)}}`,
        '',
        ...statement.paragraphs.flatMap((p) => [latex(p), '']),
        ...(statement.references.length
          ? ['\\begin{enumerate}', ...statement.references.map((r) => `  \\item ${latex(r)}`), '\\end{enumerate}', '']
          : []),
      ].join('\n');
    case 'html':
      return [
        '<section class="lurk-robustness-statement">',
        `  <h2>${html(statement.title)}</h2>`,
        ...statement.paragraphs.map((p) => `  <p>${html(p)}</p>`),
        ...(statement.references.length
          ? ['  <h3>References</h3>', '  <ol>', ...statement.references.map((r) => `    <li>${html(r)}</li>`), '  </ol>']
          : []),
        '</section>',
        '',
      ].join('\n');
  }
}

export function html(text: string): string {
  return text.replace(/[&<>"']/g, (c) => ({ '&': '&amp;', '<': '&lt;', '>': '&gt;', '"': '&quot;', "'": '&#39;' })[c] as string);
}

/** Markdown: escape the characters that would start emphasis, code or HTML inside prose. */
function escapeMarkdown(text: string): string {
  return text.replace(/([\\`*<])/g, '\\$1').replace(/(^|\s)_/g, '$1\\_');
}

const LATEX_SYMBOLS: Record<string, string> = {
  'Γ': '$\\Gamma$',
  'Λ': '$\\Lambda$',
  'Δ': '$\\Delta$',
  'α': '$\\alpha$',
  'τ': '$\\tau$',
  '²': '$^2$',
  '·': '$\\cdot$',
  '≤': '$\\leq$',
  '≥': '$\\geq$',
  '×': '$\\times$',
  '−': '$-$',
  '–': '--',
  '—': '---',
  '‘': '`',
  '’': "'",
  '“': '``',
  '”': "''",
  '…': '\\ldots{}',
  '%': '\\%',
  '&': '\\&',
  '$': '\\$',
  '#': '\\#',
  _: '\\_',
  '{': '\\{',
  '}': '\\}',
  '~': '\\textasciitilde{}',
  '^': '\\textasciicircum{}',
  '\\': '\\textbackslash{}',
};

/** LaTeX: escape special characters and write Greek letters and symbols in math mode. */
export function latex(text: string): string {
  return [...text].map((c) => LATEX_SYMBOLS[c] ?? c).join('').replace(/\$\$/g, '');
}

function num(value: number | null | undefined): string {
  const text = formatNumber(value, { significant: 3 });
  return /^-?\d+\.\d+$/.test(text) ? text.replace(/\.?0+$/, '') : text;
}

function ratio(value: number | null | undefined): string {
  return formatNumber(value, { digits: 2 });
}

/** A sensitivity value, floored to 3 decimals as everywhere (rounding up would overstate the robustness). */
function gamma(value: number | null | undefined): string {
  return formatGamma(value);
}

function int(value: number | null | undefined): string {
  return value === null || value === undefined || !Number.isFinite(value) ? formatNumber(value) : String(Math.round(value));
}

function capitalise(text: string): string {
  return text.charAt(0).toUpperCase() + text.slice(1);
}
