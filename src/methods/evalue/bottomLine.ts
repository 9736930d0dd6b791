import { formatNumber } from '../../format/formatNumber';
import { exposureLabel, outcomeLabel, type StudyLabels } from '../../format/studyLabels';
import type { BottomLinePart } from '../methodModule';
import type { EValueSummary } from './summary';

/**
 * The E-value's sentences of the bottom line, in plain words: how strong a hidden factor would have to be, how the
 * reference confounders compare, and what would and would not change the conclusion. Empty without an E-value.
 */
export function eValueBottomLine(e: EValueSummary, study: StudyLabels): BottomLinePart {
  const howStrong: string[] = [];
  const compared: string[] = [];
  const change: string[] = [];
  const notChange: string[] = [];
  if (e.eValueEstimate !== null) {
    const exposure = exposureLabel(study);
    const outcome = outcomeLabel(study);
    const ev = two(e.eValueEstimate);
    howStrong.push(
      `To explain away the link between ${exposure} and ${outcome}, a hidden factor would have to make both ${exposure} and ${outcome} at least ${ev} times as likely (E-value ${ev}), beyond what was already accounted for.`,
    );
    if (e.eValueInterval !== null) {
      if (e.eValueInterval === 1) {
        change.push(`The reported range of plausible values already includes no effect, so even without any hidden confounding the data are compatible with no link.`);
      } else {
        change.push(`A hidden factor making both at least ${two(e.eValueInterval)} times as likely could make the result compatible with no link.`);
      }
    }
    notChange.push(`Hidden factors weaker than ${ev}-fold with both ${exposure} and ${outcome} could not explain the link away on their own.`);
    for (const r of e.references ?? []) {
      compared.push(
        `${r.name} (about ${two(r.rrExposure)}-fold with ${exposure} and ${two(r.rrOutcome)}-fold with ${outcome}): a hidden factor this strong ${r.explainsEstimate ? 'could' : 'could not'} explain the link away.`,
      );
    }
  }
  return Object.freeze({
    howStrong: Object.freeze(howStrong),
    comparedWithMeasured: Object.freeze(compared),
    wouldChange: Object.freeze(change),
    wouldNotChange: Object.freeze(notChange),
  });
}

function two(value: number | null | undefined): string {
  return formatNumber(value, { digits: 2 });
}
