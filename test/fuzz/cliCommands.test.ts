// Every command of `lurk` (each method of the registry, batch, report) run in-process on hostile arguments and
// files: it exits 0, 2 (bad input) or 3 (batch/report: some rows or calculators had problems), writes at most
// one line on error that names an option the command has, never a stack trace, and no NaN/undefined/Infinity
// in what it prints.
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { runLurk } from '../../src/cli/main';
import { memoryIo } from '../../src/cli/cliIo';
import { METHODS } from '../../src/methods/registry';
import { FIGURE_OPTIONS } from '../../src/cli/figureOutput';
import { expectCleanText, FUZZ_RUNS, FUZZ_SEED, hostileValue, HOSTILE_NUMBERS, HOSTILE_WORDS } from './hostileInput';

const OPTIONS_OF: Record<string, Record<string, { type: string; short?: string }>> = {
  ...Object.fromEntries(METHODS.map((m) => [m.command.name, { ...m.command.options, ...FIGURE_OPTIONS, json: { type: 'boolean' } }])),
  batch: { json: { type: 'boolean' }, csv: { type: 'boolean' }, alpha: { type: 'string' }, 'keep-going': { type: 'boolean' } },
  report: { format: { type: 'string' }, 'bottom-line': { type: 'boolean' }, 'keep-going': { type: 'boolean' } },
};
const EXITS: Record<string, number[]> = { batch: [0, 2, 3], report: [0, 2, 3] };

