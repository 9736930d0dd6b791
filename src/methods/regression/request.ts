import { analyseOvb, validateOvbInput, type OvbBenchmarkInput, type OvbInput, type OvbResult } from '../../core/ovbAnalysis';
import { ovbRegressionSummary, type OvbRegressionSpec, type OvbRegressionSummary } from '../../core/ovbRegression';
import { designFromCrossProducts } from '../../core/crossProductFit';
import { INTERCEPT_NAME, type TriangularDesign } from '../../core/linearModel';
import type { BiasDirection } from '../../core/confounderAdjustment';
import { InputError, inputProblem, type InputProblem } from '../../core/inputProblem';
import { alphaWithinRange, fieldReader, type FieldReader } from '../fieldReader';
import { readCsvText } from '../../data/csv';
import { crossProductsFromSqlRow, summaryStatisticsSql } from './summaryStatisticsSql';
import { parseBenchmarkList } from './ovbRegressionData';

/** Where the regression's numbers come from. */
export type OvbSource = 'reported' | 'file' | 'summary';

/** A covariate's t-statistics as typed from a paper's tables. */
export interface CovariateTText {
  readonly name: string;
  /** Its t in the outcome regression. */
  readonly outcomeT: string;
  /** Its t in the regression of the treatment on the covariates (often not printed). */
  readonly treatmentT: string;
}

/** A covariate's partial R²s (fractions or percentages), as typed: with the outcome and, if known, with the treatment. */
export interface CovariateR2Text {
  readonly name: string;
  /** Its partial R² with the outcome (given the treatment and the other covariates). */
  readonly outcomeR2: string;
  /** Its partial R² with the treatment (given the other covariates); may be empty. */
  readonly treatmentR2: string;
}

/** Which way the omitted confounder is taken to move the estimate. */
export const DIRECTIONS: readonly BiasDirection[] = ['toward-zero', 'away-from-zero'];

/**
 * Everything the regression form holds, as typed (text, never parsed numbers), so nothing is lost and the form
 * can be saved and restored. A CSV's rows are never part of it: only its name and the column choices.
 */
export interface OvbFormInputs {
  readonly source: OvbSource;
  readonly estimate: string;
  readonly se: string;
  /** Whether the degrees of freedom are typed, or n and the number of coefficients. */
  readonly dfBy: 'df' | 'n';
  readonly df: string;
  readonly n: string;
  readonly parameters: string;
  readonly covariateTs: readonly CovariateTText[];
  /** Covariates given by their partial R²s instead of t-statistics (the command line's --covariate-r2). */
  readonly covariateR2s?: readonly CovariateR2Text[];
  readonly fileName: string;
  readonly outcome: string;
  readonly treatment: string;
  /** Chosen covariate columns (file and summary statistics). */
  readonly covariates: readonly string[];
  /** Numeric columns to dummy-code as categories (e.g. a region code), separated by commas. */
  readonly categorical: string;
  /** Benchmarks as text: names separated by commas, a group joined by "+"; empty for every covariate. */
  readonly benchmarks: string;
  /** Summary statistics: the table the query reads, and its pasted result (JSON object, or CSV header + row). */
  readonly summaryTable: string;
  readonly summaryColumns: string;
  readonly summaryResult: string;
  readonly k: string;
  readonly q: string;
  readonly alpha: string;
  /** toward-zero or away-from-zero, as typed (read without regard to case). */
  readonly direction: string;
  /** A confounder strength to evaluate, as percentages or fractions. */
  readonly r2dz: string;
  readonly r2yz: string;
  /** Upper end of both plot axes (percentage or fraction); empty for automatic. */
  readonly plotMax: string;
}

export function emptyOvbForm(): OvbFormInputs {
  return Object.freeze({
    source: 'reported',
    estimate: '',
    se: '',
    dfBy: 'df',
    df: '',
    n: '',
    parameters: '',
    covariateTs: Object.freeze([]),
    fileName: '',
    outcome: '',
    treatment: '',
    covariates: Object.freeze([]),
    categorical: '',
    benchmarks: '',
    summaryTable: '',
    summaryColumns: '',
    summaryResult: '',
    k: '1, 2, 3',
    q: '1',
    alpha: '0.05',
    direction: 'toward-zero',
    r2dz: '',
    r2yz: '',
    plotMax: '',
  });
}

