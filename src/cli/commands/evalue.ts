import { analyseEValue, analyseEValueFromCounts } from '../../core/eValueAnalysis';
import type { EValueCountsResult, EValueInput, EValueResult } from '../../core/eValueAnalysis';
import { InputError, inputProblem } from '../../core/inputProblem';
import type { InputProblem } from '../../core/inputProblem';
import { assessReferenceConfounder, validateReferenceConfounder } from '../../core/referenceConfounder';
import type { ReferenceConfounder, ReferenceConfounderAssessment } from '../../core/referenceConfounder';
import { EFFECT_MEASURES, OUTCOME_PREVALENCES } from '../../core/riskRatioScale';
import type { EffectMeasure, OutcomePrevalence } from '../../core/riskRatioScale';
import type { TwoByTwoMeasure } from '../../core/twoByTwo';
import { readCsvText } from '../../data/csv';
import {
  E_VALUE_CAUTION,
  MEASURE_LABELS,
  describeEValue,
  describeReferenceConfounder,
  formatEValue,
  formatLevel,
  formatMeasureValue,
  formatPlain,
} from '../../methods/evalue/text';
import { parseNumberText } from '../../data/numberText';
import { twoByTwoFromCsv } from '../../methods/evalue/twoByTwoFromCsv';
import type { TwoByTwoFromCsv } from '../../methods/evalue/twoByTwoFromCsv';
import type { CliIo } from '../cliIo';
import type { LurkCommand } from '../defineCommand';
import { choiceOption, numberListOption, numberOption } from '../parseOptions';
import type { OptionKinds } from '../parseOptions';
import { UsageError } from '../usageError';
import { defineCommand } from '../defineCommand';

const OPTIONS: OptionKinds = {
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
  file: { type: 'string', short: 'f' },
  exposure: { type: 'string' },
  outcome: { type: 'string' },
  'exposed-values': { type: 'string' },
  'outcome-values': { type: 'string' },
  'reference-confounders': { type: 'string' },
  json: { type: 'boolean' },
};

const HELP = `lurk evalue — the E-value: how strongly a hidden confounder would have to be associated with both the
exposure and the outcome (as a risk ratio) to explain away an estimate, and its confidence interval.

From a reported estimate:
  lurk evalue --measure rr|or|hr|smd|md --estimate X [--lower L --upper U | --se S] [--level 0.95]
              [--outcome-prevalence rare|common] [--sd SD] [--target T] [--json]
From a 2×2 table of counts:
  lurk evalue --counts a,b,c,d [--measure rr|or] [--level 0.95] [--outcome-prevalence rare|common] [--json]
From a CSV file with one row per person:
  lurk evalue --file data.csv --exposure COLUMN --outcome COLUMN [--exposed-values V,…] [--outcome-values V,…]
              [--measure rr|or] [--json]

Options:
  --measure             rr (risk ratio), or (odds ratio), hr (hazard ratio), smd (standardized mean
                        difference d), md (mean difference; needs --sd). Default rr for counts and files.
  --estimate            the estimate on the measure's own scale
  --lower, --upper      the confidence limits, on the same scale
  --se                  or the standard error: of the log ratio (rr, or, hr), of d (smd), of the difference (md)
  --level               the confidence level of the interval (default 0.95)
  --outcome-prevalence  rare (under about 15%: used as a risk ratio) or common (converted); required for or and hr
  --sd                  the outcome's standard deviation, to turn a mean difference into d
  --target              the value to shift the estimate to instead of the null, on the measure's own scale
  --counts              a,b,c,d: exposed with the outcome, exposed without, unexposed with, unexposed without
  --file                a CSV file (comma, semicolon or tab separated) with a header row
  --exposure, --outcome the two columns of the file
  --exposed-values      the cell values that mean exposed (default: found in a 0/1, yes/no or true/false column)
  --outcome-values      the cell values that mean the outcome happened (default as above)
  --reference-confounders  NAME:RR_EXPOSURE:RR_OUTCOME[;…], confounders of known strength to compare with
  --json                print one JSON object instead of the report

${E_VALUE_CAUTION}
`;

