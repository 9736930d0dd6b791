import { formatPercent } from '../../format/formatNumber';
import { exposureLabel, outcomeLabel, type StudyLabels } from '../../format/studyLabels';
import type { StatementPart } from '../methodModule';
import { statementCount as int, statementNumber as num } from '../workspaceText';
import type { OvbSummary } from './summary';
import { summaryBenchmarkOutcome, summaryMultiple, summaryShares, summarySignificant, summaryStrongest } from './summaryWords';

/** The reference of the omitted-variable-bias framework in partial R². */
export const OVB_REFERENCE =
  'Cinelli C, Hazlett C. Making sense of sensitivity: extending omitted variable bias. Journal of the Royal Statistical Society, Series B. 2020;82(1):39–67.';

/** The regression paragraph of the robustness statement, or null when there is no robustness value. */
export function ovbStatement(r: OvbSummary, study: StudyLabels, cite: (reference: string) => string): StatementPart | null {
  if (r.rv === null) return null;
  const exposure = exposureLabel(study);
  const outcome = outcomeLabel(study);
  const q = r.q ?? 1;
  const goal = q === 1 ? 'bring the estimate to zero' : `reduce the estimate by ${formatPercent(q, 0)}`;
  const significant = summarySignificant(r);
  const parts: string[] = [];
  if (!significant) {
    parts.push(
      `The regression estimate is not statistically significant at α = ${num(r.alpha)} even before any adjustment for unmeasured confounding (t = ${num(r.t)}), so the data are already compatible with no effect of ${exposure} on ${outcome}.`,
    );
  }
  parts.push(
    `For the linear regression of ${outcome} on ${exposure} and the measured covariates (estimate ${num(r.estimate)}, standard error ${num(r.se)}${r.t === null ? '' : `, t = ${num(r.t)}`}, ${int(r.df)} residual degrees of freedom), ` +
      `we used the omitted-variable-bias framework of Cinelli and Hazlett ${cite(OVB_REFERENCE)}.`,
    `${capitalise(exposure)} explains ${formatPercent(r.partialR2)} of the residual variance of ${outcome} (partial R²).`,
    `The robustness value is ${formatPercent(r.rv)}: an unmeasured confounder explaining at least ${formatPercent(r.rv)} of the residual variance of both ${exposure} and ${outcome} would be strong enough to ${goal}` +
      (significant ? ', while one explaining less of each could not.' : '.'),
  );
  if (r.direction === 'away-from-zero') {
    parts.push('The analysis assumed confounding that hid part of the effect (adjusting for it would move the estimate away from zero), so under that assumption no such confounder could bring the estimate to zero; the robustness values above describe confounding in the other direction.');
  }
  if (r.rvAlpha !== null && significant && r.rvAlpha > 0) {
    parts.push(`A confounder explaining at least ${formatPercent(r.rvAlpha)} of both would make the estimate lose significance at α = ${num(r.alpha)}.`);
  }
  const strongest = summaryStrongest(r);
  if (strongest) {
    parts.push(
      `For comparison, the strongest measured covariate is ${strongest.covariate}; a confounder ${summaryMultiple(strongest)} ${strongest.covariate} would explain ${summaryShares(strongest, exposure, outcome)}, ` +
        `and would ${summaryBenchmarkOutcome(r, strongest)}.`,
    );
  }
  const assumptions = [
    'The bounds assume a linear model and consider the combined linear effect of the omitted confounders.',
    'Benchmark comparisons assume the confounder is related to the treatment and outcome no more strongly, relative to the named covariate, than the stated multiple.',
  ];
  for (const c of r.conventions ?? []) assumptions.push(c.text);
  parts.push(
    'The bounds assume a linear model and consider the combined linear effect of the omitted confounders; benchmark comparisons assume the confounder is related to the treatment and outcome no more strongly, relative to the named covariate, than the stated multiple.',
  );
  return { paragraph: parts.join(' '), assumptions };
}

function capitalise(text: string): string {
  return text.charAt(0).toUpperCase() + text.slice(1);
}