/** Small CSV files with hostile headers and cells. */
const csvFile = fc
  .tuple(
    fc.array(fc.constantFrom('y', 't', 'x', 'd', 'treated', 'control', 'measure', 'estimate', 'lower', 'upper', 'se', 'df', 'label', 'outcome_prevalence', 'sd', 'n', '\u001b[2Jx', ''), { minLength: 1, maxLength: 5 }),
    fc.array(fc.array(fc.constantFrom(...HOSTILE_NUMBERS, 'rr', 'or', 'coef', 'rare', '0', '1'), { minLength: 0, maxLength: 5 }), { maxLength: 6 }),
  )
  .map(([header, rows]) => [header.join(','), ...rows.map((r) => r.map((c) => (/[",\n]/.test(c) ? `"${c.replace(/"/g, '""')}"` : c)).join(','))].join('\n'));

const number = fc.oneof(
  { weight: 2, arbitrary: fc.constantFrom(...HOSTILE_NUMBERS) },
  { weight: 3, arbitrary: fc.double({ min: 0.01, max: 20, noNaN: true }).map((x) => String(Number(x.toPrecision(3)))) },
  { weight: 2, arbitrary: fc.double({ min: -10, max: 10, noNaN: true }).map((x) => String(Number(x.toPrecision(3)))) },
  { weight: 2, arbitrary: fc.integer({ min: 0, max: 2000 }).map(String) },
);
const list = (item: fc.Arbitrary<string>) => fc.array(item, { minLength: 1, maxLength: 4 }).map((a) => a.join(','));
const name = fc.constantFrom('age', 'y', 't', 'x', 'd', '\u001b[1mbold', 'a b');
/** Plausible values per option (choices, numbers, lists, files): they reach the computations. */
const PLAUSIBLE: Record<string, fc.Arbitrary<string>> = {
  measure: fc.constantFrom('rr', 'or', 'hr', 'smd', 'md', 'RR', 'coef'),
  'outcome-prevalence': fc.constantFrom('rare', 'common'),
  counts: list(fc.integer({ min: 0, max: 60 }).map(String)),
  file: fc.constantFrom('data.csv', 'missing.csv', '-'),
  summary: fc.constantFrom('data.csv', 'a.json', 'missing.csv'),
  exposure: name, outcome: name, treatment: name, treated: name, control: name, diff: name,
  covariates: list(name), categorical: list(name), benchmark: list(name),
  'exposed-values': list(number), 'outcome-values': list(number),
  'reference-confounders': list(fc.tuple(name, number, number).map(([n, a, b]) => `${n}=${a}:${b}`)),
  'covariate-t': list(fc.tuple(name, number, number).map(([n, a, b]) => `${n}=${a}:${b}`)),
  'covariate-r2': list(fc.tuple(name, number, number).map(([n, a, b]) => `${n}=${a}:${b}`)),
  discordant: fc.oneof(list(fc.integer({ min: 0, max: 200 }).map(String)), fc.constant('1e9,999e6'), fc.constant('1000000000,999000000')),
  'outcome-type': fc.constantFrom('auto', 'numeric', 'binary'),
  test: fc.constantFrom('signrank', 'sign'),
  alternative: fc.constantFrom('greater', 'less'),
  method: fc.constantFrom('exact', 'normal', 'auto'),
  gamma: list(fc.constantFrom('1', '1.5', '2', '3', '0.5', '1e300', '6')),
  k: list(fc.constantFrom('1', '2', '3', '0.5', '1e300', '0')),
  direction: fc.constantFrom('toward-zero', 'away-from-zero'),
  svg: fc.constantFrom(...new Set(METHODS.flatMap((m) => m.command.figures.map((f) => f.name)))),
  'svg-width': fc.constantFrom('column', 'two-columns'),
  format: fc.constantFrom('md', 'tex', 'html'),
  sql: fc.constantFrom('tbl', 'schema.tbl', 'a"b'),
};

/** The options each method command is mostly used with (a base to which other options are added). */
const SCENARIOS: Record<string, string[][]> = {
  evalue: [['measure', 'estimate'], ['measure', 'estimate', 'lower'], ['measure', 'estimate', 'se'], ['counts'], ['file', 'exposure', 'outcome']],
  pairs: [['discordant'], ['file', 'treated', 'control'], ['file', 'diff']],
  ovb: [['estimate', 'se', 'df'], ['estimate', 'se', 'df', 'covariate-t'], ['file', 'outcome', 'treatment'], ['summary', 'outcome', 'treatment', 'covariates']],
  batch: [[]],
  report: [[]],
};

/** A command line that the command can mostly read: a usual base, a few more options, plausible values. */
function plausibleArgs(command: string) {
  const options = OPTIONS_OF[command];
  const names = Object.keys(options).filter((n) => n !== 'help');
  const scenarios = SCENARIOS[command] ?? [[]];
  return fc.tuple(fc.constantFrom(...scenarios), fc.subarray(names, { maxLength: Math.min(3, names.length) })).map(([base, more]) => [...new Set([...base, ...more])]).chain((chosen) =>
    fc.tuple(...chosen.map((n) => (options[n].type === 'boolean' ? fc.constant([`--${n}`]) : fc.oneof({ weight: 5, arbitrary: PLAUSIBLE[n] ?? number }, { weight: 1, arbitrary: hostileValue }).map((v) => [`--${n}`, v])))),
  ).map((parts) => parts.flat());
}

function argsFor(command: string) {
  const options = OPTIONS_OF[command];
  const names = Object.keys(options);
  const optionToken = fc.oneof(
    { weight: 6, arbitrary: fc.constantFrom(...names).map((n) => `--${n}`) },
    { weight: 1, arbitrary: fc.constantFrom(...names.filter((n) => options[n].short).map((n) => `-${options[n].short}`), '-h', '-z') },
    { weight: 1, arbitrary: fc.constantFrom('--bogus', '--', '-', '--=x', '---x', '--help') },
  );
  const pair = fc.tuple(fc.constantFrom(...names), hostileValue).map(([n, v]) => (options[n].type === 'boolean' ? [`--${n}`] : [`--${n}`, v]));
  const positional = command === 'batch' ? fc.constantFrom('b.csv', 'missing.csv', '-', 'data.csv') : command === 'report' ? fc.constantFrom('a.json', 'missing.json', 'data.csv') : fc.constantFrom(...HOSTILE_WORDS);
  const files = command === 'batch' || command === 'report' ? fc.tuple(positional, plausibleArgs(command)).map(([p, a]) => [p, ...a]) : plausibleArgs(command);
  return fc.oneof(
    { weight: 4, arbitrary: files },
    fc.array(fc.oneof(optionToken, hostileValue), { maxLength: 8 }),
    fc.tuple(fc.array(pair, { maxLength: 6 }), fc.option(positional, { freq: 3 })).map(([pairs, p]) => [...pairs.flat(), ...(p === null ? [] : [p])]),
  );
}

/** A saved appraisal with inputs made of hostile values (its statement is computed from them). */
const appraisalFile = fc
  .record({
    evalue: fc.record({ measure: hostileValue, estimate: hostileValue, lower: hostileValue, upper: hostileValue, se: hostileValue, target: hostileValue, level: hostileValue }, { requiredKeys: [] }),
    pairs: fc.record({ source: fc.constantFrom('pasted', 'discordant', 'file'), pasted: fc.array(fc.constantFrom(...HOSTILE_NUMBERS), { maxLength: 8 }).map((a) => a.join('\n')), alpha: hostileValue, gammas: hostileValue }, { requiredKeys: [] }),
    regression: fc.record({ estimate: hostileValue, se: hostileValue, df: hostileValue, q: hostileValue, alpha: hostileValue, k: hostileValue }, { requiredKeys: [] }),
  })
  .map((inputs) =>
    JSON.stringify({
      format: 'lurk-appraisal',
      version: 1,
      savedAt: '2026-01-02T03:04:05Z',
      study: { finding: 'Fictional', exposure: '\u001b[31mexposure', outcome: 'outcome', units: '', source: 'invented' },
      calculators: Object.fromEntries(Object.entries(inputs).map(([id, form]) => [id, { inputs: form, summary: null }])),
    }),
  );

/** The field an error line names: an option of the command, an argument, or the file placeholder. */
function expectOneLineNamingAnOption(command: string, args: readonly string[], stderr: string): void {
  const lines = stderr.split('\n').filter((l) => l !== '');
  expect(lines, stderr).toHaveLength(1);
  expect(stderr).not.toMatch(/\n\s+at |Error:|node:internal/);
  const m = new RegExp(`^lurk ${command}: (.+?): (.*)$`).exec(lines[0]);
  expect(m, lines[0]).not.toBeNull();
  const [, field, rule] = m!;
  // An unknown option is named as typed; every other message names an option the command has.
  if (/^is not an option/.test(rule) && /^-/.test(field)) expect(args.some((a) => a === field || a.startsWith(`${field}=`) || (/^-[^-]/.test(field) && a.startsWith(field))), lines[0]).toBe(true);
  else if (field.startsWith('--')) expect(Object.keys(OPTIONS_OF[command]).concat('help'), lines[0]).toContain(field.slice(2));
  else if (/^-[^-]/.test(field)) expect(Object.values(OPTIONS_OF[command]).map((o) => o.short).concat('h', 'z'), lines[0]).toContain(field.slice(1));
  else expect(field, lines[0]).toMatch(/^(argument ".*"|FILE|APPRAISAL|"[^"]*")$/);
}

describe('every lurk command on hostile arguments', () => {
  for (const command of Object.keys(OPTIONS_OF)) {
    it(`lurk ${command}: exit ${(EXITS[command] ?? [0, 2]).join(', ')} only; one line naming an option on error; no leaks`, async () => {
      await fc.assert(
        fc.asyncProperty(argsFor(command), csvFile, csvFile, appraisalFile, async (args, data, batch, appraisal) => {
          const io = memoryIo({ 'data.csv': data, 'b.csv': batch, 'a.json': appraisal, '-': data });
          const code = await runLurk([command, ...args], io);
          expect(EXITS[command] ?? [0, 2], `${JSON.stringify(args)} → ${code}: ${io.stderr}`).toContain(code);
          if (code === 2) {
            expectOneLineNamingAnOption(command, args, io.stderr);
            expect(io.stdout).toBe('');
          }
          if (code === 3) expect(io.stderr.split('\n').filter(Boolean)).toHaveLength(1);
          if (code === 0 && !args.includes('--help') && !args.includes('-h')) expectCleanText(io.stdout, `lurk ${command} ${JSON.stringify(args)}`, command === 'batch' ? [/^\d+ .*$/gm, /^.*\{\s*$[\s\S]*/m, /^row,.*[\s\S]*/m] : []);
          expect(io.stderr).not.toMatch(/\u001b/);
        }),
        { seed: FUZZ_SEED, numRuns: FUZZ_RUNS },
      );
    }, 120_000);
  }
});
