import { statementCitation } from '../../format/citation';
import { formatPValue } from '../../format/formatNumber';
import { formatGamma } from '../../format/gammaText';
import { exposureLabel, outcomeLabel, type StudyLabels } from '../../format/studyLabels';
import type { StatementPart } from '../methodModule';
import { statementCount as int, statementNumber as num, unitSuffix } from '../workspaceText';
import type { SetsSummary } from './summary';

/**
 * The matched-sets paragraph of the robustness statement; its references are the result's own (the
 * amplification paper where amplification is used, the others for the method), its assumptions the result's
 * conventions. Null when the summary has no p-value. `cite` numbers a reference and gives its marker ("[2]").
 */
export function setsStatement(p: SetsSummary, study: StudyLabels, cite: (reference: string) => string): StatementPart | null {
  if (p.pValue === null) return null;
  const exposure = exposureLabel(study);
  const outcome = outcomeLabel(study);
  const amplificationReference = p.references.find((r) => /amplification/i.test(r));
  const methodReferences = p.references.filter((r) => r !== amplificationReference);
  const marks = methodReferences.map((r) => cite(statementCitation(r))).join('');
  const direction = p.alternative === 'less' ? 'lowers' : 'raises';
  const test =
    p.outcomeKind === 'binary'
      ? `a one-sided test on the number of treated units with the event (${p.tail === 'exact' ? 'exact tails' : 'normal approximation'})`
      : 'a one-sided m-statistic test with Huber’s ψ (normal approximation)';
  const controls =
    p.controlsLow === null || p.controlsHigh === null
      ? ''
      : p.controlsLow === p.controlsHigh
        ? `, each with one treated unit and ${int(p.controlsLow)} control${p.controlsLow === 1 ? '' : 's'}`
        : `, each with one treated unit and ${int(p.controlsLow)} to ${int(p.controlsHigh)} controls`;
  const parts = [
    `In ${int(p.sets)} matched sets${controls}, ${test} of the hypothesis that ${exposure} ${direction} ${outcome} gave p = ${formatPValue(p.pValue)} in the absence of hidden bias.`,
    `Following Rosenbaum ${marks}, we bounded the p-value under hidden bias Γ, the largest factor by which an unmeasured covariate could make two units of a matched set differ in their odds of ${exposure}.`,
  ];
  if (p.sensitivityValue !== null) {
    const g = formatGamma(p.sensitivityValue);
    parts.push(`The upper bound on the p-value stays at or below α = ${num(p.alpha)} up to Γ = ${g}: the conclusion would hold unless such a covariate changed the odds of ${exposure} within matched sets by a factor of more than ${g}.`);
    const amp = p.amplification.find((a) => a.lambda !== null && a.delta !== null);
    if (amp && amplificationReference) {
      parts.push(
        `By amplification ${cite(statementCitation(amplificationReference))}, Γ = ${g} is equivalent, for example, to an unobserved covariate that multiplies the odds of ${exposure} by ${num(amp.lambda)} and the odds of a ${p.alternative === 'less' ? 'lower' : 'higher'} ${outcome} by ${num(amp.delta)}.`,
      );
    }
  } else if (p.sensitivityStatus === 'beyond-range') {
    parts.push(`The upper bound on the p-value stays at or below α = ${num(p.alpha)} for every Γ up to ${formatGamma(p.searchedUpTo)}, the largest value examined.`);
  } else {
    parts.push(`The finding is not significant at α = ${num(p.alpha)} even without hidden bias, so no sensitivity value is reported.`);
  }
  const unit = unitSuffix(study);
  if (p.estimate !== null) {
    let sentence = `The m-estimate of the effect is ${num(p.estimate)}${unit}`;
    if (p.rangeAt && p.rangeAt.gamma !== null && p.rangeAt.gamma > 1) {
      sentence += `; under hidden bias up to Γ = ${num(p.rangeAt.gamma)} the possible estimates range from ${num(p.rangeAt.estimateLow)} to ${num(p.rangeAt.estimateHigh)}${unit}`;
      if (p.rangeAt.intervalLow !== null && p.rangeAt.intervalHigh !== null) {
        sentence += `, and the ${num((1 - (p.alpha ?? 0.05)) * 100)}% sensitivity interval is ${num(p.rangeAt.intervalLow)} to ${num(p.rangeAt.intervalHigh)}${unit}`;
      }
    }
    parts.push(`${sentence}.`);
  }
  return Object.freeze({ paragraph: parts.join(' '), assumptions: Object.freeze([...p.conventions]) });
}
