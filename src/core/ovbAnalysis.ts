import { type InputProblem, inputProblem, throwIfProblems } from './inputProblem';
import { conventionList, type AnalysisConvention } from './analysisConvention';
import { partialR2FromT } from './linearModel';
import { robustnessValue, robustnessValueAtLevel, criticalF } from './robustnessValue';
import { type BiasDirection, type ConfounderStrength, adjustForConfounder } from './confounderAdjustment';
import { benchmarkBound, CAPPED_BOUND_REASON } from './benchmarkBounds';
import { omittedVariableBias } from './confounderAdjustment';
import { estimateBoundaryR2dz } from './flipBoundary';

/** An observed covariate (or group of covariates) used as a yardstick for the hidden confounder. */
export interface OvbBenchmarkInput {
  /** The covariate's (or group's) name, as shown to people. */
  readonly covariate: string;
  /** R²(Y~Xj|X₋j,D): its partial R² with the outcome in the outcome regression. Give this or `outcomeT`. */
  readonly r2yxj?: number;
  /** Its t-statistic in the outcome regression (as printed in a paper's table); df is the outcome model's. */
  readonly outcomeT?: number;
  /** R²(D~Xj|X₋j): its partial R² with the treatment in the regression of treatment on covariates. */
  readonly r2dxj?: number;
  /** Its t-statistic in the regression of the treatment on the covariates (df + 1 residual df). */
  readonly treatmentT?: number;
}

/** Input of {@link analyseOvb}: a regression coefficient's reported numbers and the analysis' settings. */
export interface OvbInput {
  /** The treatment's coefficient in the outcome regression. */
  readonly estimate: number;
  /** Its standard error (> 0). */
  readonly se: number;
  /** Residual degrees of freedom (> 1). Give this, or `n` and `parameters`. */
  readonly df?: number;
  /** Number of observations (with `parameters`: df = n − parameters). */
  readonly n?: number;
  /** Number of coefficients of the outcome regression, intercept and treatment included. */
  readonly parameters?: number;
  /** Fraction of the estimate a confounder would have to explain away (default 1: all of it). */
  readonly q?: number;
  /** Two-sided significance level (default 0.05). */
  readonly alpha?: number;
  /** Which way the confounder moves the estimate (default `toward-zero`). */
  readonly direction?: BiasDirection;
  /**
   * Multiples k for the benchmark bounds (default 1, 2, 3): the confounder is k_D = k times as strongly
   * associated with the treatment as the covariate, and k_Y = k times with the outcome unless `kOutcome` says
   * otherwise.
   */
  readonly k?: readonly number[];
  /**
   * Outcome-side multiples k_Y, one per entry of `k` (same length; k then gives k_D). Default: k_Y = k_D.
   */
  readonly kOutcome?: readonly number[];
  /**
   * How the reported standard error was computed. The bias and adjusted-SE formulas assume the classical OLS
   * standard error; `robust`, `clustered` or `unknown` give a warning (the adjusted standard error and t are
   * then wrong, the adjusted estimate is not). Default `classical`.
   */
  readonly seKind?: StandardErrorKind;
  readonly benchmarks?: readonly OvbBenchmarkInput[];
  /** A confounder strength to evaluate (e.g. chosen on the plot). */
  readonly scenario?: ConfounderStrength;
}

/** How a regression's standard error was computed. */
export type StandardErrorKind = 'classical' | 'robust' | 'clustered' | 'unknown';

export const STANDARD_ERROR_KINDS: readonly StandardErrorKind[] = Object.freeze(['classical', 'robust', 'clustered', 'unknown']);

/** The estimate adjusted for one confounder strength. */
export interface OvbAdjustedRow {
  readonly r2dz: number;
  readonly r2yz: number;
  readonly bias: number;
  readonly correctedEstimate: number;
  readonly correctedSe: number;
  readonly correctedT: number;
  readonly correctedDf: number;
}

