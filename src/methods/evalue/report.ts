import type { EValueCountsResult } from '../../core/eValueAnalysis';
import type { ReferenceConfounderAssessment } from '../../core/referenceConfounder';
import type { EValueFormOutcome, EValueSource } from './request';
import { echoTyped } from '../../format/formatNumber';
import { jsonReading } from '../jsonReading';
import type { CommandFigure } from '../methodModule';
import type { PlotSpec } from '../../plot/plotSpec';
import { jointStrengthPlot } from './jointStrengthPlot';
import { MEASURE_LABELS, describeEValue, describeReferenceConfounder, formatEValue, formatLevel, formatMeasureValue, formatPlain } from './text';

/** What the reports are built from: the request reader's outcome (with a result) and where the estimate came from. */
export interface EValueReportInput {
  readonly outcome: EValueFormOutcome;
  readonly source: EValueSource;
}

function parts(input: EValueReportInput) {
  const result = input.outcome.result;
  if (!result) throw new Error('an E-value report needs a result');
  const confounders = input.outcome.confounders.filter((c): c is ReferenceConfounderAssessment => c !== null);
  return { result, confounders, csv: input.outcome.csv };
}

/** The figures of `lurk evalue --svg NAME`. */
export const EVALUE_FIGURES: readonly CommandFigure[] = Object.freeze([
  { name: 'strengths', shows: 'the pairs of confounder strengths that would explain away the estimate and the interval, with the reference confounders' },
]);

/** The figures of an E-value result by name (the joint-strength plot the page draws, the file's columns as labels). */
export function eValueFigures(input: EValueReportInput): Readonly<Record<string, () => PlotSpec | null>> {
  const { result, confounders, csv } = parts(input);
  const study = csv ? { exposure: csv.exposure.column, outcome: csv.outcome.column } : undefined;
  return { strengths: () => jointStrengthPlot(result, { study, confounders }) };
}

/** The JSON report of `lurk evalue --json`: the inputs echoed, the E-values, the readings and the warnings. */
export function eValueJsonReport(input: EValueReportInput) {
  const { result, confounders, csv } = parts(input);
  const reading = describeEValue(result, undefined, input.outcome.typed?.target);
  const counted = input.source === 'reported' ? null : (result as EValueCountsResult);
  const table = counted ? counted.table : null;
  return {
    method: result.method,
    references: result.references,
    source: input.source,
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
    targetDirection: result.targetDirection,
    design: counted ? counted.design : undefined,
    requestedMeasure: counted ? counted.requestedMeasure : undefined,
    conventions: result.conventions,
    table: table
      ? {
          counts: table.counts,
          countsUsed: table.countsUsed,
          zeroCellCorrection: table.zeroCellCorrection,
          logStandardError: table.logSe,
        }
      : undefined,
    file: csv ? { rowsUsed: csv.rowsUsed, rowsMissing: csv.rowsMissing, exposure: csv.exposure, outcome: csv.outcome } : undefined,
    referenceConfounders: confounders.map((c) => ({ ...c, sentence: describeReferenceConfounder(c, result) })),
    reading: jsonReading(reading.sentences, { estimate: reading.estimate, interval: reading.interval }),
    caution: reading.caution,
    warnings: result.warnings,
  };
}

/** The text report of `lurk evalue`: the table (if any), the estimate, the E-values, the readings and the caution. */
export function eValueTextReport(input: EValueReportInput): string {
  const { result, confounders, csv } = parts(input);
  const typed = input.outcome.typed;
  const reading = describeEValue(result, undefined, typed?.target);
  const measure = result.measure;
  const rr = result.riskRatioScale;
  const interval = (lower: number | null, upper: number | null, show: (x: number) => string) =>
    lower === null || upper === null ? '' : `  (${formatLevel(result.level)} interval ${show(lower)} to ${show(upper)})`;
  const own = (x: number) => formatMeasureValue(x, measure);
  const lines: string[] = [];
  const echo = (x: number | null | undefined, text: string | undefined) => echoTyped(x, text, (v) => own(v as number));
  lines.push(`E-value for ${article(MEASURE_LABELS[measure])} ${MEASURE_LABELS[measure]}, against ${result.targetIsNull ? 'the null' : `the target ${echo(result.target, typed?.target)}`}`);
  lines.push('');
  if (input.source !== 'reported') {
    const { counts } = (result as EValueCountsResult).table;
    const from = csv ? `${csv.rowsUsed} rows of the file` : 'the counts';
    const counted = result as EValueCountsResult;
    lines.push(`  Table (from ${from})   a ${counts.a}, b ${counts.b}, c ${counts.c}, d ${counts.d}`);
    lines.push(`  Design                  ${counted.design}${counted.requestedMeasure !== counted.measure ? ` (the table's own ${MEASURE_LABELS[counted.measure]} is used)` : ''}`);
  }
  const typedInterval = result.interval?.source === 'limits' && typed ? { lower: typed.lower, upper: typed.upper } : null;
  const ownInterval =
    result.interval === null
      ? ''
      : typedInterval
        ? `  (${formatLevel(result.level)} interval ${echo(result.interval.lower, typedInterval.lower)} to ${echo(result.interval.upper, typedInterval.upper)})`
        : interval(result.interval.lower, result.interval.upper, own);
  lines.push(`  Estimate                ${input.source === 'reported' ? echo(result.input.estimate, typed?.estimate) : own(result.input.estimate)}${ownInterval}`);
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
  for (const sentence of reading.sentences) lines.push(sentence);
  for (const c of confounders) lines.push(describeReferenceConfounder(c, result));
  lines.push('');
  lines.push(`Conversion: ${result.conversion.note}`);
  lines.push('Conventions:');
  for (const c of result.conventions) lines.push(`  - ${c.text}`);
  for (const warning of result.warnings) lines.push(`Warning: ${warning}`);
  lines.push('');
  lines.push(reading.caution);
  return lines.join('\n') + '\n';
}

function article(noun: string): string {
  return /^[aeiou]/i.test(noun) ? 'an' : 'a';
}
