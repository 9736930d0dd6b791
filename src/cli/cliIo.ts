import { readFile } from 'node:fs/promises';
import { createReadStream } from 'node:fs';
import { Readable } from 'node:stream';

/** What a command may touch outside itself; tests pass an in-memory version. */
export interface CliIo {
  out(text: string): void;
  err(text: string): void;
  readText(path: string): Promise<string>;
  /** A byte stream of a file, for inputs too large to read whole. */
  openStream(path: string): Readable;
}

export function processIo(): CliIo {
  return {
    out: (text) => void process.stdout.write(text),
    err: (text) => void process.stderr.write(text),
    // "-" is standard input.
    readText: (path) => (path === '-' ? readAll(process.stdin) : readFile(path, 'utf8')),
    openStream: (path) => (path === '-' ? process.stdin : createReadStream(path)),
  };
}

/** Everything a stream gives, as UTF-8 text. */
async function readAll(stream: Readable): Promise<string> {
  const chunks: Buffer[] = [];
  for await (const chunk of stream) chunks.push(typeof chunk === 'string' ? Buffer.from(chunk, 'utf8') : (chunk as Buffer));
  return Buffer.concat(chunks).toString('utf8');
}

/** Collects output in memory: for tests. */
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
      if (path in files) return files[path];
      return readFile(path, 'utf8');
    },
    openStream(path: string): Readable {
      if (path in files) {
        return Readable.from([Buffer.from(files[path], 'utf8')]);
      }
      return createReadStream(path);
    },
  };
  return io;
}
