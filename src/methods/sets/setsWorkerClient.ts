import type { MatchedSetsResult } from '../../core/matchedSetsAnalysis';
import { deepFreeze, runWorkerTask } from '../../data/webWorkerTask';
import type { SetsFormInputs } from './request';
import type { SetsReadSummary } from './setsFromCsv';
import type { SetsWorkerReply, SetsWorkerRequest } from './setsWorkerProtocol';

export interface SetsWorkerProgress {
  readonly phase: 'reading' | 'analysing';
  readonly bytesRead: number;
  readonly totalBytes: number | null;
  readonly rowsRead: number;
}

export interface SetsWorkerOptions {
  readonly onProgress?: (progress: SetsWorkerProgress) => void;
  /** Aborting stops the worker at once; the promise rejects with an `AbortError` DOMException. */
  readonly signal?: AbortSignal;
  readonly chunkBytes?: number;
}

/**
 * Reads a CSV of matched sets and runs the analysis in a Web Worker, with progress and cancel.
 * @throws InputError with the problems found (named by form field); AbortError when aborted
 */
export function runSetsInWorker(file: Blob, form: SetsFormInputs, options: SetsWorkerOptions = {}): Promise<{ result: MatchedSetsResult; read: SetsReadSummary }> {
  return runWorkerTask({
    start: () => new Worker(new URL('./setsWorker.ts', import.meta.url), { type: 'module' }),
    request: () => ({ file, form: { ...form }, chunkBytes: options.chunkBytes ?? 1 << 20 }) satisfies SetsWorkerRequest,
    signal: options.signal,
    onProgress: options.onProgress,
    progressOf: (reply: Extract<SetsWorkerReply, { type: 'progress' }>): SetsWorkerProgress => reply,
    resultOf: (reply: Extract<SetsWorkerReply, { type: 'done' }>) => ({ result: deepFreeze(reply.result), read: deepFreeze(reply.read) }),
    name: 'matched-sets',
    cancelledMessage: 'The matched-sets analysis was cancelled.',
  });
}
