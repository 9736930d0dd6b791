import { readFile } from 'node:fs/promises';
import { createReadStream } from 'node:fs';

/** What a command may touch outside itself; tests pass an in-memory version. */
export interface CliIo {
  out(text: string): void;
  err(text: string): void;
  /** The whole text of a file; the path "-" is standard input. Rejects (never throws) when it cannot be read. */
  readText(path: string): Promise<string>;
  /**
   * The bytes of a file, for inputs too large to read whole; the path "-" is standard input. Nothing is opened
   * until the bytes are iterated, and a file that cannot be opened or read rejects the iteration (an error with
   * its `code`, e.g. ENOENT) instead of being emitted where nobody listens.
   */
  openStream(path: string): AsyncIterable<Uint8Array>;
}

export function processIo(): CliIo {
  return {
    out: (text) => void process.stdout.write(text),
    err: (text) => void process.stderr.write(text),
    readText: (path) => (path === '-' ? standardInputText() : readFile(path, 'utf8')),
    openStream: (path) => (path === '-' ? chunksOf(() => process.stdin) : fileChunks(path)),
  };
}

/** Collects output in memory: for tests. `files` are read by name; "-" is `files['-']` when given. */
export function memoryIo(files: Record<string, string> = {}): CliIo & { stdout: string; stderr: string } {
  const io = {
    stdout: '',
    stderr: '',
    out(text: string) {
      io.stdout += text;
    },
    err(text: string) {
      io.stderr += text;
    },
    async readText(path: string) {
      if (Object.hasOwn(files, path)) return files[path];
      return readFile(path, 'utf8');
    },
    openStream(path: string): AsyncIterable<Uint8Array> {
      if (Object.hasOwn(files, path)) {
        const text = files[path];
        return (async function* () {
          yield Buffer.from(text, 'utf8');
        })();
      }
      return fileChunks(path);
    },
  };
  return io;
}

/** A file's chunks, opened on the first read; errors (missing file, a folder) reject the iteration. */
function fileChunks(path: string): AsyncIterable<Uint8Array> {
  return chunksOf(() => createReadStream(path));
}

function chunksOf(open: () => AsyncIterable<Buffer | string>): AsyncIterable<Uint8Array> {
  return {
    async *[Symbol.asyncIterator]() {
      // Async iteration of a Node stream listens for its 'error' event and destroys it when the loop stops early.
      for await (const chunk of open()) yield typeof chunk === 'string' ? Buffer.from(chunk, 'utf8') : chunk;
    },
  };
}

async function standardInputText(): Promise<string> {
  const parts: Buffer[] = [];
  for await (const chunk of process.stdin) parts.push(typeof chunk === 'string' ? Buffer.from(chunk, 'utf8') : chunk);
  return Buffer.concat(parts).toString('utf8');
}
