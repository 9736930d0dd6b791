import { printable } from '../data/printable';
import { UsageError } from './usageError';

export type OptionKinds = Record<string, { type: 'string' | 'boolean'; short?: string }>;

/** A positional argument as it is named in messages: `argument "estimate"` (escaped, cut short). */
export function argumentName(text: string): string {
  return `argument "${printableWord(text)}"`;
}

/**
 * Parses a command's options strictly. Returns the option values as strings/booleans and the positional arguments.
 *
 * Rules (one line naming the option for every breach, see {@link UsageError}):
 * - `--name VALUE`, `--name=VALUE`, `-n VALUE` and `-nVALUE` give a value to an option that takes one. The next
 *   argument is its value whatever it starts with (`--estimate -0.4`, `--lower -Infinity`, `--file -x`), unless it
 *   is itself an option of the command: then the option "needs a value".
 * - `--flag` sets an option that takes no value; `--flag=…` is refused ("takes no value").
 * - An option given twice keeps the last value.
 * - `-` (standard input) and anything not starting with `-` is a positional argument; so is everything after `--`.
 * - `-h` / `--help` asks for the help text.
 */
export function parseOptions(
  args: readonly string[],
  options: OptionKinds,
): { values: Record<string, string | boolean | undefined>; positionals: string[] } {
  const kinds: OptionKinds = { ...options, help: { type: 'boolean', short: 'h' } };
  const byShort = new Map<string, string>();
  for (const [name, kind] of Object.entries(kinds)) if (kind.short) byShort.set(kind.short, name);
  const values: Record<string, string | boolean | undefined> = {};
  const positionals: string[] = [];
  const isOption = (arg: string): boolean => {
    const long = /^--([^=]+)(=|$)/.exec(arg);
    if (long) return Object.hasOwn(kinds, long[1]);
    return /^-[^-]/.test(arg) && byShort.has(arg[1]);
  };
  for (let i = 0; i < args.length; i++) {
    const arg = args[i];
    if (arg === '--') {
      positionals.push(...args.slice(i + 1));
      break;
    }
    let name: string;
    let shown: string;
    let inline: string | undefined;
    if (arg.startsWith('--')) {
      const eq = arg.indexOf('=');
      name = eq < 0 ? arg.slice(2) : arg.slice(2, eq);
      inline = eq < 0 ? undefined : arg.slice(eq + 1);
      shown = `--${printableWord(name)}`;
      if (name === '' || !Object.hasOwn(kinds, name)) throw new UsageError(shown, 'is not an option of this command (see --help)');
    } else if (arg.length >= 2 && arg.startsWith('-')) {
      const letter = String.fromCodePoint(arg.codePointAt(1)!);
      shown = `-${printableWord(letter)}`;
      const found = byShort.get(letter);
      if (found === undefined) throw new UsageError(shown, 'is not an option of this command (see --help)');
      name = found;
      const rest = arg.slice(1 + letter.length);
      if (rest !== '') {
        if (kinds[name].type === 'boolean') throw new UsageError(shown, 'takes no value');
        inline = rest.startsWith('=') ? rest.slice(1) : rest;
      }
    } else {
      positionals.push(arg);
      continue;
    }
    if (kinds[name].type === 'boolean') {
      if (inline !== undefined) throw new UsageError(shown, 'takes no value');
      values[name] = true;
      continue;
    }
    if (inline === undefined) {
      const next = args[i + 1];
      if (next === undefined || isOption(next)) throw new UsageError(shown, 'needs a value');
      inline = next;
      i++;
    }
    values[name] = inline;
  }
  return { values, positionals };
}

/** A typed word as it may be echoed: control characters escaped, cut to 40 characters. */
function printableWord(text: string): string {
  return printable(text, 40);
}

/** Reads a number option: finite, decimal point or decimal comma; names the option when it is not a number. */
export function numberOption(value: string | boolean | undefined, option: string): number | undefined {
  if (value === undefined) return undefined;
  if (typeof value !== 'string') throw new UsageError(option, 'needs a number');
  const text = value.trim();
  const normalised = /^[+-]?\d+,\d+$/.test(text) ? text.replace(',', '.') : text;
  const number = normalised === '' ? NaN : Number(normalised);
  if (!Number.isFinite(number)) throw new UsageError(option, `must be a finite number, got "${printableWord(value)}"`);
  return number;
}

/** Reads a comma-separated list of numbers (e.g. --gamma 1,1.5,2). */
export function numberListOption(value: string | boolean | undefined, option: string): number[] | undefined {
  if (value === undefined) return undefined;
  if (typeof value !== 'string' || value.trim() === '') throw new UsageError(option, 'needs a comma-separated list of numbers');
  return value.split(',').map((part, i) => {
    const number = Number(part.trim());
    if (part.trim() === '' || !Number.isFinite(number)) {
      throw new UsageError(option, `item ${i + 1} must be a finite number, got "${printableWord(part)}"`);
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
    throw new UsageError(option, `must be one of ${choices.join(', ')}, got "${printableWord(String(value))}"`);
  }
  return value as T;
}
