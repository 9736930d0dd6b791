import { analyseOvb, DEFAULT_BENCHMARK_MULTIPLES, type OvbBenchmarkInput, type OvbInput } from '../../core/ovbAnalysis';
import { ovbRegressionSummary, type OvbRegressionSummary } from '../../core/ovbRegression';
import { designFromCrossProducts } from '../../core/crossProductFit';
import { INTERCEPT_NAME } from '../../core/linearModel';
import { InputError, inputProblem, type InputProblem } from '../../core/inputProblem';
import type { BiasDirection } from '../../core/confounderAdjustment';
import { accumulateRegressionFromStream } from '../../methods/regression/regressionData';
import { ovbSpecFromRegressionData, parseBenchmarkList } from '../../methods/regression/ovbRegressionData';
import { crossProductsFromSqlRow, summaryStatisticsSql } from '../../methods/regression/summaryStatisticsSql';
import { readCsvText } from '../../data/csv';
import { ovbJson, ovbReport } from '../../methods/regression/text';
import { ovbContourPlot } from '../../methods/regression/ovbContourPlot';
import { ovbExtremeScenarioPlot } from '../../methods/regression/ovbExtremeScenarioPlot';
import { renderSvgString } from '../../plot/svgString';
import type { CliIo } from '../cliIo';
import type { LurkCommand } from '../defineCommand';
import { choiceOption, numberListOption, numberOption, type OptionKinds } from '../parseOptions';
import { UsageError } from '../usageError';
import { readFileArgument } from '../readFileArgument';
import { defineCommand } from '../defineCommand';

const OPTIONS: OptionKinds = {
  estimate: { type: 'string' },
  se: { type: 'string' },
  df: { type: 'string' },
  n: { type: 'string' },
  parameters: { type: 'string' },
  'covariate-t': { type: 'string' },
  'covariate-r2': { type: 'string' },
  file: { type: 'string' },
  summary: { type: 'string' },
  sql: { type: 'string' },
  outcome: { type: 'string' },
  treatment: { type: 'string' },
  covariates: { type: 'string' },
  categorical: { type: 'string' },
  benchmark: { type: 'string' },
  k: { type: 'string' },
  q: { type: 'string' },
  alpha: { type: 'string' },
  direction: { type: 'string' },
  r2dz: { type: 'string' },
  r2yz: { type: 'string' },
  json: { type: 'boolean' },
  svg: { type: 'string' },
};

const HELP = `lurk ovb — how strong would an omitted confounder have to be to overturn a regression estimate?
Omitted-variable bias in partial R² (Cinelli & Hazlett 2020): robustness values, adjusted estimates and bounds
from measured covariates.

From reported numbers:
  lurk ovb --estimate E --se S --df N [--covariate-t NAME=T_OUTCOME[:T_TREATMENT],...]
  lurk ovb --estimate E --se S --n N --parameters P         (df = n − number of coefficients)
From raw data (a CSV; read in chunks, so the file may be larger than memory):
  lurk ovb --file F --outcome COL --treatment COL [--covariates a,b,...] [--categorical c,...]
From summary statistics computed in your own database:
  lurk ovb --sql TABLE --outcome COL --treatment COL --covariates a,b,...   prints the query to run
  lurk ovb --summary RESULT --outcome COL --treatment COL --covariates a,b,...
      RESULT: the query's one result row, as CSV (header and one row) or as a JSON object

Options:
  --covariates    covariate columns (default: every other column); text columns are dummy-coded
  --categorical   numeric columns to treat as categories (e.g. a region code)
  --benchmark     covariates to compare with (default: all), a group as a+b: --benchmark age,income+education
                  (with reported numbers: a choice among the --covariate-t names)
  --covariate-t   with reported numbers: a covariate's t in the outcome regression and, if known, in the
                  regression of the treatment on the covariates (needed for its bounds), e.g. age=2.4:-2.6
  --covariate-r2  with reported numbers: a covariate's partial R² with the outcome and, if known, with the
                  treatment (fractions or percentages), e.g. age=0.04:1.2%
  --k             multiples for the bounds (default ${DEFAULT_BENCHMARK_MULTIPLES.join(',')})
  --q             fraction of the estimate to explain away (default 1: all of it)
  --alpha         significance level (default 0.05)
  --direction     toward-zero (default) or away-from-zero: which way the confounder moves the estimate
  --r2dz, --r2yz  a confounder strength to evaluate (partial R²s with treatment and outcome, in [0, 1))
  --json          one JSON object: estimate, se, t, df, partialR2, rv, rvAlpha, benchmarks [{covariate, k,
                  r2dz, r2yz, correctedEstimate, correctedSe, correctedT, ...}], extremeScenarios, ...
  --svg PLOT      print a plot as SVG instead of the report: estimate (contours of the adjusted estimate),
                  t (contours of the adjusted t) or extreme (extreme scenarios); e.g. --svg t > contours.svg

A sensitivity analysis bounds how strong hidden confounding would have to be; it does not prove causation.
Decisions about health or safety defer to domain experts, local guidance and licensed practice.
`;

