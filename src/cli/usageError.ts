import type { InputProblem } from '../methods/problems';
import { InputError } from '../methods/problems';
import type { CliIo } from './cliIo';
import { printable } from '../data/printable';

/** The longest error line printed (characters). */
const MAX_LINE = 600;

/** Exit status for bad input (a usage error), as is usual for command-line tools. */
export const EXIT_BAD_INPUT = 2;
/** Exit status of `lurk batch` and `lurk report` when the output is printed but some rows or calculators had problems. */
export const EXIT_WITH_PROBLEMS = 3;

/** A command-line problem: which option and which rule. */
export class UsageError extends Error {
  constructor(
    readonly field: string,
    readonly rule: string,
  ) {
    super(`${field}: ${rule}`);
    this.name = 'UsageError';
  }
}

/**
 * Prints the first problem of a bad-input error as one line `lurk <command>: field: rule` (the rule of the
 * project: one clear message naming the field and the rule) and returns the exit status 2.
 * Anything else is re-thrown: it is a bug, not bad input.
 */
export function reportBadInput(command: string, error: unknown, io: CliIo): number {
  let first: InputProblem | undefined;
  if (error instanceof UsageError) first = { field: error.field, code: 'usage', message: error.rule };
  else if (error instanceof InputError) first = error.problems[0] && { ...error.problems[0], field: optionName(error.problems[0].field) };
  if (!first) throw error;
  // Text from files and arguments is escaped where it is quoted; this is the last line of defence: one line,
  // no terminal control characters, whatever a message holds.
  const line = `lurk ${command}: ${first.field}: ${first.message}`;
  io.err(`${printable(line.replace(/\r?\n/g, ' '), MAX_LINE)}\n`);
  return EXIT_BAD_INPUT;
}

/** Input-object field names are camelCase; on the command line they are --kebab-case options. */
export function optionName(field: string): string {
  // Only plain camelCase names are option names; FILE-like placeholders and key paths stay as they are.
  if (!/^[a-z][a-zA-Z0-9]*$/.test(field)) return field;
  return '--' + field.replace(/[A-Z]/g, (c) => '-' + c.toLowerCase());
}
