import type { FileSource } from '../methods/methodModule';
import type { CliIo } from './cliIo';

/** A file named on the command line as a method's FileSource; nothing is opened until the method reads it. */
export function fileSourceOf(path: string, io: CliIo): FileSource {
  return {
    name: path === '-' ? 'standard input' : path,
    size: null,
    text: () => io.readText(path),
    bytes: () => io.openStream(path),
  };
}
