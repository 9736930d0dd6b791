/// <reference lib="webworker" />
// The Web Worker that reads a large CSV of matched sets in chunks and runs the analysis, so the page stays
// responsive. Started by runSetsInWorker (setsWorkerClient.ts).
import { InputError } from '../../core/inputProblem';
import { blobChunks } from '../../data/byteSource';
import { endReplyFor } from '../../data/webWorkerTask';
import { setsColumnsOf } from './request';
import { analyseSetsForm } from './runner';
import { setsFromCsvStream } from './setsFromCsv';
import type { SetsWorkerReply, SetsWorkerRequest } from './setsWorkerProtocol';

declare const self: DedicatedWorkerGlobalScope;

function post(reply: SetsWorkerReply): void {
  self.postMessage(reply);
}

self.onmessage = async (event: MessageEvent<SetsWorkerRequest>) => {
  const { file, form, chunkBytes } = event.data;
  let lastPost = 0;
  try {
    const read = await setsFromCsvStream(blobChunks(file, chunkBytes), setsColumnsOf(form), {
      onProgress: (bytesRead, rowsRead) => {
        const now = performance.now();
        if (now - lastPost < 50 && bytesRead < file.size) return;
        lastPost = now;
        post({ type: 'progress', phase: 'reading', bytesRead, totalBytes: file.size, rowsRead });
      },
    });
    post({ type: 'progress', phase: 'analysing', bytesRead: file.size, totalBytes: null, rowsRead: read.rowsRead });
    const outcome = analyseSetsForm(form, read);
    if (!outcome.result) throw new InputError([...outcome.problems]);
    post({ type: 'done', result: outcome.result, read: outcome.read! });
  } catch (error) {
    post(endReplyFor(error));
  }
};
