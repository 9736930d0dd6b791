import { readCsvHeadColumns } from '../../data/csvHead';
import { InputError, inputProblem, type InputProblem } from '../../core/inputProblem';
import type { WeightingResult } from '../../core/weightingAnalysis';
import type { ByteSource } from '../../data/byteSource';
import type { MethodOutcome } from '../methodModule';
import { bootstrapInPieces, finishAnalysis, prepareFromRead, type WeightingAnalysis } from './analysis';
import { readWeightingSettings, type WeightingFormInputs, type WeightingSettings } from './request';
import { readWeightingColumns, type WeightingReadSummary } from './weightingData';
import { runWeightingInWorker } from './weightingWorkerClient';
import type { WeightingProgress, WeightingWorkerRequest } from './weightingWorkerProtocol';

export type { WeightingProgress } from './weightingWorkerProtocol';

/** What reading and analysing the weighting form gives: the result or the problems, and what was read. */
export interface WeightingOutcome extends MethodOutcome {
  readonly result: WeightingResult | null;
  /** The propensity model's coefficient standard errors (intercept first), with the result. */
  readonly standardErrors: readonly (number | null)[];
  readonly problems: readonly InputProblem[];
  readonly started: boolean;
  readonly read: WeightingReadSummary | null;
}

/** What the page does next: show problems at once, or run the worker. */
export type WeightingPlan =
  | { readonly kind: 'done'; readonly outcome: WeightingOutcome }
  | { readonly kind: 'worker'; readonly request: Omit<WeightingWorkerRequest, 'chunkBytes'>; readonly started: boolean };

function outcomeOf(analysis: WeightingAnalysis | null, read: WeightingReadSummary | null, problems: readonly InputProblem[], started: boolean): WeightingOutcome {
  return Object.freeze({
    result: analysis?.result ?? null,
    standardErrors: analysis?.standardErrors ?? Object.freeze([]),
    read,
    problems: Object.freeze([...problems]),
    started,
  });
}

/** The columns of a chosen file, from its first rows, or the reason it cannot be read. */
export const readWeightingFileColumns = readCsvHeadColumns;

/** Guesses the treatment and outcome columns from a header ("treat…", "outcome"/"y"-like names). */
export function guessWeightingColumns(columns: readonly string[]): { treatment: string; outcome: string } {
  const find = (pattern: RegExp) => columns.find((c) => pattern.test(c.trim())) ?? '';
  return { treatment: find(/^(treat|treated|treatment|exposed|exposure)$|treat/i), outcome: find(/^(outcome|y|response)$|outcome/i) };
}

/**
 * The page's controller, first step: reads the form's settings with the request reader and either gives the
 * problems at once or the request for the Web Worker (which reads the file, fits and resamples).
 */
export function planWeighting(form: WeightingFormInputs, file: Blob | null, started: boolean): WeightingPlan {
  const settings = readWeightingSettings(form);
  const problems = [...settings.problems];
  if (!file) problems.push(inputProblem('fileName', 'required', form.fileName ? `choose ${form.fileName} again` : 'choose a CSV file with one row per person'));
  if (problems.length > 0) return { kind: 'done', outcome: outcomeOf(null, null, problems, started) };
  const { problems: _problems, ...rest } = settings;
  return { kind: 'worker', request: { file: file!, settings: rest }, started };
}

/**
 * The page's controller, second step: runs the worker with progress and cancel, and gives the outcome (a
 * cancelled run is the problem `analysis`/`cancelled`; a failure is named by `fileName`).
 */
export async function runWeightingPlan(
  plan: Extract<WeightingPlan, { kind: 'worker' }>,
  options: { readonly signal?: AbortSignal; readonly onProgress?: (progress: WeightingProgress) => void } = {},
): Promise<WeightingOutcome> {
  try {
    const { analysis, read } = await runWeightingInWorker(plan.request, options);
    return outcomeOf(analysis, read, [], plan.started);
  } catch (error) {
    if (error instanceof DOMException && error.name === 'AbortError') {
      return outcomeOf(null, null, [inputProblem('analysis', 'cancelled', 'the analysis was cancelled; change any input or press Run to start again')], plan.started);
    }
    if (error instanceof InputError) return outcomeOf(null, null, error.problems.map(onPage), plan.started);
    return outcomeOf(null, null, [inputProblem('fileName', 'failure', error instanceof Error ? error.message : String(error))], plan.started);
  }
}

/** The reader's `file` problems belong to the form's file field. */
function onPage(p: InputProblem): InputProblem {
  return p.field === 'file' ? inputProblem('fileName', p.code, p.message, p.value) : p;
}

/**
 * The whole page path in this thread (what the worker does): read the stream, prepare, resample in pieces and
 * finish. Used by tests to compare the page's result with the command line's.
 * @throws InputError with the problems, named by form field
 */
export async function analyseWeightingStream(source: ByteSource, settings: WeightingSettings): Promise<{ analysis: WeightingAnalysis; read: WeightingReadSummary }> {
  if (settings.problems.length > 0) throw new InputError(settings.problems);
  const read = await readWeightingColumns(source, settings.columns);
  const prepared = prepareFromRead(settings, read);
  return { analysis: await finishAnalysis(prepared, bootstrapInPieces(prepared)!), read: read.summary };
}
