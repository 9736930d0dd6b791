import { WEIGHTING_ANALYSIS_REFERENCES } from '../../core/weightingAnalysis';
import { statementCitation } from '../../format/citation';
import { exposureLabel, outcomeLabel, type StudyLabels } from '../../format/studyLabels';
import type { StatementPart } from '../methodModule';
import { statementCount as int, statementNumber as num, unitSuffix } from '../workspaceText';
import type { WeightingSummary } from './summary';
import { formatLambda } from './text';

/** The works the weighting paragraph cites (full citations; recalled from memory). */
export const WEIGHTING_REFERENCES = {
  tan: statementCitation(WEIGHTING_ANALYSIS_REFERENCES.find((r) => r.startsWith('Tan Z')) ?? ''),
  zhao: statementCitation(WEIGHTING_ANALYSIS_REFERENCES.find((r) => r.startsWith('Zhao Q, Small DS')) ?? ''),
} as const;

/**
 * The weighting paragraph of the robustness statement. When the interval at Λ = 1 already includes no effect,
 * that comes first. Null when the summary has no estimate.
 */
export function weightingStatement(s: WeightingSummary, study: StudyLabels, cite: (reference: string) => string): StatementPart | null {
  if (s.effect === null) return null;
  const exposure = exposureLabel(study);
  const outcome = outcomeLabel(study);
  const unit = unitSuffix(study);
  const pct = num((1 - (s.alpha ?? 0.05)) * 100);
  const target = s.estimand === 'ate' ? 'average effect' : 'average effect among the treated';
  const parts: string[] = [];
  if (s.tippingIntervalStatus === 'includes-zero-at-one') {
    parts.push(
      `Even before allowing for hidden confounding, the ${pct}% interval of the inverse-probability-weighted ${target} of ${exposure} on ${outcome}` +
        (s.intervalLowAtOne !== null && s.intervalHighAtOne !== null ? ` (${num(s.intervalLowAtOne)} to ${num(s.intervalHighAtOne)}${unit})` : '') +
        ' includes no effect, so the weighted analysis does not by itself establish an effect.',
    );
  }
  parts.push(
    `In ${int(s.used)} people (${int(s.treated)} treated, ${int(s.control)} control), inverse-probability weighting with a logistic propensity model estimated the ${target} of ${exposure} on ${outcome} as ${num(s.effect)}${unit}` +
      (s.intervalLowAtOne !== null && s.intervalHighAtOne !== null && s.tippingIntervalStatus !== 'includes-zero-at-one' ? ` (${pct}% bootstrap interval ${num(s.intervalLowAtOne)} to ${num(s.intervalHighAtOne)}${unit})` : '') +
      '.',
  );
  parts.push(
    `Under the marginal sensitivity model ${cite(WEIGHTING_REFERENCES.tan)}, a hidden factor may change each person's odds of ${exposure} by up to Λ-fold from the fitted odds; we bounded the weighted effect at each Λ and formed percentile-bootstrap sensitivity intervals ${cite(WEIGHTING_REFERENCES.zhao)}.`,
  );
  if (s.tippingPointStatus === 'found') {
    parts.push(`The bounds first include no effect at Λ = ${formatLambda(s.tippingLambdaPoint)}`);
    if (s.tippingIntervalStatus === 'found') parts[parts.length - 1] += `, and the ${pct}% sensitivity interval at Λ = ${formatLambda(s.tippingLambdaInterval)}.`;
    else if (s.tippingIntervalStatus === 'beyond-range') parts[parts.length - 1] += `; the sensitivity interval excludes no effect up to Λ = ${formatLambda(s.searchedUpTo)}.`;
    else parts[parts.length - 1] += '.';
  } else if (s.tippingPointStatus === 'beyond-range') {
    parts.push(`The bounds exclude no effect for every Λ up to ${formatLambda(s.searchedUpTo)}, the largest value examined.`);
  }
  const assumptions = [
    'The weighting analysis assumes that the logistic propensity model is correctly specified for the measured covariates, that every person had some chance of either treatment (overlap), and that a hidden factor acts only through the odds of treatment, by at most Λ-fold for each person.',
  ];
  return Object.freeze({ paragraph: parts.join(' '), assumptions: Object.freeze(assumptions) });
}
