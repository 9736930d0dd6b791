import { InputError } from '../core/inputProblem';
import type { PairsResult } from '../core/pairsAnalysis';
import type { PairsReadSummary, PairsWorkerReply, PairsWorkerRequest } from './pairsWorkerProtocol';

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
  const { signal, onProgress } = options;
  if (signal?.aborted) return Promise.reject(abortError());
  const worker = new Worker(new URL('./pairsWorker.ts', import.meta.url), { type: 'module' });
  return new Promise((resolve, reject) => {
    const stop = (): void => {
      worker.terminate();
      signal?.removeEventListener('abort', onAbort);
    };
    const onAbort = (): void => {
      stop();
      reject(abortError());
    };
    signal?.addEventListener('abort', onAbort, { once: true });
    worker.onmessage = (event: MessageEvent<PairsWorkerReply>) => {
      const reply = event.data;
      if (reply.type === 'progress') {
        onProgress?.(reply);
        return;
      }
      stop();
      if (reply.type === 'done') resolve({ result: deepFreeze(reply.result), read: reply.read ? deepFreeze(reply.read) : null });
      else if (reply.type === 'problems') reject(new InputError(reply.problems));
      else reject(new Error(`The matched-pairs worker failed: ${reply.message}`));
    };
    worker.onerror = (event: ErrorEvent) => {
      stop();
      reject(new Error(`The matched-pairs worker failed: ${event.message || 'could not start'}`));
    };
    worker.postMessage({ ...request, chunkBytes: options.chunkBytes ?? 1 << 20 } satisfies PairsWorkerRequest);
  });
}

function abortError(): DOMException {
  return new DOMException('The matched-pairs analysis was cancelled.', 'AbortError');
}

function deepFreeze<T>(value: T): T {
  if (value && typeof value === 'object' && !ArrayBuffer.isView(value) && !Object.isFrozen(value)) {
    for (const key of Object.keys(value)) deepFreeze((value as Record<string, unknown>)[key]);
    Object.freeze(value);
  }
  return value;
}
