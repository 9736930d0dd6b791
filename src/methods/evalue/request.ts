import { analyseEValue, analyseEValueFromCounts, STUDY_DESIGNS, validateEValueCountsInput, validateEValueInput } from '../../core/eValueAnalysis';
import type { StudyDesign } from '../../core/eValueAnalysis';
import type { EValueCountsInput, EValueInput, EValueResult } from '../../core/eValueAnalysis';
import { InputError, inputProblem } from '../../core/inputProblem';
import type { InputProblem } from '../../core/inputProblem';
import { assessReferenceConfounder, validateReferenceConfounder } from '../../core/referenceConfounder';
import type { ReferenceConfounderAssessment } from '../../core/referenceConfounder';
import { EFFECT_MEASURES, OUTCOME_PREVALENCES } from '../../core/riskRatioScale';
import type { EffectMeasure, OutcomePrevalence } from '../../core/riskRatioScale';
import type { TwoByTwoMeasure } from '../../core/twoByTwo';
import type { CsvTable } from '../../data/csv';
import type { NumberKind } from '../../data/numberText';
import { fieldReader, RATIO_RANGE, type FieldReader } from '../fieldReader';
import { twoByTwoFromCsv } from './twoByTwoFromCsv';
import type { TwoByTwoFromCsv } from './twoByTwoFromCsv';
import { readResultRow } from '../../data/sqlText';
import { twoByTwoFromSqlRow } from './twoByTwoSql';

/** Where the estimate comes from. */
export type EValueSource = 'reported' | 'counts' | 'file' | 'summary';

/** A reference confounder as typed. */
export interface ConfounderText {
  readonly name: string;
  readonly rrExposure: string;
  readonly rrOutcome: string;
}

/**
 * Everything the E-value form holds, as the user typed it (text, never parsed numbers), so nothing typed is
 * lost and the whole form can be saved and restored. A CSV's rows are not part of it, only its name and the
 * choices made about its columns.
 */
export interface EValueFormInputs {
  readonly source: EValueSource;
  readonly measure: EffectMeasure;
  readonly estimate: string;
  /** Whether the interval is given by its limits or by the standard error. */
  readonly intervalBy: 'limits' | 'se';
  readonly lower: string;
  readonly upper: string;
  readonly se: string;
  /** The confidence level, as a percentage ("95") or a fraction ("0.95"). */
  readonly level: string;
  readonly outcomePrevalence: '' | OutcomePrevalence;
  readonly sd: string;
  readonly target: string;
  readonly counts: { readonly a: string; readonly b: string; readonly c: string; readonly d: string };
  readonly tableMeasure: TwoByTwoMeasure;
  /** How a 2×2 table was sampled: cohort (default when empty) or case-control. */
  readonly design: '' | StudyDesign;
  readonly fileName: string;
  readonly exposureColumn: string;
  readonly outcomeColumn: string;
  /** Values meaning exposed; empty to use the values found from a yes/no-like column. */
  readonly exposedValues: readonly string[];
  readonly outcomeValues: readonly string[];
  readonly confounders: readonly ConfounderText[];
  /** Summary statistics: the table the counting query reads (columns as for a file), and its pasted result. */
  readonly summaryTable?: string;
  readonly summaryResult?: string;
}

export function emptyEValueForm(): EValueFormInputs {
  return Object.freeze({
    source: 'reported',
    measure: 'rr',
    estimate: '',
    intervalBy: 'limits',
    lower: '',
    upper: '',
    se: '',
    level: '95',
    outcomePrevalence: '',
    sd: '',
    target: '',
    counts: Object.freeze({ a: '', b: '', c: '', d: '' }),
    tableMeasure: 'rr',
    design: '',
    fileName: '',
    exposureColumn: '',
    outcomeColumn: '',
    exposedValues: Object.freeze([]),
    outcomeValues: Object.freeze([]),
    confounders: Object.freeze([]),
    summaryTable: '',
    summaryResult: '',
  });
}

/**
 * A complete form from whatever was saved (a partial object, an older version, or nothing): every field takes
 * the saved text when it has the right type and the empty form's value otherwise.
 */
