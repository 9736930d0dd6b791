import { InputError, inputProblem, type InputProblem } from '../../core/inputProblem';
import { twoByTwoFromStream, type TwoByTwoFromCsv } from './twoByTwoFromCsv';
import { NUMBER_READING_RULE } from '../../data/numberText';
import type { CommandContext, MethodModule, OptionValues } from '../methodModule';
import { eValueBottomLine } from './bottomLine';
import { EVALUE_FIGURES, eValueFigures, eValueJsonReport, eValueTextReport } from './report';
import { emptyEValueForm, evaluateEValueForm, normaliseEValueForm, type EValueFormInputs, type EValueFormOutcome } from './request';
import { eValueStatement } from './statement';
import { readEValueSummary, summariseEValue, type EValueSummary } from './summary';
import { E_VALUE_CAUTION } from './text';
import { eValueSummaryQuery } from './summaryQuery';
import { queryReport, readSummaryArgument, SUMMARY_ARGUMENT_RULE } from '../summaryArgument';

const OPTIONS = {
  measure: { type: 'string', short: 'm' },
  estimate: { type: 'string', short: 'e' },
  lower: { type: 'string' },
  upper: { type: 'string' },
  se: { type: 'string' },
  level: { type: 'string' },
  'outcome-prevalence': { type: 'string' },
  sd: { type: 'string' },
  target: { type: 'string' },
  counts: { type: 'string' },
  design: { type: 'string' },
  file: { type: 'string', short: 'f' },
  exposure: { type: 'string' },
  outcome: { type: 'string' },
  'exposed-values': { type: 'string' },
  'outcome-values': { type: 'string' },
  'reference-confounders': { type: 'string' },
  sql: { type: 'string' },
  summary: { type: 'string' },
} as const;

const HELP = `lurk evalue — the E-value: how strongly a hidden confounder would have to be associated with both the
exposure and the outcome (as a risk ratio) to explain away an estimate, and its confidence interval.

From a reported estimate:
  lurk evalue --measure rr|or|hr|smd|md --estimate X [--lower L --upper U | --se S] [--level 0.95]
              [--outcome-prevalence rare|common] [--sd SD] [--target T] [--json]
From a 2×2 table of counts:
  lurk evalue --counts a,b,c,d [--design cohort|case-control] [--measure rr|or] [--level 0.95]
              [--outcome-prevalence rare|common] [--json]
From a CSV file with one row per person:
  lurk evalue --file data.csv --exposure COLUMN --outcome COLUMN [--exposed-values V,…] [--outcome-values V,…]
              [--measure rr|or] [--json]
From a table in your own database (no row leaves it):
  lurk evalue --sql TABLE --exposure COLUMN --outcome COLUMN [--exposed-values V,… --outcome-values V,…]
              prints one standard SQL query that counts the 2×2 table; run it, then
  lurk evalue --summary ROW [--measure rr|or] [--json]      gives the same E-values as --file on the same data
              ${SUMMARY_ARGUMENT_RULE.replace(/\n/g, '\n              ')}

Options:
  --measure             rr (risk ratio), or (odds ratio), hr (hazard ratio), smd (standardized mean
                        difference d), md (mean difference; needs --sd). Default rr for counts and files.
  --estimate            the estimate on the measure's own scale
  --lower, --upper      the confidence limits, on the same scale
  --se                  or the standard error: of the log ratio (rr, or, hr), of d (smd), of the difference (md)
  --level               the confidence level of the interval (default 0.95; "95" and "95%" work too)
  --outcome-prevalence  rare (under about 15%: used as a risk ratio) or common (converted); required for or and hr
  --sd                  the outcome's standard deviation, to turn a mean difference into d
  --target              the value to shift the estimate to instead of the null, on the measure's own scale
  --counts              a,b,c,d: exposed with the outcome, exposed without, unexposed with, unexposed without
                        (separate them with ";" or spaces when a count has a thousands separator)
  --design              how the table (or file) was sampled: cohort (default; also a trial or a cross-section)
                        or case-control (sampled by outcome: only the odds ratio is allowed). A cohort table
                        with a common outcome uses its own risk ratio, not the square root of its odds ratio.
  --file                a CSV file (comma, semicolon or tab separated) with a header row; "-" for standard input
  --exposure, --outcome the two columns of the file
  --exposed-values      the cell values that mean exposed (default: found in a 0/1, yes/no or true/false column)
  --outcome-values      the cell values that mean the outcome happened (default as above)
  --reference-confounders  NAME:RR_EXPOSURE:RR_OUTCOME[;…], confounders of known strength to compare with
  --json                print one JSON object instead of the report

Conventions (each report lists the ones that apply):
  - The E-value is the smallest strength of association, on the risk-ratio scale, that a confounder would need
    with both the exposure and the outcome, beyond the measured covariates, to move the estimate to the target.
  - The interval E-value uses the limit nearer the target; it is 1 when the interval contains the target.
  - With a target beyond the estimate (farther from the null), the E-values refer to confounding that pushed the
    estimate toward the null; otherwise to confounding that pushed it away from the null.
  - A rare outcome (under about 15%): an odds or hazard ratio is used as a risk ratio. A common outcome: an odds
    ratio by its square root (VanderWeele 2017), a hazard ratio by VanderWeele's 2020 approximation. A
    standardized mean difference d by exp(0.91·d).
  - A table's interval is the log-scale Wald interval; with a zero cell, 0.5 is added to every cell.

${NUMBER_READING_RULE}

${E_VALUE_CAUTION}
`;

