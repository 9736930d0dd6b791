/**
 * The labels of the finding being appraised, shared by every calculator so that its text, tables and plots
 * speak of "cycling to work" and "hypertension" rather than "exposure" and "outcome".
 */
export interface StudyLabels {
  /** A short name of the finding, e.g. "Cycling to work and hypertension". */
  readonly finding: string;
  /** The exposure or treatment, e.g. "cycling to work". */
  readonly exposure: string;
  /** The outcome, e.g. "hypertension within 5 years". */
  readonly outcome: string;
  /** Units of a continuous outcome, e.g. "mmHg" (empty when the outcome is binary). */
  readonly units: string;
  /** Where the finding comes from: a citation or a note. */
  readonly source: string;
}

/** A finding's own exposure, outcome and units, where they differ from the study's (empty: the study's). */
export type FindingLabels = Partial<Pick<StudyLabels, 'exposure' | 'outcome' | 'units'>>;

/**
 * The labels one finding speaks with: the study's, with the finding's own exposure, outcome and units where it
 * has them (a paper's mortality hazard ratio and its readmission odds ratio share a study, not an outcome).
 */
export function labelsOfFinding(study: StudyLabels, own: FindingLabels | undefined): StudyLabels {
  if (!own) return study;
  const pick = (mine: string | undefined, theirs: string) => (mine !== undefined && mine.trim() !== '' ? mine : theirs);
  return Object.freeze({ ...study, exposure: pick(own.exposure, study.exposure), outcome: pick(own.outcome, study.outcome), units: pick(own.units, study.units) });
}

export const emptyStudy: StudyLabels = Object.freeze({ finding: '', exposure: '', outcome: '', units: '', source: '' });

/** The exposure's label for prose, or a generic phrase when none was given. */
export function exposureLabel(study: Partial<StudyLabels> | undefined): string {
  return study?.exposure?.trim() || 'the exposure';
}

/** The outcome's label for prose, or a generic phrase when none was given. */
export function outcomeLabel(study: Partial<StudyLabels> | undefined): string {
  return study?.outcome?.trim() || 'the outcome';
}

/** " mmHg" when units are set, for appending to numbers. */
export function unitsSuffix(study: Partial<StudyLabels> | undefined): string {
  const units = study?.units?.trim();
  return units ? ` ${units}` : '';
}

/**
 * The outcome as a bare noun, for phrases that bring their own article ("the odds of a higher …"): the label,
 * or "outcome" when none was given (never "a higher the outcome").
 */
export function outcomeNoun(study: Partial<StudyLabels> | undefined): string {
  return study?.outcome?.trim() || 'outcome';
}

/** The exposure as a bare noun ("the odds of …"): the label, or "treatment" when none was given. */
export function exposureNoun(study: Partial<StudyLabels> | undefined): string {
  return study?.exposure?.trim() || 'treatment';
}
