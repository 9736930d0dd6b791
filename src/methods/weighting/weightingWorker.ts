/// <reference lib="webworker" />
// The Web Worker of the weighting page: reads the CSV in chunks, fits the propensity model, runs the bootstrap
// resamples with progress, and finishes the analysis, so the page stays responsive. Started by
// runWeightingInWorker (weightingWorkerClient.ts); cancelled by terminating it.
import { blobChunks } from '../../data/byteSource';
import { endReplyFor } from '../../data/webWorkerTask';
import { bootstrapInPieces, finishAnalysis, prepareFromRead } from './analysis';
import { readWeightingColumns } from './weightingData';
import type { WeightingProgress, WeightingWorkerReply, WeightingWorkerRequest } from './weightingWorkerProtocol';

declare const self: DedicatedWorkerGlobalScope;

function post(reply: WeightingWorkerReply): void {
  self.postMessage(reply);
}

self.onmessage = async (event: MessageEvent<WeightingWorkerRequest>) => {
  const { file, settings, chunkBytes } = event.data;
  const progress: { -readonly [K in keyof WeightingProgress]: WeightingProgress[K] } = {
    phase: 'reading',
    bytesRead: 0,
    totalBytes: file.size,
    rowsRead: 0,
    resamplesDone: 0,
    resamplesTotal: settings.bootstrap ?? 1000,
  };
  let lastPost = 0;
  const report = (force = false) => {
    // At most ~20 progress messages a second.
    const now = performance.now();
    if (!force && now - lastPost < 50) return;
    lastPost = now;
    post({ type: 'progress', ...progress });
  };
  try {
    const read = await readWeightingColumns(blobChunks(file, chunkBytes), settings.columns, {
      onProgress: (p) => {
        progress.bytesRead = p.bytesRead;
        progress.rowsRead = p.rowsRead;
        report();
      },
    });
    progress.phase = 'fitting';
    progress.bytesRead = file.size;
    progress.rowsRead = read.summary.rowsRead;
    report(true);
    const prepared = prepareFromRead({ ...settings, problems: [] }, read);
    progress.phase = 'resampling';
    progress.resamplesTotal = prepared.bootstrap;
    report(true);
    const chunks = bootstrapInPieces(prepared, {
      onProgress: (done) => {
        progress.resamplesDone = done;
        report(done === prepared.bootstrap);
      },
    })!;
    post({ type: 'done', analysis: await finishAnalysis(prepared, chunks), read: read.summary });
  } catch (error) {
    post(endReplyFor(error));
  }
};