/** A complete form from whatever was saved (partial, older, or nothing): unknown or mistyped fields take defaults. */
export function normaliseOvbForm(saved: unknown): OvbFormInputs {
  const base = emptyOvbForm();
  if (!saved || typeof saved !== 'object') return base;
  const s = saved as Record<string, unknown>;
  const asText = (value: unknown, fallback = ''): string => (typeof value === 'string' ? value : typeof value === 'number' && Number.isFinite(value) ? String(value) : fallback);
  const text = (key: keyof OvbFormInputs): string => asText(s[key], base[key] as string);
  const strings = (value: unknown): string[] => (Array.isArray(value) ? value.filter((v): v is string => typeof v === 'string') : []);
  const covariateTs = Array.isArray(s.covariateTs)
    ? s.covariateTs
        .filter((c): c is Record<string, unknown> => !!c && typeof c === 'object')
        .map((c) => Object.freeze({ name: asText(c.name), outcomeT: asText(c.outcomeT), treatmentT: asText(c.treatmentT) }))
    : [];
  const covariateR2s = Array.isArray(s.covariateR2s)
    ? s.covariateR2s
        .filter((c): c is Record<string, unknown> => !!c && typeof c === 'object')
        .map((c) => Object.freeze({ name: asText(c.name), outcomeR2: asText(c.outcomeR2), treatmentR2: asText(c.treatmentR2) }))
    : [];
  const direction = typeof s.direction === 'string' ? DIRECTIONS.find((d) => d === (s.direction as string).trim().toLowerCase()) : undefined;
  return Object.freeze({
    source: s.source === 'file' || s.source === 'summary' ? s.source : 'reported',
    estimate: text('estimate'),
    se: text('se'),
    dfBy: s.dfBy === 'n' ? 'n' : 'df',
    df: text('df'),
    n: text('n'),
    parameters: text('parameters'),
    covariateTs: Object.freeze(covariateTs),
    ...(covariateR2s.length > 0 ? { covariateR2s: Object.freeze(covariateR2s) } : {}),
    fileName: text('fileName'),
    outcome: text('outcome'),
    treatment: text('treatment'),
    covariates: Object.freeze(strings(s.covariates)),
    categorical: text('categorical'),
    benchmarks: text('benchmarks'),
    summaryTable: text('summaryTable'),
    summaryColumns: text('summaryColumns'),
    summaryResult: text('summaryResult'),
    k: text('k'),
    q: text('q'),
    alpha: text('alpha'),
    direction: direction ?? 'toward-zero',
    r2dz: text('r2dz'),
    r2yz: text('r2yz'),
    plotMax: text('plotMax'),
  }) as OvbFormInputs;
}

/** What the form gives: the analysis (or null) and every problem, keyed by form field. */
export interface OvbFormOutcome {
  readonly result: OvbResult | null;
  readonly problems: readonly InputProblem[];
  /** Whether the user has typed the main numbers yet ("required" problems are shown only then). */
  readonly started: boolean;
  /** The regression behind the result, for raw data and summary statistics. */
  readonly regression: OvbRegressionSummary | null;
  /** The chosen upper end of the plot axes, or undefined for automatic. */
  readonly plotMax: number | undefined;
}

/**
 * Turns the form into the analysis. `fileData` is the regression data read from the chosen file (null until
 * it has been read; changing the file's column choices needs a new read). Problems name form fields: estimate, se, df,
 * n, parameters, covariateTs[i].outcomeT, k, q, alpha, r2dz, r2yz, plotMax, outcome, treatment, covariates,
 * benchmarks, summaryTable, summaryColumns, summaryResult.
 */
