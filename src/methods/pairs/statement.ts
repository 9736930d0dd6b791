import { PAIRS_ANALYSIS_REFERENCES } from '../../core/pairsAnalysis';
import { statementCitation } from '../../format/citation';
import { pValueClause } from '../../format/formatNumber';
import { exposureLabel, outcomeLabel, outcomeNoun, type StudyLabels } from '../../format/studyLabels';
import type { StatementPart } from '../methodModule';
import { statementCount as int, statementNumber as num, unitSuffix } from '../workspaceText';
import type { PairsSummary } from './summary';
import { formatGamma } from './text';

/** The works the matched-pairs paragraph cites (full citations). */
export const PAIRS_REFERENCES = {
  rosenbaum: coreReference(/Observational Studies/),
  hodgesLehmann: coreReference(/Hodges–Lehmann/),
  amplification: coreReference(/Amplification/),
} as const;

/** One of the core's own references of the matched-pairs analysis, in the statement's reference style. */
function coreReference(pattern: RegExp): string {
  return statementCitation(PAIRS_ANALYSIS_REFERENCES.find((r) => pattern.test(r)) ?? '');
}

/**
 * The matched-pairs paragraph of the robustness statement, with the conventions it relies on; null when the
 * summary has no p-value. `cite` numbers a reference and gives its marker ("[2]").
 */
export function pairsStatement(p: PairsSummary, study: StudyLabels, cite: (reference: string) => string): StatementPart | null {
  if (p.pValue === null) return null;
  const exposure = exposureLabel(study);
  const outcome = outcomeLabel(study);
  const testName = p.test === 'sign' ? 'sign test' : 'Wilcoxon signed-rank test';
  const direction = p.alternative === 'less' ? 'lowers' : 'raises';
  const unit = unitSuffix(study);
  const parts: string[] = [];
  if (p.sensitivityStatus === 'not-significant') {
    parts.push(
      p.pointsOtherWay
        ? `The data point the other way: ${p.estimate !== null ? `the Hodges–Lehmann estimate, ${num(p.estimate)}${unit}, is opposite in sign to` : 'most informative pairs go against'} the hypothesis that ${exposure} ${direction} ${outcome}, so the matched comparison gives no evidence for it (${pValueClause(p.pValue)}) and there is no finding for hidden bias to explain away; the opposite direction would need its own, pre-specified test.`
        : `The matched comparison is not statistically significant at α = ${num(p.alpha)} even without hidden bias (${pValueClause(p.pValue)}), so there is no finding for hidden bias to explain away.`,
    );
  }
  parts.push(
    `In ${int(p.n)} matched pairs, a one-sided ${testName} of the hypothesis that ${exposure} ${direction} ${outcome} gave ${pValueClause(p.pValue)} in the absence of hidden bias.`,
    `Following Rosenbaum ${cite(PAIRS_REFERENCES.rosenbaum)}, we bounded the p-value under hidden bias Γ, the largest factor by which an unmeasured covariate could make two matched units differ in their odds of ${exposure}.`,
  );
  if (p.sensitivityValue !== null) {
    parts.push(
      `The upper bound on the p-value stays at or below α = ${num(p.alpha)} up to Γ = ${formatGamma(p.sensitivityValue)} (${p.tailMethod === 'exact' ? 'exact bounding distribution' : (p.tailMethodReason ?? 'normal approximation')}): ` +
        `the conclusion would hold unless such a covariate changed the odds of ${exposure} within pairs by a factor of more than ${formatGamma(p.sensitivityValue)}.`,
    );
    const amp = p.amplification?.find((a) => a.lambda !== null && a.delta !== null);
    if (amp) {
      parts.push(
        `By amplification ${cite(PAIRS_REFERENCES.amplification)}, Γ = ${formatGamma(p.sensitivityValue)} is equivalent, for example, to an unobserved covariate that multiplies the odds of ${exposure} by ${num(amp.lambda)} and the odds of a ${p.alternative === 'less' ? 'lower' : 'higher'} ${outcomeNoun(study)} by ${num(amp.delta)}.`,
      );
    }
  } else if (p.sensitivityStatus === 'beyond-range') {
    parts.push(`The upper bound on the p-value stays at or below α = ${num(p.alpha)} for every Γ up to ${formatGamma(p.searchedUpTo)}, the largest value examined.`);
  } else {
    parts.push('No sensitivity value is reported, because the finding is not significant at Γ = 1.');
  }
  if (p.estimate !== null) {
    let sentence = `The Hodges–Lehmann estimate of the effect is ${num(p.estimate)}${unit}`;
    if (p.rangeAt && p.rangeAt.gamma !== null && p.rangeAt.gamma > 1 && p.rangeAt.estimateLow !== null && p.rangeAt.estimateHigh !== null) {
      sentence += `; under hidden bias up to Γ = ${num(p.rangeAt.gamma)} the possible estimates range from ${num(p.rangeAt.estimateLow)} to ${num(p.rangeAt.estimateHigh)}${unit}`;
      if (p.rangeAt.intervalLow !== null && p.rangeAt.intervalHigh !== null) {
        sentence += `, and the ${num((1 - (p.alpha ?? 0.05)) * 100)}% sensitivity interval is ${num(p.rangeAt.intervalLow)} to ${num(p.rangeAt.intervalHigh)}${unit}`;
      }
    }
    parts.push(`${sentence} ${cite(PAIRS_REFERENCES.hodgesLehmann)}.`);
  }
  const assumptions = [
    'The matched-pairs analysis assumes that pairs were matched on the measured covariates and that, within pairs, only an unmeasured covariate could change the odds of treatment.',
  ];
  if (p.estimate !== null) assumptions.push('The Hodges–Lehmann estimates and sensitivity intervals further assume an additive, constant effect.');
  for (const c of p.conventions ?? []) assumptions.push(c.text);
  return Object.freeze({ paragraph: parts.join(' '), assumptions: Object.freeze(assumptions) });
}
