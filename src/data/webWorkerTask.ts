import { InputError, type InputProblem } from '../core/inputProblem';

/** The replies every Lurk worker sends besides its progress: exactly one of done / problems / failure. */
export type WorkerEndReply = { readonly type: 'problems'; readonly problems: InputProblem[] } | { readonly type: 'failure'; readonly message: string };

/** How {@link runWorkerTask} talks to one kind of worker. */
export interface WorkerTask<Reply extends { readonly type: string }, Progress, Result> {
  /** Starts the worker; called only when the signal has not aborted yet. */
  readonly start: () => Worker;
  /** Makes the message that starts the work (called once the worker has started, inside the promise). */
  readonly request: () => unknown;
  readonly signal?: AbortSignal;
  readonly onProgress?: (progress: Progress) => void;
  /** The progress a `progress` reply carries. */
  readonly progressOf: (reply: Extract<Reply, { type: 'progress' }>) => Progress;
  /** The result a `done` reply carries. */
  readonly resultOf: (reply: Extract<Reply, { type: 'done' }>) => Result;
  /** Names the work in messages: "The <name> worker failed: …". */
  readonly name: string;
  /** The message of the `AbortError` when the signal aborts. */
  readonly cancelledMessage: string;
}

/**
 * Runs one request in a Web Worker: progress replies go to `onProgress`; the first `done`, `problems` or
 * `failure` reply (or a worker error) settles the promise and terminates the worker; aborting the signal
 * terminates it at once.
 *
 * @throws InputError with the problems the worker found; AbortError (a DOMException) when aborted; Error when
 * the worker failed or could not start
 */
export function runWorkerTask<Reply extends { readonly type: string }, Progress, Result>(
  task: WorkerTask<Reply, Progress, Result>,
): Promise<Result> {
  const { signal, onProgress } = task;
  const abortError = (): DOMException => new DOMException(task.cancelledMessage, 'AbortError');
  if (signal?.aborted) return Promise.reject(abortError());
  const worker = task.start();
  return new Promise<Result>((resolve, reject) => {
    const stop = (): void => {
      worker.terminate();
      signal?.removeEventListener('abort', onAbort);
    };
    const onAbort = (): void => {
      stop();
      reject(abortError());
    };
    signal?.addEventListener('abort', onAbort, { once: true });
    worker.onmessage = (event: MessageEvent<Reply | WorkerEndReply>) => {
      const reply = event.data;
      if (reply.type === 'progress') {
        onProgress?.(task.progressOf(reply as Extract<Reply, { type: 'progress' }>));
        return;
      }
      stop();
      if (reply.type === 'done') resolve(task.resultOf(reply as Extract<Reply, { type: 'done' }>));
      else if (reply.type === 'problems') reject(new InputError((reply as WorkerEndReply & { type: 'problems' }).problems));
      else reject(new Error(`The ${task.name} worker failed: ${(reply as WorkerEndReply & { type: 'failure' }).message}`));
    };
    worker.onerror = (event: ErrorEvent) => {
      stop();
      reject(new Error(`The ${task.name} worker failed: ${event.message || 'could not start'}`));
    };
    worker.postMessage(task.request());
  });
}

/** Results cross the worker boundary as copies; freeze them again (typed arrays cannot be frozen). */
export function deepFreeze<T>(value: T): T {
  if (value && typeof value === 'object' && !ArrayBuffer.isView(value) && !Object.isFrozen(value)) {
    for (const key of Object.keys(value)) deepFreeze((value as Record<string, unknown>)[key]);
    Object.freeze(value);
  }
  return value;
}

/** The reply a worker sends when its work threw: the problems of an InputError, else the error's message. */
export function endReplyFor(error: unknown): WorkerEndReply {
  if (error instanceof InputError) return { type: 'problems', problems: [...error.problems] };
  return { type: 'failure', message: error instanceof Error ? error.message : String(error) };
}