/** Options that belong to one source of the estimate only. */
const SOURCE_OPTIONS: Record<'estimate' | 'file', readonly string[]> = {
  estimate: ['lower', 'upper', 'se', 'sd'],
  file: ['exposure', 'outcome', 'exposed-values', 'outcome-values'],
};

const CELL_NAMES: Record<string, string> = {
  a: 'a (exposed, had the outcome)',
  b: 'b (exposed, no outcome)',
  c: 'c (unexposed, had the outcome)',
  d: 'd (unexposed, no outcome)',
};

const FIELD_OPTIONS: Record<string, string> = {
  estimate: '--estimate',
  measure: '--measure',
  tableMeasure: '--measure',
  lower: '--lower',
  upper: '--upper',
  se: '--se',
  sd: '--sd',
  level: '--level',
  target: '--target',
  outcomePrevalence: '--outcome-prevalence',
  file: '--file',
  fileName: '--file',
  exposure: '--exposure',
  exposureColumn: '--exposure',
  outcome: '--outcome',
  outcomeColumn: '--outcome',
  exposedValues: '--exposed-values',
  outcomeValues: '--outcome-values',
  input: '--estimate',
  summaryTable: '--sql',
  summaryResult: '--summary',
};

/**
 * The E-value form from `lurk evalue` options: the text of each option goes to its form field unread (the request
 * reader reads it, as on the page). Two sources at once, options of another source, limits together with a
 * standard error and a malformed list are refused, naming the option.
 */