export function evaluateOvbForm(form: OvbFormInputs, fileData: FileRegression | null): OvbFormOutcome {
  const reader = fieldReader();
  const problems = reader.problems;
  const settings = readSettings(form, reader);
  let regression: OvbRegressionSummary | null = null;
  let base: Pick<OvbInput, 'estimate' | 'se' | 'df' | 'n' | 'parameters' | 'benchmarks'> | null = null;
  let started = true;
  let rowOfBenchmark: number[] = [];
  if (form.source === 'reported') {
    started = form.estimate.trim() !== '' || form.se.trim() !== '';
    const estimate = opt(reader.required('estimate', form.estimate, 'decimal', 'the coefficient of the treatment'));
    const se = opt(reader.required('se', form.se, 'decimal', 'its standard error'));
    // |t| beyond 1e6 overflows the bounds' arithmetic (t² and its scenarios) and is a slip in a reported number.
    if (estimate !== undefined && se !== undefined && se > 0 && !(Math.abs(estimate / se) <= MAX_ABS_T)) {
      problems.push(inputProblem('se', 'outside-range', `is too small for the estimate: t = estimate / se must be at most ${MAX_ABS_T.toLocaleString('en')} in size, got ${(estimate / se).toPrecision(3)}`, se));
    }
    const df = form.dfBy === 'df' ? opt(reader.required('df', form.df, 'whole', 'the residual degrees of freedom')) : undefined;
    const n = form.dfBy === 'n' ? opt(reader.required('n', form.n, 'whole', 'the number of observations')) : undefined;
    const parameters = form.dfBy === 'n' ? opt(reader.required('parameters', form.parameters, 'whole', 'the number of coefficients')) : undefined;
    const benchmarks: OvbBenchmarkInput[] = [];
    rowOfBenchmark = [];
    form.covariateTs.forEach((c, i) => {
      if (c.name.trim() === '' && c.outcomeT.trim() === '' && c.treatmentT.trim() === '') return;
      const outcomeT = opt(reader.required(`covariateTs[${i}].outcomeT`, c.outcomeT, 'decimal', 'its t in the outcome regression'));
      const treatmentT = opt(reader.number(`covariateTs[${i}].treatmentT`, c.treatmentT, 'decimal'));
      if (c.name.trim() === '') problems.push(inputProblem(`covariateTs[${i}].name`, 'required', 'needs a name.'));
      if (outcomeT !== undefined) rowOfBenchmark.push(i);
      if (outcomeT !== undefined) benchmarks.push({ covariate: c.name.trim() || `covariate ${i + 1}`, outcomeT, ...(treatmentT !== undefined ? { treatmentT } : {}) });
    });
    (form.covariateR2s ?? []).forEach((c, i) => {
      if (c.name.trim() === '' && c.outcomeR2.trim() === '' && c.treatmentR2.trim() === '') return;
      const r2yxj = opt(reader.required(`covariateR2s[${i}].outcomeR2`, c.outcomeR2, 'fraction', 'its partial R² with the outcome'));
      const r2dxj = opt(reader.number(`covariateR2s[${i}].treatmentR2`, c.treatmentR2, 'fraction'));
      if (c.name.trim() === '') problems.push(inputProblem(`covariateR2s[${i}].name`, 'required', 'needs a name.'));
      if (r2yxj !== undefined) rowOfBenchmark.push(R2_ROW + i);
      if (r2yxj !== undefined) benchmarks.push({ covariate: c.name.trim() || `covariate ${i + 1}`, r2yxj, ...(r2dxj !== undefined ? { r2dxj } : {}) });
    });
    if (estimate !== undefined && se !== undefined) base = { estimate, se, ...(df !== undefined ? { df } : {}), ...(n !== undefined ? { n } : {}), ...(parameters !== undefined ? { parameters } : {}), benchmarks };
  } else if (form.source === 'file') {
    started = form.fileName !== '';
    if (!fileData) {
      problems.push(inputProblem('file', 'required', form.fileName ? 'read the file to fit the regression.' : 'choose a CSV file.'));
    } else {
      regression = collect(problems, () => ovbRegressionSummary(fileData.design, { ...fileData.spec, ...benchmarkGroups(form) }), listField);
    }
  } else {
    started = form.summaryResult.trim() !== '';
    regression = summaryRegression(form, problems);
  }
  if (regression && !(regression.df > 1)) {
    problems.push(
      inputProblem(
        form.source === 'file' ? 'file' : 'summaryResult',
        'too-few-rows',
        `has too few complete rows for this model: ${regression.n} rows and ${regression.n - regression.df} coefficients leave ${regression.df} residual degrees of freedom; at least 2 are needed.`,
      ),
    );
  } else if (regression) {
    base = { estimate: regression.estimate, se: regression.se, df: regression.df, benchmarks: regression.benchmarks };
  }
  let result: OvbResult | null = null;
  if (base && problems.length === 0) {
    const input: OvbInput = { ...base, ...settings };
    const analysisProblems = validateOvbInput(input).map((p) => toFormField(p, rowOfBenchmark));
    problems.push(...analysisProblems);
    if (analysisProblems.length === 0) result = analyseOvb(input);
  }
  const plotMax = opt(reader.number('plotMax', form.plotMax, 'fraction'));
  if (plotMax !== undefined && !(plotMax > 0 && plotMax < 1)) problems.push(inputProblem('plotMax', 'outside-interval', 'must be above 0 and below 100%.', form.plotMax));
  return { result, problems, started, regression, plotMax };
}