export function normaliseEValueForm(saved: unknown): EValueFormInputs {
  const base = emptyEValueForm();
  if (saved === null || typeof saved !== 'object') return base;
  const s = saved as Record<string, unknown>;
  const asText = (value: unknown): string | null => (typeof value === 'string' ? value : typeof value === 'number' && Number.isFinite(value) ? String(value) : null);
  const text = (key: keyof EValueFormInputs) => asText(s[key]) ?? (base[key] as string);
  const pick = <T extends string>(key: keyof EValueFormInputs, choices: readonly T[]) => {
    const wanted = typeof s[key] === 'string' ? (s[key] as string).trim().toLowerCase() : null;
    return choices.find((c) => c === wanted) ?? (base[key] as T);
  };
  const strings = (value: unknown) => (Array.isArray(value) ? value.map(asText).filter((v): v is string => v !== null) : []);
  const counts = (s.counts ?? {}) as Record<string, unknown>;
  const countText = (cell: string) => asText(counts[cell]) ?? '';
  const confounders = Array.isArray(s.confounders)
    ? s.confounders
        .filter((c): c is Record<string, unknown> => c !== null && typeof c === 'object')
        .map((c) =>
          Object.freeze({
            name: typeof c.name === 'string' ? c.name : '',
            rrExposure: asText(c.rrExposure) ?? '',
            rrOutcome: asText(c.rrOutcome) ?? '',
          }),
        )
    : [];
  return Object.freeze({
    source: pick('source', ['reported', 'counts', 'file', 'summary'] as const),
    measure: pick('measure', EFFECT_MEASURES),
    estimate: text('estimate'),
    intervalBy: pick('intervalBy', ['limits', 'se'] as const),
    lower: text('lower'),
    upper: text('upper'),
    se: text('se'),
    level: text('level'),
    outcomePrevalence: pick('outcomePrevalence', ['', 'rare', 'common'] as const),
    sd: text('sd'),
    target: text('target'),
    counts: Object.freeze({ a: countText('a'), b: countText('b'), c: countText('c'), d: countText('d') }),
    tableMeasure: pick('tableMeasure', ['rr', 'or'] as const),
    design: pick('design', ['', ...STUDY_DESIGNS] as const),
    fileName: text('fileName'),
    exposureColumn: text('exposureColumn'),
    outcomeColumn: text('outcomeColumn'),
    exposedValues: Object.freeze(strings(s.exposedValues)),
    outcomeValues: Object.freeze(strings(s.outcomeValues)),
    confounders: Object.freeze(confounders),
    summaryTable: text('summaryTable'),
    summaryResult: text('summaryResult'),
  });
}

/** What the form's current text gives. */
export interface EValueFormOutcome {
  /** The analysis, or null while the form has problems or is not filled in yet. */
  readonly result: EValueResult | null;
  /** Every problem, by input field (`estimate`, `counts.a`, `exposure`, `confounders[1].rrOutcome`, …). */
  readonly problems: readonly InputProblem[];
  /** Whether the user has entered the main value(s) yet: until then "required" problems are not worth showing. */
  readonly started: boolean;
  /** The table counted from the file (file source only). */
  readonly csv: TwoByTwoFromCsv | null;
  /** One entry per confounder row: its assessment, or null while it has problems or no result exists. */
  readonly confounders: ReadonlyArray<ReferenceConfounderAssessment | null>;
  /** The numbers as typed (estimate, limits, target), so that reports echo them with the precision typed. */
  readonly typed?: { readonly estimate: string; readonly lower: string; readonly upper: string; readonly target: string };
}

/**
 * Reads the form's text with the one field reader (numbers with a decimal point or an unambiguous decimal comma;
 * counts as whole numbers, thousands separators allowed; the level as "95", "95%" or "0.95"; choices without
 * regard to case), checks it with the core's validation, and runs the analysis when there is no problem. Text
 * that is not a number is named by field with what was typed; nothing is thrown. The page, the command line and
 * saved forms all come through here, so the same text gives the same value or the same message everywhere.
 *
 * @param form the form as typed (a choice typed in another case, "RR", is accepted)
 * @param table the CSV read from the chosen file (file source only), or null when none is loaded
 */