/** One benchmark bound: a confounder k times as strong as the covariate. NaN fields when unavailable. */
export interface OvbBenchmarkRow extends OvbAdjustedRow {
  readonly covariate: string;
  /** k_D, the treatment-side multiple (the k of the input). */
  readonly k: number;
  /** k_D again, named for its side. */
  readonly kTreatment: number;
  /** k_Y, the outcome-side multiple (equal to k unless `kOutcome` was given). */
  readonly kOutcome: number;
  readonly r2dxj: number;
  readonly r2yxj: number;
  /** R²yz was capped at 1. */
  readonly capped: boolean;
  /** Null when available; otherwise why not. */
  readonly unavailable: string | null;
  /**
   * False when the bound is not available, or reaches 100% of the outcome's residual variance (R²yz capped at
   * 1: adjusted SE 0, adjusted t not available); a report should then say so in words instead of numbers.
   */
  readonly informative: boolean;
  /** Null when informative; otherwise why not, in plain words. */
  readonly reason: string | null;
}

/** The extreme scenario: the confounder explains this share of the outcome's residual variance. */
export interface OvbExtremeScenario {
  readonly r2yz: number;
  /** The R²dz at which the estimate is brought to (1 − q)·estimate (NaN away from zero). */
  readonly r2dzToReach: number;
}

export interface OvbResult {
  readonly method: string;
  readonly references: readonly string[];
  readonly estimate: number;
  readonly se: number;
  readonly t: number;
  readonly df: number;
  readonly q: number;
  readonly alpha: number;
  readonly direction: BiasDirection;
  /** R²(Y~D|X), the partial R² of the treatment with the outcome. */
  readonly partialR2: number;
  /** RV_q. */
  readonly rv: number;
  /** RV_{q,α}. */
  readonly rvAlpha: number;
  /** t* = the 1 − α/2 quantile of Student's t with df − 1 degrees of freedom. */
  readonly criticalT: number;
  /** (1 − q)·estimate: the value the confounder is asked to bring the estimate to. */
  readonly threshold: number;
  readonly k: readonly number[];
  /** The outcome-side multiples k_Y, one per entry of `k` (equal to `k` unless given separately). */
  readonly kOutcome: readonly number[];
  readonly benchmarks: readonly OvbBenchmarkRow[];
  /**
   * The strongest measured covariate, by one rule: among the benchmarks with an available bound at
   * k_D = k_Y = 1, the one whose bound gives the largest |bias| (se·√df·√(R²yz·R²dz/(1 − R²dz))); ties broken by
   * name (code-unit order). Null when no benchmark has such a bound.
   */
  readonly strongestCovariate: string | null;
  readonly extremeScenarios: readonly OvbExtremeScenario[];
  readonly scenario: OvbAdjustedRow | null;
  /** How the reported standard error was computed (as given; default `classical`). */
  readonly seKind: StandardErrorKind;
  /** Every convention this analysis follows, in plain words. */
  readonly conventions: readonly AnalysisConvention[];
  readonly warnings: readonly string[];
}

export const OVB_METHOD =
  'Omitted-variable bias in partial R²: a confounder Z with partial R² R²dz with the treatment and R²yz with the ' +
  'outcome changes the estimate by se·√df·√(R²yz·R²dz/(1 − R²dz)); the robustness values are the equal ' +
  'strengths that explain away a fraction q of the estimate (RV_q) or its significance at level α (RV_{q,α}, ' +
  'critical value from t with df − 1 degrees of freedom); benchmarks bound a confounder k times as strong as an ' +
  'observed covariate.';

export const OVB_REFERENCES: readonly string[] = Object.freeze([
  'Cinelli C, Hazlett C (2020). Making sense of sensitivity: extending omitted variable bias. Journal of the Royal Statistical Society, Series B 82(1):39–67.',
]);

