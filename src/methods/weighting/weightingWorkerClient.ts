import { deepFreeze, runWorkerTask } from '../../data/webWorkerTask';
import type { WeightingAnalysis } from './analysis';
import type { WeightingReadSummary } from './weightingData';
import type { WeightingProgress, WeightingWorkerReply, WeightingWorkerRequest } from './weightingWorkerProtocol';

export interface WeightingWorkerOptions {
  readonly onProgress?: (progress: WeightingProgress) => void;
  /** Aborting stops the worker at once; the promise rejects with an `AbortError` DOMException. */
  readonly signal?: AbortSignal;
  readonly chunkBytes?: number;
}

/**
 * Reads a CSV, fits the propensity model and runs the bootstrap of the weighting analysis in a Web Worker,
 * with progress and cancel.
 * @throws InputError with the problems found; AbortError when aborted
 */
export function runWeightingInWorker(
  request: Omit<WeightingWorkerRequest, 'chunkBytes'>,
  options: WeightingWorkerOptions = {},
): Promise<{ analysis: WeightingAnalysis; read: WeightingReadSummary }> {
  return runWorkerTask({
    start: () => new Worker(new URL('./weightingWorker.ts', import.meta.url), { type: 'module' }),
    request: () => ({ ...request, chunkBytes: options.chunkBytes ?? 1 << 20 }) satisfies WeightingWorkerRequest,
    signal: options.signal,
    onProgress: options.onProgress,
    progressOf: (reply: Extract<WeightingWorkerReply, { type: 'progress' }>): WeightingProgress => {
      const { type: _type, ...progress } = reply;
      return progress;
    },
    resultOf: (reply: Extract<WeightingWorkerReply, { type: 'done' }>) => ({ analysis: deepFreeze(reply.analysis), read: deepFreeze(reply.read) }),
    name: 'weighting',
    cancelledMessage: 'The weighting analysis was cancelled.',
  });
}