/** The regression data read from a file, and how its columns enter the analysis. */
export interface FileRegression {
  readonly design: TriangularDesign;
  readonly spec: OvbRegressionSpec;
}

/** The SQL to run for summary statistics, or a problem naming the missing field. */
export function ovbSummarySql(form: OvbFormInputs): { sql: string; problem: InputProblem | null } {
  const variables = summaryVariables(form);
  if (form.summaryTable.trim() === '') return { sql: '', problem: inputProblem('summaryTable', 'required', 'needs the name of the table (or view) in your database.') };
  if (!variables) return { sql: '', problem: inputProblem('summaryColumns', 'required', 'name the outcome, the treatment and the covariates.') };
  try {
    return { sql: summaryStatisticsSql({ table: form.summaryTable.trim().split('.'), variables: variables.map((column) => ({ column })) }), problem: null };
  } catch (error) {
    if (error instanceof InputError) return { sql: '', problem: { ...error.problems[0], field: 'summaryColumns' } };
    throw error;
  }
}

/** Covariates…, treatment, outcome: the order of the summary query's variables. */
function summaryVariables(form: OvbFormInputs): string[] | null {
  const covariates = form.summaryColumns.split(',').map((s) => s.trim()).filter((s) => s !== '');
  if (!form.outcome.trim() || !form.treatment.trim()) return null;
  return [...covariates, form.treatment.trim(), form.outcome.trim()];
}

function summaryRegression(form: OvbFormInputs, problems: InputProblem[]): OvbRegressionSummary | null {
  if (!form.outcome.trim()) problems.push(inputProblem('outcome', 'required', 'name the outcome column.'));
  if (!form.treatment.trim()) problems.push(inputProblem('treatment', 'required', 'name the treatment column.'));
  const variables = summaryVariables(form);
  if (!variables) return null;
  const twice = variables.find((v, i) => variables.indexOf(v) !== i);
  if (twice !== undefined) {
    problems.push(inputProblem('summaryColumns', 'chosen-twice', `"${twice}" is chosen twice.`, twice));
    return null;
  }
  if (form.summaryResult.trim() === '') {
    problems.push(inputProblem('summaryResult', 'required', 'paste the one row the query returned.'));
    return null;
  }
  const row = collect(problems, () => parseSummaryRow(form.summaryResult));
  if (!row) return null;
  // A problem with a column of the pasted row belongs to the pasted result (not to an option of the same name).
  const design = collect(
    problems,
    () => designFromCrossProducts(crossProductsFromSqlRow(row, variables.map((column) => ({ column })))),
    (p) => (p.field === 'summary' ? p : { ...p, field: 'summaryResult', message: `column "${p.field}" ${p.message}` }),
  );
  if (!design) return null;
  const covariates = variables.slice(0, -2);
  return collect(
    problems,
    () =>
    ovbRegressionSummary(design, {
      outcome: form.outcome.trim(),
      treatment: form.treatment.trim(),
      covariates: covariates.map((c) => ({ name: c, designColumns: [c] })),
      intercept: INTERCEPT_NAME,
      ...benchmarkGroups(form),
    }),
    (p) => (p.field === 'treatment' || p.field === 'outcome' ? p : { ...p, field: /^benchmarks/.test(p.field) ? 'benchmarks' : 'summaryColumns' }),
  );
}