/** The rule that names the strongest measured covariate (also in the result's conventions). */
export const STRONGEST_COVARIATE_RULE =
  'The strongest measured covariate is the benchmark whose bound at k_D = k_Y = 1 (a confounder as strong as that covariate) gives the largest bias; ties are broken by name.';

export const DEFAULT_BENCHMARK_MULTIPLES: readonly number[] = Object.freeze([1, 2, 3]);
/** The outcome shares of the extreme-scenario plot (all, three quarters, half of the residual variance). */
export const EXTREME_SCENARIO_R2YZ: readonly number[] = Object.freeze([1, 0.75, 0.5]);

/**
 * Checks the input of {@link analyseOvb}; returns every problem (empty when valid).
 * Fields: estimate, se, df, n, parameters, q, alpha, direction, k[i], kOutcome / kOutcome[i], seKind,
 * scenario.r2dz, scenario.r2yz,
 * benchmarks[i].covariate/r2yxj/outcomeT/r2dxj/treatmentT.
 */
export function validateOvbInput(input: OvbInput): InputProblem[] {
  const problems: InputProblem[] = [];
  const finite = (field: string, value: unknown): value is number => {
    if (typeof value !== 'number' || !Number.isFinite(value)) {
      problems.push(inputProblem(field, 'not-finite', 'must be a finite number.', value));
      return false;
    }
    return true;
  };
  finite('estimate', input.estimate);
  if (finite('se', input.se) && !(input.se > 0)) {
    problems.push(inputProblem('se', 'not-positive', 'must be greater than 0.', input.se));
  }
  const hasDf = input.df !== undefined;
  const hasN = input.n !== undefined || input.parameters !== undefined;
  if (!hasDf && !hasN) {
    problems.push(inputProblem('df', 'missing', 'is needed (or the number of observations and of coefficients).'));
  } else if (hasDf) {
    if (finite('df', input.df) && !(input.df! > 1)) {
      problems.push(inputProblem('df', 'too-small', 'must be greater than 1 (the adjusted test has df − 1 degrees of freedom).', input.df));
    }
    if (hasN && Number.isFinite(input.df) && input.n !== undefined && input.parameters !== undefined && input.n - input.parameters !== input.df) {
      problems.push(inputProblem('df', 'inconsistent', `does not equal n − parameters (${input.n} − ${input.parameters}); give one or the other.`, input.df));
    }
  } else {
    const whole = (field: string, value: unknown, min: number) => {
      if (!finite(field, value)) return false;
      if (!Number.isInteger(value) || (value as number) < min) {
        problems.push(inputProblem(field, 'not-whole', `must be a whole number of at least ${min}.`, value));
        return false;
      }
      return true;
    };
    const nOk = input.n === undefined ? (problems.push(inputProblem('n', 'missing', 'is needed with the number of coefficients (or give df).')), false) : whole('n', input.n, 1);
    const pOk =
      input.parameters === undefined
        ? (problems.push(inputProblem('parameters', 'missing', 'is needed with n (or give df).')), false)
        : whole('parameters', input.parameters, 1);
    if (nOk && pOk && !(input.n! - input.parameters! > 1)) {
      problems.push(
        inputProblem('n', 'too-small', `must exceed the number of coefficients by more than 1 (df = n − parameters = ${input.n! - input.parameters!}).`, input.n),
      );
    }
  }
  if (input.q !== undefined && finite('q', input.q) && !(input.q > 0)) {
    problems.push(inputProblem('q', 'not-positive', 'must be greater than 0 (1 means: all of the estimate).', input.q));
  }
  if (input.alpha !== undefined && finite('alpha', input.alpha) && !(input.alpha > 0 && input.alpha < 1)) {
    problems.push(inputProblem('alpha', 'outside-interval', 'must be between 0 and 1 (e.g. 0.05).', input.alpha));
  }
  if (input.direction !== undefined && input.direction !== 'toward-zero' && input.direction !== 'away-from-zero') {
    problems.push(inputProblem('direction', 'not-a-choice', 'must be toward-zero or away-from-zero.', input.direction));
  }
  (input.k ?? []).forEach((k, i) => {
    if (finite(`k[${i}]`, k) && !(k > 0)) problems.push(inputProblem(`k[${i}]`, 'not-positive', 'must be greater than 0.', k));
  });
  if (input.kOutcome !== undefined) {
    const kLength = (input.k ?? DEFAULT_BENCHMARK_MULTIPLES).length;
    if (!Array.isArray(input.kOutcome) || input.kOutcome.length !== kLength) {
      problems.push(
        inputProblem('kOutcome', 'unequal-length', `needs one outcome-side multiple per treatment-side multiple k (${kLength}).`, input.kOutcome),
      );
    } else {
      input.kOutcome.forEach((k, i) => {
        if (finite(`kOutcome[${i}]`, k) && !(k > 0)) problems.push(inputProblem(`kOutcome[${i}]`, 'not-positive', 'must be greater than 0.', k));
      });
    }
  }
  if (input.seKind !== undefined && !STANDARD_ERROR_KINDS.includes(input.seKind)) {
    problems.push(inputProblem('seKind', 'not-a-choice', 'must be classical, robust, clustered or unknown.', input.seKind));
  }
  if (input.scenario !== undefined) {
    partialR2Problem(problems, 'scenario.r2dz', input.scenario.r2dz);
    partialR2Problem(problems, 'scenario.r2yz', input.scenario.r2yz);
  }
  const seen = new Map<string, number>();
  (input.benchmarks ?? []).forEach((b, i) => {
    const at = `benchmarks[${i}]`;
    if (typeof b.covariate !== 'string' || b.covariate.trim() === '') {
      problems.push(inputProblem(`${at}.covariate`, 'missing', 'needs a name.', b.covariate));
    } else if (seen.has(b.covariate)) {
      problems.push(inputProblem(`${at}.covariate`, 'duplicate', `"${b.covariate}" is chosen twice.`, b.covariate));
    } else {
      seen.set(b.covariate, i);
    }
    if ((b.r2yxj === undefined) === (b.outcomeT === undefined)) {
      problems.push(inputProblem(`${at}.outcomeT`, 'one-of', 'give either the t-statistic in the outcome regression or the partial R² with the outcome (exactly one).'));
    } else if (b.r2yxj !== undefined) {
      partialR2Problem(problems, `${at}.r2yxj`, b.r2yxj);
    } else {
      finite(`${at}.outcomeT`, b.outcomeT);
    }
    if (b.r2dxj !== undefined && b.treatmentT !== undefined) {
      problems.push(inputProblem(`${at}.treatmentT`, 'one-of', 'give either the t-statistic in the treatment regression or the partial R² with the treatment, not both.'));
    } else if (b.r2dxj !== undefined) {
      partialR2Problem(problems, `${at}.r2dxj`, b.r2dxj);
    } else if (b.treatmentT !== undefined) {
      finite(`${at}.treatmentT`, b.treatmentT);
    }
  });
  return problems;
}

