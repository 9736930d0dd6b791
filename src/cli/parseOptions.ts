import { parseArgs } from 'node:util';
import { UsageError } from './usageError';

export type OptionKinds = Record<string, { type: 'string' | 'boolean'; short?: string }>;

/**
 * Parses a command's options strictly (unknown options and missing values are usage errors naming the option).
 * Returns the option values as strings/booleans and the positional arguments.
 */
export function parseOptions(
  args: readonly string[],
  options: OptionKinds,
): { values: Record<string, string | boolean | undefined>; positionals: string[] } {
  try {
    const parsed = parseArgs({
      args: attachNegativeValues(args, options),
      options: { ...options, help: { type: 'boolean', short: 'h' } },
      strict: true,
      allowPositionals: true,
    });
    return { values: parsed.values as Record<string, string | boolean | undefined>, positionals: parsed.positionals };
  } catch (error) {
    const message = error instanceof Error ? error.message : String(error);
    const option = /'(-{1,2}[\w-]+)/.exec(message)?.[1] ?? 'options';
    if (/Unknown option/i.test(message)) throw new UsageError(option, 'is not an option of this command (see --help)');
    if (/argument missing|requires a value|expects? (a|an) (value|argument)/i.test(message)) {
      throw new UsageError(option, 'needs a value');
    }
    if (/does not take an argument/i.test(message)) throw new UsageError(option, 'takes no value');
    throw new UsageError(option, message);
  }
}

/**
 * Node's parser reads the "-0.4" of `--estimate -0.4` as an option of its own; a value that looks like a
 * negative number (a leading "-" or typographic minus before a digit, point or comma, as in "-0.87" or the list
 * "a=-2.4:-2.6" after it), following an option that takes a value, is joined to it (`--estimate=-0.4`).
 */
function attachNegativeValues(args: readonly string[], options: OptionKinds): string[] {
  const out: string[] = [];
  for (let i = 0; i < args.length; i++) {
    const name = /^--([\w-]+)$/.exec(args[i])?.[1];
    const next = args[i + 1];
    if (name && options[name]?.type === 'string' && next !== undefined && /^[-\u2212][\d.,]/.test(next)) {
      out.push(`${args[i]}=${next}`);
      i++;
    } else out.push(args[i]);
  }
  return out;
}

/** Reads a number option: finite, decimal point or decimal comma; names the option when it is not a number. */
export function numberOption(value: string | boolean | undefined, option: string): number | undefined {
  if (value === undefined) return undefined;
  if (typeof value !== 'string') throw new UsageError(option, 'needs a number');
  const text = value.trim();
  const normalised = /^[+-]?\d+,\d+$/.test(text) ? text.replace(',', '.') : text;
  const number = normalised === '' ? NaN : Number(normalised);
  if (!Number.isFinite(number)) throw new UsageError(option, `must be a finite number, got "${value}"`);
  return number;
}

/** Reads a comma-separated list of numbers (e.g. --gamma 1,1.5,2). */
export function numberListOption(value: string | boolean | undefined, option: string): number[] | undefined {
  if (value === undefined) return undefined;
  if (typeof value !== 'string' || value.trim() === '') throw new UsageError(option, 'needs a comma-separated list of numbers');
  return value.split(',').map((part, i) => {
    const number = Number(part.trim());
    if (part.trim() === '' || !Number.isFinite(number)) {
      throw new UsageError(option, `item ${i + 1} must be a finite number, got "${part}"`);
    }
    return number;
  });
}

/** Reads an option that must be one of a few words. */
export function choiceOption<T extends string>(
  value: string | boolean | undefined,
  option: string,
  choices: readonly T[],
): T | undefined {
  if (value === undefined) return undefined;
  if (typeof value !== 'string' || !choices.includes(value as T)) {
    throw new UsageError(option, `must be one of ${choices.join(', ')}, got "${String(value)}"`);
  }
  return value as T;
}
