import { echoTyped, formatNumber } from '../../format/formatNumber';
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
    const intervalIncludes = e.eValueInterval === 1;
    const atTarget = e.eValueEstimate === 1;
    const target = e.targetIsNull ? null : echoTyped(e.target, e.typed?.target, (x) => formatNumber(x, { significant: 3 }));
    const noLink = target === null ? 'no link' : `a value of ${target}`;
    const goal = target === null ? `explain away the link between ${exposure} and ${outcome}` : `move the estimate for ${exposure} and ${outcome} to ${target}`;
    if (atTarget) {
      howStrong.push(`The estimate itself shows ${noLink} between ${exposure} and ${outcome}: there is nothing for a hidden factor to explain away.`);
    } else if (intervalIncludes) {
      howStrong.push(
        `The reported range of plausible values already includes ${noLink}: even without any hidden confounding, the data are compatible with ${target === null ? `no link between ${exposure} and ${outcome}` : 'that value'}.`,
      );
      howStrong.push(`Moving the point estimate itself to ${noLink} would take a hidden factor making both ${exposure} and ${outcome} at least ${ev} times as likely (E-value ${ev}).`);
    } else {
      howStrong.push(
        `To ${goal}, a hidden factor would have to make both ${exposure} and ${outcome} at least ${ev} times as likely (E-value ${ev}), beyond what was already accounted for.`,
      );
      if (e.eValueInterval !== null) {
        change.push(`A hidden factor making both at least ${two(e.eValueInterval)} times as likely could make the result compatible with ${noLink}.`);
      }
      notChange.push(`Hidden factors weaker than ${ev}-fold with both ${exposure} and ${outcome} could not ${target === null ? 'explain the link away' : `move the estimate to ${target}`} on their own.`);
    }
    if (e.targetDirection === 'away-from-null' && !atTarget) {
      howStrong.push('The target lies beyond the estimate: this number concerns hidden confounding that pushed the estimate toward no effect (hiding a larger one).');
    }
    for (const r of e.references ?? []) {
      const strength = `${r.name} (about ${two(r.rrExposure)}-fold with ${exposure} and ${two(r.rrOutcome)}-fold with ${outcome})`;
      compared.push(
        intervalIncludes || atTarget
          ? `${strength}: a hidden factor this strong would ${r.explainsEstimate ? '' : 'not '}be enough to move the point estimate to ${noLink}.`
          : `${strength}: a hidden factor this strong ${r.explainsEstimate ? 'could' : 'could not'} ${target === null ? 'explain the link away' : `move the estimate to ${target}`}.`,
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