export function eValueFormFromOptions(values: OptionValues): EValueFormInputs {
  const text = (name: string) => (typeof values[name] === 'string' ? (values[name] as string) : '');
  const given = (name: string) => values[name] !== undefined;
  const sources = (['estimate', 'counts', 'file', 'sql', 'summary'] as const).filter(given);
  if (sources.length > 1) refuse(`--${sources[1]}`, 'combined-sources', `cannot be combined with --${sources[0]}: give one source of the estimate`);
  const source = sources[0] ?? 'estimate';
  // The query of --sql reads the same columns as --file; its result (--summary) needs none of them.
  const allowed = source === 'estimate' ? SOURCE_OPTIONS.estimate : source === 'file' || source === 'sql' ? SOURCE_OPTIONS.file : [];
  for (const [owner, names] of Object.entries(SOURCE_OPTIONS)) {
    for (const name of names) {
      if (given(name) && !allowed.includes(name)) refuse(`--${name}`, 'other-source', `goes with --${owner === 'file' ? 'file or --sql' : owner}, not with --${source}`);
    }
  }
  if (source === 'estimate' && given('design')) refuse('--design', 'other-source', 'goes with --counts or --file, not with --estimate');
  const base = emptyEValueForm();
  const shared = {
    ...base,
    level: text('level'),
    target: text('target'),
    outcomePrevalence: text('outcome-prevalence') as EValueFormInputs['outcomePrevalence'],
    design: text('design') as EValueFormInputs['design'],
    confounders: confoundersFromOption(values['reference-confounders']),
  };
  if (source === 'estimate') {
    const bySe = given('se');
    if (bySe && (given('lower') || given('upper'))) refuse('--se', 'interval-and-se', 'give either the interval limits or the standard error, not both');
    return Object.freeze({
      ...shared,
      source: 'reported',
      measure: text('measure') as EValueFormInputs['measure'],
      estimate: text('estimate'),
      intervalBy: bySe ? 'se' : 'limits',
      lower: text('lower'),
      upper: text('upper'),
      se: text('se'),
      sd: text('sd'),
    });
  }
  const tableMeasure = (text('measure') || 'rr') as EValueFormInputs['tableMeasure'];
  if (source === 'sql' || source === 'summary') {
    return Object.freeze({
      ...shared,
      source: 'summary',
      tableMeasure,
      summaryTable: text('sql'),
      summaryResult: text('summary'),
      exposureColumn: text('exposure'),
      outcomeColumn: text('outcome'),
      exposedValues: Object.freeze(valueList(values['exposed-values'])),
      outcomeValues: Object.freeze(valueList(values['outcome-values'])),
    });
  }
  if (source === 'counts') {
    const items = splitCounts(text('counts'));
    if (items.length !== 4) {
      refuse('--counts', 'wrong-length', `needs four counts a,b,c,d (exposed with the outcome, exposed without, unexposed with, unexposed without); got ${items.length}`);
    }
    const [a, b, c, d] = items;
    return Object.freeze({ ...shared, source: 'counts', tableMeasure, counts: Object.freeze({ a, b, c, d }) });
  }
  return Object.freeze({
    ...shared,
    source: 'file',
    tableMeasure,
    fileName: text('file'),
    exposureColumn: text('exposure'),
    outcomeColumn: text('outcome'),
    exposedValues: Object.freeze(valueList(values['exposed-values'])),
    outcomeValues: Object.freeze(valueList(values['outcome-values'])),
  });
}

/** The option that holds a form field (`counts.a` → `--counts`, `confounders[1].rrOutcome` → `--reference-confounders`). */
export function eValueOptionOf(field: string): string {
  if (field.startsWith('counts')) return '--counts';
  if (field.startsWith('confounders')) return '--reference-confounders';
  return FIELD_OPTIONS[field] ?? `--${field}`;
}

/** Reads the form (and the file it names) with the request reader, and reports; bad input is thrown by field. */
async function runEValueCommand(form: EValueFormInputs, values: OptionValues, context: CommandContext) {
  if (values.sql !== undefined) {
    const { sql, problems } = eValueSummaryQuery(form);
    if (problems.length > 0) throw new InputError(problems);
    return queryReport(sql, { table: form.summaryTable, exposure: form.exposureColumn.trim(), outcome: form.outcomeColumn.trim(), exposedValues: [...form.exposedValues], outcomeValues: [...form.outcomeValues] });
  }
  if (form.source === 'summary') form = { ...form, summaryResult: await readSummaryArgument(form.summaryResult ?? '', context, 'summaryResult') };
  let table: TwoByTwoFromCsv | null = null;
  if (form.source === 'file') {
    // Counted while the file streams by: memory stays bounded by the distinct values, not by the file's size.
    try {
      table = await twoByTwoFromStream(context.open(form.fileName).bytes(), {
        exposureColumn: form.exposureColumn,
        outcomeColumn: form.outcomeColumn,
        exposedValues: form.exposedValues,
        outcomeValues: form.outcomeValues,
      });
    } catch (error) {
      if (error instanceof InputError) throw new InputError(error.problems.map((p) => forCommandLine(p, form)));
      const reason = (error as NodeJS.ErrnoException).code === 'ENOENT' ? 'no such file' : (error as NodeJS.ErrnoException).code === 'EISDIR' ? 'it is a folder' : (error as Error).message;
      throw new InputError([inputProblem('file', 'unreadable-file', `cannot read "${form.fileName}": ${reason}`, form.fileName)]);
    }
  }
  const outcome = evaluateEValueForm(form, table);
  if (outcome.problems.length > 0) throw new InputError(outcome.problems.map((p) => forCommandLine(p, form)));
  if (!outcome.result) throw new InputError([inputProblem('estimate', 'required', 'is required')]);
  const report = { outcome, source: form.source };
  return { text: eValueTextReport(report), json: eValueJsonReport(report), figures: eValueFigures(report) };
}