/** The query's result row, pasted: a JSON object, or CSV text with a header row and one data row. */
export function parseSummaryRow(text: string): Record<string, unknown> {
  const trimmed = text.replace(/^\uFEFF/, '').trim();
  if (trimmed.startsWith('{')) {
    try {
      const parsed = JSON.parse(trimmed) as unknown;
      if (parsed && typeof parsed === 'object' && !Array.isArray(parsed)) return parsed as Record<string, unknown>;
    } catch {
      // reported below
    }
    throw new InputError([inputProblem('summaryResult', 'not-json', 'is not a JSON object of the query result (n, s_1, …, c_1_1, …).')]);
  }
  const table = readCsvText(trimmed, 'summaryResult');
  if (table.rows.length !== 1) throw new InputError([inputProblem('summaryResult', 'not-one-row', `must hold the query's one result row with its header; found ${table.rows.length} rows.`)]);
  const row: Record<string, unknown> = {};
  table.columns.forEach((c, i) => (row[c] = table.rows[0][i]));
  return row;
}

function benchmarkGroups(form: OvbFormInputs) {
  const groups = parseBenchmarkList(form.benchmarks);
  return groups ? { benchmarks: groups } : {};
}

/** The largest |t| (estimate / standard error) a reported estimate may have. */
const MAX_ABS_T = 1e6;

function readSettings(form: OvbFormInputs, reader: FieldReader): Pick<OvbInput, 'q' | 'alpha' | 'direction' | 'k' | 'scenario'> {
  const problems = reader.problems;
  const q = opt(reader.number('q', form.q, 'fraction'));
  const alpha = opt(alphaWithinRange(reader, 'alpha', reader.number('alpha', form.alpha, 'fraction')));
  const direction = reader.choice('direction', form.direction, DIRECTIONS) ?? 'toward-zero';
  const kText = form.k.trim();
  const k = reader.numberList('k', kText, 'decimal') ?? [];
  const r2dz = opt(reader.number('r2dz', form.r2dz, 'fraction'));
  const r2yz = opt(reader.number('r2yz', form.r2yz, 'fraction'));
  if ((r2dz === undefined) !== (r2yz === undefined) && !problems.some((p) => p.field === 'r2dz' || p.field === 'r2yz')) {
    problems.push(inputProblem(r2dz === undefined ? 'r2dz' : 'r2yz', 'required', 'is needed too: give both partial R² values to evaluate a confounder.'));
  }
  return {
    ...(q !== undefined ? { q } : {}),
    ...(alpha !== undefined ? { alpha } : {}),
    direction,
    ...(kText !== '' ? { k } : {}),
    ...(r2dz !== undefined && r2yz !== undefined ? { scenario: { r2dz, r2yz } } : {}),
  };
}

/** A reader's value as an optional one (undefined when empty or bad). */
function opt(value: number | null): number | undefined {
  return value === null ? undefined : value;
}

/** Benchmarks from covariateR2s are numbered from here in the map of benchmarks to form rows. */
const R2_ROW = 1_000_000;

/** The analysis' fields as the form's fields (benchmarks[i].outcomeT → covariateTs[i].outcomeT; scenario.r2dz → r2dz). */
function toFormField(p: InputProblem, rowOfBenchmark: readonly number[]): InputProblem {
  let field = p.field;
  if (field.startsWith('scenario.')) field = field.slice('scenario.'.length);
  else if (/^k\[\d+\]$/.test(field)) field = 'k';
  else {
    const m = /^benchmarks\[(\d+)\]\.(\w+)$/.exec(field);
    if (m) {
      const row = rowOfBenchmark[Number(m[1])] ?? Number(m[1]);
      const name = m[2] === 'covariate' ? 'name' : m[2];
      field = row >= R2_ROW ? `covariateR2s[${row - R2_ROW}].${name === 'r2yxj' ? 'outcomeR2' : name === 'r2dxj' ? 'treatmentR2' : name}` : `covariateTs[${row}].${name}`;
    }
  }
  return field === p.field ? p : { ...p, field };
}

/** Problems about list items name the form's list field (covariates[2] → covariates). */
function listField(p: InputProblem): InputProblem {
  const m = /^(covariates|benchmarks|categorical)\[\d+\]$/.exec(p.field);
  return m ? { ...p, field: m[1] } : p;
}

/** Runs f, turning an InputError into problems. */
function collect<T>(problems: InputProblem[], f: () => T, rename: (p: InputProblem) => InputProblem = (p) => p): T | null {
  try {
    return f();
  } catch (error) {
    if (error instanceof InputError) {
      problems.push(...error.problems.map(rename));
      return null;
    }
    throw error;
  }
}
