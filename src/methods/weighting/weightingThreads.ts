// Node only: the command line's bootstrap on worker threads. Imported only (dynamically) by the command's run
// path, and it reaches node:worker_threads through process.getBuiltinModule, so no page bundle ever imports a
// Node module. The same file is the threads' entry: a worker thread started with this module's own URL (the
// bundled CLI's chunk) finds its task in workerData, runs its resamples and posts the chunk back.
import type { Worker as NodeWorker } from 'node:worker_threads';
import { runBootstrapChunk, splitBootstrap, type BootstrapChunk, type BootstrapChunkRequest } from '../../core/weightingBootstrap';
import type { PreparedWeighting } from '../../core/weightingPreparation';

const TASK = 'lurk-weighting-bootstrap';

type WorkerThreads = typeof import('node:worker_threads');

function workerThreads(): WorkerThreads | null {
  const p = (globalThis as { process?: { getBuiltinModule?: (id: string) => unknown } }).process;
  return (p?.getBuiltinModule?.('node:worker_threads') as WorkerThreads | undefined) ?? null;
}

interface ThreadTask {
  readonly task: typeof TASK;
  readonly prepared: PreparedWeighting;
  readonly request: BootstrapChunkRequest;
}

// Entry of a worker thread: run this thread's resamples and post the chunk (its buffers moved, not copied).
const threads = workerThreads();
if (threads && !threads.isMainThread && (threads.workerData as ThreadTask | null)?.task === TASK) {
  const { prepared, request } = threads.workerData as ThreadTask;
  const chunk = runBootstrapChunk(prepared, request);
  const buffers = [chunk.status, chunk.lowerBounds, chunk.upperBounds, chunk.gridLowerBounds, chunk.gridUpperBounds].map((a) => a.buffer as ArrayBuffer);
  threads.parentPort!.postMessage(chunk, buffers);
}

/**
 * Runs the B resamples of a prepared analysis on `threads` worker threads (default 2: both cores), each on one
 * part of `splitBootstrap(B, threads)`; the chunks give the same result as one thread would (each resample has
 * its own random stream).
 * @param moduleUrl the file the threads load (default: this module's own URL)
 */
export async function bootstrapInThreads(prepared: PreparedWeighting, threadCount = 2, moduleUrl: URL = new URL(import.meta.url)): Promise<BootstrapChunk[]> {
  const parts = splitBootstrap(prepared.bootstrap, threadCount);
  const wt = workerThreads();
  // Without worker threads, with one part, or run from the TypeScript sources (tests), the parts run here.
  if (wt === null || parts.length <= 1 || moduleUrl.pathname.endsWith('.ts')) return parts.map((request) => runBootstrapChunk(prepared, request));
  const started: NodeWorker[] = [];
  try {
    return await Promise.all(
      parts.map(
        (request) =>
          new Promise<BootstrapChunk>((resolve, reject) => {
            const worker = new wt.Worker(moduleUrl, { workerData: { task: TASK, prepared, request } satisfies ThreadTask });
            started.push(worker);
            worker.once('message', (chunk: BootstrapChunk) => resolve(chunk));
            worker.once('error', reject);
            worker.once('exit', (code) => reject(new Error(`a bootstrap thread stopped (exit code ${code}) before posting its resamples`)));
          }),
      ),
    );
  } finally {
    for (const w of started) void w.terminate();
  }
}
