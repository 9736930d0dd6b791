import { analyseOvb, validateOvbInput, type OvbBenchmarkInput, type OvbInput, type OvbResult } from '../../core/ovbAnalysis';
import { ovbRegressionSummary, type OvbRegressionSpec, type OvbRegressionSummary } from '../../core/ovbRegression';
import { designFromCrossProducts } from '../../core/crossProductFit';
import { INTERCEPT_NAME, type TriangularDesign } from '../../core/linearModel';
import type { BiasDirection } from '../../core/confounderAdjustment';
import { InputError, inputProblem, type InputProblem } from '../../core/inputProblem';
import { parseTypedNumber } from '../../data/numberText';
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
  readonly direction: BiasDirection;
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
  const text = (key: keyof OvbFormInputs): string => (typeof s[key] === 'string' ? (s[key] as string) : (base[key] as string));
  const strings = (value: unknown): string[] => (Array.isArray(value) ? value.filter((v): v is string => typeof v === 'string') : []);
  const covariateTs = Array.isArray(s.covariateTs)
    ? s.covariateTs
        .filter((c): c is Record<string, unknown> => !!c && typeof c === 'object')
        .map((c) => Object.freeze({ name: String(c.name ?? ''), outcomeT: String(c.outcomeT ?? ''), treatmentT: String(c.treatmentT ?? '') }))
    : [];
  return Object.freeze({
    source: s.source === 'file' || s.source === 'summary' ? s.source : 'reported',
    estimate: text('estimate'),
    se: text('se'),
    dfBy: s.dfBy === 'n' ? 'n' : 'df',
    df: text('df'),
    n: text('n'),
    parameters: text('parameters'),
    covariateTs: Object.freeze(covariateTs),
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
    direction: s.direction === 'away-from-zero' ? 'away-from-zero' : 'toward-zero',
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
  const problems: InputProblem[] = [];
  const settings = readSettings(form, problems);
  let regression: OvbRegressionSummary | null = null;
  let base: Pick<OvbInput, 'estimate' | 'se' | 'df' | 'n' | 'parameters' | 'benchmarks'> | null = null;
  let started = true;
  let rowOfBenchmark: number[] = [];
  if (form.source === 'reported') {
    started = form.estimate.trim() !== '' || form.se.trim() !== '';
    const estimate = readNumber(form.estimate, 'estimate', problems, true);
    const se = readNumber(form.se, 'se', problems, true);
    const df = form.dfBy === 'df' ? readNumber(form.df, 'df', problems, true) : undefined;
    const n = form.dfBy === 'n' ? readNumber(form.n, 'n', problems, true) : undefined;
    const parameters = form.dfBy === 'n' ? readNumber(form.parameters, 'parameters', problems, true) : undefined;
    const benchmarks: OvbBenchmarkInput[] = [];
    rowOfBenchmark = [];
    form.covariateTs.forEach((c, i) => {
      if (c.name.trim() === '' && c.outcomeT.trim() === '' && c.treatmentT.trim() === '') return;
      const outcomeT = readNumber(c.outcomeT, `covariateTs[${i}].outcomeT`, problems, true);
      const treatmentT = readNumber(c.treatmentT, `covariateTs[${i}].treatmentT`, problems, false);
      if (c.name.trim() === '') problems.push(inputProblem(`covariateTs[${i}].name`, 'required', 'needs a name.'));
      if (outcomeT !== undefined) rowOfBenchmark.push(i);
      if (outcomeT !== undefined) benchmarks.push({ covariate: c.name.trim() || `covariate ${i + 1}`, outcomeT, ...(treatmentT !== undefined ? { treatmentT } : {}) });
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
  const plotMax = readFraction(form.plotMax, 'plotMax', problems, false);
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
  const design = collect(problems, () => designFromCrossProducts(crossProductsFromSqlRow(row, variables.map((column) => ({ column })))));
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

function readSettings(form: OvbFormInputs, problems: InputProblem[]): Pick<OvbInput, 'q' | 'alpha' | 'direction' | 'k' | 'scenario'> {
  const q = readNumber(form.q, 'q', problems, false);
  const alpha = readNumber(form.alpha, 'alpha', problems, false);
  const k: number[] = [];
  const kText = form.k.trim();
  if (kText !== '') {
    kText.split(/[;,\s]+/).filter((s) => s !== '').forEach((part) => {
      const v = parseTypedNumber(part);
      if (Number.isNaN(v)) problems.push(inputProblem('k', 'not-a-number', `"${part}" is not a number; write multiples like 1, 2, 3.`, part));
      else k.push(v);
    });
  }
  const r2dz = readFraction(form.r2dz, 'r2dz', problems, false);
  const r2yz = readFraction(form.r2yz, 'r2yz', problems, false);
  if ((r2dz === undefined) !== (r2yz === undefined) && !problems.some((p) => p.field === 'r2dz' || p.field === 'r2yz')) {
    problems.push(inputProblem(r2dz === undefined ? 'r2dz' : 'r2yz', 'required', 'give both partial R² values to evaluate a confounder.'));
  }
  return {
    ...(q !== undefined ? { q } : {}),
    ...(alpha !== undefined ? { alpha } : {}),
    direction: form.direction,
    ...(kText !== '' ? { k } : {}),
    ...(r2dz !== undefined && r2yz !== undefined ? { scenario: { r2dz, r2yz } } : {}),
  };
}

function readNumber(text: string, field: string, problems: InputProblem[], required: boolean): number | undefined {
  if (text.trim() === '') {
    if (required) problems.push(inputProblem(field, 'required', 'is needed.'));
    return undefined;
  }
  const v = parseTypedNumber(text);
  if (Number.isNaN(v)) {
    problems.push(inputProblem(field, 'not-a-number', `"${text.trim()}" is not a number (e.g. 0.42 or 0,42).`, text));
    return undefined;
  }
  return v;
}

/** A partial R² typed as a percentage ("13.9%") or a fraction ("0.139"). */
function readFraction(text: string, field: string, problems: InputProblem[], required: boolean): number | undefined {
  const trimmed = text.trim();
  if (trimmed.endsWith('%')) {
    const v = readNumber(trimmed.slice(0, -1), field, problems, true);
    return v === undefined ? undefined : v / 100;
  }
  return readNumber(trimmed, field, problems, required);
}

/** The analysis' fields as the form's fields (benchmarks[i].outcomeT → covariateTs[i].outcomeT; scenario.r2dz → r2dz). */
function toFormField(p: InputProblem, rowOfBenchmark: readonly number[]): InputProblem {
  let field = p.field;
  if (field.startsWith('scenario.')) field = field.slice('scenario.'.length);
  else if (/^k\[\d+\]$/.test(field)) field = 'k';
  else {
    const m = /^benchmarks\[(\d+)\]\.(\w+)$/.exec(field);
    if (m) field = `covariateTs[${rowOfBenchmark[Number(m[1])] ?? m[1]}].${m[2] === 'covariate' ? 'name' : m[2]}`;
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