export const command: LurkCommand = defineCommand({
  name: 'ovb',
  summary: 'omitted-variable bias of a regression estimate: robustness values, bounds from covariates',
  help: HELP,
  options: OPTIONS,
  async run({ values, positionals }, io) {
    if (positionals.length > 0) throw new UsageError(positionals[0], 'is not an option (see lurk ovb --help)');
    const text = (name: string): string | undefined => {
      const v = values[name];
      if (v === undefined) return undefined;
      if (typeof v !== 'string' || v.trim() === '') throw new UsageError(`--${name}`, 'needs a value');
      return v.trim();
    };
    const list = (name: string): string[] | undefined => text(name)?.split(',').map((s) => s.trim()).filter((s) => s !== '');
    const reported = ['estimate', 'se', 'df', 'n', 'parameters', 'covariate-t', 'covariate-r2'].filter((o) => values[o] !== undefined);
    const sources = ['file', 'summary', 'sql'].filter((o) => values[o] !== undefined);
    if (sources.length > 1) throw new UsageError(`--${sources[1]}`, `cannot be combined with --${sources[0]}`);
    if (sources.length === 1 && reported.length > 0) {
      throw new UsageError(`--${reported[0]}`, `gives reported numbers; it cannot be combined with --${sources[0]}`);
    }
    if (sources.length === 0) {
      for (const o of ['outcome', 'treatment', 'covariates', 'categorical']) {
        if (values[o] !== undefined) throw new UsageError(`--${o}`, 'needs --file, --summary or --sql (data columns)');
      }
    }
    const settings = {
      q: numberOption(values.q, '--q'),
      alpha: numberOption(values.alpha, '--alpha'),
      direction: choiceOption<BiasDirection>(values.direction, '--direction', ['toward-zero', 'away-from-zero']),
      k: numberListOption(values.k, '--k'),
      scenario: scenarioOption(values),
    };
    if (values.sql !== undefined) {
      const { outcome, treatment, covariates } = columnsFor('--sql', text, list);
      io.out(summaryStatisticsSql({ table: text('sql')!, variables: [...covariates, treatment, outcome].map((column) => ({ column })) }));
      return 0;
    }
    let input: OvbInput;
    let dataNote: string | undefined;
    let study = { exposure: 'the treatment', outcome: 'the outcome' };
    let extra: Record<string, unknown> = {};
    if (values.file !== undefined || values.summary !== undefined) {
      let summary: OvbRegressionSummary;
      if (values.file !== undefined) {
        const path = text('file')!;
        const outcome = text('outcome');
        const treatment = text('treatment');
        if (!outcome) throw new UsageError('--outcome', 'is needed with --file');
        if (!treatment) throw new UsageError('--treatment', 'is needed with --file');
        const spec = { outcome, treatment, covariates: list('covariates'), categorical: list('categorical') };
        const data = await renameFields(() => accumulateRegressionFromStream(openOrFail(io, path), spec), readFailure(path));
        summary = await renameFields(() => ovbRegressionSummary(data.design, ovbSpecFromRegressionData(data, parseBenchmarkList(text('benchmark')))));
        dataNote =
          `Data: ${path}, ${data.rowsUsed} rows used of ${data.rowsRead}` +
          (data.rowsDropped > 0 ? ` (${data.rowsDropped} dropped for a missing value)` : '') +
          `; outcome ${data.outcome}, treatment ${data.treatment}, covariates ${data.covariates.join(', ') || 'none'}.` +
          data.categorical.map((c) => `\n${c.column} is categorical: reference level "${c.reference}".`).join('');
        study = { exposure: data.treatment, outcome: data.outcome };
        extra = { rowsRead: data.rowsRead, rowsUsed: data.rowsUsed, rowsDropped: data.rowsDropped, outcome: data.outcome, treatment: data.treatment, covariates: data.covariates };
        for (const w of data.warnings) dataNote += `\nNote: ${w}`;
      } else {
        const path = text('summary')!;
        const { outcome, treatment, covariates } = columnsFor('--summary', text, list);
        const raw = await readFileArgument(io, path, '--summary');
        const row = summaryRow(raw);
        const variables = [...covariates, treatment, outcome].map((column) => ({ column }));
        const design = designFromCrossProducts(crossProductsFromSqlRow(row, variables));
        summary = await renameFields(() =>
          ovbRegressionSummary(design, {
            outcome,
            treatment,
            covariates: covariates.map((c) => ({ name: c, designColumns: [c] })),
            intercept: INTERCEPT_NAME,
            ...(text('benchmark') ? { benchmarks: parseBenchmarkList(text('benchmark')) } : {}),
          }),
        );
        dataNote = `Summary statistics: ${path}, n = ${summary.n}; outcome ${outcome}, treatment ${treatment}, covariates ${covariates.join(', ')}.`;
        extra = { rowsUsed: summary.n, outcome, treatment, covariates };
        study = { exposure: treatment, outcome };
      }
      if (!(summary.df > 1)) {
        const source = values.file !== undefined ? '--file' : '--summary';
        throw new UsageError(
          source,
          `has too few complete rows for this model: ${summary.n} rows and ${summary.n - summary.df} coefficients leave ${summary.df} residual degrees of freedom; the sensitivity analysis needs at least 2`,
        );
      }
      input = { estimate: summary.estimate, se: summary.se, df: summary.df, benchmarks: summary.benchmarks, ...defined(settings) };
    } else {
      input = {
        estimate: requiredNumber(values.estimate, '--estimate'),
        se: requiredNumber(values.se, '--se'),
        ...defined({
          df: numberOption(values.df, '--df'),
          n: numberOption(values.n, '--n'),
          parameters: numberOption(values.parameters, '--parameters'),
          benchmarks: chooseBenchmarks(joinLists(covariateTOption(text('covariate-t')), covariateR2Option(text('covariate-r2'))), list('benchmark')),
        }),
        ...defined(settings),
      };
    }
    const plot = choiceOption(values.svg, '--svg', ['estimate', 't', 'extreme'] as const);
    if (plot && values.json) throw new UsageError('--svg', 'cannot be combined with --json');
    const result = await renameFields(() => analyseOvb(input));
    if (plot) {
      const spec = plot === 'extreme' ? ovbExtremeScenarioPlot(result, { study }) : ovbContourPlot(result, { kind: plot, study });
      io.out(renderSvgString(spec, { includeTitle: true }) + '\n');
      return 0;
    }
    io.out(values.json ? ovbJson(result, extra) : ovbReport(result, { dataNote, study }));
    return 0;
  },
});

