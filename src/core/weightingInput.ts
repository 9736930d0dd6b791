/** The estimand of an inverse-probability-weighted analysis. */
export type WeightingEstimand = 'ate' | 'att';

/** A numeric covariate column (dummy-code text and categorical columns first, e.g. with `dummyCode`). */
export interface WeightingCovariate {
  readonly name: string;
  /** One value per person; NaN marks a missing value (the person is dropped and counted). */
  readonly values: readonly number[];
}

/** Drop people whose estimated propensity lies outside [below, above] (counted and reported). */
export interface PropensityTrimming {
  readonly below: number;
  readonly above: number;
}

/** Input of the weighting sensitivity analysis (`analyseWeighting`). */
export interface WeightingInput {
  /** 1 = treated, 0 = control, one per person; NaN = missing. */
  readonly treatment: readonly number[];
  /** The outcome, one per person; NaN = missing. */
  readonly outcome: readonly number[];
  /** Covariates of the propensity model (an intercept is always added). May be empty. */
  readonly covariates: readonly WeightingCovariate[];
  /** `ate`: average effect in everyone; `att`: average effect in the treated. */
  readonly estimand: WeightingEstimand;
  /** Values of Λ ≥ 1 at which bounds and intervals are reported. Default {@link DEFAULT_LAMBDAS}. */
  readonly lambdas?: readonly number[];
  /** Bootstrap resamples B (whole number, 0 = point bounds only). Default 1000. */
  readonly bootstrap?: number;
  /** Seed of the resampling (whole number in [0, 2⁵³ − 1]). Default 1. */
  readonly seed?: number;
  /** 1 − the coverage of the sensitivity interval, in (0, 1). Default 0.05. */
  readonly alpha?: number;
  /** Optional propensity trimming rule. Default null (no trimming). */
  readonly trim?: PropensityTrimming | null;
  /** The largest Λ searched for the tipping values, > 1. Default 100. */
  readonly lambdaSearchLimit?: number;
}

export const DEFAULT_LAMBDAS: readonly number[] = Object.freeze([1, 1.25, 1.5, 2, 3]);
export const DEFAULT_BOOTSTRAP = 1000;
export const DEFAULT_WEIGHTING_SEED = 1;
export const DEFAULT_WEIGHTING_ALPHA = 0.05;
export const DEFAULT_LAMBDA_SEARCH_LIMIT = 100;
/** Largest B accepted (a guard against a typing slip; 100,000 resamples is far beyond any need). */
export const MAX_BOOTSTRAP = 100_000;
