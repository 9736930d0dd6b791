import type { Appraisal } from './appraisal';
import { currentSummaries } from './currentSummaries';
import { labelsOfFinding } from '../format/studyLabels';

/**
 * The bottom line for decision-makers, finding by finding: in plain words, how strong a hidden confounder would have to be,
 * compared with the strongest measured covariates where known, what would and would not change the
 * conclusion, and the caution. Each method contributes its sentences (its `workspace.bottomLine`), written
 * from the appraisal's inputs (see `currentSummaries`), never from a stale stored summary.
 */
export interface BottomLine {
  /** Each finding with a result, in the appraisal's order, with its own sentences. */
  readonly findings: readonly FindingBottomLine[];
  /**
   * The sentences of every finding in one list each (for plain text): when more than one finding has a result,
   * each sentence starts with its finding's name.
   * One sentence per analysis: how strong a hidden confounder would have to be.
   */
  readonly howStrong: readonly string[];
  /** Comparisons with measured covariates or known confounders, where given. */
  readonly comparedWithMeasured: readonly string[];
  /** What would change the conclusion. */
  readonly wouldChange: readonly string[];
  /** What would not. */
  readonly wouldNotChange: readonly string[];
  readonly caution: string;
  /** True when no finding has a result yet. */
  readonly empty: boolean;
}

/** One finding's sentences of the bottom line. */
export interface FindingBottomLine {
  readonly findingId: string;
  /** The finding's name (or its method and place when it has none). */
  readonly heading: string;
  readonly howStrong: readonly string[];
  readonly comparedWithMeasured: readonly string[];
  readonly wouldChange: readonly string[];
  readonly wouldNotChange: readonly string[];
}

export const DECISION_CAUTION =
  'A sensitivity analysis bounds how much hidden confounding it would take to change a conclusion; it does not prove ' +
  'that the exposure causes the outcome, and it does not address other problems such as who was studied or how things ' +
  'were measured. Decisions about health or safety defer to domain experts, local guidance and licensed practice.';

export function buildBottomLine(appraisal: Appraisal): BottomLine {
  const findings: FindingBottomLine[] = currentSummaries(appraisal).map(({ finding, heading, method, summary }) => {
    const part = method.workspace.bottomLine(summary, labelsOfFinding(appraisal.study, finding.labels));
    return Object.freeze({
      findingId: finding.id,
      heading,
      howStrong: Object.freeze([...part.howStrong]),
      comparedWithMeasured: Object.freeze([...part.comparedWithMeasured]),
      wouldChange: Object.freeze([...part.wouldChange]),
      wouldNotChange: Object.freeze([...part.wouldNotChange]),
    });
  });
  const named = findings.length > 1;
  const all = (pick: (f: FindingBottomLine) => readonly string[]) => Object.freeze(findings.flatMap((f) => pick(f).map((s) => (named ? `${f.heading}: ${s}` : s))));
  return Object.freeze({
    findings: Object.freeze(findings),
    howStrong: all((f) => f.howStrong),
    comparedWithMeasured: all((f) => f.comparedWithMeasured),
    wouldChange: all((f) => f.wouldChange),
    wouldNotChange: all((f) => f.wouldNotChange),
    caution: DECISION_CAUTION,
    empty: findings.every((f) => f.howStrong.length === 0),
  });
}
