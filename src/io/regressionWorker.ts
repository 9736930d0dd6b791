/// <reference lib="webworker" />
// The Web Worker that reads a CSV file in chunks and accumulates the regression's triangular factor, so
// the page stays responsive on large files. Started by runRegressionInWorker (regressionWorkerClient.ts).
import { InputError } from '../core/inputProblem';
import { accumulateRegressionFromStream } from './regressionData';
import type { RegressionWorkerReply, RegressionWorkerRequest } from './regressionWorkerProtocol';

declare const self: DedicatedWorkerGlobalScope;

/** The bytes of a Blob, `chunkBytes` at a time (each slice is read only when needed, so memory stays flat). */
async function* blobChunks(blob: Blob, chunkBytes: number): AsyncGenerator<Uint8Array> {
  for (let offset = 0; offset < blob.size; offset += chunkBytes) {
    yield new Uint8Array(await blob.slice(offset, offset + chunkBytes).arrayBuffer());
  }
}

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
    if (error instanceof InputError) post({ type: 'problems', problems: [...error.problems] });
    else post({ type: 'failure', message: error instanceof Error ? error.message : String(error) });
  }
};
