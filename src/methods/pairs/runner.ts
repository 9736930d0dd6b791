import { InputError, type InputProblem } from '../../core/inputProblem';
import { analysePairs, type PairsInput, type PairsResult } from '../../core/pairsAnalysis';
import { CsvChunkReader } from '../../data/csvChunkReader';
import type { MethodOutcome } from '../methodModule';
import { pairsFromCsvText, type PairsRead } from './pairsFromCsv';
import { runPairsInWorker, type PairsWorkerProgress } from './pairsWorkerClient';
import type { PairsReadSummary, PairsWorkerRequest } from './pairsWorkerProtocol';
import { pairsColumnsOf, pairsInputFromForm, readPairsSettings, type PairsFormInputs } from './request';

/** What reading and analysing the matched-pairs form gives: the result or the problems, and what was read. */
export interface PairsOutcome extends MethodOutcome {
  readonly result: PairsResult | null;
  readonly problems: readonly InputProblem[];
  readonly started: boolean;
  /** What was read from a file or a paste box (rows, dropped rows, warnings), without the numbers. */
  readonly read: PairsReadSummary | null;
}

/** The data a form of source `file` needs on the page: the chosen file, and its text when it is small. */
export interface PairsPageData {
  readonly file: Blob | null;
  /** The file's text, read at once when the file is small (`WORKER_FILE_BYTES` or less); null otherwise. */
  readonly fileText: string | null;
}

/** Files larger than this are read in a Web Worker (with progress and cancel). */
export const WORKER_FILE_BYTES = 1 << 20;
/** Analyses with more pairs than this run in a Web Worker unless the tails are normal (exact tails take a while). */
export const WORKER_PAIRS = 300;
/** Discordant counts above this total run in a Web Worker too (the search over Γ is not free for huge counts). */
export const WORKER_DISCORDANT_PAIRS = 1e6;

/** What the page does next: show an outcome at once, or run the worker (reading a large file, or a long analysis). */
export type PairsPlan =
  | { readonly kind: 'done'; readonly outcome: PairsOutcome }
  | {
      readonly kind: 'worker';
      readonly request: Omit<PairsWorkerRequest, 'chunkBytes'>;
      /** What was read already (pasted numbers, a small file), shown with the worker's result. */
      readonly read: PairsReadSummary | null;
      readonly phase: 'reading' | 'analysing';
      readonly started: boolean;
    };

/**
 * The page's controller, first step: reads the form (and the chosen file's text when small) with the request
 * reader, and either analyses at once or says what the Web Worker must do (a file over 1 MB, more than 300
 * pairs with exact tails, or discordant counts above 1e6).
 */
export function planPairs(form: PairsFormInputs, data: PairsPageData, started: boolean): PairsPlan {
  const done = (result: PairsResult | null, read: PairsReadSummary | null, problems: readonly InputProblem[]): PairsPlan => ({
    kind: 'done',
    outcome: Object.freeze({ result, read, problems: Object.freeze([...problems]), started }),
  });
  let read: PairsRead | null = null;
  if (form.source === 'file') {
    if (!data.file) {
      return done(null, null, [{ field: 'file', code: 'required', message: form.fileName ? `choose ${form.fileName} again` : 'choose a CSV file of pairs' }]);
    }
    if (data.fileText === null) {
      const settings = readPairsSettings(form);
      if (settings.problems.length > 0) return done(null, null, settings.problems);
      const { problems: _problems, outcome: _outcome, ...options } = settings;
      return {
        kind: 'worker',
        request: { source: { kind: 'file', file: data.file, columns: pairsColumnsOf(form) }, options },
        read: null,
        phase: 'reading',
        started,
      };
    }
    try {
      read = pairsFromCsvText(data.fileText, pairsColumnsOf(form));
    } catch (error) {
      if (!(error instanceof InputError)) throw error;
      return done(null, null, [...readPairsSettings(form).problems, ...error.problems]);
    }
  }
  const prepared = pairsInputFromForm(form, read);
  const summary = readSummaryOf(prepared.read);
  if (!prepared.input) return done(null, summary, prepared.problems);
  if (needsWorker(prepared.input)) {
    return { kind: 'worker', request: { source: { kind: 'data', data: prepared.input.data }, options: withoutData(prepared.input) }, read: summary, phase: 'analysing', started };
  }
  const [result, problems] = analyseOrProblems(prepared.input);
  return done(result, summary, problems);
}

