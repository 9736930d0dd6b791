import { InputError, inputProblem } from '../../core/inputProblem';
import type { CommandContext, CommandReport, MethodModule, OptionValues } from '../methodModule';
import { pairsBottomLine } from './bottomLine';
import { PAIRS_HELP } from './help';
import { pairsFromCsvStream, type PairsRead } from './pairsFromCsv';
import { PAIRS_FIGURES, pairsReport } from './report';
import { emptyPairsForm, normalisePairsForm, pairsColumnsOf, readPairsSettings, type PairsFormInputs } from './request';
import { analysePairsForm, type PairsOutcome } from './runner';
import { pairsStatement } from './statement';
import { readPairsSummary, summarisePairs, type PairsSummary } from './summary';
import { pairsQueryOfForm } from './pairsFromSummary';
import { queryReport, readSummaryArgument } from '../summaryArgument';

/** The options of `lurk pairs` (--json is added by the generic command). */
const OPTIONS = {
  file: { type: 'string', short: 'f' },
  treated: { type: 'string' },
  control: { type: 'string' },
  diff: { type: 'string' },
  discordant: { type: 'string' },
  'outcome-type': { type: 'string' },
  test: { type: 'string' },
  gamma: { type: 'string' },
  alpha: { type: 'string' },
  alternative: { type: 'string' },
  method: { type: 'string' },
  'continuity-correction': { type: 'boolean' },
  sql: { type: 'string' },
  summary: { type: 'string' },
  zeros: { type: 'string' },
} as const;

/** Form fields (and the fields of the readers' problems) → the option that holds them. */
const OPTION_OF: Readonly<Record<string, string>> = {
  file: '--file',
  fileName: '--file',
  pasted: '--file',
  treated: '--treated',
  treatedColumn: '--treated',
  control: '--control',
  controlColumn: '--control',
  difference: '--diff',
  differenceColumn: '--diff',
  treatedOnly: '--discordant',
  controlOnly: '--discordant',
  outcome: '--outcome-type',
  outcomeType: '--outcome-type',
  test: '--test',
  alternative: '--alternative',
  method: '--method',
  alpha: '--alpha',
  gammas: '--gamma',
  continuityCorrection: '--continuity-correction',
  summaryTable: '--sql',
  summaryResult: '--summary',
  summary: '--summary',
  zeros: '--zeros',
  zeroRule: '--zeros',
};

