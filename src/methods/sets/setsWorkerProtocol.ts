import type { InputProblem } from '../../core/inputProblem';
import type { MatchedSetsResult } from '../../core/matchedSetsAnalysis';
import type { SetsFormInputs } from './request';
import type { SetsReadSummary } from './setsFromCsv';

/** What the matched-sets worker is asked to do: read a CSV file and analyse it as the form says. */
export interface SetsWorkerRequest {
  readonly file: Blob;
  readonly form: SetsFormInputs;
  readonly chunkBytes: number;
}

/** Worker messages: progress while reading and analysing, then exactly one of done / problems / failure. */
export type SetsWorkerReply =
  | { readonly type: 'progress'; readonly phase: 'reading' | 'analysing'; readonly bytesRead: number; readonly totalBytes: number | null; readonly rowsRead: number }
  | { readonly type: 'done'; readonly result: MatchedSetsResult; readonly read: SetsReadSummary }
  | { readonly type: 'problems'; readonly problems: InputProblem[] }
  | { readonly type: 'failure'; readonly message: string };