function requiredNumber(value: string | boolean | undefined, option: string): number {
  const n = numberOption(value, option);
  if (n === undefined) throw new UsageError(option, 'is needed (or give --file, --summary or --sql)');
  return n;
}

function scenarioOption(values: Record<string, string | boolean | undefined>): { r2dz: number; r2yz: number } | undefined {
  const r2dz = numberOption(values.r2dz, '--r2dz');
  const r2yz = numberOption(values.r2yz, '--r2yz');
  if (r2dz === undefined && r2yz === undefined) return undefined;
  if (r2dz === undefined) throw new UsageError('--r2dz', 'is needed with --r2yz');
  if (r2yz === undefined) throw new UsageError('--r2yz', 'is needed with --r2dz');
  return { r2dz, r2yz };
}

/** NAME=T_OUTCOME[:T_TREATMENT],... → benchmark inputs. */
function covariateTOption(value: string | undefined): OvbBenchmarkInput[] | undefined {
  if (value === undefined) return undefined;
  return value.split(',').map((part, i) => {
    const m = /^\s*([^=]+?)\s*=\s*([^:]+?)\s*(?::\s*(.+?)\s*)?$/.exec(part);
    if (!m) throw new UsageError('--covariate-t', `item ${i + 1} must look like NAME=T_OUTCOME or NAME=T_OUTCOME:T_TREATMENT, got "${part}"`);
    const outcomeT = numberOption(m[2], '--covariate-t')!;
    const treatmentT = m[3] === undefined ? undefined : numberOption(m[3], '--covariate-t');
    return treatmentT === undefined ? { covariate: m[1], outcomeT } : { covariate: m[1], outcomeT, treatmentT };
  });
}

/** NAME=R2_OUTCOME[:R2_TREATMENT],... (partial R²s as fractions or percentages) → benchmark inputs. */
function covariateR2Option(value: string | undefined): OvbBenchmarkInput[] | undefined {
  if (value === undefined) return undefined;
  const fraction = (text: string): number => {
    const trimmed = text.trim();
    const n = numberOption(trimmed.replace(/%$/, ''), '--covariate-r2')!;
    return trimmed.endsWith('%') ? n / 100 : n;
  };
  return value.split(',').map((part, i) => {
    const m = /^\s*([^=]+?)\s*=\s*([^:]+?)\s*(?::\s*(.+?)\s*)?$/.exec(part);
    if (!m) throw new UsageError('--covariate-r2', `item ${i + 1} must look like NAME=R2_OUTCOME or NAME=R2_OUTCOME:R2_TREATMENT, got "${part}"`);
    const r2yxj = fraction(m[2]);
    return m[3] === undefined ? { covariate: m[1], r2yxj } : { covariate: m[1], r2yxj, r2dxj: fraction(m[3]) };
  });
}

