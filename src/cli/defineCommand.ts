import type { CliIo } from './cliIo';
import { parseOptions, type OptionKinds } from './parseOptions';
import { reportBadInput } from './usageError';

/** One sub-command of `lurk`: its one-line summary and its runner (returns the exit status). */
export interface LurkCommand {
  summary: string;
  run(args: readonly string[], io: CliIo): Promise<number>;
}

/** What a sub-command declares; `defineCommand` adds option parsing, --help and the bad-input exit. */
export interface CommandSpec {
  /** The sub-command's name, as typed after `lurk` (used in error lines). */
  readonly name: string;
  readonly summary: string;
  /** The text printed for --help. */
  readonly help: string;
  readonly options: OptionKinds;
  /** Runs the command on parsed options; returns the exit status. Bad input is thrown (InputError, UsageError). */
  run(parsed: ReturnType<typeof parseOptions>, io: CliIo): Promise<number> | number;
}

/**
 * A `lurk` sub-command: parses its options strictly, prints its help for --help, runs, and turns bad input into
 * one line `lurk <name>: field: rule` on stderr with exit status 2.
 */
export function defineCommand(spec: CommandSpec): LurkCommand {
  return {
    summary: spec.summary,
    async run(args: readonly string[], io: CliIo): Promise<number> {
      try {
        const parsed = parseOptions(args, spec.options);
        if (parsed.values.help) {
          io.out(spec.help);
          return 0;
        }
        return await spec.run(parsed, io);
      } catch (error) {
        return reportBadInput(spec.name, error, io);
      }
    },
  };
}
