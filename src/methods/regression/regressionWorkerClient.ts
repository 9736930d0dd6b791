import type { RegressionData, RegressionDataSpec, RegressionProgress } from './regressionData';
import type { RegressionWorkerReply, RegressionWorkerRequest } from './regressionWorkerProtocol';
import { deepFreeze, runWorkerTask } from '../../data/webWorkerTask';

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
  return runWorkerTask({
    start: () => new Worker(new URL('./regressionWorker.ts', import.meta.url), { type: 'module' }),
    request: (): RegressionWorkerRequest => ({
      file,
      spec: JSON.parse(JSON.stringify(spec)) as RegressionDataSpec,
      chunkBytes: options.chunkBytes ?? 1 << 18,
    }),
    signal: options.signal,
    onProgress: options.onProgress,
    progressOf: (reply: Extract<RegressionWorkerReply, { type: 'progress' }>) => reply.progress,
    resultOf: (reply: Extract<RegressionWorkerReply, { type: 'done' }>) => deepFreeze(reply.data),
    name: 'regression',
    cancelledMessage: 'The regression was cancelled.',
  });
}
