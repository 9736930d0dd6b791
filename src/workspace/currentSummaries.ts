import type { StudyLabels } from '../format/studyLabels';
import type { MethodModule, MethodSummary } from '../methods/methodModule';
import { methodById } from '../methods/registry';
import type { Appraisal, Finding } from './appraisal';

/** One finding's headline numbers as the statement and the bottom line use them, and where they came from. */
export interface CurrentSummary {
  readonly finding: Finding;
  /** What the finding is called in the statement and the bottom line: its name, else its method and place. */
  readonly heading: string;
  readonly method: MethodModule;
  readonly summary: MethodSummary;
  /** `inputs`: recomputed from the saved inputs now; `saved-file-result`: kept from a file whose rows are not saved. */
  readonly from: 'inputs' | 'saved-file-result';
}

/** What a finding is called in the statement and the bottom line: its name, or its method's title and number. */
export function findingHeading(finding: Finding, index: number): string {
  const name = finding.name.trim();
  if (name !== '') return name;
  return `Finding ${index + 1} (${methodById(finding.method)?.title.toLowerCase() ?? finding.method})`;
}

/**
 * The summaries the statement and the bottom line are written from, one per finding with a result, in the
 * appraisal's order. Typed inputs are read and run again now (never a stored summary that may be stale); only a
 * summary of raw data that is not saved (a file) is taken from the appraisal, and then only after its fields are
 * checked.
 */
export function currentSummaries(appraisal: Appraisal): CurrentSummary[] {
  const out: CurrentSummary[] = [];
  for (const [index, finding] of appraisal.findings.entries()) {
    const method = methodById(finding.method);
    if (!method) continue;
    const heading = findingHeading(finding, index);
    const form = method.form.normalise(finding.inputs);
    if (method.workspace.needsData(form)) {
      const saved = method.workspace.readSummary(finding.summary);
      if (saved) out.push({ finding, heading, method, summary: saved, from: 'saved-file-result' });
    } else {
      const summary = method.workspace.summaryFromForm(form);
      if (summary) out.push({ finding, heading, method, summary, from: 'inputs' });
    }
  }
  return out;
}

/** Findings saved with a result (a summary) that give none now: their inputs have problems, or their saved result cannot be read. */
export function findingsWithoutResult(appraisal: Appraisal): Finding[] {
  const shown = new Set(currentSummaries(appraisal).map((s) => s.finding));
  return appraisal.findings.filter((f) => f.summary !== null && !shown.has(f));
}

export type { StudyLabels };
