/// <reference lib="webworker" />
// The Web Worker that reads a large CSV of pairs in chunks and runs the matched-pairs analysis, so the page
// stays responsive (a large file, or exact tails for several thousand pairs, can take a second or more). Started by runPairsInWorker (pairsWorkerClient.ts).
import { analysePairs } from '../../core/pairsAnalysis';
import { pairsFromCsvStream, type PairsRead } from './pairsFromCsv';
import { blobChunks } from '../../data/byteSource';
import type { PairsWorkerReply, PairsWorkerRequest } from './pairsWorkerProtocol';
import { endReplyFor } from '../../data/webWorkerTask';

declare const self: DedicatedWorkerGlobalScope;

function post(reply: PairsWorkerReply): void {
  self.postMessage(reply);
}

self.onmessage = async (event: MessageEvent<PairsWorkerRequest>) => {
  const { source, options, chunkBytes } = event.data;
  let lastPost = 0;
  try {
    let read: PairsRead | null = null;
    if (source.kind === 'file') {
      read = await pairsFromCsvStream(blobChunks(source.file, chunkBytes), source.columns, {
        totalBytes: source.file.size,
        onProgress: (p) => {
          const now = performance.now();
          if (now - lastPost < 50 && p.bytesRead < source.file.size) return;
          lastPost = now;
          post({ type: 'progress', phase: 'reading', bytesRead: p.bytesRead, totalBytes: p.totalBytes, rowsRead: p.rowsRead });
        },
      });
    }
    post({ type: 'progress', phase: 'analysing', bytesRead: source.kind === 'file' ? source.file.size : 0, totalBytes: null, rowsRead: read?.rowsRead ?? 0 });
    const data = read ? read.data : source.kind === 'data' ? source.data : null;
    const result = analysePairs({ ...options, data: data!, droppedRows: read?.droppedRows ?? options.droppedRows });
    let summary = null;
    if (read) {
      const { data: _numbers, ...rest } = read;
      summary = rest;
    }
    post({ type: 'done', result, read: summary });
  } catch (error) {
    post(endReplyFor(error));
  }
};