/** The option a form field stands for: `gammas[1]` → `--gamma`, `data.controlOnly` → `--file`, … */
export function pairsOptionOf(field: string, form?: PairsFormInputs): string {
  const base = field.replace(/\[.*$/, '');
  if (base.startsWith('data') && form?.source === 'summary') return '--summary';
  if (base.startsWith('data')) return form?.source === 'discordant' ? '--discordant' : '--file';
  return OPTION_OF[base] ?? field;
}

const text = (value: string | boolean | undefined): string => (typeof value === 'string' ? value : '');

/** Splits the text of `--discordant A,B` into its items (as the field reader splits lists); no number is read. */
function discordantItems(typed: string): string[] {
  const trimmed = typed.trim();
  if (trimmed === '') return [];
  return /;/.test(trimmed) ? trimmed.split(/\s*;\s*/) : /\s/.test(trimmed) && !/,\s/.test(trimmed) ? trimmed.split(/\s+/) : trimmed.split(/\s*,\s*/);
}

/**
 * The form the options of `lurk pairs` give, as typed (no number is read here). Refuses mixes of sources the
 * form cannot express: `--discordant` with a file or its columns, and `--diff` with `--treated`/`--control`.
 * @throws InputError naming the options
 */
export function pairsFormFromOptions(values: OptionValues): PairsFormInputs {
  const given = (name: string) => values[name] !== undefined;
  const summarySources = ['sql', 'summary'].filter(given);
  if (summarySources.length > 0) {
    const others = [...summarySources.slice(1), 'file', 'discordant'].filter(given).map((o) => `--${o}`);
    if (others.length > 0) {
      throw new InputError([inputProblem(`--${summarySources[0]}`, 'mixed-sources', `cannot be combined with ${others.join(' and ')}: give one source of the pairs`)]);
    }
  }
  if (given('summary')) {
    const columns = ['diff', 'treated', 'control', 'outcome-type'].filter(given).map((o) => `--${o}`);
    if (columns.length > 0) throw new InputError([inputProblem(columns[0], 'other-source', 'goes with --file or --sql; the result given to --summary already holds what the query read')]);
  }
  if (given('discordant')) {
    const others = ['file', 'diff', 'treated', 'control', 'outcome-type'].filter(given).map((o) => `--${o}`);
    if (others.length > 0) {
      throw new InputError([inputProblem('--discordant', 'mixed-sources', `give either --discordant or ${others.join(' and ')}, not both (discordant counts need no file)`)]);
    }
  }
  if (given('diff') && (given('treated') || given('control'))) {
    const columns = ['treated', 'control'].filter(given).map((o) => `--${o}`);
    throw new InputError([inputProblem('--diff', 'mixed-sources', `give either --diff or ${columns.join(' and ')}, not both (a difference column, or treated and control columns)`)]);
  }
  let treatedOnly = '';
  let controlOnly = '';
  if (given('discordant')) {
    const items = discordantItems(text(values.discordant));
    if (items.length !== 2) {
      throw new InputError([inputProblem('--discordant', 'count-of-values', `needs two counts A,B (only treated had the event, only control had it), got ${items.length}`)]);
    }
    [treatedOnly, controlOnly] = items;
  }
  return Object.freeze({
    ...emptyPairsForm(),
    source: given('discordant') ? 'discordant' : given('sql') || given('summary') ? 'summary' : 'file',
    summaryTable: text(values.sql),
    summaryResult: text(values.summary),
    fileName: text(values.file),
    columnsBy: given('diff') ? 'difference' : 'outcomes',
    treatedColumn: text(values.treated),
    controlColumn: text(values.control),
    differenceColumn: text(values.diff),
    outcomeType: text(values['outcome-type']),
    treatedOnly,
    controlOnly,
    test: text(values.test),
    alternative: text(values.alternative),
    alpha: text(values.alpha),
    gammas: text(values.gamma),
    method: text(values.method),
    continuityCorrection: values['continuity-correction'] === true,
    zeros: text(values.zeros),
  });
}

/**
 * `lurk pairs`: reads the form (and the file it names) with the request reader, analyses, and reports.
 * @throws InputError with every problem, named by form field (the generic command names the options)
 */
export async function runPairsCommand(form: PairsFormInputs, values: OptionValues, context: CommandContext): Promise<CommandReport> {
  const settings = readPairsSettings(form);
  if (values.sql !== undefined) {
    const { sql, problems } = pairsQueryOfForm({ ...form, summaryTable: form.summaryTable ?? '' });
    if (problems.length > 0) throw new InputError(problems);
    const columns = form.columnsBy === 'difference' ? { difference: form.differenceColumn } : { treated: form.treatedColumn, control: form.controlColumn };
    return queryReport(sql, { table: form.summaryTable, ...columns });
  }
  if (form.source === 'summary') {
    form = { ...form, summaryResult: await readSummaryArgument(form.summaryResult ?? '', context, 'summaryResult') };
  }
  let read: PairsRead | null = null;
  if (form.source === 'file') {
    if (form.fileName.trim() === '') {
      throw new InputError([...settings.problems, inputProblem('file', 'required', 'give a CSV file of pairs (or --discordant A,B for a binary outcome)')]);
    }
    if (settings.problems.length > 0) throw new InputError(settings.problems);
    read = await readPairsFile(form, context);
  }
  const outcome = analysePairsForm(form, read);
  if (!outcome.result) throw new InputError([...outcome.problems]);
  return pairsReport(outcome.result, outcome.read?.warnings ?? [], form.alpha);
}

async function readPairsFile(form: PairsFormInputs, context: CommandContext): Promise<PairsRead> {
  const path = form.fileName;
  try {
    return await pairsFromCsvStream(context.open(path).bytes(), pairsColumnsOf(form));
  } catch (error) {
    if (error instanceof InputError) throw error;
    const code = (error as { code?: string }).code;
    const reason = code === 'ENOENT' ? 'no such file' : code === 'EISDIR' ? 'is a folder, not a file' : 'cannot be read';
    throw new InputError([inputProblem('file', 'unreadable', `"${path}": ${reason}`)]);
  }
}

/** The matched-pairs method: Rosenbaum bounds, tipping Γ, estimate range and amplification for matched pairs. */
export const pairsMethod: MethodModule<PairsFormInputs, PairsOutcome, PairsSummary> = {
  id: 'pairs',
  title: 'Matched pairs',
  view: {
    element: 'lurk-pairs',
    heading: 'Rosenbaum bounds for matched pairs',
    intro: 'How much could hidden bias change the odds of treatment within a matched pair before the finding stops being significant?',
  },
  form: {
    empty: emptyPairsForm,
    normalise: normalisePairsForm,
    rawDataFields: ['pasted'],
  },
  command: {
    name: 'pairs',
    summary: 'Rosenbaum bounds for matched pairs: tipping Γ, p-value bounds, estimate range, amplification',
    help: PAIRS_HELP,
    options: OPTIONS,
    formFromOptions: pairsFormFromOptions,
    optionOf: (field) => pairsOptionOf(field),
    figures: PAIRS_FIGURES,
    run: runPairsCommand,
  },
  workspace: {
    summarise: summarisePairs,
    readSummary: readPairsSummary,
    // File rows are never saved, and pasted rows are left out of share links: then the saved summary stands in.
    needsData: (form) => form.source === 'file' || (form.source === 'pasted' && form.pasted.trim() === ''),
    summaryFromForm: (form) => summarisePairs(analysePairsForm(form, null)),
    statement: pairsStatement,
    bottomLine: pairsBottomLine,
  },
};