/** `lurk evalue`: E-values from a reported estimate, a 2×2 table or a CSV file. */
export const command: LurkCommand = defineCommand({
  name: 'evalue',
  summary: 'E-value for a risk, odds or hazard ratio, a standardized or raw mean difference, or a 2×2 table',
  help: HELP,
  options: OPTIONS,
  async run({ values }, io) {
    const analysis = await analyse(values, io);
    const confounders = referenceConfounders(values['reference-confounders']).map((c) => assessReferenceConfounder(analysis.result, c));
    if (values.json) io.out(JSON.stringify(jsonReport(analysis, confounders), null, 2) + '\n');
    else io.out(textReport(analysis, confounders));
    return 0;
  },
});

interface Analysis {
  readonly result: EValueResult;
  readonly source: 'reported' | 'counts' | 'file';
  readonly csv?: TwoByTwoFromCsv;
}

type Values = Record<string, string | boolean | undefined>;

async function analyse(values: Values, io: CliIo): Promise<Analysis> {
  const level = numberOption(values.level, '--level');
  const outcomePrevalence = choiceOption(values['outcome-prevalence'], '--outcome-prevalence', OUTCOME_PREVALENCES) as
    | OutcomePrevalence
    | undefined;
  const target = numberOption(values.target, '--target');
  const sources = (['estimate', 'counts', 'file'] as const).filter((name) => values[name] !== undefined);
  if (sources.length === 0) throw new UsageError('--estimate', 'is required (or give --counts or --file); see lurk evalue --help');
  if (sources.length > 1) {
    throw new UsageError(`--${sources[1]}`, `cannot be combined with --${sources[0]}: give one source of the estimate`);
  }
  refuseOptionsOfOtherSources(values, sources[0]);

  if (sources[0] === 'estimate') {
    const measure = choiceOption(values.measure, '--measure', EFFECT_MEASURES) as EffectMeasure | undefined;
    if (measure === undefined) throw new UsageError('--measure', `is required with --estimate: one of ${EFFECT_MEASURES.join(', ')}`);
    const input: EValueInput = {
      measure,
      estimate: numberOption(values.estimate, '--estimate') as number,
      lower: numberOption(values.lower, '--lower') ?? null,
      upper: numberOption(values.upper, '--upper') ?? null,
      se: numberOption(values.se, '--se') ?? null,
      level: level ?? null,
      outcomePrevalence: outcomePrevalence ?? null,
      sd: numberOption(values.sd, '--sd') ?? null,
      target: target ?? null,
    };
    return { result: analyseEValue(input), source: 'reported' };
  }

  const measure = (choiceOption(values.measure, '--measure', ['rr', 'or'] as const) ?? 'rr') as TwoByTwoMeasure;
  if (sources[0] === 'counts') {
    const list = numberListOption(values.counts, '--counts') as number[];
    if (list.length !== 4) {
      throw new UsageError('--counts', `needs four counts a,b,c,d (exposed with the outcome, exposed without, unexposed with, unexposed without); got ${list.length}`);
    }
    const [a, b, c, d] = list;
    const result = withCountsOption(() => analyseEValueFromCounts({ counts: { a, b, c, d }, measure, level, outcomePrevalence, target }));
    return { result, source: 'counts' };
  }

  const path = values.file as string;
  if (typeof values.exposure !== 'string') throw new UsageError('--exposure', 'is required with --file: the name of the exposure column');
  if (typeof values.outcome !== 'string') throw new UsageError('--outcome', 'is required with --file: the name of the outcome column');
  let text: string;
  try {
    text = await io.readText(path);
  } catch (error) {
    const reason = (error as NodeJS.ErrnoException).code === 'ENOENT' ? 'no such file' : (error as Error).message;
    throw new UsageError('--file', `cannot read "${path}": ${reason}`);
  }
  const csv = twoByTwoFromCsv(readCsvText(text, 'file'), {
    exposureColumn: values.exposure,
    outcomeColumn: values.outcome,
    exposedValues: valueList(values['exposed-values']),
    outcomeValues: valueList(values['outcome-values']),
  });
  const result = withCountsOption(() => analyseEValueFromCounts({ counts: csv.counts, measure, level, outcomePrevalence, target }), 'file');
  return { result: { ...result, warnings: [...csv.warnings, ...result.warnings] }, source: 'file', csv };
}

