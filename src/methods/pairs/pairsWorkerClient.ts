import type { PairsResult } from '../../core/pairsAnalysis';
import type { PairsReadSummary, PairsWorkerReply, PairsWorkerRequest } from './pairsWorkerProtocol';
import { deepFreeze, runWorkerTask } from '../../data/webWorkerTask';

export interface PairsWorkerProgress {
  readonly phase: 'reading' | 'analysing';
  readonly bytesRead: number;
  readonly totalBytes: number | null;
  readonly rowsRead: number;
}

export interface PairsWorkerOptions {
  readonly onProgress?: (progress: PairsWorkerProgress) => void;
  /** Aborting stops the worker at once; the promise rejects with an `AbortError` DOMException. */
  readonly signal?: AbortSignal;
  readonly chunkBytes?: number;
}

/**
 * Reads a CSV of pairs and/or runs the matched-pairs analysis in a Web Worker, with progress and cancel.
 * @throws InputError with the problems found; AbortError when aborted
 */
export function runPairsInWorker(
  request: Omit<PairsWorkerRequest, 'chunkBytes'>,
  options: PairsWorkerOptions = {},
): Promise<{ result: PairsResult; read: PairsReadSummary | null }> {
  return runWorkerTask({
    start: () => new Worker(new URL('./pairsWorker.ts', import.meta.url), { type: 'module' }),
    request: () => ({ ...request, chunkBytes: options.chunkBytes ?? 1 << 20 }) satisfies PairsWorkerRequest,
    signal: options.signal,
    onProgress: options.onProgress,
    progressOf: (reply: Extract<PairsWorkerReply, { type: 'progress' }>): PairsWorkerProgress => reply,
    resultOf: (reply: Extract<PairsWorkerReply, { type: 'done' }>) => ({
      result: deepFreeze(reply.result),
      read: reply.read ? deepFreeze(reply.read) : null,
    }),
    name: 'matched-pairs',
    cancelledMessage: 'The matched-pairs analysis was cancelled.',
  });
}
