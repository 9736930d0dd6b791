import { analyseOvb, STANDARD_ERROR_KINDS, validateOvbInput, type OvbBenchmarkInput, type OvbInput, type OvbResult } from '../../core/ovbAnalysis';
import { ovbRegressionSummary, type OvbRegressionSpec, type OvbRegressionSummary } from '../../core/ovbRegression';
import { designFromCrossProducts } from '../../core/crossProductFit';
import { INTERCEPT_NAME, type TriangularDesign } from '../../core/linearModel';
import type { BiasDirection } from '../../core/confounderAdjustment';
import { InputError, inputProblem, type InputProblem } from '../../core/inputProblem';
import { alphaWithinRange, fieldReader, type FieldReader } from '../fieldReader';
import { readCsvText } from '../../data/csv';
import { crossProductsFromSqlRow, summaryStatisticsSql } from './summaryStatisticsSql';
import { parseBenchmarkList } from './ovbRegressionData';
import { categoryLevelsSql, decodeCategoryLevels, encodeCategoryLevels, readCategoryLevels, summaryDesign, type CategoryLevels } from './categoryLevels';

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
  /** Summary statistics with categorical covariates: the pasted result of the levels query (or {"column": [levels]}). */
  readonly summaryLevels?: string;
  readonly k: string;
  /** Outcome-side multiples k_Y, one per k (empty: k_Y = k). */
  readonly kOutcome?: string;
  /** How the reported standard error was computed: classical, robust, clustered or unknown (empty: classical). */
  readonly seKind?: string;
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
    summaryLevels: '',
    k: '1, 2, 3',
    kOutcome: '',
    seKind: '',
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
    summaryLevels: asText(s.summaryLevels),
    k: text('k'),
    kOutcome: typeof s.kOutcome === 'string' ? s.kOutcome : '',
    seKind: typeof s.seKind === 'string' && (STANDARD_ERROR_KINDS as readonly string[]).includes(s.seKind.trim().toLowerCase()) ? s.seKind.trim().toLowerCase() : '',
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

/**
 * The SQL to run for summary statistics, or a problem naming the missing field. With categorical covariates
 * and no levels yet, the query that lists their levels (`stage: 'levels'`); with the levels, the summary query
 * with an indicator for each level but the first (`stage: 'summary'`).
 */
export function ovbSummarySql(form: OvbFormInputs): { sql: string; problem: InputProblem | null; stage: 'levels' | 'summary' } {
  const variables = summaryVariables(form);
  const fail = (problem: InputProblem) => ({ sql: '', problem, stage: 'summary' as const });
  if (form.summaryTable.trim() === '') return fail(inputProblem('summaryTable', 'required', 'needs the name of the table (or view) in your database.'));
  if (!variables) return fail(inputProblem('summaryColumns', 'required', 'name the outcome, the treatment and the covariates.'));
  const categorical = categoricalOf(form);
  const problems: InputProblem[] = [];
  let levels: CategoryLevels = new Map();
  if (categorical.length > 0) {
    const outside = categorical.find((c) => !variables.slice(0, -2).includes(c));
    if (outside !== undefined) return fail(inputProblem('categorical', 'not-a-covariate', `"${outside}" is not among the covariate columns; only covariates can be categorical here.`, outside));
    if ((form.summaryLevels ?? '').trim() === '') {
      try {
        return { sql: categoryLevelsSql({ table: form.summaryTable, columns: variables, categorical }), problem: null, stage: 'levels' };
      } catch (error) {
        if (error instanceof InputError) return fail(error.problems[0]);
        throw error;
      }
    }
    levels = collect(problems, () => readCategoryLevels(form.summaryLevels ?? '', categorical)) ?? levels;
    if (problems.length > 0) return fail(problems[0]);
  }
  const design = summaryDesign(variables.slice(0, -2), variables[variables.length - 2], variables[variables.length - 1], levels);
  try {
    const sql = summaryStatisticsSql({ table: form.summaryTable.trim(), variables: design.variables, ...(levels.size > 0 ? { levels: encodeCategoryLevels(levels) } : {}) });
    return { sql, problem: null, stage: 'summary' };
  } catch (error) {
    if (error instanceof InputError) return fail({ ...error.problems[0], field: 'summaryColumns' });
    throw error;
  }
}

/** The categorical columns named in the form (commas between). */
function categoricalOf(form: OvbFormInputs): string[] {
  return form.categorical.split(',').map((s) => s.trim()).filter((s) => s !== '');
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
  const levels = summaryLevelsOf(form, row, problems);
  if (!levels) return null;
  const layout = summaryDesign(variables.slice(0, -2), form.treatment.trim(), form.outcome.trim(), levels);
  const names = layout.variables.map((v) => ('level' in v ? `${v.column}=${v.level}` : v.column));
  const input = collect(problems, () => crossProductsFromSqlRow(row, layout.variables), (p) => resultColumnProblem(p));
  if (!input) return null;
  if (!(Number.isInteger(input.rowCount) && input.rowCount >= 2)) {
    problems.push(inputProblem('summaryResult', 'not-a-count', `column n must be a whole number of rows, at least 2; got ${input.rowCount}.`, input.rowCount));
    return null;
  }
  if (input.kind === 'covariance') {
    input.covariance.forEach((r, i) => {
      if (!(r[i] > 0)) {
        problems.push(
          inputProblem('summaryResult', r[i] === 0 ? 'no-variation' : 'negative-variance', `column c_${i + 1}_${i + 1}: "${names[i]}" has ${r[i] === 0 ? 'no variation (a variance of 0)' : 'a negative variance'} in the rows used, so its effect cannot be estimated.`, r[i]),
        );
      }
    });
    if (problems.length > 0) return null;
  }
  const design = collect(problems, () => designFromCrossProducts(input), (p) => resultColumnProblem(p));
  if (!design) return null;
  return collect(
    problems,
    () =>
    ovbRegressionSummary(design, {
      outcome: form.outcome.trim(),
      treatment: form.treatment.trim(),
      covariates: layout.covariates,
      intercept: INTERCEPT_NAME,
      ...benchmarkGroups(form),
    }),
    (p) => (p.field === 'treatment' || p.field === 'outcome' ? p : { ...p, field: /^benchmarks/.test(p.field) ? 'benchmarks' : 'summaryColumns' }),
  );
}

