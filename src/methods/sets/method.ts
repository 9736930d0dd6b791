import { InputError, inputProblem } from '../../core/inputProblem';
import type { CommandContext, CommandReport, MethodModule, OptionValues } from '../methodModule';
import { setsBottomLine } from './bottomLine';
import { SETS_HELP } from './help';
import { SETS_FIGURES, setsReport } from './report';
import { emptySetsForm, normaliseSetsForm, setsColumnsOf, setsSettingsProblems, validateSetsColumnsOfForm, type SetsFormInputs } from './request';
import { analyseSetsForm, type SetsOutcome } from './runner';
import { setsFromCsvStream, type SetsRead } from './setsFromCsv';
import { setsStatement } from './statement';
import { readSetsSummary, summariseSets, type SetsSummary } from './summary';

/** The options of `lurk sets` (--json is added by the generic command). */
const OPTIONS = {
  file: { type: 'string', short: 'f' },
  set: { type: 'string' },
  treated: { type: 'string' },
  outcome: { type: 'string' },
  gamma: { type: 'string' },
  alpha: { type: 'string' },
  alternative: { type: 'string' },
  trim: { type: 'string' },
  'outcome-kind': { type: 'string' },
  tail: { type: 'string' },
} as const;

/** Form fields (and the fields of the readers' and the core's problems) → the option that holds them. */
const OPTION_OF: Readonly<Record<string, string>> = {
  file: '--file',
  fileName: '--file',
  setColumn: '--set',
  setIds: '--set',
  treatedColumn: '--treated',
  treated: '--treated',
  outcomeColumn: '--outcome',
  outcomes: '--outcome',
  gammas: '--gamma',
  alpha: '--alpha',
  alternative: '--alternative',
  trim: '--trim',
  outcomeKind: '--outcome-kind',
  tail: '--tail',
};

/** The option a form field stands for: `gammas[1]` → `--gamma`, `setColumn` → `--set`, … */
export function setsOptionOf(field: string): string {
  return OPTION_OF[field.replace(/\[.*$/, '')] ?? field;
}

const text = (value: string | boolean | undefined): string => (typeof value === 'string' ? value : '');

/** The form the options of `lurk sets` give, as typed (no number is read here); an option not given is empty. */
export function setsFormFromOptions(values: OptionValues): SetsFormInputs {
  return Object.freeze({
    ...emptySetsForm(),
    fileName: text(values.file),
    setColumn: text(values.set),
    treatedColumn: text(values.treated),
    outcomeColumn: text(values.outcome),
    gammas: text(values.gamma),
    alpha: values.alpha === undefined ? emptySetsForm().alpha : text(values.alpha),
    alternative: values.alternative === undefined ? emptySetsForm().alternative : text(values.alternative),
    trim: values.trim === undefined ? emptySetsForm().trim : text(values.trim),
    outcomeKind: values['outcome-kind'] === undefined ? emptySetsForm().outcomeKind : text(values['outcome-kind']),
    tail: values.tail === undefined ? emptySetsForm().tail : text(values.tail),
  });
}

/**
 * `lurk sets`: reads the form (and the file it names, "-" for standard input) with the request reader,
 * analyses, and reports.
 * @throws InputError with every problem, named by form field (the generic command names the options)
 */
export async function runSetsCommand(form: SetsFormInputs, _values: OptionValues, context: CommandContext): Promise<CommandReport> {
  const problems = [...setsSettingsProblems(form), ...validateSetsColumnsOfForm(form)];
  if (form.fileName.trim() === '') problems.push(inputProblem('file', 'required', 'give a CSV file of matched sets, one row per unit ("-" reads standard input)'));
  if (problems.length > 0) throw new InputError(problems);
  const read = await readSetsFile(form, context);
  const outcome = analyseSetsForm(form, read);
  if (!outcome.result) throw new InputError([...outcome.problems]);
  return setsReport(outcome.result, read.warnings);
}

async function readSetsFile(form: SetsFormInputs, context: CommandContext): Promise<SetsRead> {
  const path = form.fileName;
  try {
    return await setsFromCsvStream(context.open(path).bytes(), setsColumnsOf(form));
  } catch (error) {
    if (error instanceof InputError) throw error;
    const code = (error as { code?: string }).code;
    const reason = code === 'ENOENT' ? 'no such file' : code === 'EISDIR' ? 'is a folder, not a file' : 'cannot be read';
    throw new InputError([inputProblem('file', 'unreadable', `"${path}": ${reason}`)]);
  }
}

/** The matched-sets method: Rosenbaum bounds for one treated unit and several controls per set. */
export const setsMethod: MethodModule<SetsFormInputs, SetsOutcome, SetsSummary> = {
  id: 'sets',
  title: 'Matched sets',
  view: {
    element: 'lurk-sets',
    heading: 'Rosenbaum bounds for matched sets with several controls',
    intro: 'How much could hidden bias change the odds of treatment within a matched set before the finding stops being significant?',
  },
  form: {
    empty: emptySetsForm,
    normalise: normaliseSetsForm,
    rawDataFields: [],
  },
  command: {
    name: 'sets',
    summary: 'Rosenbaum bounds for matched sets (one treated, several controls): tipping Γ, p-value bounds, m-estimate range',
    help: SETS_HELP,
    options: OPTIONS,
    formFromOptions: setsFormFromOptions,
    optionOf: setsOptionOf,
    figures: SETS_FIGURES,
    run: runSetsCommand,
  },
  workspace: {
    summarise: summariseSets,
    readSummary: readSetsSummary,
    // A file's rows are never saved: the saved summary always stands in.
    needsData: () => true,
    summaryFromForm: () => null,
    statement: setsStatement,
    bottomLine: setsBottomLine,
  },
};
