import { DEFAULT_BENCHMARK_MULTIPLES, STRONGEST_COVARIATE_RULE } from '../../core/ovbAnalysis';
import { InputError, inputProblem } from '../../core/inputProblem';
import { NUMBER_READING_RULE } from '../../data/numberText';
import { SUMMARY_ARGUMENT_RULE } from '../summaryArgument';
import type { OptionSpec, OptionValues } from '../methodModule';
import { emptyOvbForm, type CovariateR2Text, type CovariateTText, type OvbFormInputs } from './request';

/** The options of `lurk ovb` (every one fills a form field; --json, --svg and --svg-width are added by the command line). */
export const OVB_OPTIONS: Readonly<Record<string, OptionSpec>> = {
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
  levels: { type: 'string' },
  benchmark: { type: 'string' },
  times: { type: 'string' },
  k: { type: 'string' },
  'times-outcome': { type: 'string' },
  'se-kind': { type: 'string' },
  fraction: { type: 'string' },
  q: { type: 'string' },
  alpha: { type: 'string' },
  direction: { type: 'string' },
  'confounder-treatment-r2': { type: 'string' },
  'confounder-outcome-r2': { type: 'string' },
  r2dz: { type: 'string' },
  r2yz: { type: 'string' },
};

export const OVB_HELP = `lurk ovb — how strong would an omitted confounder have to be to overturn a regression estimate?
Omitted-variable bias in partial R² (Cinelli & Hazlett 2020): robustness values, adjusted estimates and bounds
from measured covariates.

From reported numbers:
  lurk ovb --estimate E --se S --df N [--covariate-t NAME=T_OUTCOME[:T_TREATMENT],...]
  lurk ovb --estimate E --se S --n N --parameters P         (df = n − number of coefficients)
From raw data (a CSV; read in chunks, so the file may be larger than memory):
  lurk ovb --file F --outcome COL --treatment COL [--covariates a,b,...] [--categorical c,...]
From summary statistics computed in your own database:
  lurk ovb --sql TABLE --outcome COL --treatment COL --covariates a,b,...   prints the query to run
  lurk ovb --summary ROW --outcome COL --treatment COL --covariates a,b,...
      ROW: the query's one result row.
      ${SUMMARY_ARGUMENT_RULE.replace(/\n/g, '\n      ')}
  Categorical covariates (--categorical c,...): --sql first prints a query for their levels; run it and give
  its rows to --levels (same rule as ROW; or a JSON object {"c": ["level", ...]}) to print the summary query.
  Its result carries the levels, so --summary needs no --levels. The first level in character order is the
  reference, as for a CSV file.

Options:
  --covariates    covariate columns (default: every other column); text columns are dummy-coded
  --categorical   numeric columns to treat as categories (e.g. a region code); with --sql/--summary, every
                  categorical covariate
  --levels        with --sql: the levels of the categorical covariates (the levels query's result)
  --benchmark     covariates to compare with (default: all), a group as a+b: --benchmark age,income+education
                  (with reported numbers: a choice among the --covariate-t names)
  --covariate-t   with reported numbers: a covariate's t in the outcome regression and, if known, in the
                  regression of the treatment on the covariates (needed for its bounds), e.g. age=2.4:-2.6
  --covariate-r2  with reported numbers: a covariate's partial R² with the outcome and, if known, with the
                  treatment (fractions or percentages), e.g. age=0.04:1.2%
  --times         multiples for the bounds (default ${DEFAULT_BENCHMARK_MULTIPLES.join(',')}): a confounder that many times as strongly
                  associated with the treatment as the covariate, and as many times with the outcome unless
  --times-outcome gives separate outcome-side multiples, one per value of --times (e.g. --times 1,2 --times-outcome 3,3)
  --se-kind       how the reported standard error was computed: classical (default), robust, clustered or
                  unknown. The bias formula assumes the classical OLS standard error: with any other kind the
                  adjusted estimates hold, but the adjusted standard errors and t-values do not (a warning says so)
  --fraction      fraction of the estimate to explain away, q (default 1: all of it)
  --alpha         significance level (default 0.05)
  --direction     toward-zero (default) or away-from-zero: which way the confounder moves the estimate
  --confounder-treatment-r2, --confounder-outcome-r2
                  a confounder strength to evaluate: its partial R² with the treatment and with the outcome, in [0, 1)

Earlier names, kept for one release: --k (now --times), --q (--fraction), --r2dz (--confounder-treatment-r2),
--r2yz (--confounder-outcome-r2).
  --json          one JSON object: estimate, se, t, df, partialR2, rv, rvAlpha, benchmarks [{covariate, k,
                  r2dz, r2yz, correctedEstimate, correctedSe, correctedT, ...}], extremeScenarios, reading, ...
                  (with --sql: {query, table, outcome, treatment, covariates})

Conventions (each report lists the ones that apply):
  - The partial R² and RV_q use the residual degrees of freedom df; the significance threshold (RV_q,α and the
    adjusted t) uses Student's t with df − 1, since the model with the confounder has one more coefficient.
  - A covariate's t in the outcome regression becomes a partial R² with df degrees of freedom; its t in the
    regression of the treatment on the covariates with df + 1.
  - ${STRONGEST_COVARIATE_RULE}
  - A bound on the outcome side is capped at 100% of the outcome's residual variance; a capped bound is not
    informative (the report says so in words).

${NUMBER_READING_RULE}

A sensitivity analysis bounds how strong hidden confounding would have to be; it does not prove causation.
Decisions about health or safety defer to domain experts, local guidance and licensed practice.
`;