function joinLists<T>(a: T[] | undefined, b: T[] | undefined): T[] | undefined {
  return a === undefined && b === undefined ? undefined : [...(a ?? []), ...(b ?? [])];
}

/** With reported numbers, --benchmark picks among the --covariate-t and --covariate-r2 entries. */
function chooseBenchmarks(all: OvbBenchmarkInput[] | undefined, names: string[] | undefined): OvbBenchmarkInput[] | undefined {
  if (names === undefined) return all;
  const known = (all ?? []).map((b) => b.covariate);
  const unknown = names.find((n) => !known.includes(n));
  if (unknown !== undefined) {
    throw new UsageError('--benchmark', `"${unknown}" is not among the --covariate-t entries (${known.join(', ') || 'none given'})`);
  }
  return (all ?? []).filter((b) => names.includes(b.covariate));
}

function columnsFor(
  option: string,
  text: (name: string) => string | undefined,
  list: (name: string) => string[] | undefined,
): { outcome: string; treatment: string; covariates: string[] } {
  const outcome = text('outcome');
  const treatment = text('treatment');
  const covariates = list('covariates');
  if (!outcome) throw new UsageError('--outcome', `is needed with ${option}`);
  if (!treatment) throw new UsageError('--treatment', `is needed with ${option}`);
  if (!covariates) throw new UsageError('--covariates', `is needed with ${option} (the query has no header to take them from)`);
  const all = [outcome, treatment, ...covariates];
  const twice = all.find((c, i) => all.indexOf(c) !== i);
  if (twice !== undefined) throw new UsageError(twice === treatment ? '--treatment' : '--covariates', `"${twice}" is chosen twice`);
  return { outcome, treatment, covariates };
}

/** The summary query's result row: a JSON object, or a CSV with a header and one row. */
function summaryRow(raw: string): Record<string, unknown> {
  const trimmed = raw.replace(/^\uFEFF/, '').trim();
  if (trimmed.startsWith('{')) {
    try {
      const parsed = JSON.parse(trimmed) as unknown;
      if (parsed && typeof parsed === 'object' && !Array.isArray(parsed)) return parsed as Record<string, unknown>;
    } catch {
      // fall through to the message below
    }
    throw new UsageError('--summary', 'is not a JSON object of the query result (n, s_1, …, c_1_1, …)');
  }
  const table = readCsvText(trimmed, '--summary');
  if (table.rows.length !== 1) throw new UsageError('--summary', `must hold the query's one result row, found ${table.rows.length}`);
  const row: Record<string, unknown> = {};
  table.columns.forEach((c, i) => (row[c] = table.rows[0][i]));
  return row;
}

function openOrFail(io: CliIo, path: string) {
  const stream = io.openStream(path);
  return stream;
}

function readFailure(path: string) {
  return (error: unknown): never => {
    const code = (error as { code?: string }).code;
    if (code === 'ENOENT' || code === 'EACCES' || code === 'EISDIR') throw new UsageError('--file', `cannot read "${path}"`);
    throw error;
  };
}

/** The analysis' input fields, as command-line options. */
const FIELD_OPTIONS: [RegExp, string][] = [
  [/^covariates\[\d+\]$/, '--covariates'],
  [/^categorical\[\d+\]$/, '--categorical'],
  [/^benchmarks\[\d+\]\.(outcomeT|treatmentT|covariate)$/, '--covariate-t'],
  [/^benchmarks\[\d+\]\.(r2yxj|r2dxj)$/, '--covariate-r2'],
  [/^benchmarks\[\d+\]$/, '--benchmark'],
  [/^k\[\d+\]$/, '--k'],
  [/^scenario\.r2dz$/, '--r2dz'],
  [/^scenario\.r2yz$/, '--r2yz'],
  [/^file$/, '--file'],
  [/^rowCount$/, '--file'],
];

async function renameFields<T>(run: () => T | Promise<T>, onOther?: (error: unknown) => never): Promise<T> {
  try {
    return await run();
  } catch (error) {
    if (error instanceof InputError) {
      throw new InputError(
        error.problems.map((p): InputProblem => {
          const option = FIELD_OPTIONS.find(([re]) => re.test(p.field))?.[1];
          return option ? inputProblem(option, p.code, p.message, p.value) : p;
        }),
      );
    }
    if (onOther) onOther(error);
    throw error;
  }
}

function defined<T extends Record<string, unknown>>(o: T): Partial<T> {
  return Object.fromEntries(Object.entries(o).filter(([, v]) => v !== undefined)) as Partial<T>;
}
