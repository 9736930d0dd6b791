import { InputError, type InputProblem } from '../../core/inputProblem';
import { analyseMatchedSets, type MatchedSetsResult } from '../../core/matchedSetsAnalysis';
import type { MethodOutcome } from '../methodModule';
import { setsColumnsOf, setsFormProblem, setsInputFromForm, setsSettingsProblems, type SetsFormInputs } from './request';
import { setsFromCsvText, type SetsRead, type SetsReadSummary } from './setsFromCsv';
import { runSetsInWorker, type SetsWorkerProgress } from './setsWorkerClient';

/** What reading and analysing the matched-sets form gives: the result or the problems, and what was read. */
export interface SetsOutcome extends MethodOutcome {
  readonly result: MatchedSetsResult | null;
  readonly problems: readonly InputProblem[];
  readonly started: boolean;
  /** What was read from the file (rows, missing outcomes, reader's notes), without the values. */
  readonly read: SetsReadSummary | null;
}

/** The data the form needs on the page: the chosen file, and its text when it is small. */
export interface SetsPageData {
  readonly file: Blob | null;
  /** The file's text, read at once when the file is small (`SETS_WORKER_FILE_BYTES` or less); null otherwise. */
  readonly fileText: string | null;
}

/** Files larger than this are read and analysed in a Web Worker (with progress and cancel). */
export const SETS_WORKER_FILE_BYTES = 1 << 20;

/** What the page does next: show an outcome at once, or run the worker on a large file. */
export type SetsPlan =
  | { readonly kind: 'done'; readonly outcome: SetsOutcome }
  | { readonly kind: 'worker'; readonly file: Blob; readonly form: SetsFormInputs; readonly started: boolean };

function outcomeOf(result: MatchedSetsResult | null, read: SetsReadSummary | null, problems: readonly InputProblem[], started: boolean): SetsOutcome {
  return Object.freeze({ result, read, problems: Object.freeze([...problems]), started });
}

/**
 * The page's controller, first step: reads the form (and the chosen file's text when small) with the request
 * reader and analyses at once, or says that the Web Worker must read the file (over 1 MiB).
 */
export function planSets(form: SetsFormInputs, data: SetsPageData, started: boolean): SetsPlan {
  const done = (outcome: SetsOutcome): SetsPlan => ({ kind: 'done', outcome });
  if (!data.file) {
    const settings = setsSettingsProblems(form);
    const message = form.fileName ? `choose ${form.fileName} again` : 'choose a CSV file of matched sets (one row per unit)';
    return done(outcomeOf(null, null, [...settings, { field: 'file', code: 'required', message }], started));
  }
  if (data.fileText === null) {
    const settings = setsSettingsProblems(form);
    if (settings.length > 0) return done(outcomeOf(null, null, settings, started));
    return { kind: 'worker', file: data.file, form, started };
  }
  let read: SetsRead;
  try {
    read = setsFromCsvText(data.fileText, setsColumnsOf(form));
  } catch (error) {
    if (!(error instanceof InputError)) throw error;
    return done(outcomeOf(null, null, [...setsSettingsProblems(form), ...error.problems], started));
  }
  return done({ ...analyseSetsForm(form, read), started });
}

/**
 * The page's controller, second step: runs the worker of a plan, with progress and cancel, and gives the
 * outcome (a cancelled run is the problem `analysis`/`cancelled`; a failure is named by `file`).
 */
export async function runSetsPlan(
  plan: Extract<SetsPlan, { kind: 'worker' }>,
  options: { readonly signal?: AbortSignal; readonly onProgress?: (progress: SetsWorkerProgress) => void } = {},
): Promise<SetsOutcome> {
  try {
    const { result, read } = await runSetsInWorker(plan.file, plan.form, options);
    return outcomeOf(result, read, [], plan.started);
  } catch (error) {
    if (error instanceof DOMException && error.name === 'AbortError') {
      return outcomeOf(null, null, [{ field: 'analysis', code: 'cancelled', message: 'the analysis was cancelled; change any input to run it again' }], plan.started);
    }
    if (error instanceof InputError) return outcomeOf(null, null, error.problems, plan.started);
    return outcomeOf(null, null, [{ field: 'file', code: 'failure', message: error instanceof Error ? error.message : String(error) }], plan.started);
  }
}

/**
 * Reads the form and the rows already read from its file, and analyses them in this thread (the command line,
 * the worker, small files on the page). Problems are named by form field.
 */
export function analyseSetsForm(form: SetsFormInputs, read: SetsRead | null): SetsOutcome {
  const prepared = setsInputFromForm(form, read);
  const summary = read ? readSummaryOf(read) : null;
  if (!prepared.input) return outcomeOf(null, summary, prepared.problems, true);
  try {
    return outcomeOf(analyseMatchedSets(prepared.input), summary, [], true);
  } catch (error) {
    if (!(error instanceof InputError)) throw error;
    return outcomeOf(null, summary, error.problems.map(setsFormProblem), true);
  }
}

function readSummaryOf(read: SetsRead): SetsReadSummary {
  const { data: _data, ...rest } = read;
  return rest;
}

export { csvHeaderOf } from '../pairs/runner';