/** Options that belong to another source of the estimate are refused rather than silently ignored. */
function refuseOptionsOfOtherSources(values: Values, source: 'estimate' | 'counts' | 'file'): void {
  const only: Record<string, readonly string[]> = {
    estimate: ['lower', 'upper', 'se', 'sd'],
    file: ['exposure', 'outcome', 'exposed-values', 'outcome-values'],
  };
  for (const [owner, names] of Object.entries(only)) {
    if (owner === source) continue;
    for (const name of names) {
      if (values[name] !== undefined) throw new UsageError(`--${name}`, `goes with --${owner}, not with --${source}`);
    }
  }
}

/** Problems with cells of the table name the --counts option (or the file they were counted from). */
function withCountsOption<T>(run: () => T, option: 'counts' | 'file' = 'counts'): T {
  const cells: Record<string, string> = {
    a: 'a (exposed, had the outcome)',
    b: 'b (exposed, no outcome)',
    c: 'c (unexposed, had the outcome)',
    d: 'd (unexposed, no outcome)',
  };
  try {
    return run();
  } catch (error) {
    if (!(error instanceof InputError)) throw error;
    const problems: InputProblem[] = error.problems.map((p) => {
      if (!p.field.startsWith('counts')) return p;
      const cell = p.field.split('.')[1];
      const what = option === 'file' ? 'the table counted from the file' : cell ? `count ${cells[cell]}` : 'the table';
      return inputProblem(`--${option}`, p.code, `${what} ${p.message}`, p.value);
    });
    throw new InputError(problems);
  }
}

function article(noun: string): string {
  return /^[aeiou]/i.test(noun) ? 'an' : 'a';
}

function valueList(value: string | boolean | undefined): string[] | null {
  if (typeof value !== 'string') return null;
  return value.split(',').map((v) => v.trim()).filter((v) => v !== '');
}

/** Parses NAME:RR_EXPOSURE:RR_OUTCOME[;…]; every problem names the option and the item. */
function referenceConfounders(value: string | boolean | undefined): ReferenceConfounder[] {
  if (value === undefined) return [];
  const option = '--reference-confounders';
  if (typeof value !== 'string' || value.trim() === '') throw new UsageError(option, 'needs NAME:RR_EXPOSURE:RR_OUTCOME[;…]');
  return value
    .split(';')
    .filter((item) => item.trim() !== '')
    .map((item, i) => {
      const parts = item.split(':');
      if (parts.length !== 3) throw new UsageError(option, `item ${i + 1} ("${item}") must be NAME:RR_EXPOSURE:RR_OUTCOME`);
      const confounder = { name: parts[0].trim(), rrExposure: parseNumberText(parts[1]), rrOutcome: parseNumberText(parts[2]) };
      const problems = validateReferenceConfounder(confounder, 'confounder');
      if (problems.length > 0) {
        const p = problems[0];
        const which = p.field.endsWith('name') ? 'name' : p.field.endsWith('rrExposure') ? 'risk ratio with the exposure' : 'risk ratio with the outcome';
        throw new UsageError(option, `item ${i + 1} ("${item}"): the ${which} ${p.message}`);
      }
      return confounder;
    });
}

