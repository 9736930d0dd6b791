import { formatNumber } from '../format/formatNumber';
import { exposureLabel, outcomeLabel, type StudyLabels } from '../format/studyLabels';
import type { BottomLinePart } from './methodModule';

/** A number in a robustness statement: three significant digits, without trailing zeros after the point. */
export function statementNumber(value: number | null | undefined): string {
  const text = formatNumber(value, { significant: 3 });
  return /^-?\d+\.\d+$/.test(text) ? text.replace(/\.?0+$/, '') : text;
}

/** A count in a robustness statement: rounded to a whole number (a missing or non-finite count as formatNumber words it). */
export function statementCount(value: number | null | undefined): string {
  return value === null || value === undefined || !Number.isFinite(value) ? formatNumber(value) : String(Math.round(value));
}

/** The study's units after a number (" mmHg"), or "" when the study names none. */
export function unitSuffix(study: StudyLabels): string {
  return study.units.trim() ? ` ${study.units.trim()}` : '';
}

/** The sentence lists of a method's bottom line, being written, with the study's exposure and outcome words. */
export interface BottomLineDraft {
  readonly exposure: string;
  readonly outcome: string;
  readonly howStrong: string[];
  readonly comparedWithMeasured: string[];
  readonly wouldChange: string[];
  readonly wouldNotChange: string[];
}

/** An empty bottom-line draft for a study. */
export function bottomLineDraft(study: StudyLabels): BottomLineDraft {
  return { exposure: exposureLabel(study), outcome: outcomeLabel(study), howStrong: [], comparedWithMeasured: [], wouldChange: [], wouldNotChange: [] };
}

/** A finished bottom line: the draft's sentence lists, frozen. */
export function finishBottomLine(draft: Omit<BottomLineDraft, 'exposure' | 'outcome'>): BottomLinePart {
  return Object.freeze({
    howStrong: Object.freeze([...draft.howStrong]),
    comparedWithMeasured: Object.freeze([...draft.comparedWithMeasured]),
    wouldChange: Object.freeze([...draft.wouldChange]),
    wouldNotChange: Object.freeze([...draft.wouldNotChange]),
  });
}
