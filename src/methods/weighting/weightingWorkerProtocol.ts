import type { InputProblem } from '../../core/inputProblem';
import type { WeightingAnalysis } from './analysis';
import type { WeightingSettings } from './request';
import type { WeightingReadSummary } from './weightingData';

/** What the weighting worker is asked to do: read the file, fit, resample and finish. */
export interface WeightingWorkerRequest {
  readonly file: Blob;
  readonly settings: Omit<WeightingSettings, 'problems'>;
  readonly chunkBytes: number;
}

/** Where the worker is: reading the file, fitting the propensity model, or resampling. */
export interface WeightingProgress {
  readonly phase: 'reading' | 'fitting' | 'resampling';
  readonly bytesRead: number;
  readonly totalBytes: number;
  readonly rowsRead: number;
  readonly resamplesDone: number;
  readonly resamplesTotal: number;
}

/** Worker messages: progress, then exactly one of done / problems / failure. */
export type WeightingWorkerReply =
  | ({ readonly type: 'progress' } & WeightingProgress)
  | { readonly type: 'done'; readonly analysis: WeightingAnalysis; readonly read: WeightingReadSummary }
  | { readonly type: 'problems'; readonly problems: InputProblem[] }
  | { readonly type: 'failure'; readonly message: string };
