import { InputError, inputProblem } from '../core/inputProblem';
import type { CommandContext, CommandReport } from './methodModule';

/**
 * The one rule for the value of `--summary ROW` on every command: text that starts with `{` or `[`, or that
 * holds a line break, is the query's result itself (a JSON object, or CSV: the header line and the row);
 * anything else is the path of a file that holds it, and `-` reads standard input.
 */
export const SUMMARY_ARGUMENT_RULE =
  'ROW is the result itself when it starts with { or [ or holds a line break\n' +
  '(a JSON object, or CSV: the header line and the row); otherwise it names\n' +
  'a file that holds the result ("-": standard input).';

/** Whether the value of --summary is the result itself (see {@link SUMMARY_ARGUMENT_RULE}). */
export function isInlineResult(value: string): boolean {
  const s = value.trim();
  return s.startsWith('{') || s.startsWith('[') || /[\r\n]/.test(s);
}

/**
 * The text of the query's result named by `--summary` (see {@link SUMMARY_ARGUMENT_RULE}).
 * @throws InputError naming `field` when the file cannot be read
 */
export async function readSummaryArgument(value: string, context: CommandContext, field: string): Promise<string> {
  if (isInlineResult(value)) return value;
  const file = context.open(value.trim());
  try {
    return await file.text();
  } catch {
    throw new InputError([inputProblem(field, 'unreadable', `cannot read "${file.name}" (give the result itself, or a file holding it)`)]);
  }
}

/** The report of `--sql`: the query for people, and {query, …details} for --json. */
export function queryReport(query: string, details: Readonly<Record<string, unknown>>): CommandReport {
  return Object.freeze({ text: query.endsWith('\n') ? query : query + '\n', json: { query, ...details } });
}
