import { InputError } from '../core/inputProblem';
import type { RegressionData, RegressionDataSpec, RegressionProgress } from './regressionData';
import type { RegressionWorkerReply, RegressionWorkerRequest } from './regressionWorkerProtocol';

export type { RegressionData, RegressionDataSpec, RegressionProgress } from './regressionData';

/** Options for {@link runRegressionInWorker}. */
export interface RegressionWorkerOptions {
  /** Called while the file is read (bytes read of total, rows read). */
  readonly onProgress?: (progress: RegressionProgress) => void;
  /** Aborting stops the worker at once; the promise then rejects with an `AbortError` DOMException. */
  readonly signal?: AbortSignal;
  /** Bytes read per chunk (default 256 KiB). */
  readonly chunkBytes?: number;
}

/**
 * Accumulates the regression of a CSV file in a Web Worker: the file is read in chunks (memory does not grow
 * with its size), progress is reported, and the work can be cancelled.
 *
 * @returns the same {@link RegressionData} as `accumulateRegressionFromStream` (frozen)
 * @throws InputError with the problems found in the file or the column choice; AbortError when aborted
 */
export function runRegressionInWorker(
  file: Blob,
  spec: RegressionDataSpec,
  options: RegressionWorkerOptions = {},
): Promise<RegressionData> {
  const { signal, onProgress } = options;
  if (signal?.aborted) return Promise.reject(abortError());
  const worker = new Worker(new URL('./regressionWorker.ts', import.meta.url), { type: 'module' });
  return new Promise<RegressionData>((resolve, reject) => {
    const stop = (): void => {
      worker.terminate();
      signal?.removeEventListener('abort', onAbort);
    };
    const onAbort = (): void => {
      stop();
      reject(abortError());
    };
    signal?.addEventListener('abort', onAbort, { once: true });
    worker.onmessage = (event: MessageEvent<RegressionWorkerReply>) => {
      const reply = event.data;
      if (reply.type === 'progress') {
        onProgress?.(reply.progress);
        return;
      }
      stop();
      if (reply.type === 'done') resolve(deepFreeze(reply.data));
      else if (reply.type === 'problems') reject(new InputError(reply.problems));
      else reject(new Error(`The regression worker failed: ${reply.message}`));
    };
    worker.onerror = (event: ErrorEvent) => {
      stop();
      reject(new Error(`The regression worker failed: ${event.message || 'could not start'}`));
    };
    const request: RegressionWorkerRequest = {
      file,
      spec: JSON.parse(JSON.stringify(spec)) as RegressionDataSpec,
      chunkBytes: options.chunkBytes ?? 1 << 18,
    };
    worker.postMessage(request);
  });
}

function abortError(): DOMException {
  return new DOMException('The regression was cancelled.', 'AbortError');
}

/** Results cross the worker boundary as copies; freeze them again (typed arrays cannot be frozen). */
function deepFreeze<T>(value: T): T {
  if (value && typeof value === 'object' && !ArrayBuffer.isView(value) && !Object.isFrozen(value)) {
    for (const key of Object.keys(value)) deepFreeze((value as Record<string, unknown>)[key]);
    Object.freeze(value);
  }
  return value;
}
