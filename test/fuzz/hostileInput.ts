// Shared pieces of the fuzz suite: hostile words and numbers, and the rules every answer must keep.
import fc from 'fast-check';
import { expect } from 'vitest';

/** The seed of every fuzz run (LURK_FUZZ_SEED overrides it to explore): a failure is reproducible. */
export const FUZZ_SEED = Number(process.env.LURK_FUZZ_SEED ?? 20261202);
/** Inputs per entry point and run. */
export const FUZZ_RUNS = 2000;

/** Numbers as text that have broken readers before: signs, extremes, separators, non-numbers. */
export const HOSTILE_NUMBERS = [
  '0', '1', '-1', '2', '3.9', '0.5', '-0.4', '−0.4', '1e-300', '-1e-300', '1e300', '1.79e308', '-1.79e308', '5e-324',
  'Infinity', '-Infinity', 'NaN', '1,200', '1.200,5', '0,05', '95%', '1e9', '999e6', '1000000000', '999000000',
  '0.05', '0.95', '1e-12', '0.999999', '', ' ', 'x', '--', '-', '1,2,3', '1;2', '2:3', 'a=1.5:2', '3.9e', '.5', '5.',
];
/** Words that have broken messages before: empty, control characters, option look-alikes, very long text. */
export const HOSTILE_WORDS = [
  '', ' ', 'estimate', 'yes', '-x', '-e', '--', '-', 'missing.csv', 'data.csv', 'a.json', 'b.csv', 'rr', 'or', 'hr', 'smd', 'md',
  'rare', 'common', 'signrank', 'sign', 'greater', 'less', 'exact', 'normal', 'auto', 'binary', 'toward-zero', 'away-from-zero',
  'md', 'tex', 'html', 'y', 't', 'x', 'd', '\u001b[31mred\u001b[0m', 'a\nb', '\u202eevil', 'x'.repeat(300), '__proto__', 'constructor',
];

/** Any typed value: a hostile number or word, or arbitrary text. */
export const hostileValue = fc.oneof(
  { weight: 4, arbitrary: fc.constantFrom(...HOSTILE_NUMBERS) },
  { weight: 3, arbitrary: fc.constantFrom(...HOSTILE_WORDS) },
  { weight: 1, arbitrary: fc.string({ maxLength: 12 }) },
  { weight: 1, arbitrary: fc.array(fc.constantFrom(...HOSTILE_NUMBERS.filter((n) => n !== '')), { minLength: 1, maxLength: 4 }).map((a) => a.join(',')) },
);

/** Words that must never appear inside a sentence shown to a person ("not available: <why>" explains itself). */
export const LEAKS = /NaN|undefined|Infinity|not available(?!:)|\[object Object\]/;

/** Checks a sentence-bearing text: no NaN/undefined/Infinity/"not available", no terminal control characters. */
export function expectCleanText(text: string, where: string, echoes: RegExp[] = []): void {
  // Typed text echoed back in quotes ("got \"NaN\"") or in a table of the typed rows is the user's, not a leak;
  // indented lines are table rows, whose cells may say "not available" (only sentences are checked for it).
  const said = [/"[^"\n]*"/g, ...echoes].reduce((t, re) => t.replace(re, '""'), text);
  const tableCells = said.match(/^ {2}.*$/gm) ?? [];
  const cellLeak = tableCells.map((l) => /NaN|undefined|Infinity|\[object Object\]/.exec(l)).find((m) => m);
  expect(cellLeak?.[0], `${where} leaks in a table: ${tableCells.join('\n').slice(0, 400)}`).toBeUndefined();
  const prose = said.replace(/^ {2}.*$/gm, '');
  const leak = LEAKS.exec(prose);
  expect(leak, `${where} leaks "${leak?.[0]}" in: ${prose.slice(Math.max(0, (leak?.index ?? 0) - 200), (leak?.index ?? 0) + 100)}`).toBeNull();
  // eslint-disable-next-line no-control-regex
  expect(/\u001b/.test(text), `${where} holds an escape character`).toBe(false);
}