/**
 * Omitted-variable-bias sensitivity analysis of a regression coefficient from its reported numbers: the
 * treatment's partial R² with the outcome, the robustness values RV_q and RV_{q,α}, bounds on confounders k
 * times as strong as observed covariates, the extreme scenarios, and a chosen confounder's adjusted estimate.
 *
 * **Method.** R²(Y~D|X) = t²/(t² + df) with t = estimate/se; RV_q and RV_{q,α} in closed form
 * ({@link robustnessValue}, {@link robustnessValueAtLevel}); a benchmark's R²yxj from its partial R² or its
 * t in the outcome regression (df), its R²dxj from its partial R² or its t in the treatment regression
 * (df + 1: that regression lacks the treatment); bounds by {@link benchmarkBound} with k_D = k and k_Y =
 * `kOutcome` (default k); adjusted values by {@link adjustForConfounder}. A bound with R²yz = 1 is flagged
 * not informative. The strongest measured covariate: {@link STRONGEST_COVARIATE_RULE}. `conventions` lists
 * every convention in words (degrees of freedom, classical SE, multiples, direction).
 *
 * **References.** Cinelli C, Hazlett C (2020). Making sense of sensitivity: extending omitted variable bias.
 * JRSS-B 82(1):39–67, §3 (bias in partial R²s), §4 (robustness values), §5 (extreme scenarios), §6 (bounds
 * from observed covariates; §6.1 with separate k_D and k_Y, recalled from memory).
 *
 * **Special cases.** An estimate of 0 has RV 0. A reported t that is not significant at α has RV_{q,α} = 0
 * (and a warning). A benchmark without its association with the treatment has no bound (a row per k with
 * the reason). With `away-from-zero`, the robustness values (which concern bias toward zero) are still
 * reported, and the extreme-scenario thresholds are not available.
 *
 * @throws InputError carrying every problem found by {@link validateOvbInput}
 */