export function evaluateEValueForm(form: EValueFormInputs, table: CsvTable | TwoByTwoFromCsv | null): EValueFormOutcome {
  const reader = fieldReader();
  const problems = reader.problems;
  const number = (field: string, text: string, kind: NumberKind = 'decimal'): number | null => boundedSize(reader, field, reader.number(field, text, kind));
  const level = number('level', form.level, 'level');
  const target = number('target', form.target);
  const prevalence = reader.choice('outcomePrevalence', form.outcomePrevalence, OUTCOME_PREVALENCES);
  let result: EValueResult | null = null;
  let csv: TwoByTwoFromCsv | null = null;
  let started: boolean;

  const run = (validate: () => InputProblem[], analyse: () => EValueResult) => {
    // Fields that failed to be read are already reported; the rules are checked on the rest.
    const read = new Set(problems.map((p) => p.field));
    const ruleProblems = validate().filter((p) => !read.has(p.field));
    problems.push(...ruleProblems);
    if (problems.length === 0) {
      try {
        result = analyse();
      } catch (error) {
        if (error instanceof InputError) problems.push(...error.problems);
        else throw error;
      }
    }
  };

  if (form.source === 'reported') {
    started = String(form.estimate).trim() !== '';
    const measure = reader.choice('measure', form.measure, EFFECT_MEASURES);
    const limits = form.intervalBy === 'limits';
    const estimate = number('estimate', form.estimate);
    if (measure === null) {
      if (!started) problems.unshift(inputProblem('estimate', 'required', 'is required'));
      if (!reader.has('measure')) problems.push(inputProblem('measure', 'required', `is required: one of ${EFFECT_MEASURES.join(', ')}`));
    }
    const input: EValueInput = {
      measure: measure ?? 'rr',
      estimate: estimate as number,
      lower: limits ? number('lower', form.lower) : null,
      upper: limits ? number('upper', form.upper) : null,
      se: limits ? null : number('se', form.se),
      level,
      outcomePrevalence: measure === 'or' || measure === 'hr' ? prevalence : null,
      sd: measure === 'md' ? number('sd', form.sd) : null,
      target,
    };
    if (measure !== null) {
      run(
        () => validateEValueInput(input),
        () => analyseEValue(input),
      );
    }
  } else {
    const tableMeasure = reader.choice('tableMeasure', form.tableMeasure, ['rr', 'or'] as const);
    let summaryWarnings: readonly string[] = [];
    const counts =
      form.source === 'summary'
        ? countsFromSummary(form.summaryResult ?? '', problems, (w) => (summaryWarnings = w))
        : countsFrom(form, table, number, problems, (c) => (csv = c));
    started =
      form.source === 'counts'
        ? Object.values(form.counts).some((t) => String(t).trim() !== '')
        : form.source === 'summary'
          ? (form.summaryResult ?? '').trim() !== ''
          : table !== null;
    if (counts && tableMeasure !== null) {
      const input: EValueCountsInput = {
        counts,
        measure: tableMeasure,
        design: reader.choice('design', form.design, STUDY_DESIGNS),
        level,
        outcomePrevalence: tableMeasure === 'or' ? prevalence : null,
        target,
      };
      run(
        () => validateEValueCountsInput(input).map((p) => (form.source === 'summary' ? asSummaryProblem(p) : p)),
        () => withWarnings(withFileWarnings(analyseEValueFromCounts(input), csv), summaryWarnings),
      );
    }
  }

  const finalResult = result as EValueResult | null;
  const confounders = form.confounders.map((row, i) => {
    const field = `confounders[${i}]`;
    const before = problems.length;
    const confounder = {
      name: row.name,
      rrExposure: number(`${field}.rrExposure`, row.rrExposure) ?? NaN,
      rrOutcome: number(`${field}.rrOutcome`, row.rrOutcome) ?? NaN,
    };
    const read = new Set(problems.slice(before).map((p) => p.field));
    const rowProblems = validateReferenceConfounder(confounder, field).filter((p) => !read.has(p.field));
    problems.push(...rowProblems);
    if (problems.length > before || !finalResult) return null;
    return assessReferenceConfounder(finalResult, confounder);
  });

  return Object.freeze({
    result: finalResult,
    problems: Object.freeze([...problems]),
    started,
    csv,
    confounders: Object.freeze(confounders),
    typed: Object.freeze(
      form.source === 'reported'
        ? { estimate: form.estimate, lower: form.intervalBy === 'limits' ? form.lower : '', upper: form.intervalBy === 'limits' ? form.upper : '', target: form.target }
        : { estimate: '', lower: '', upper: '', target: form.target },
    ),
  });
}

/** The file's own warnings (rows left out, repaired header) go first among the result's warnings. */
function withFileWarnings(result: EValueResult, csv: TwoByTwoFromCsv | null): EValueResult {
  if (!csv || csv.warnings.length === 0) return result;
  return Object.freeze({ ...result, warnings: Object.freeze([...csv.warnings, ...result.warnings]) });
}

