import type { Appraisal } from './appraisal';
import { currentSummaries } from './currentSummaries';

/**
 * The bottom line for decision-makers: in plain words, how strong a hidden confounder would have to be,
 * compared with the strongest measured covariates where known, what would and would not change the
 * conclusion, and the caution. Each method contributes its sentences (its `workspace.bottomLine`), written
 * from the appraisal's inputs (see `currentSummaries`), never from a stale stored summary.
 */
export interface BottomLine {
  /** One sentence per analysis: how strong a hidden confounder would have to be. */
  readonly howStrong: readonly string[];
  /** Comparisons with measured covariates or known confounders, where given. */
  readonly comparedWithMeasured: readonly string[];
  /** What would change the conclusion. */
  readonly wouldChange: readonly string[];
  /** What would not. */
  readonly wouldNotChange: readonly string[];
  readonly caution: string;
  /** True when no calculator has a result yet. */
  readonly empty: boolean;
}

export const DECISION_CAUTION =
  'A sensitivity analysis bounds how much hidden confounding it would take to change a conclusion; it does not prove ' +
  'that the exposure causes the outcome, and it does not address other problems such as who was studied or how things ' +
  'were measured. Decisions about health or safety defer to domain experts, local guidance and licensed practice.';

export function buildBottomLine(appraisal: Appraisal): BottomLine {
  const howStrong: string[] = [];
  const compared: string[] = [];
  const change: string[] = [];
  const notChange: string[] = [];
  for (const { method, summary } of currentSummaries(appraisal)) {
    const part = method.workspace.bottomLine(summary, appraisal.study);
    howStrong.push(...part.howStrong);
    compared.push(...part.comparedWithMeasured);
    change.push(...part.wouldChange);
    notChange.push(...part.wouldNotChange);
  }
  return Object.freeze({
    howStrong: Object.freeze(howStrong),
    comparedWithMeasured: Object.freeze(compared),
    wouldChange: Object.freeze(change),
    wouldNotChange: Object.freeze(notChange),
    caution: DECISION_CAUTION,
    empty: howStrong.length === 0,
  });
}
