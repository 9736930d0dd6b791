import { formatNumber } from '../../format/formatNumber';
import { formatGamma } from '../../format/gammaText';
import type { StudyLabels } from '../../format/studyLabels';
import type { BottomLinePart } from '../methodModule';
import { bottomLineDraft, finishBottomLine } from '../workspaceText';
import type { SetsSummary } from './summary';

/**
 * The matched-sets sentences of the bottom line for decision-makers, in plain words. When the comparison is not
 * significant even without hidden bias, that is said first and nothing is said about what hidden bias could or
 * could not do (there is no finding to explain away). Empty lists when the summary has no p-value.
 */
export function setsBottomLine(p: SetsSummary, study: StudyLabels): BottomLinePart {
  const draft = bottomLineDraft(study);
  const { exposure, outcome, howStrong, wouldChange: change, wouldNotChange: notChange } = draft;
  if (p.pValue !== null) {
    if (p.sensitivityStatus === 'not-significant' || (p.sensitivityValue === null && p.sensitivityStatus !== 'beyond-range')) {
      howStrong.push('The matched-sets comparison is not statistically significant even without any hidden bias, so on its own it gives no firm evidence of a link.');
    } else if (p.sensitivityValue !== null) {
      const g = formatGamma(p.sensitivityValue);
      howStrong.push(
        `In the matched-sets comparison, the finding holds unless a hidden factor made otherwise similar people in the same matched set differ in their chances of ${exposure} by more than ${g} to 1 (Γ = ${g}).`,
      );
      change.push(`A hidden factor that changed the odds of ${exposure} within matched sets by more than ${g}-fold, and strongly predicted ${outcome}, could overturn the matched comparison.`);
      notChange.push(`Hidden differences in the odds of ${exposure} smaller than ${g}-fold within matched sets could not make the matched finding lose significance.`);
    } else {
      const top = formatNumber(p.searchedUpTo, { digits: 2 });
      howStrong.push(`The matched-sets comparison stays significant for every amount of hidden bias examined (up to ${top}-fold).`);
      notChange.push(`Hidden differences in the odds of ${exposure} of up to ${top}-fold within matched sets could not make the matched finding lose significance.`);
    }
  }
  return finishBottomLine(draft);
}
