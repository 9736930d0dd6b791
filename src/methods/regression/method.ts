import { InputError, inputProblem } from '../../core/inputProblem';
import type { CommandContext, CommandReport, FileSource, MethodModule, OptionValues } from '../methodModule';
import { ovbBottomLine } from './bottomLine';
import { fitFileStream, type FittedFile } from './fileFit';
import { OVB_HELP, OVB_OPTIONS, ovbFormFromOptions, ovbOptionOf } from './options';
import { OVB_FIGURES, ovbCommandReport, ovbSqlReport, type OvbDataOrigin } from './report';
import { emptyOvbForm, evaluateOvbForm, normaliseOvbForm, ovbSummarySql, type OvbFormInputs, type OvbFormOutcome } from './request';
import { ovbStatement } from './statement';
import { ovbSummary, readOvbSummary, type OvbSummary } from './summary';
import { isInlineResult, readSummaryArgument } from '../summaryArgument';

/** The regression (omitted-variable bias in partial R²) method: form, command `lurk ovb` and workspace part. */
export const regressionMethod: MethodModule<OvbFormInputs, OvbFormOutcome, OvbSummary> = {
  id: 'regression',
  title: 'Regression',
  view: {
    element: 'lurk-ovb',
    heading: 'Omitted-variable bias in a linear regression',
    intro: 'How much of the residual variance of treatment and outcome would a hidden confounder have to explain to change the conclusion?',
  },
  form: {
    empty: emptyOvbForm,
    normalise: normaliseOvbForm,
    rawDataFields: [],
  },
  command: {
    name: 'ovb',
    summary: 'omitted-variable bias of a regression estimate: robustness values, bounds from covariates',
    help: OVB_HELP,
    options: OVB_OPTIONS,
    formFromOptions: ovbFormFromOptions,
    optionOf: ovbOptionOf,
    figures: OVB_FIGURES,
    run: runOvbCommand,
  },
  workspace: {
    summarise: (outcome) => (outcome.result ? ovbSummary(outcome.result) : null),
    readSummary: readOvbSummary,
    // The rows of a file are never saved: a form that reads a file needs it again (the saved summary stands in).
    needsData: (form) => form.source === 'file',
    summaryFromForm: (form) => {
      const outcome = evaluateOvbForm(form, null);
      return outcome.result ? ovbSummary(outcome.result) : null;
    },
    statement: ovbStatement,
    bottomLine: ovbBottomLine,
  },
};

/** `lurk ovb`: the query for --sql, else the analysis of the form (and its file) as a report with its figures. */
async function runOvbCommand(form: OvbFormInputs, values: OptionValues, context: CommandContext): Promise<CommandReport> {
  if (values.sql !== undefined) {
    const read = (form.summaryLevels ?? '') !== '' ? { ...form, summaryLevels: await readSummaryArgument(form.summaryLevels ?? '', context, 'summaryLevels') } : form;
    const { sql, problem, stage } = ovbSummarySql(read);
    if (problem) throw new InputError([problem]);
    const report = ovbSqlReport(sql, { table: form.summaryTable, outcome: form.outcome, treatment: form.treatment, covariates: covariatesOf(form) });
    return { ...report, json: { ...(report.json as Record<string, unknown>), stage } };
  }
  let fitted: FittedFile | null = null;
  let read = form;
  if (form.source === 'file') {
    const file = context.open(form.fileName);
    fitted = await readOrRefuse(file, '--file', () => fitFileStream(file.bytes(), form));
  } else if (form.source === 'summary') {
    read = { ...form, summaryResult: await readSummaryArgument(form.fileName, context, 'summaryResult') };
    if ((form.summaryLevels ?? '') !== '') read = { ...read, summaryLevels: await readSummaryArgument(form.summaryLevels ?? '', context, 'summaryLevels') };
  }
  const outcome = evaluateOvbForm(read, fitted?.fileData ?? null);
  if (outcome.problems.length > 0 || !outcome.result) throw new InputError(outcome.problems);
  const origin: OvbDataOrigin = fitted
    ? { kind: 'file', path: form.fileName, data: fitted.data }
    : form.source === 'summary'
      ? { kind: 'summary', path: isInlineResult(form.fileName) ? 'the result given to --summary' : form.fileName, n: outcome.regression?.n ?? 0, outcome: form.outcome, treatment: form.treatment, covariates: covariatesOf(form) }
      : { kind: 'reported', typed: { estimate: form.estimate, se: form.se } };
  const report = ovbCommandReport(outcome.result, origin, { q: form.q, alpha: form.alpha });
  const notes = earlierNamesUsed(values);
  return notes.length === 0 ? report : { ...report, text: `${report.text}\n${notes.join('\n')}\n` };
}

/** A note for each earlier option name used: it keeps working for one release. */
function earlierNamesUsed(values: OptionValues): string[] {
  const renamed: Record<string, string> = { k: 'times', q: 'fraction', r2dz: 'confounder-treatment-r2', r2yz: 'confounder-outcome-r2' };
  return Object.entries(renamed)
    .filter(([old]) => values[old] !== undefined)
    .map(([old, name]) => `Note: --${old} is the earlier name of --${name}; it keeps working for this release.`);
}

function covariatesOf(form: OvbFormInputs): string[] {
  return form.summaryColumns.split(',').map((s) => s.trim()).filter((s) => s !== '');
}

/** Runs a read of a file; a file that cannot be opened is refused naming the option. */
async function readOrRefuse<T>(file: FileSource, option: string, read: () => Promise<T>): Promise<T> {
  try {
    return await read();
  } catch (error) {
    if (error instanceof InputError || (error instanceof DOMException && error.name === 'AbortError')) throw error;
    const code = (error as { code?: string }).code;
    if (code === 'ENOENT' || code === 'EACCES' || code === 'EISDIR' || option === '--summary') {
      throw new InputError([inputProblem(option, 'unreadable', `cannot read "${file.name}"`)]);
    }
    throw error;
  }
}