export function analyseOvb(input: OvbInput): OvbResult {
  throwIfProblems(validateOvbInput(input));
  const df = input.df ?? input.n! - input.parameters!;
  const q = input.q ?? 1;
  const alpha = input.alpha ?? 0.05;
  const direction = input.direction ?? 'toward-zero';
  const kList = [...(input.k ?? DEFAULT_BENCHMARK_MULTIPLES)];
  const kOutcomeList = input.kOutcome ? [...input.kOutcome] : [...kList];
  const seKind = input.seKind ?? 'classical';
  const { estimate, se } = input;
  const t = estimate / se;
  const warnings: string[] = [];
  const rv = robustnessValue(t, df, q);
  const rvAlpha = robustnessValueAtLevel(t, df, q, alpha);
  const criticalT = criticalF(df, alpha) * Math.sqrt(df - 1);
  if (!Number.isInteger(df)) warnings.push(`The residual degrees of freedom (${df}) are not a whole number; check them.`);
  if (rvAlpha === 0) {
    warnings.push(
      q === 1
        ? `The estimate is not statistically significant at level ${alpha} even without confounding (|t| ≤ ${criticalT.toPrecision(4)} on df − 1), so no confounding is needed to make it lose significance.`
        : `Even without confounding, the data do not reject an effect of ${1 - q} times the estimate at level ${alpha}.`,
    );
  }
  if (seKind !== 'classical') {
    warnings.push(
      `The standard error is ${seKind === 'unknown' ? 'of unknown kind' : seKind}; the bias formula assumes the classical OLS standard error, so the adjusted standard errors and t-statistics shown are not right for it (the adjusted estimates are).`,
    );
  }
  if (direction === 'away-from-zero') {
    warnings.push('A confounder that pushes the estimate away from zero cannot explain it away; the robustness values describe confounding toward zero.');
  }
  const reported = { estimate, se, df };
  const adjust = (strength: ConfounderStrength): OvbAdjustedRow => {
    const a = adjustForConfounder(reported, strength, direction);
    return { r2dz: strength.r2dz, r2yz: strength.r2yz, bias: a.bias, correctedEstimate: a.estimate, correctedSe: a.se, correctedT: a.t, correctedDf: a.df };
  };
  const benchmarks: OvbBenchmarkRow[] = [];
  let strongest: string | null = null;
  let strongestBias = -Infinity;
  for (const b of input.benchmarks ?? []) {
    const r2yxj = b.r2yxj ?? partialR2OfT(b.outcomeT!, df);
    const r2dxj = b.r2dxj ?? (b.treatmentT !== undefined ? partialR2OfT(b.treatmentT, df + 1) : NaN);
    if (Number.isNaN(r2dxj)) {
      warnings.push(
        `No bound for ${b.covariate}: it needs the covariate’s association with the treatment (its t in the regression of the treatment on the covariates), which papers rarely print.`,
      );
    }
    const usable = !Number.isNaN(r2dxj) && r2yxj < 1 && r2dxj < 1;
    kList.forEach((k, i) => {
      const kOutcome = kOutcomeList[i];
      if (!usable) {
        const reason = Number.isNaN(r2dxj)
          ? 'its association with the treatment is not known'
          : 'the covariate explains all of the residual variance';
        benchmarks.push(unavailableRow(b.covariate, k, kOutcome, r2dxj, r2yxj, reason));
        return;
      }
      const bound = benchmarkBound(r2dxj, r2yxj, k, kOutcome);
      if (bound.unavailable !== null) {
        benchmarks.push(unavailableRow(b.covariate, k, kOutcome, r2dxj, r2yxj, bound.unavailable));
        return;
      }
      const multiple = k === kOutcome ? `${k} ×` : `k_D = ${k}, k_Y = ${kOutcome} ×`;
      if (!bound.informative) {
        warnings.push(`For ${multiple} ${b.covariate} the bound on R²(Y~Z|D,X) reached 1 (100% of the outcome’s residual variance) and was capped there: the bound is not informative: a confounder this strong could explain all of the outcome’s remaining variance, so it gives no adjusted standard error or t.`);
      }
      benchmarks.push({
        covariate: b.covariate,
        k,
        kTreatment: k,
        kOutcome,
        r2dxj,
        r2yxj,
        capped: bound.capped,
        unavailable: null,
        informative: bound.informative,
        reason: bound.reason,
        ...adjust({ r2dz: bound.r2dz, r2yz: bound.r2yz }),
      });
    });
    if (usable) {
      const one = benchmarkBound(r2dxj, r2yxj, 1, 1);
      if (one.unavailable === null) {
        const bias = omittedVariableBias(se, df, { r2dz: one.r2dz, r2yz: one.r2yz });
        if (bias > strongestBias || (bias === strongestBias && strongest !== null && b.covariate < strongest)) {
          strongest = b.covariate;
          strongestBias = bias;
        }
      }
    }
  }
  const setting = { t, df, q, alpha, direction };
  const extremeScenarios = EXTREME_SCENARIO_R2YZ.map((r2yz) => ({ r2yz, r2dzToReach: estimateBoundaryR2dz(setting, r2yz) }));
  return deepFreeze({
    method: OVB_METHOD,
    references: OVB_REFERENCES,
    estimate,
    se,
    t,
    df,
    q,
    alpha,
    direction,
    partialR2: partialR2OfT(t, df),
    rv,
    rvAlpha,
    criticalT,
    threshold: (1 - q) * estimate,
    k: kList,
    kOutcome: kOutcomeList,
    benchmarks,
    strongestCovariate: strongest,
    extremeScenarios,
    scenario: input.scenario ? adjust(input.scenario) : null,
    seKind,
    conventions: ovbConventions({
      seKind,
      direction,
      hasBenchmarks: (input.benchmarks ?? []).length > 0,
      outcomeT: (input.benchmarks ?? []).some((b) => b.outcomeT !== undefined),
      treatmentT: (input.benchmarks ?? []).some((b) => b.treatmentT !== undefined),
      sameMultiples: kList.every((k, i) => k === kOutcomeList[i]),
    }),
    warnings,
  });
}

