import { formatNumber, formatPercent } from '../../format/formatNumber';
import { exposureLabel, outcomeLabel, type StudyLabels } from '../../format/studyLabels';
import type { BottomLinePart } from '../methodModule';
import type { OvbSummary } from './summary';
import { summaryBenchmarkOutcome, summaryMultiple, summarySignificant, summaryStrongest } from './summaryWords';

/** The regression's sentences of the bottom line, in plain words; empty when there is no robustness value. */
export function ovbBottomLine(r: OvbSummary, study: StudyLabels): BottomLinePart {
  const howStrong: string[] = [];
  const compared: string[] = [];
  const change: string[] = [];
  const notChange: string[] = [];
  if (r.rv !== null) {
    const exposure = exposureLabel(study);
    const outcome = outcomeLabel(study);
    const significant = summarySignificant(r);
    if (!significant) {
      howStrong.push(
        `The regression estimate is not statistically significant even before allowing for any hidden factor: the data are already compatible with no effect of ${exposure} on ${outcome}.`,
      );
    }
    howStrong.push(
      `In the regression, a hidden factor would have to account for at least ${formatPercent(r.rv)} of the otherwise unexplained differences in both ${exposure} and ${outcome} to remove the estimated effect.`,
    );
    if (r.direction === 'away-from-zero') {
      howStrong.push('These numbers describe hidden factors that inflated the estimate; the analysis assumed the opposite (hidden factors that hid part of the effect), under which adjusting would only make the estimate larger.');
    }
    if (significant && r.rvAlpha !== null && r.rvAlpha > 0) {
      change.push(`A hidden factor accounting for ${formatPercent(r.rvAlpha)} or more of both would leave the regression estimate no longer statistically distinguishable from zero.`);
    }
    if (significant) notChange.push(`Hidden factors accounting for less than ${formatPercent(r.rv)} of each could not remove the regression estimate.`);
    const strongest = summaryStrongest(r);
    if (strongest) {
      const outcomeWords = summaryBenchmarkOutcome(r, strongest).replace(/^leave an adjusted estimate of /, `change the estimate from ${formatNumber(r.estimate, { significant: 3 })} to `);
      compared.push(
        `The strongest measured factor is ${strongest.covariate}. A hidden factor ${summaryMultiple(strongest)} it would account for ${formatPercent(strongest.r2dz)} of ${exposure} and ${formatPercent(strongest.r2yz)} of ${outcome} in the same terms, and would ${outcomeWords}.`,
      );
    }
  }
  return Object.freeze({ howStrong, comparedWithMeasured: compared, wouldChange: change, wouldNotChange: notChange });
}
