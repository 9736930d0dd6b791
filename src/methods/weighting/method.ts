import { InputError, inputProblem } from '../../core/inputProblem';
import type { CommandContext, CommandReport, MethodModule, OptionValues } from '../methodModule';
import { finishAnalysis, prepareFromRead } from './analysis';
import { weightingBottomLine } from './bottomLine';
import { WEIGHTING_HELP } from './help';
import { WEIGHTING_FIGURES, weightingReport } from './report';
import { emptyWeightingForm, normaliseWeightingForm, readWeightingSettings, type WeightingFormInputs } from './request';
import type { WeightingOutcome } from './runner';
import { weightingStatement } from './statement';
import { readWeightingSummary, summariseWeighting, type WeightingSummary } from './summary';
import { readWeightingColumns, type WeightingRead } from './weightingData';

/** The options of `lurk weighting` (--json is added by the generic command). */
const OPTIONS = {
  file: { type: 'string', short: 'f' },
  treatment: { type: 'string' },
  outcome: { type: 'string' },
  covariates: { type: 'string' },
  categorical: { type: 'string' },
  estimand: { type: 'string' },
  lambda: { type: 'string' },
  bootstrap: { type: 'string' },
  seed: { type: 'string' },
  alpha: { type: 'string' },
  'trim-below': { type: 'string' },
  'trim-above': { type: 'string' },
} as const;

/** Form fields (and the fields of the readers' problems) → the option that holds them. */
const OPTION_OF: Readonly<Record<string, string>> = {
  file: '--file',
  fileName: '--file',
  treatment: '--treatment',
  outcome: '--outcome',
  covariates: '--covariates',
  categorical: '--categorical',
  estimand: '--estimand',
  lambdas: '--lambda',
  lambdaSearchLimit: '--lambda',
  bootstrap: '--bootstrap',
  seed: '--seed',
  alpha: '--alpha',
  trim: '--trim-below',
  trimBelow: '--trim-below',
  trimAbove: '--trim-above',
};

/** The option a form field stands for: `lambdas[1]` → `--lambda`, `covariates[0].values` → `--covariates`. */
export function weightingOptionOf(field: string): string {
  const base = field.replace(/\[.*$/, '').replace(/\..*$/, '');
  return OPTION_OF[base] ?? field;
}

const text = (value: string | boolean | undefined): string => (typeof value === 'string' ? value : '');

/** The form the options of `lurk weighting` give, as typed (no number is read here). */
export function weightingFormFromOptions(values: OptionValues): WeightingFormInputs {
  const base = emptyWeightingForm();
  const given = (name: string, fallback: string) => (typeof values[name] === 'string' ? (values[name] as string) : fallback);
  return Object.freeze({
    fileName: text(values.file),
    treatment: text(values.treatment),
    outcome: text(values.outcome),
    covariates: text(values.covariates),
    categorical: text(values.categorical),
    estimand: given('estimand', base.estimand),
    lambdas: text(values.lambda),
    bootstrap: given('bootstrap', base.bootstrap),
    seed: given('seed', base.seed),
    alpha: given('alpha', base.alpha),
    trimBelow: text(values['trim-below']),
    trimAbove: text(values['trim-above']),
  });
}

/**
 * `lurk weighting`: reads the settings and the file (streamed), fits and prepares in this thread, runs the
 * bootstrap on two worker threads (both cores), and reports.
 * @throws InputError with every problem, named by form field (the generic command names the options)
 */
export async function runWeightingCommand(form: WeightingFormInputs, _values: OptionValues, context: CommandContext): Promise<CommandReport> {
  const settings = readWeightingSettings(form);
  const problems = [...settings.problems];
  if (form.fileName.trim() === '') problems.push(inputProblem('fileName', 'required', 'give a CSV file with one row per person'));
  if (problems.length > 0) throw new InputError(problems);
  let read: WeightingRead;
  try {
    read = await readWeightingColumns(context.open(form.fileName).bytes(), settings.columns);
  } catch (error) {
    if (error instanceof InputError) throw error;
    const code = (error as { code?: string }).code;
    const reason = code === 'ENOENT' ? 'no such file' : code === 'EISDIR' ? 'is a folder, not a file' : 'cannot be read';
    throw new InputError([inputProblem('fileName', 'unreadable', `"${form.fileName}": ${reason}`)]);
  }
  const prepared = prepareFromRead(settings, read);
  // Node-only code, loaded only here: the page never reaches it.
  const { bootstrapInThreads } = await import('./weightingThreads');
  const chunks = await bootstrapInThreads(prepared, 2);
  return weightingReport(await finishAnalysis(prepared, chunks), read.summary);
}

/** The weighting method: sensitivity of an inverse-probability-weighted estimate (marginal sensitivity model). */
export const weightingMethod: MethodModule<WeightingFormInputs, WeightingOutcome, WeightingSummary> = {
  id: 'weighting',
  title: 'Weighting',
  view: {
    element: 'lurk-weighting',
    heading: 'Sensitivity of an inverse-probability-weighted estimate',
    intro: "How far could a hidden factor that changes people's odds of treatment move a weighted comparison?",
  },
  form: {
    empty: emptyWeightingForm,
    normalise: normaliseWeightingForm,
    rawDataFields: [],
  },
  command: {
    name: 'weighting',
    summary: 'sensitivity of an inverse-probability-weighted estimate: bounds and intervals by Λ, tipping Λ',
    help: WEIGHTING_HELP,
    options: OPTIONS,
    formFromOptions: weightingFormFromOptions,
    optionOf: weightingOptionOf,
    figures: WEIGHTING_FIGURES,
    run: runWeightingCommand,
  },
  workspace: {
    summarise: summariseWeighting,
    readSummary: readWeightingSummary,
    // The rows of a file are never saved: the saved summary stands in.
    needsData: () => true,
    summaryFromForm: () => null,
    statement: weightingStatement,
    bottomLine: weightingBottomLine,
  },
};
