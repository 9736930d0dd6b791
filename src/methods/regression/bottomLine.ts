import { formatNumber, formatPercent } from '../../format/formatNumber';
import { exposureLabel, outcomeLabel, type StudyLabels } from '../../format/studyLabels';
import type { BottomLinePart } from '../methodModule';
import type { OvbSummary } from './summary';

/** The regression's sentences of the bottom line, in plain words; empty when there is no robustness value. */
export function ovbBottomLine(r: OvbSummary, study: StudyLabels): BottomLinePart {
  const howStrong: string[] = [];
  const compared: string[] = [];
  const change: string[] = [];
  const notChange: string[] = [];
  if (r.rv !== null) {
    const exposure = exposureLabel(study);
    const outcome = outcomeLabel(study);
    howStrong.push(
      `In the regression, a hidden factor would have to account for at least ${formatPercent(r.rv)} of the otherwise unexplained differences in both ${exposure} and ${outcome} to remove the estimated effect.`,
    );
    if (r.rvAlpha !== null && r.rvAlpha > 0) {
      change.push(`A hidden factor accounting for ${formatPercent(r.rvAlpha)} or more of both would leave the regression estimate no longer statistically distinguishable from zero.`);
    }
    notChange.push(`Hidden factors accounting for less than ${formatPercent(r.rv)} of each could not remove the regression estimate.`);
    const strongest = strongestBenchmark(r);
    if (strongest) {
      compared.push(
        `The strongest measured factor, ${strongest.covariate}, accounts for ${formatPercent(strongest.r2dz)} of ${exposure} and ${formatPercent(strongest.r2yz)} of ${outcome} in the same terms; a hidden factor as strong would change the estimate from ${formatNumber(r.estimate, { significant: 3 })} to ${formatNumber(strongest.correctedEstimate, { significant: 3 })}.`,
      );
    }
  }
  return Object.freeze({ howStrong, comparedWithMeasured: compared, wouldChange: change, wouldNotChange: notChange });
}

/** The benchmark at k = 1 with the largest adjusted change (the strongest measured covariate). */
function strongestBenchmark(r: OvbSummary) {
  const atOne = (r.benchmarks ?? []).filter((b) => b.k === 1 && b.correctedEstimate !== null && b.r2dz !== null && b.r2yz !== null);
  if (atOne.length === 0) return undefined;
  return atOne.reduce((best, b) => (Math.abs((r.estimate ?? 0) - (b.correctedEstimate ?? 0)) > Math.abs((r.estimate ?? 0) - (best.correctedEstimate ?? 0)) ? b : best));
}