function jsonReport(analysis: Analysis, confounders: readonly ReferenceConfounderAssessment[]) {
  const { result } = analysis;
  const reading = describeEValue(result);
  const table = analysis.source === 'reported' ? null : (result as EValueCountsResult).table;
  return {
    method: result.method,
    references: result.references,
    source: analysis.source,
    measure: result.measure,
    level: result.level,
    estimate: result.input.estimate,
    lower: result.interval?.lower ?? null,
    upper: result.interval?.upper ?? null,
    intervalSource: result.interval?.source ?? null,
    target: result.target,
    riskRatioScale: result.riskRatioScale,
    conversion: result.conversion,
    eValueEstimate: result.eValueEstimate,
    eValueInterval: result.eValueInterval,
    intervalLimitUsed: result.intervalLimitUsed,
    direction: result.direction,
    table: table
      ? {
          counts: table.counts,
          countsUsed: table.countsUsed,
          zeroCellCorrection: table.zeroCellCorrection,
          logStandardError: table.logSe,
        }
      : undefined,
    file: analysis.csv
      ? { rowsUsed: analysis.csv.rowsUsed, rowsMissing: analysis.csv.rowsMissing, exposure: analysis.csv.exposure, outcome: analysis.csv.outcome }
      : undefined,
    referenceConfounders: confounders.map((c) => ({ ...c, sentence: describeReferenceConfounder(c, result) })),
    reading: { estimate: reading.estimate, interval: reading.interval },
    caution: reading.caution,
    warnings: result.warnings,
  };
}

function textReport(analysis: Analysis, confounders: readonly ReferenceConfounderAssessment[]): string {
  const { result } = analysis;
  const reading = describeEValue(result);
  const measure = result.measure;
  const rr = result.riskRatioScale;
  const interval = (lower: number | null, upper: number | null, show: (x: number) => string) =>
    lower === null || upper === null ? '' : `  (${formatLevel(result.level)} interval ${show(lower)} to ${show(upper)})`;
  const own = (x: number) => formatMeasureValue(x, measure);
  const lines: string[] = [];
  lines.push(`E-value for ${article(MEASURE_LABELS[measure])} ${MEASURE_LABELS[measure]}, against ${result.targetIsNull ? 'the null' : `the target ${own(result.target)}`}`);
  lines.push('');
  if (analysis.source !== 'reported') {
    const { counts } = (result as EValueCountsResult).table;
    const from = analysis.csv ? `${analysis.csv.rowsUsed} rows of the file` : 'the counts';
    lines.push(`  Table (from ${from})   a ${counts.a}, b ${counts.b}, c ${counts.c}, d ${counts.d}`);
  }
  lines.push(`  Estimate                ${own(result.input.estimate)}${interval(result.interval?.lower ?? null, result.interval?.upper ?? null, own)}`);
  if (result.conversion.kind !== 'none') {
    lines.push(`  On the risk-ratio scale ${formatPlain(rr.estimate)}${interval(rr.lower, rr.upper, formatPlain)}`);
    if (!result.targetIsNull) lines.push(`  Target on that scale    ${formatPlain(rr.target)}`);
  }
  lines.push(`  E-value, estimate       ${formatEValue(result.eValueEstimate)}`);
  if (result.eValueInterval !== null) {
    const from = result.intervalLimitUsed === 'none' ? `the interval includes the ${result.targetIsNull ? 'null' : 'target'}` : `from the ${result.intervalLimitUsed} limit`;
    lines.push(`  E-value, interval       ${formatEValue(result.eValueInterval)}  (${from})`);
  } else {
    lines.push('  E-value, interval       none (no interval given)');
  }
  lines.push('');
  lines.push(reading.estimate);
  if (reading.interval) lines.push(reading.interval);
  for (const c of confounders) lines.push(describeReferenceConfounder(c, result));
  lines.push('');
  lines.push(`Conversion: ${result.conversion.note}`);
  for (const warning of result.warnings) lines.push(`Warning: ${warning}`);
  lines.push('');
  lines.push(reading.caution);
  return lines.join('\n') + '\n';
}