/**
 * On the command line one option holds several form fields: a problem with a count or a reference confounder
 * says which item of the option it is about.
 */
function forCommandLine(problem: InputProblem, form: EValueFormInputs): InputProblem {
  const cell = /^counts\.([abcd])$/.exec(problem.field)?.[1];
  if (form.source === 'file' && problem.field.startsWith('counts')) {
    return { ...problem, field: 'file', message: `the table counted from the file ${problem.message}` };
  }
  if (cell) return { ...problem, message: `count ${CELL_NAMES[cell]} ${problem.message}` };
  if (problem.field === 'counts') return { ...problem, message: `the table ${problem.message}` };
  const item = /^confounders\[(\d+)\]\.(\w+)$/.exec(problem.field);
  if (item) {
    const index = Number(item[1]);
    const row = form.confounders[index];
    const which = item[2] === 'name' ? 'name' : item[2] === 'rrExposure' ? 'risk ratio with the exposure' : 'risk ratio with the outcome';
    return { ...problem, message: `item ${index + 1} ("${row.name}:${row.rrExposure}:${row.rrOutcome}"): the ${which} ${problem.message}` };
  }
  return problem;
}

function refuse(field: string, code: string, message: string): never {
  throw new InputError([inputProblem(field, code, message)]);
}

/** The four counts as typed: split on ";" or spaces when present (so "1,200" can be a count), else on commas. */
function splitCounts(text: string): string[] {
  const trimmed = text.trim();
  if (trimmed === '') return [];
  if (/;/.test(trimmed)) return trimmed.split(/\s*;\s*/);
  if (/\s/.test(trimmed) && !/,\s/.test(trimmed)) return trimmed.split(/\s+/);
  return trimmed.split(/\s*,\s*/);
}

function valueList(value: string | boolean | undefined): string[] {
  if (typeof value !== 'string') return [];
  return value
    .split(',')
    .map((v) => v.trim())
    .filter((v) => v !== '');
}

/** NAME:RR_EXPOSURE:RR_OUTCOME[;…] as rows of text; the numbers are read by the request reader. */
function confoundersFromOption(value: string | boolean | undefined): EValueFormInputs['confounders'] {
  if (value === undefined) return Object.freeze([]);
  const option = '--reference-confounders';
  if (typeof value !== 'string' || value.trim() === '') refuse(option, 'required', 'needs NAME:RR_EXPOSURE:RR_OUTCOME[;…]');
  const rows = value
    .split(';')
    .filter((item) => item.trim() !== '')
    .map((item, i) => {
      const parts = item.split(':');
      if (parts.length !== 3) refuse(option, 'bad-item', `item ${i + 1} ("${item}") must be NAME:RR_EXPOSURE:RR_OUTCOME`);
      return Object.freeze({ name: parts[0].trim(), rrExposure: parts[1].trim(), rrOutcome: parts[2].trim() });
    });
  return Object.freeze(rows);
}

/** The E-value: the method module that the page, the command line and the workspace use. */
export const evalueMethod: MethodModule<EValueFormInputs, EValueFormOutcome, EValueSummary> = {
  id: 'evalue',
  title: 'Reported estimate',
  view: {
    element: 'lurk-evalue',
    heading: 'E-value: from a reported estimate or a 2×2 table',
    intro: 'How strongly would a hidden confounder have to be associated with both the exposure and the outcome to explain the finding away?',
  },
  form: {
    empty: emptyEValueForm,
    normalise: normaliseEValueForm,
    rawDataFields: [],
  },
  command: {
    name: 'evalue',
    summary: 'E-value for a risk, odds or hazard ratio, a standardized or raw mean difference, or a 2×2 table',
    help: HELP,
    options: OPTIONS,
    formFromOptions: eValueFormFromOptions,
    optionOf: eValueOptionOf,
    figures: EVALUE_FIGURES,
    run: runEValueCommand,
  },
  workspace: {
    summarise: summariseEValue,
    readSummary: readEValueSummary,
    needsData: (form) => form.source === 'file',
    summaryFromForm: (form) => summariseEValue(evaluateEValueForm(form, null)),
    statement: eValueStatement,
    bottomLine: eValueBottomLine,
  },
};
