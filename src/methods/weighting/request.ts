import { inputProblem, type InputProblem } from '../../core/inputProblem';
import type { PropensityTrimming, WeightingEstimand } from '../../core/weightingInput';
import { fieldReader } from '../fieldReader';

/** The estimands the form accepts (without regard to case). */
export const WEIGHTING_ESTIMANDS = ['ate', 'att'] as const;

/**
 * Everything the weighting form holds, as typed (text, never parsed numbers), so nothing is lost and the form
 * can be saved and restored. A file's rows are never part of it: only its name and the column choices.
 */
export interface WeightingFormInputs {
  readonly fileName: string;
  /** The 0/1 treatment column. */
  readonly treatment: string;
  /** The numeric outcome column. */
  readonly outcome: string;
  /** Covariate columns separated by commas; empty for every other column. */
  readonly covariates: string;
  /** Numeric columns to dummy-code as categories (e.g. a site code), separated by commas. */
  readonly categorical: string;
  /** `ate` (average effect in everyone) or `att` (average effect in the treated). */
  readonly estimand: string;
  /** Λ values separated by commas, semicolons or spaces; empty for the default list. */
  readonly lambdas: string;
  /** Bootstrap resamples B (whole number; 0 = point bounds only). */
  readonly bootstrap: string;
  /** Seed of the resampling (whole number). */
  readonly seed: string;
  /** 1 − coverage of the sensitivity interval (a fraction or percentage). */
  readonly alpha: string;
  /** Optional trimming rule: leave out people with estimated propensity below / above these (both or neither). */
  readonly trimBelow: string;
  readonly trimAbove: string;
}

export function emptyWeightingForm(): WeightingFormInputs {
  return Object.freeze({
    fileName: '',
    treatment: '',
    outcome: '',
    covariates: '',
    categorical: '',
    estimand: 'ate',
    lambdas: '',
    bootstrap: '1000',
    seed: '1',
    alpha: '0.05',
    trimBelow: '',
    trimAbove: '',
  });
}

const TEXT_FIELDS: readonly (keyof WeightingFormInputs)[] = [
  'fileName',
  'treatment',
  'outcome',
  'covariates',
  'categorical',
  'estimand',
  'lambdas',
  'bootstrap',
  'seed',
  'alpha',
  'trimBelow',
  'trimAbove',
];

/**
 * Completes a saved or partial form object: unknown keys dropped, numbers taken as their text (0.05 → "0.05"),
 * other wrong types replaced by the defaults.
 */
export function normaliseWeightingForm(saved: unknown): WeightingFormInputs {
  const base = emptyWeightingForm();
  if (saved === null || typeof saved !== 'object') return base;
  const s = saved as Record<string, unknown>;
  const out: Record<string, string> = {};
  for (const key of TEXT_FIELDS) {
    const value = s[key];
    out[key] = typeof value === 'string' ? value : typeof value === 'number' && Number.isFinite(value) ? String(value) : base[key];
  }
  return Object.freeze(out as unknown as WeightingFormInputs);
}

/** Splits a comma (or semicolon) separated list of column names; blanks dropped, each name once. */
export function columnList(text: string): string[] {
  const items = String(text ?? '')
    .split(/[,;]/)
    .map((s) => s.trim())
    .filter((s) => s !== '');
  return [...new Set(items)];
}

/** The columns the form asks for: treatment, outcome, covariates (empty = every other column), categorical. */
export interface WeightingColumns {
  readonly treatment: string;
  readonly outcome: string;
  /** Empty: every column other than the treatment and the outcome. */
  readonly covariates: readonly string[];
  readonly categorical: readonly string[];
}

/** The settings of the form, read: everything of the analysis input except the data. */
export interface WeightingSettings {
  readonly columns: WeightingColumns;
  readonly estimand: WeightingEstimand;
  readonly lambdas?: number[];
  readonly bootstrap?: number;
  readonly seed?: number;
  readonly alpha?: number;
  readonly trim: PropensityTrimming | null;
  readonly problems: InputProblem[];
}

/**
 * Reads the settings with the one field reader: the estimand without regard to case (empty = ate), Λ as a
 * list of decimals, B and the seed as whole numbers, α as a fraction ("5%" = 0.05), the trimming bounds as
 * fractions (both or neither). Columns: the treatment and outcome are required; the covariates and
 * categorical columns are comma lists. An empty number is left undefined (the analysis default). The rules
 * of the analysis itself (Λ ≥ 1, B ≤ 100,000, …) are checked by the core's validation, named by these fields.
 */
export function readWeightingSettings(form: WeightingFormInputs): WeightingSettings {
  const reader = fieldReader();
  const problems = reader.problems;
  const treatment = String(form.treatment ?? '').trim();
  const outcome = String(form.outcome ?? '').trim();
  if (treatment === '') problems.push(inputProblem('treatment', 'required', 'is required (the 0/1 treatment column)'));
  if (outcome === '') problems.push(inputProblem('outcome', 'required', 'is required (the numeric outcome column)'));
  if (treatment !== '' && treatment === outcome) problems.push(inputProblem('outcome', 'same-column', `must differ from the treatment column ("${outcome}")`));
  const estimand = reader.choice('estimand', form.estimand, WEIGHTING_ESTIMANDS) ?? 'ate';
  const lambdas = reader.numberList('lambdas', form.lambdas, 'decimal') ?? undefined;
  const bootstrap = reader.number('bootstrap', form.bootstrap, 'whole') ?? undefined;
  const seed = reader.number('seed', form.seed, 'whole') ?? undefined;
  const alpha = reader.number('alpha', form.alpha, 'fraction') ?? undefined;
  const below = reader.number('trimBelow', form.trimBelow, 'fraction');
  const above = reader.number('trimAbove', form.trimAbove, 'fraction');
  const belowTyped = String(form.trimBelow ?? '').trim() !== '';
  const aboveTyped = String(form.trimAbove ?? '').trim() !== '';
  let trim: PropensityTrimming | null = null;
  if (belowTyped !== aboveTyped) {
    const missing = belowTyped ? 'trimAbove' : 'trimBelow';
    problems.push(inputProblem(missing, 'required', 'trimming needs both bounds: below (e.g. 0.1) and above (e.g. 0.9)'));
  } else if (below !== null && above !== null) trim = { below, above };
  const covariates = columnList(form.covariates).filter((c) => c !== treatment && c !== outcome);
  const categorical = columnList(form.categorical);
  for (const c of categorical) {
    if (c === treatment || c === outcome) problems.push(inputProblem('categorical', 'not-a-covariate', `"${c}" is the ${c === treatment ? 'treatment' : 'outcome'}, not a covariate`, c));
    else if (covariates.length > 0 && !covariates.includes(c)) problems.push(inputProblem('categorical', 'not-a-covariate', `"${c}" is not one of the covariates`, c));
  }
  return { columns: { treatment, outcome, covariates, categorical }, estimand, lambdas, bootstrap, seed, alpha, trim, problems };
}

/**
 * The form field an analysis problem belongs to: `covariates[2]` → `covariates`, `lambdas[0]` → `lambdas`,
 * `trim` → `trimBelow`, `treatment` and `outcome` stay.
 */
export function formFieldOf(field: string): keyof WeightingFormInputs | 'file' {
  const base = field.replace(/\[.*$/, '').replace(/\..*$/, '');
  if (base === 'trim') return 'trimBelow';
  if (base === 'lambdaSearchLimit') return 'lambdas';
  if ((TEXT_FIELDS as readonly string[]).includes(base)) return base as keyof WeightingFormInputs;
  return 'file';
}
