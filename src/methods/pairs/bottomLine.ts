import { formatNumber, pValueClause } from '../../format/formatNumber';
import type { StudyLabels } from '../../format/studyLabels';
import type { BottomLinePart } from '../methodModule';
import { bottomLineDraft, finishBottomLine } from '../workspaceText';
import type { PairsSummary } from './summary';
import { formatGamma } from './text';

/**
 * The matched-pairs sentences of the bottom line for decision-makers, in plain words: how large a hidden
 * difference in the odds of treatment within pairs would overturn the matched comparison. Empty lists when the
 * summary has no p-value.
 */
export function pairsBottomLine(p: PairsSummary, study: StudyLabels): BottomLinePart {
  const draft = bottomLineDraft(study);
  const { exposure, outcome, howStrong, wouldChange: change, wouldNotChange: notChange } = draft;
  if (p.pValue !== null) {
    if (p.sensitivityValue !== null) {
      const g = formatGamma(p.sensitivityValue);
      howStrong.push(
        `In the matched comparison, the finding holds unless a hidden factor made otherwise similar people differ in their chances of ${exposure} by more than ${g} to 1 (Γ = ${g}).`,
      );
      change.push(`A hidden factor that changed the odds of ${exposure} within matched pairs by more than ${g}-fold, and strongly predicted ${outcome}, could overturn the matched comparison.`);
      notChange.push(`Hidden differences in the odds of ${exposure} smaller than ${g}-fold within pairs could not make the matched finding lose significance.`);
    } else if (p.sensitivityStatus === 'not-significant' && p.pointsOtherWay) {
      const direction = p.alternative === 'less' ? 'lowers' : 'raises';
      howStrong.push(
        `In the matched comparison the data point the other way: they give no support to the idea that ${exposure} ${direction} ${outcome} (${pValueClause(p.pValue)}), so there is nothing for hidden bias to explain away. Whether ${exposure} ${p.alternative === 'less' ? 'raises' : 'lowers'} ${outcome} instead would need its own test, chosen before looking at the data.`,
      );
    } else if (p.sensitivityStatus === 'not-significant') {
      howStrong.push(`The matched comparison is not statistically significant even without hidden bias (${pValueClause(p.pValue)}), so it gives no firm evidence of a link on its own and there is nothing for hidden bias to explain away.`);
    } else {
      howStrong.push(`The matched comparison stays significant for every amount of hidden bias examined (up to ${formatNumber(p.searchedUpTo, { digits: 2 })}-fold).`);
    }
  }
  return finishBottomLine(draft);
}