const REPORTED = ['estimate', 'se', 'df', 'n', 'parameters', 'covariate-t', 'covariate-r2'];
const SOURCES = ['file', 'summary', 'sql'];

function refuse(option: string, message: string): never {
  throw new InputError([inputProblem(option, 'usage', message)]);
}

/**
 * The regression form the options give, as text (numbers are read by the request reader). Mixes the form
 * cannot express are refused naming the option.
 */
export function ovbFormFromOptions(values: OptionValues): OvbFormInputs {
  const text = (name: string): string | undefined => {
    const v = values[name];
    if (v === undefined) return undefined;
    // An empty value goes to the request reader, which says what the field needs (as the page does).
    if (typeof v !== 'string') refuse(`--${name}`, 'needs a value');
    return v;
  };
  const list = (name: string): string[] | undefined => text(name)?.split(',').map((s) => s.trim()).filter((s) => s !== '');
  const reported = REPORTED.filter((o) => values[o] !== undefined);
  const sources = SOURCES.filter((o) => values[o] !== undefined);
  if (sources.length > 1) refuse(`--${sources[1]}`, `cannot be combined with --${sources[0]}`);
  if (sources.length === 1 && reported.length > 0) refuse(`--${reported[0]}`, `gives reported numbers; it cannot be combined with --${sources[0]}`);
  if (sources.length === 0) {
    for (const o of ['outcome', 'treatment', 'covariates', 'categorical']) if (values[o] !== undefined) refuse(`--${o}`, 'needs --file, --summary or --sql (data columns)');
  }
  const base = emptyOvbForm();
  // Each setting has a self-explaining name; the earlier short name keeps working for one release.
  const renamed = (name: string, old: string): string | undefined => {
    if (values[name] !== undefined && values[old] !== undefined) refuse(`--${old}`, `is the earlier name of --${name}: give one of them`);
    return text(name) ?? text(old);
  };
  const settings: Partial<OvbFormInputs> = {
    k: renamed('times', 'k') ?? base.k,
    kOutcome: text('times-outcome') ?? '',
    seKind: text('se-kind') ?? '',
    q: renamed('fraction', 'q') ?? base.q,
    alpha: text('alpha') ?? base.alpha,
    direction: text('direction') ?? base.direction,
    r2dz: renamed('confounder-treatment-r2', 'r2dz') ?? '',
    r2yz: renamed('confounder-outcome-r2', 'r2yz') ?? '',
  };
  const source = sources[0];
  if (source === undefined) {
    if (values.df !== undefined && (values.n !== undefined || values.parameters !== undefined)) {
      refuse(values.n !== undefined ? '--n' : '--parameters', 'cannot be combined with --df (give --df, or --n and --parameters)');
    }
    const byN = values.n !== undefined || values.parameters !== undefined;
    let covariateTs = covariateEntries(text('covariate-t'), '--covariate-t', 'NAME=T_OUTCOME or NAME=T_OUTCOME:T_TREATMENT').map(
      ([name, outcomeT, treatmentT]): CovariateTText => ({ name, outcomeT, treatmentT }),
    );
    let covariateR2s = covariateEntries(text('covariate-r2'), '--covariate-r2', 'NAME=R2_OUTCOME or NAME=R2_OUTCOME:R2_TREATMENT').map(
      ([name, outcomeR2, treatmentR2]): CovariateR2Text => ({ name, outcomeR2, treatmentR2 }),
    );
    const chosen = list('benchmark');
    if (chosen !== undefined) {
      const known = [...covariateTs, ...covariateR2s].map((c) => c.name);
      const unknown = chosen.find((name) => !known.includes(name));
      if (unknown !== undefined) refuse('--benchmark', `"${unknown}" is not among the --covariate-t entries (${known.join(', ') || 'none given'})`);
      covariateTs = covariateTs.filter((c) => chosen.includes(c.name));
      covariateR2s = covariateR2s.filter((c) => chosen.includes(c.name));
    }
    return Object.freeze({
      ...base,
      ...settings,
      source: 'reported',
      estimate: text('estimate') ?? '',
      se: text('se') ?? '',
      dfBy: byN ? 'n' : 'df',
      df: text('df') ?? '',
      n: text('n') ?? '',
      parameters: text('parameters') ?? '',
      covariateTs,
      ...(covariateR2s.length > 0 ? { covariateR2s } : {}),
    }) as OvbFormInputs;
  }
  const option = `--${source}`;
  const outcome = text('outcome')?.trim();
  const treatment = text('treatment')?.trim();
  if (!outcome) refuse('--outcome', `is needed with ${option}`);
  if (!treatment) refuse('--treatment', `is needed with ${option}`);
  const covariates = list('covariates');
  const common = { ...base, ...settings, outcome, treatment, benchmarks: text('benchmark') ?? '' };
  if (source === 'file') {
    return Object.freeze({ ...common, source: 'file', fileName: text('file')!, covariates: covariates ?? [], categorical: text('categorical') ?? '' }) as OvbFormInputs;
  }
  if (!covariates) refuse('--covariates', `is needed with ${option} (the query has no header to take them from)`);
  const all = [outcome, treatment, ...covariates];
  const twice = all.find((c, i) => all.indexOf(c) !== i);
  if (twice !== undefined) refuse(twice === treatment ? '--treatment' : '--covariates', `"${twice}" is chosen twice`);
  return Object.freeze({
    ...common,
    source: 'summary',
    summaryTable: source === 'sql' ? text('sql')!.trim() : '',
    summaryColumns: covariates.join(', '),
    categorical: text('categorical') ?? '',
    summaryLevels: text('levels') ?? '',
    fileName: source === 'summary' ? text('summary')! : '',
  }) as OvbFormInputs;
}

