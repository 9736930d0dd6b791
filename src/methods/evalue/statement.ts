import { CONVERSION_REFERENCES, E_VALUE_REFERENCES } from '../../core/eValueAnalysis';
import { statementCitation } from '../../format/citation';
import { echoTyped, formatNumber } from '../../format/formatNumber';
import { exposureLabel, outcomeLabel, type StudyLabels } from '../../format/studyLabels';
import type { StatementPart } from '../methodModule';
import { statementNumber as num } from '../workspaceText';
import type { EValueSummary } from './summary';

/** The works the E-value paragraph cites: the core's own references, in the statement's reference style. */
export const E_VALUE_STATEMENT_REFERENCES = {
  evalue: statementCitation(E_VALUE_REFERENCES[0]),
  bounding: statementCitation(E_VALUE_REFERENCES[1]),
  orCommon: statementCitation(CONVERSION_REFERENCES['odds-ratio-square-root'] ?? ''),
  hrCommon: statementCitation(CONVERSION_REFERENCES['hazard-ratio-common-outcome'] ?? ''),
} as const;

const MEASURE_NAMES: Record<string, string> = {
  rr: 'risk ratio',
  or: 'odds ratio',
  hr: 'hazard ratio',
  smd: 'standardized mean difference',
  md: 'mean difference',
};

/**
 * The E-value's paragraph of the robustness statement (the numbers, the conversion to the risk-ratio scale, the
 * reference confounders) and the conventions it relies on; null when the summary has no E-value.
 */
export function eValueStatement(e: EValueSummary, study: StudyLabels, cite: (reference: string) => string): StatementPart | null {
  if (e.eValueEstimate === null) return null;
  const refs = E_VALUE_STATEMENT_REFERENCES;
  const exposure = exposureLabel(study);
  const outcome = outcomeLabel(study);
  const measure = MEASURE_NAMES[e.measure] ?? e.measure;
  const unit = e.measure === 'md' && study.units.trim() ? ` ${study.units.trim()}` : '';
  const typed = e.typed;
  const lowerText = echoTyped(e.lower, typed?.lower, num);
  const upperText = echoTyped(e.upper, typed?.upper, num);
  const targetText = echoTyped(e.target, typed?.target, num);
  const interval =
    e.lower !== null && e.upper !== null && e.level !== null ? `, ${num(e.level * 100)}% confidence interval ${lowerText} to ${upperText}${unit}` : '';
  const goal = e.targetIsNull ? 'explain away the observed association' : `shift the estimate to ${targetText}${unit}`;
  const intervalIncludes = e.eValueInterval === 1;
  const atTarget = e.eValueEstimate === 1;
  const parts: string[] = [];
  if (intervalIncludes || atTarget) {
    const what = e.targetIsNull ? 'the null (no association)' : `the target value ${targetText}${unit}`;
    parts.push(
      atTarget
        ? `The estimate equals ${what}, so there is no association for unmeasured confounding to explain away.`
        : `The confidence interval already includes ${what}: even without unmeasured confounding, the data are compatible with ${e.targetIsNull ? 'no association' : 'that value'}.`,
    );
  }
  parts.push(
    `We assessed the sensitivity of the association between ${exposure} and ${outcome} (${measure} ${echoTyped(e.estimate, typed?.estimate, num)}${unit}${interval}) ` +
      `to unmeasured confounding with the E-value ${cite(refs.evalue)}, which builds on the bounding factor of Ding and VanderWeele ${cite(refs.bounding)}.`,
  );
  const assumptions = [
    'The E-value makes no assumption about the number, type or prevalence of unmeasured confounders; it is the minimum joint strength, on the risk-ratio scale, that a confounder would need.',
  ];
  if (e.conversion === 'odds-ratio-square-root') {
    parts.push(`The odds ratio was converted to the risk-ratio scale by its square root because the outcome is common ${cite(refs.orCommon)}.`);
  } else if (e.conversion === 'hazard-ratio-common-outcome') {
    parts.push(`The hazard ratio was converted to the risk-ratio scale with the approximation for a common outcome ${cite(refs.hrCommon)}.`);
  } else if (e.conversion === 'standardized-mean-difference' || e.conversion === 'mean-difference-via-sd') {
    parts.push(`The ${measure} was converted to an approximate risk ratio as exp(0.91·d) ${cite(refs.evalue)}.`);
  } else if (e.conversion === 'odds-ratio-rare-outcome' || e.conversion === 'hazard-ratio-rare-outcome') {
    parts.push(`Because the outcome is rare, the ${measure} was used as an approximate risk ratio.`);
  }
  if (e.conventions && e.conventions.length > 0) {
    for (const c of e.conventions) assumptions.push(c.text);
  } else {
    assumptions.push(...olderFileAssumptions(e, measure));
  }
  if (!atTarget) {
    parts.push(
      `The E-value for the point estimate is ${ratio(e.eValueEstimate)}: to ${goal}, an unmeasured confounder would have to be associated with both ` +
        `${exposure} and ${outcome} by a risk ratio of at least ${ratio(e.eValueEstimate)} each, above and beyond the measured covariates` +
        (intervalIncludes ? '.' : '; weaker confounding could not do so.'),
    );
  }
  if (e.eValueInterval !== null && !intervalIncludes) {
    parts.push(`For the confidence limit closest to ${e.targetIsNull ? 'the null' : 'the target'}, the E-value is ${ratio(e.eValueInterval)}.`);
  }
  if (e.targetDirection === 'away-from-null') {
    parts.push('The target lies beyond the estimate, farther from the null, so these E-values concern confounding that pushed the estimate toward the null (hiding a larger effect).');
  }
  for (const r of (e.references ?? []).filter((ref) => ref.rrExposure !== null && ref.rrOutcome !== null)) {
    parts.push(
      intervalIncludes || atTarget
        ? `A confounder as strongly related to the exposure and outcome as ${r.name} (risk ratios ${ratio(r.rrExposure)} and ${ratio(r.rrOutcome)}) ` +
            `would ${r.explainsEstimate ? '' : 'not '}be strong enough to move the point estimate itself to ${e.targetIsNull ? 'the null' : 'the target'}.`
        : `A confounder as strongly related to the exposure and outcome as ${r.name} (risk ratios ${ratio(r.rrExposure)} and ${ratio(r.rrOutcome)}) ` +
            `${r.explainsEstimate ? 'could' : 'could not'} explain away the estimate${r.explainsInterval === null ? '' : ` and ${r.explainsInterval ? 'could' : 'could not'} move the confidence interval to include the null`}.`,
    );
  }
  return Object.freeze({ paragraph: parts.join(' '), assumptions: Object.freeze(assumptions) });
}

/** The conversion's assumption in words, for a summary saved before conventions were kept. */
function olderFileAssumptions(e: EValueSummary, measure: string): string[] {
  if (e.conversion === 'odds-ratio-square-root') return ['The square root of a common outcome’s odds ratio is an approximate risk ratio.'];
  if (e.conversion === 'hazard-ratio-common-outcome') return ['A common outcome’s hazard ratio is put on the risk-ratio scale by an approximation.'];
  if (e.conversion === 'standardized-mean-difference' || e.conversion === 'mean-difference-via-sd') return ['A standardized mean difference d corresponds approximately to a risk ratio of exp(0.91·d).'];
  if (e.conversion === 'odds-ratio-rare-outcome' || e.conversion === 'hazard-ratio-rare-outcome') return [`For a rare outcome (under about 15%) the ${measure} approximates the risk ratio.`];
  return [];
}

function ratio(value: number | null | undefined): string {
  return formatNumber(value, { digits: 2 });
}