/**
 * A problem of the pasted result (a result column, or the design made from it) as a problem of the paste box,
 * its message naming the result column: `m_2`, `rowCount` → n, `covariance[0][1]` → c_1_2, `means[1]` → m_2.
 */
function resultColumnProblem(p: InputProblem): InputProblem {
  const column = (text: string) => ({ ...p, field: 'summaryResult', message: `column ${text} ${p.message}` });
  if (/^(n|[mdsc]_\d+(_\d+)?)$/.test(p.field)) return column(p.field);
  if (p.field === 'rowCount') return column('n');
  const cell = /^(?:covariance|crossProducts)\[(\d+)\]\[(\d+)\]$/.exec(p.field);
  if (cell) {
    const [i, j] = [Number(cell[1]), Number(cell[2])].sort((x, y) => x - y);
    return column(`c_${i + 1}_${j + 1}`);
  }
  const mean = /^(?:means|sums)\[(\d+)\]$/.exec(p.field);
  if (mean) return column(`m_${Number(mean[1]) + 1}`);
  if (p.field === 'summary' || p.field === 'covariance' || p.field === 'crossProducts') return { ...p, field: 'summaryResult', message: p.field === 'summary' ? p.message : `the sums of products ${p.message}` };
  return p;
}

/**
 * The levels of the categorical covariates: from the result's `lurk_levels` when the query wrote them, else from
 * the pasted levels; they must agree when both are given. Null (with a problem) when they cannot be had.
 */
function summaryLevelsOf(form: OvbFormInputs, row: Record<string, unknown>, problems: InputProblem[]): CategoryLevels | null {
  const categorical = categoricalOf(form);
  const written = typeof row.lurk_levels === 'string' ? decodeCategoryLevels(row.lurk_levels) : null;
  if (typeof row.lurk_levels === 'string' && !written) {
    problems.push(inputProblem('summaryResult', 'bad-levels', 'column lurk_levels is not as the query wrote it (run the whole query unchanged).'));
    return null;
  }
  const pasted = (form.summaryLevels ?? '').trim() !== '' ? collect(problems, () => readCategoryLevels(form.summaryLevels ?? '', categorical)) : new Map<string, string[]>();
  if (!pasted) return null;
  if (written) {
    const same = (a: CategoryLevels, b: CategoryLevels) => [...a].every(([c, l]) => (b.get(c) ?? []).join('\u0000') === l.join('\u0000')) && a.size === b.size;
    const extra = [...written.keys()].find((c) => !categorical.includes(c));
    if (extra !== undefined || categorical.some((c) => !written.has(c))) {
      problems.push(inputProblem('categorical', 'other-levels', `must name the categorical columns of the query that made the result (${[...written.keys()].join(', ') || 'none'}).`));
      return null;
    }
    if (pasted.size > 0 && !same(written, pasted)) {
      problems.push(inputProblem('summaryLevels', 'other-levels', 'differ from the levels the summary query was printed with; print the query again.'));
      return null;
    }
    return written;
  }
  if (categorical.length > 0 && pasted.size === 0) {
    problems.push(inputProblem('summaryLevels', 'required', 'paste the result of the levels query (the summary query needs the levels of the categorical columns).'));
    return null;
  }
  return pasted;
}

/** The query's result row, pasted: a JSON object, or CSV text with a header row and one data row. */
export function parseSummaryRow(text: string): Record<string, unknown> {
  const trimmed = text.replace(/^\uFEFF/, '').trim();
  if (trimmed.startsWith('{') || trimmed.startsWith('[')) {
    try {
      let parsed = JSON.parse(trimmed) as unknown;
      // A driver's or a database shell's JSON output: an array holding the one row.
      if (Array.isArray(parsed) && parsed.length === 1) parsed = parsed[0];
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

function readSettings(form: OvbFormInputs, reader: FieldReader): Pick<OvbInput, 'q' | 'alpha' | 'direction' | 'k' | 'kOutcome' | 'seKind' | 'scenario'> {
  const problems = reader.problems;
  const q = opt(reader.number('q', form.q, 'fraction'));
  const alpha = opt(alphaWithinRange(reader, 'alpha', reader.number('alpha', form.alpha, 'fraction')));
  const direction = reader.choice('direction', form.direction, DIRECTIONS) ?? 'toward-zero';
  const kText = form.k.trim();
  const k = reader.numberList('k', kText, 'decimal') ?? [];
  const kOutcome = reader.numberList('kOutcome', form.kOutcome ?? '', 'decimal');
  const seKind = reader.choice('seKind', form.seKind ?? '', STANDARD_ERROR_KINDS);
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
    ...(kOutcome !== null ? { kOutcome } : {}),
    ...(seKind !== null ? { seKind } : {}),
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
  else if (/^kOutcome\[\d+\]$/.test(field)) field = 'kOutcome';
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