/** A problem of the counts (`counts.a`) as a problem of the pasted result, naming its column (`a`). */
function asSummaryProblem(p: InputProblem): InputProblem {
  const cell = /^counts\.([abcd])$/.exec(p.field)?.[1];
  if (cell) return { ...p, field: 'summaryResult', message: `column ${cell} ${p.message}` };
  return p.field === 'counts' ? { ...p, field: 'summaryResult', message: `the counted table ${p.message}` } : p;
}

/** Warnings of the data (rows left out of a database's counts) go first among the result's warnings. */
function withWarnings(result: EValueResult, warnings: readonly string[]): EValueResult {
  if (warnings.length === 0) return result;
  return Object.freeze({ ...result, warnings: Object.freeze([...warnings, ...result.warnings]) });
}

/**
 * The 2×2 counts from the pasted result of the counting query (a JSON object, or CSV header line and row).
 * Problems are named `summaryResult`, each message naming the result's column.
 */
function countsFromSummary(text: string, problems: InputProblem[], keepWarnings: (warnings: readonly string[]) => void) {
  if (text.trim() === '') {
    problems.push(inputProblem('summaryResult', 'required', 'paste the one row the counting query returned'));
    return null;
  }
  const row = readResultRow(text);
  if (!row) {
    problems.push(inputProblem('summaryResult', 'not-a-result', "must be the query's one result row: a JSON object, or CSV text with the header line and the row"));
    return null;
  }
  try {
    const read = twoByTwoFromSqlRow(row);
    keepWarnings(read.warnings);
    return { ...read.counts };
  } catch (error) {
    if (!(error instanceof InputError)) throw error;
    for (const p of error.problems) {
      const column = /^summary\.(.+)$/.exec(p.field)?.[1];
      problems.push({ ...p, field: 'summaryResult', message: column ? `column ${column} ${p.message}` : p.message });
    }
    return null;
  }
}

/** "95" and "0.95" both mean 95%: a number above 1 and below 100 is read as a percentage. */
export function parseLevel(value: number | null): number | null {
  if (value === null || Number.isNaN(value)) return null;
  return value > 1 && value < 100 ? value / 100 : value;
}

function countsFrom(
  form: EValueFormInputs,
  table: CsvTable | TwoByTwoFromCsv | null,
  number: (field: string, text: string, kind?: NumberKind) => number | null,
  problems: InputProblem[],
  keepCsv: (csv: TwoByTwoFromCsv) => void,
) {
  if (form.source === 'counts') {
    const cells = (['a', 'b', 'c', 'd'] as const).map((cell) => {
      const value = number(`counts.${cell}`, form.counts[cell], 'whole');
      if (value === null && String(form.counts[cell] ?? '').trim() === '') problems.push(inputProblem(`counts.${cell}`, 'required', 'is required (a count, 0 or more)'));
      return value;
    });
    if (cells.some((v) => v === null)) {
      // The cells that were read are still checked against the rules, so every problem shows at once.
      const read = new Set(problems.map((p) => p.field));
      const [a, b, c, d] = cells.map((v) => v ?? NaN);
      problems.push(...validateEValueCountsInput({ counts: { a, b, c, d }, measure: 'rr' }).filter((p) => p.field.startsWith('counts.') && !read.has(p.field)));
      return null;
    }
    const [a, b, c, d] = cells as number[];
    return { a, b, c, d };
  }
  if (!table) {
    problems.push(inputProblem('file', 'required', 'choose a CSV file with one row per person'));
    return null;
  }
  try {
    // A table already counted from a stream (a large file read chunk by chunk) is taken as it is.
    const csv = 'counts' in table ? table : twoByTwoFromCsv(table, {
      exposureColumn: form.exposureColumn,
      outcomeColumn: form.outcomeColumn,
      exposedValues: form.exposedValues,
      outcomeValues: form.outcomeValues,
    });
    keepCsv(csv);
    return csv.counts;
  } catch (error) {
    if (error instanceof InputError) problems.push(...error.problems);
    else throw error;
    return null;
  }
}

/**
 * A number whose size is within [1e-300, 1e300] (or 0, which the method's rules judge): beyond that range a ratio's
 * E-value or its conversions are not representable, and such a value is a typing slip rather than a finding.
 */
function boundedSize(reader: FieldReader, field: string, value: number | null): number | null {
  if (value === null || value === 0) return value;
  const size = Math.abs(value);
  if (size >= RATIO_RANGE.low && size <= RATIO_RANGE.high) return value;
  reader.problems.push(inputProblem(field, 'outside-range', `must be between ${RATIO_RANGE.low} and ${RATIO_RANGE.high} in size (beyond that an E-value cannot be represented), got ${value}`, value));
  return null;
}
