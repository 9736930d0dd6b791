import type { CliIo } from './cliIo';
import { UsageError } from './usageError';

/**
 * The text of a file named on the command line.
 * @param field the option or placeholder the path was given as (e.g. `FILE`, `--summary`), named in the message
 * @throws UsageError `field: cannot read "path"` when the file cannot be read
 */
export async function readFileArgument(io: CliIo, path: string, field: string): Promise<string> {
  try {
    return await io.readText(path);
  } catch {
    throw new UsageError(field, `cannot read "${path}"`);
  }
}