/** t²/(t² + df), written as 1/(1 + df/t²) for large |t| so that t² cannot overflow (Cinelli & Hazlett 2020, §4). */
function partialR2OfT(t: number, df: number): number {
  const t2 = t * t;
  if (t2 === Infinity) return 1;
  return t2 < df ? partialR2FromT(t, df) : 1 / (1 + df / t2);
}

/** The conventions of an omitted-variable-bias analysis, in plain words (frozen). */
function ovbConventions(settings: {
  seKind: StandardErrorKind;
  direction: BiasDirection;
  hasBenchmarks: boolean;
  outcomeT: boolean;
  treatmentT: boolean;
  sameMultiples: boolean;
}): readonly AnalysisConvention[] {
  const c = conventionList();
  c.add(
    'degrees-of-freedom',
    'The partial R² of the treatment and the robustness value RV_q use the regression’s residual degrees of freedom df; the significance threshold (RV_q,α and the adjusted t) uses Student’s t with df − 1, because the regression that includes the confounder has one more coefficient.',
  );
  c.add(
    'classical-standard-error',
    settings.seKind === 'classical'
      ? 'The bias formula assumes the classical OLS standard error; with a robust or clustered standard error the adjusted standard error and t would be wrong.'
      : `The bias formula assumes the classical OLS standard error, but this one is ${settings.seKind === 'unknown' ? 'of unknown kind' : settings.seKind}: the adjusted standard errors and t-statistics are not right for it; the adjusted estimates are.`,
  );
  c.add(
    'bias-direction',
    settings.direction === 'toward-zero'
      ? 'The confounder is assumed to have pushed the estimate away from zero, so adjusting for it moves the estimate toward zero.'
      : 'The confounder is assumed to have pushed the estimate toward zero, so adjusting for it moves the estimate away from zero.',
  );
  if (settings.hasBenchmarks) {
    if (settings.outcomeT) c.add('outcome-t-df', 'A covariate’s t in the outcome regression is converted to a partial R² with df degrees of freedom.');
    if (settings.treatmentT) {
      c.add('treatment-t-df', 'A covariate’s t in the regression of the treatment on the covariates is converted to a partial R² with df + 1 degrees of freedom (that regression lacks the treatment).');
    }
    c.add(
      'benchmark-multiples',
      settings.sameMultiples
        ? 'Benchmarks bound a confounder k times as strongly associated with the treatment and k times with the outcome as the covariate (k_D = k_Y = k), with the confounder unrelated to the measured covariates.'
        : 'Benchmarks bound a confounder k_D times as strongly associated with the treatment and k_Y times with the outcome as the covariate (different multiples for the two sides), with the confounder unrelated to the measured covariates.',
    );
    c.add('capped-bounds', 'A bound on the outcome side is capped at 100% of the outcome’s residual variance; where it is capped the bound is marked not informative: a confounder that strong could explain all of the outcome’s remaining variance, so no adjusted standard error or t follows from it.');
    c.add('strongest-covariate', STRONGEST_COVARIATE_RULE);
  }
  return c.list();
}

function unavailableRow(covariate: string, k: number, kOutcome: number, r2dxj: number, r2yxj: number, reason: string): OvbBenchmarkRow {
  return {
    covariate,
    k,
    kTreatment: k,
    kOutcome,
    r2dxj,
    r2yxj,
    capped: false,
    unavailable: reason,
    informative: false,
    reason,
    r2dz: NaN,
    r2yz: NaN,
    bias: NaN,
    correctedEstimate: NaN,
    correctedSe: NaN,
    correctedT: NaN,
    correctedDf: NaN,
  };
}

function partialR2Problem(problems: InputProblem[], field: string, value: unknown): void {
  if (typeof value !== 'number' || !Number.isFinite(value)) {
    problems.push(inputProblem(field, 'not-finite', 'must be a finite number.', value));
  } else if (!(value >= 0 && value < 1)) {
    problems.push(inputProblem(field, 'outside-interval', 'must be a partial R² in [0, 1): at least 0 and below 1.', value));
  }
}

function deepFreeze<T>(value: T): T {
  if (value && typeof value === 'object' && !Object.isFrozen(value)) {
    for (const key of Object.keys(value)) deepFreeze((value as Record<string, unknown>)[key]);
    Object.freeze(value);
  }
  return value;
}
