import type { InputProblem } from '../../core/inputProblem';
import type { RegressionData, RegressionDataSpec, RegressionProgress } from './regressionData';

/** The message that starts the worker. */
export interface RegressionWorkerRequest {
  readonly file: Blob;
  readonly spec: RegressionDataSpec;
  readonly chunkBytes: number;
}

/** The worker's messages: progress while reading, then exactly one of done / problems / failure. */
export type RegressionWorkerReply =
  | { readonly type: 'progress'; readonly progress: RegressionProgress }
  | { readonly type: 'done'; readonly data: RegressionData }
  | { readonly type: 'problems'; readonly problems: InputProblem[] }
  | { readonly type: 'failure'; readonly message: string };