/** NAME=A[:B],... as [name, A, B] text triples (the numbers are read by the request reader). */
function covariateEntries(value: string | undefined, option: string, shape: string): [string, string, string][] {
  if (value === undefined) return [];
  return value.split(',').map((part, i) => {
    const m = /^\s*([^=]+?)\s*=\s*([^:]+?)\s*(?::\s*(.+?)\s*)?$/.exec(part);
    if (!m) refuse(option, `item ${i + 1} must look like ${shape}, got "${part}"`);
    return [m[1], m[2], m[3] ?? ''];
  });
}

const FIELD_OPTIONS: [RegExp, string][] = [
  [/^covariateTs\b/, '--covariate-t'],
  [/^covariateR2s\b/, '--covariate-r2'],
  [/^(covariates|summaryColumns)\b/, '--covariates'],
  [/^categorical\b/, '--categorical'],
  [/^benchmarks\b/, '--benchmark'],
  [/^(file|fileName|rowCount)$/, '--file'],
  [/^summaryResult$/, '--summary'],
  [/^summaryLevels$/, '--levels'],
  [/^summaryTable$/, '--sql'],
  [/^kOutcome\b/, '--times-outcome'],
  [/^seKind$/, '--se-kind'],
  [/^k$/, '--times'],
  [/^q$/, '--fraction'],
  [/^r2dz$/, '--confounder-treatment-r2'],
  [/^r2yz$/, '--confounder-outcome-r2'],
  [/^(estimate|se|df|n|parameters|outcome|treatment|alpha|direction)$/, ''],
];

/** The option that holds a form field (`covariateTs[0].outcomeT` → `--covariate-t`), for messages. */
export function ovbOptionOf(field: string): string {
  const found = FIELD_OPTIONS.find(([re]) => re.test(field));
  if (!found) return field;
  return found[1] || `--${field}`;
}
