import type { StudyLabels } from '../format/studyLabels';
import type { MethodModule, MethodSummary } from '../methods/methodModule';
import { METHODS } from '../methods/registry';
import type { Appraisal } from './appraisal';

/** One method's headline numbers as the statement and the bottom line use them, and where they came from. */
export interface CurrentSummary {
  readonly method: MethodModule;
  readonly summary: MethodSummary;
  /** `inputs`: recomputed from the saved inputs now; `saved-file-result`: kept from a file whose rows are not saved. */
  readonly from: 'inputs' | 'saved-file-result';
}

/**
 * The summaries the statement and the bottom line are written from, in registry order. Typed inputs are read
 * and run again now (never a stored summary that may be stale); only a summary of raw data that is not saved
 * (a file) is taken from the appraisal, and then only after its fields are checked.
 */
export function currentSummaries(appraisal: Appraisal): CurrentSummary[] {
  const out: CurrentSummary[] = [];
  for (const method of METHODS) {
    const entry = (appraisal.calculators as Record<string, { inputs: unknown; summary: unknown } | undefined>)[method.id];
    if (!entry) continue;
    const form = method.form.normalise(entry.inputs);
    if (method.workspace.needsData(form)) {
      const saved = method.workspace.readSummary(entry.summary);
      if (saved) out.push({ method, summary: saved, from: 'saved-file-result' });
    } else {
      const summary = method.workspace.summaryFromForm(form);
      if (summary) out.push({ method, summary, from: 'inputs' });
    }
  }
  return out;
}

export type { StudyLabels };