/**
 * The page's controller, second step: runs the worker of a plan, with progress and cancel, and gives the
 * outcome (a cancelled run is the problem `analysis`/`cancelled`; a failure is named by `file`).
 */
export async function runPairsPlan(
  plan: Extract<PairsPlan, { kind: 'worker' }>,
  options: { readonly signal?: AbortSignal; readonly onProgress?: (progress: PairsWorkerProgress) => void } = {},
): Promise<PairsOutcome> {
  const outcome = (result: PairsResult | null, read: PairsReadSummary | null, problems: readonly InputProblem[]): PairsOutcome =>
    Object.freeze({ result, read, problems: Object.freeze([...problems]), started: plan.started });
  try {
    const { result, read } = await runPairsInWorker(plan.request, options);
    return outcome(result, read ?? plan.read, []);
  } catch (error) {
    if (error instanceof DOMException && error.name === 'AbortError') {
      return outcome(null, null, [{ field: 'analysis', code: 'cancelled', message: 'the analysis was cancelled; change any input to run it again' }]);
    }
    if (error instanceof InputError) return outcome(null, null, error.problems);
    return outcome(null, null, [{ field: 'file', code: 'failure', message: error instanceof Error ? error.message : String(error) }]);
  }
}

/**
 * Reads the form and the pairs already read (a file's, on the command line) and analyses them in this thread.
 * Problems are named by form field.
 */
export function analysePairsForm(form: PairsFormInputs, read: PairsRead | null): PairsOutcome {
  const prepared = pairsInputFromForm(form, read);
  const summary = readSummaryOf(prepared.read);
  const [result, problems] = prepared.input ? analyseOrProblems(prepared.input) : [null, prepared.problems];
  return Object.freeze({ result, read: summary, problems: Object.freeze([...problems]), started: true });
}

/** Whether an analysis input is worth a Web Worker on the page. */
export function needsWorker(input: PairsInput): boolean {
  const data = input.data;
  if (data.kind === 'discordant') {
    const total = data.treatedOnly + data.controlOnly;
    return total > WORKER_DISCORDANT_PAIRS || (input.method === 'exact' && total > WORKER_PAIRS * 100);
  }
  if (data.kind === 'signed-rank-summary') return false;
  const pairs = data.kind === 'differences' ? data.differences.length : data.treated.length;
  return pairs > WORKER_PAIRS && input.method !== 'normal';
}

/** The header row of a CSV sample (its first record), blank names written "column N". */
export function csvHeaderOf(sample: string): string[] {
  let header: string[] = [];
  const reader = new CsvChunkReader((fields, record) => {
    if (record === 1) header = fields.map((f, i) => f.trim() || `column ${i + 1}`);
  });
  reader.push(sample);
  reader.end();
  return header;
}

function analyseOrProblems(input: PairsInput): [PairsResult | null, readonly InputProblem[]] {
  try {
    return [analysePairs(input), []];
  } catch (error) {
    if (!(error instanceof InputError)) throw error;
    return [null, error.problems];
  }
}

function readSummaryOf(read: PairsRead | null): PairsReadSummary | null {
  if (!read) return null;
  const { data: _data, ...rest } = read;
  return rest;
}

function withoutData(input: PairsInput): Omit<PairsInput, 'data'> {
  const { data: _data, ...rest } = input;
  return rest;
}
