/// <reference lib="webworker" />
// The Web Worker that reads a CSV file in chunks and accumulates the regression's triangular factor, so
// the page stays responsive on large files. Started by runRegressionInWorker (regressionWorkerClient.ts).
import { accumulateRegressionFromStream } from './regressionData';
import { blobChunks } from '../../data/byteSource';
import type { RegressionWorkerReply, RegressionWorkerRequest } from './regressionWorkerProtocol';
import { endReplyFor } from '../../data/webWorkerTask';

declare const self: DedicatedWorkerGlobalScope;

function post(reply: RegressionWorkerReply, transfer: Transferable[] = []): void {
  self.postMessage(reply, transfer);
}

self.onmessage = async (event: MessageEvent<RegressionWorkerRequest>) => {
  const { file, spec, chunkBytes } = event.data;
  let lastPost = 0;
  try {
    const data = await accumulateRegressionFromStream(blobChunks(file, chunkBytes), spec, {
      totalBytes: file.size,
      onProgress: (progress) => {
        // At most ~20 progress messages a second.
        const now = performance.now();
        if (now - lastPost < 50 && progress.bytesRead < file.size) return;
        lastPost = now;
        post({ type: 'progress', progress });
      },
    });
    post({ type: 'done', data }, [data.design.r.buffer]);
  } catch (error) {
    post(endReplyFor(error));
  }
};
