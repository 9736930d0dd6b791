import type { StudyLabels } from '../../format/studyLabels';
import type { BottomLinePart } from '../methodModule';
import { bottomLineDraft, finishBottomLine } from '../workspaceText';
import type { WeightingSummary } from './summary';
import { formatLambda } from './text';

/**
 * The weighting sentences of the bottom line, in plain words. When the interval at Λ = 1 already includes no
 * effect, that is said first.
 */
export function weightingBottomLine(s: WeightingSummary, study: StudyLabels): BottomLinePart {
  const draft = bottomLineDraft(study);
  const { exposure, outcome, howStrong, wouldChange: change, wouldNotChange: notChange } = draft;
  if (s.effect !== null) {
    if (s.tippingIntervalStatus === 'includes-zero-at-one') {
      howStrong.push(`The weighted comparison of ${exposure} and ${outcome} is inconclusive even without hidden bias: its interval already includes no effect.`);
    }
    const tip = s.tippingIntervalStatus === 'found' ? s.tippingLambdaInterval : null;
    const point = s.tippingPointStatus === 'found' ? s.tippingLambdaPoint : null;
    if (tip !== null) {
      howStrong.push(`In the weighted comparison, the finding holds unless a hidden factor changed some people's odds of ${exposure} by more than ${formatLambda(tip)}-fold.`);
      change.push(`A hidden factor that changed some people's odds of ${exposure} by more than ${formatLambda(tip)}-fold could make the weighted finding inconclusive.`);
      notChange.push(`Hidden factors changing the odds of ${exposure} by less than ${formatLambda(tip)}-fold could not make the weighted finding lose its interval's exclusion of no effect.`);
    } else if (point !== null) {
      change.push(`A hidden factor that changed some people's odds of ${exposure} by more than ${formatLambda(point)}-fold could move the weighted estimate to no effect.`);
    }
    if (s.tippingPointStatus === 'beyond-range') {
      howStrong.push(`The weighted estimate stays away from no effect for every amount of hidden bias examined (up to ${formatLambda(s.searchedUpTo)}-fold).`);
    }
  }
  return finishBottomLine(draft);
}
