import { METHODS } from '../src/methods/registry';
import { batchCellsOfFinding } from '../src/workspace/batchRows';

/** The workspace's tabs: one per method of the registry, then the statement, the bottom line and the batch table. */
export interface ViewInfo {
  readonly id: string;
  readonly tab: string;
  readonly heading: string;
  readonly intro: string;
  /** The calculator element of a method's view. */
  readonly element?: string;
}

export const VIEWS: readonly ViewInfo[] = [
  ...METHODS.map((m) => ({ id: m.id, tab: m.title, heading: m.view.heading, intro: m.view.intro, element: m.view.element })),
  { id: 'statement', tab: 'Robustness statement', heading: 'Robustness statement for a paper', intro: 'A paragraph per finding, named after it, with the numbers, the assumptions each method makes, and full references.' },
  { id: 'bottom-line', tab: 'Bottom line', heading: 'The bottom line: how sure are we?', intro: 'In plain words, finding by finding, for decision-makers.' },
  { id: 'batch', tab: 'Many findings', heading: 'Many reported findings at once', intro: 'For reviewers and evidence synthesis: E-values and robustness values for a table of reported estimates.' },
];

export const METHOD_CHOICES = METHODS.map((m) => ({ id: m.id, title: m.title }));
/** Methods whose finding can be a row of the batch table (a reported estimate or coefficient). */
export const BATCH_METHODS = new Set(METHODS.filter((m) => !('reason' in batchCellsOfFinding(m.id, '', m.form.empty()))).map((m) => m.id));
