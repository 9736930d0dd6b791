import type { InputProblem } from '../../core/inputProblem';
import type { PairsData, PairsInput, PairsResult } from '../../core/pairsAnalysis';
import type { PairsColumns, PairsRead } from './pairsFromCsv';

/** What the pairs worker is asked to do: read a CSV file and analyse it, or analyse pairs already read. */
export interface PairsWorkerRequest {
  readonly source: { readonly kind: 'file'; readonly file: Blob; readonly columns: PairsColumns } | { readonly kind: 'data'; readonly data: PairsData };
  /** Everything of the analysis input except the data. */
  readonly options: Omit<PairsInput, 'data'>;
  readonly chunkBytes: number;
}

/** What was read from a file, without the numbers themselves (they stay in the worker). */
export type PairsReadSummary = Omit<PairsRead, 'data'>;

/** Worker messages: progress while reading and analysing, then exactly one of done / problems / failure. */
export type PairsWorkerReply =
  | { readonly type: 'progress'; readonly phase: 'reading' | 'analysing'; readonly bytesRead: number; readonly totalBytes: number | null; readonly rowsRead: number }
  | { readonly type: 'done'; readonly result: PairsResult; readonly read: PairsReadSummary | null }
  | { readonly type: 'problems'; readonly problems: InputProblem[] }
  | { readonly type: 'failure'; readonly message: string };
