import { conventionList, type AnalysisConvention } from './analysisConvention';
import { type BootstrapChunk, lambdaGrid, LAMBDA_GRID_SIZE, ResampleStatus, runBootstrapChunk } from './weightingBootstrap';
import { type WeightingBoundTables, weightingBoundTables, weightingEffectBounds } from './weightingBounds';
import type { PropensityTrimming, WeightingEstimand, WeightingInput } from './weightingInput';
import { prepareWeighting, type PreparedWeighting, type WeightingCounts } from './weightingPreparation';

/** Bounds and sensitivity interval at one Λ. */
export interface WeightingLambdaRow {
  readonly lambda: number;
  /** Smallest and largest weighted effect over the marginal sensitivity model at this Λ (point bounds). */
  readonly lowerBound: number;
  readonly upperBound: number;
  /** The 1 − α percentile-bootstrap sensitivity interval; null when B = 0 or no resample could be used. */
  readonly intervalLower: number | null;
  readonly intervalUpper: number | null;
}

/**
 * `found`: the value; `includes-zero-at-one`: already includes no effect at Λ = 1 (value 1);
 * `beyond-range`: still excludes it at the search limit (value null); `not-available`: no usable resamples
 * (interval only; value null).
 */
export type WeightingTippingStatus = 'found' | 'includes-zero-at-one' | 'beyond-range' | 'not-available';

/** Summary of the normalised (Hájek) weights of one group at Λ = 1. */
export interface WeightSummary {
  readonly people: number;
  readonly smallest: number;
  readonly largest: number;
  readonly mean: number;
  /** Kish's effective sample size (Σw)²/Σw². */
  readonly effectiveSize: number;
  /** The largest weight's share of the group's total weight. */
  readonly largestShare: number;
}

/** One bin of the propensity histogram: people with from ≤ e < to (the last bin includes 1). */
export interface PropensityBin {
  readonly from: number;
  readonly to: number;
  readonly treated: number;
  readonly control: number;
}

/** The result of {@link analyseWeighting}. Frozen; never NaN or infinite (null where not available). */
export interface WeightingResult {
  readonly method: string;
  readonly estimand: WeightingEstimand;
  /** The settings used (defaults filled in) and the covariate names. */
  readonly inputs: {
    readonly covariates: readonly string[];
    readonly lambdas: readonly number[];
    readonly bootstrap: number;
    readonly seed: number;
    readonly alpha: number;
    readonly trim: PropensityTrimming | null;
    readonly lambdaSearchLimit: number;
  };
  readonly counts: WeightingCounts;
  readonly propensityModel: {
    readonly coefficients: readonly { readonly name: string; readonly value: number }[];
    readonly iterations: number;
    readonly converged: boolean;
    readonly deviance: number;
  };
  /** The Hájek estimate at Λ = 1 (no hidden bias). */
  readonly estimate: { readonly treatedMean: number; readonly controlMean: number; readonly effect: number };
  readonly rows: readonly WeightingLambdaRow[];
  /** Smallest Λ at which the point bounds include 0 (no effect). */
  readonly tippingLambdaPoint: number | null;
  readonly tippingPointStatus: WeightingTippingStatus;
  /** Smallest Λ at which the sensitivity interval includes 0. */
  readonly tippingLambdaInterval: number | null;
  readonly tippingIntervalStatus: WeightingTippingStatus;
  readonly bootstrap: {
    readonly requested: number;
    readonly used: number;
    readonly failed: number;
    readonly failedSeparation: number;
    readonly failedNotConverged: number;
    readonly failedRankDeficient: number;
    readonly seed: number;
    readonly stratified: true;
  };
  readonly overlap: {
    readonly bins: readonly PropensityBin[];
    readonly treatedRange: { readonly smallest: number; readonly largest: number };
    readonly controlRange: { readonly smallest: number; readonly largest: number };
    /** People with estimated propensity below `lowThreshold` / above `highThreshold`. */
    readonly belowLow: number;
    readonly aboveHigh: number;
    readonly lowThreshold: number;
    readonly highThreshold: number;
  };
  readonly weights: { readonly treated: WeightSummary; readonly control: WeightSummary };
  /** The conventions this computation follows, in words, each with a stable id. */
  readonly conventions: readonly AnalysisConvention[];
  readonly references: readonly string[];
  readonly warnings: readonly string[];
}

const METHOD =
  'Inverse-probability weighting with normalised (Hájek) weights and a logistic propensity model, and its ' +
  'sensitivity to hidden confounding under the marginal sensitivity model (the odds of treatment may differ ' +
  'from the fitted odds by a factor between 1/Λ and Λ for each person): exact bounds on the weighted effect ' +
  'at each Λ, and a percentile-bootstrap sensitivity interval.';

/** The works the weighting analysis follows (also what the robustness statement cites). */
export const WEIGHTING_ANALYSIS_REFERENCES = Object.freeze([
  'Tan Z (2006) A distributional approach for causal inference using propensity scores. Journal of the American Statistical Association 101(476):1619–1637 (the marginal sensitivity model) — recalled from memory.',
  'Zhao Q, Small DS, Bhattacharya BB (2019) Sensitivity analysis for inverse probability weighting estimators via the percentile bootstrap. Journal of the Royal Statistical Society Series B 81(4):735–761 (exact bounds by sorting; percentile-bootstrap sensitivity interval) — recalled from memory.',
  'Rosenbaum PR, Rubin DB (1983) The central role of the propensity score in observational studies for causal effects. Biometrika 70(1):41–55.',
  'Hájek J (1971) Comment on "An essay on the logical foundations of survey sampling, part one" by D. Basu. In Godambe VP, Sprott DA (eds) Foundations of Statistical Inference, Holt, Rinehart and Winston, p. 236 (the normalised weighted mean) — recalled from memory.',
  'McCullagh P, Nelder JA (1989) Generalized Linear Models, 2nd ed., Chapman & Hall, §2.5 (IRLS).',
  'Efron B, Tibshirani RJ (1993) An Introduction to the Bootstrap, Chapman & Hall, ch. 13 (percentile intervals).',
  'Hyndman RJ, Fan Y (1996) Sample quantiles in statistical packages. The American Statistician 50(4):361–365 (definition 7).',
  'Steele GL Jr, Lea D, Flood CH (2014) Fast splittable pseudorandom number generators. OOPSLA \'14, ACM, 453–472 (SplitMix64).',
  'Kish L (1965) Survey Sampling, Wiley (effective sample size (Σw)²/Σw²).',
]);

/** Propensity thresholds for the extreme-propensity warning (common practice, no source). */
const LOW_PROPENSITY = 0.01;
const HIGH_PROPENSITY = 0.99;
const BINS = 20;

/**
 * Sensitivity of an inverse-probability-weighted effect estimate to hidden confounding under the marginal
 * sensitivity model: point bounds and percentile-bootstrap sensitivity intervals at each Λ, and the tipping
 * Λ at which each first includes no effect.
 *
 * **Method.** (1) People with a missing value are dropped and counted. (2) Propensity e(x): logistic
 * regression of treatment on the covariates with an intercept, by Newton/IRLS (R's `glm` start and stopping
 * rule: |ΔD|/(|D| + 0.1) < 1e-8, at most 25 iterations). (3) Optional trimming: people with e outside
 * [below, above] are dropped and counted, and the model is refitted to those kept; the trimming is done once
 * and not repeated within resamples. (4) Hájek estimate: ATE weights 1/e (treated), 1/(1 − e) (control); ATT
 * weights 1 (treated), e/(1 − e) (control); each group's mean Σwy/Σw; effect = treated − control.
 * (5) Marginal sensitivity model: each person's true odds of treatment lie within a factor Λ of the fitted
 * odds, so each weight lies in a box (see `weightingBoundTables`); the point bounds are the exact extremes of
 * the effect over the boxes (sorted outcomes, threshold search). (6) Percentile bootstrap: B resamples
 * stratified by treatment group, the propensity model refitted in each, the bounds recomputed; the interval
 * at Λ runs from the α/2 quantile of the resampled lower bounds to the 1 − α/2 quantile of the resampled
 * upper bounds (quantile type 7, linear interpolation between order statistics). (7) Tipping Λ of the point
 * bounds: bisection in log Λ on the bound nearer zero (exact up to 1e-12 relative); of the interval: the
 * resampled bounds on a grid of 801 log-spaced Λ values from 1 to the search limit, the first grid value
 * whose interval includes 0 found by bisection (the interval widens with Λ), then linear interpolation in
 * log Λ between it and the grid value before.
 *
 * **References.** See `references` on the result; principally Tan (2006) and Zhao, Small & Bhattacharya
 * (2019), both recalled from memory.
 *
 * **Special cases.** B = 0: point bounds only (interval fields null, interval tipping `not-available`).
 * Resamples whose refit fails (separation, no convergence, a covariate constant or collinear among those
 * drawn) are counted and left out; if none is usable, intervals are null. An estimate of exactly 0 gives
 * tipping Λ = 1 (`includes-zero-at-one`).
 *
 * @param input see {@link WeightingInput}
 * @throws InputError carrying every problem found by `validateWeighting`
 */
export function analyseWeighting(input: WeightingInput): WeightingResult {
  const prepared = prepareWeighting(input);
  const chunk = runBootstrapChunk(prepared, { start: 0, count: prepared.bootstrap });
  return finishWeighting(prepared, [chunk]);
}

/**
 * Assembles the result from a prepared analysis and bootstrap chunks computed anywhere (worker threads, a
 * Web Worker): the chunks, in any order, must cover resamples 0 … B − 1 exactly once. The result is the same
 * however the resamples were split.
 *
 * **Method.** As {@link analyseWeighting}, steps (4)–(7).
 *
 * **References.** As {@link analyseWeighting}.
 *
 * **Special cases.** B = 0: pass no chunks.
 *
 * @param prepared from `prepareWeighting`
 * @param chunks from `runBootstrapChunk`
 * @throws RangeError when the chunks leave out or repeat a resample
 */
export function finishWeighting(prepared: PreparedWeighting, chunks: readonly BootstrapChunk[]): WeightingResult {
  const B = prepared.bootstrap;
  const L = prepared.lambdas.length;
  const G = LAMBDA_GRID_SIZE;
  const ordered = [...chunks].filter((c) => c.count > 0).sort((a, b) => a.start - b.start);
  let next = 0;
  for (const c of ordered) {
    if (c.start !== next) throw new RangeError(c.start > next ? `resamples ${next} to ${c.start - 1} are missing` : `resample ${c.start} is given twice`);
    next = c.start + c.count;
  }
  if (next !== B) throw new RangeError(`resamples ${next} to ${B - 1} are missing`);

  // Gather the usable resamples.
  let failedSeparation = 0;
  let failedNotConverged = 0;
  let failedRankDeficient = 0;
  const usedRows: { chunk: BootstrapChunk; row: number }[] = [];
  for (const c of ordered) {
    for (let r = 0; r < c.count; r++) {
      const s = c.status[r];
      if (s === ResampleStatus.used) usedRows.push({ chunk: c, row: r });
      else if (s === ResampleStatus.separation) failedSeparation++;
      else if (s === ResampleStatus.notConverged) failedNotConverged++;
      else failedRankDeficient++;
    }
  }
  const used = usedRows.length;
  const lowP = prepared.alpha / 2;
  const highP = 1 - prepared.alpha / 2;
  const column = new Float64Array(used);
  const quantileOf = (pick: (c: BootstrapChunk) => Float64Array, width: number, index: number, prob: number): number => {
    usedRows.forEach(({ chunk, row }, k) => (column[k] = pick(chunk)[row * width + index]));
    return quantileType7(column, prob);
  };

  // Point bounds and intervals at the requested Λ.
  const tables = weightingBoundTables(prepared.estimand, prepared.outcome, prepared.treatedOrder, prepared.controlOrder, prepared.linearPredictor, null);
  const atOne = weightingEffectBounds(tables, 1);
  const estimate = Object.freeze({ treatedMean: atOne.treatedLower, controlMean: atOne.controlLower, effect: atOne.lowerBound });
  const rows = prepared.lambdas.map((lambda, l) => {
    const b = weightingEffectBounds(tables, lambda);
    return Object.freeze({
      lambda,
      lowerBound: b.lowerBound,
      upperBound: b.upperBound,
      intervalLower: used > 0 ? quantileOf((c) => c.lowerBounds, L, l, lowP) : null,
      intervalUpper: used > 0 ? quantileOf((c) => c.upperBounds, L, l, highP) : null,
    });
  });

  const limit = prepared.lambdaSearchLimit;
  const point = pointTipping(tables, estimate.effect, limit);
  const interval =
    used > 0
      ? intervalTipping(
          lambdaGrid(limit),
          (g) => quantileOf((c) => c.gridLowerBounds, G, g, lowP),
          (g) => quantileOf((c) => c.gridUpperBounds, G, g, highP),
        )
      : { lambda: null, status: 'not-available' as const };

  const overlap = overlapSummary(prepared);
  const weights = Object.freeze({ treated: weightSummary(prepared, 1), control: weightSummary(prepared, 0) });
  const failed = B - used;
  const warnings: string[] = [];
  const c = prepared.counts;
  if (c.droppedMissing > 0) {
    const by = c.missingByColumn.map((m) => `${m.column}: ${m.count}`).join(', ');
    warnings.push(`${c.droppedMissing} of ${c.given} people were left out for a missing value (${by}).`);
  }
  if (c.trimmedBelow + c.trimmedAbove > 0) {
    warnings.push(
      `Trimming left out ${c.trimmedBelow} people with estimated propensity below ${prepared.trim!.below} and ${c.trimmedAbove} above ${prepared.trim!.above}; the results describe the people kept, not everyone.`,
    );
  }
  if (overlap.belowLow + overlap.aboveHigh > 0) {
    warnings.push(
      `${overlap.belowLow} people have an estimated propensity below ${LOW_PROPENSITY} and ${overlap.aboveHigh} above ${HIGH_PROPENSITY} (thresholds: common practice, no source): their weights are extreme and overlap between the groups is poor; consider trimming or a different estimand.`,
    );
  }
  if (B > 0 && failed > 0) {
    warnings.push(
      `${failed} of ${B} bootstrap resamples could not be used (${failedSeparation} with separation, ${failedNotConverged} not converged, ${failedRankDeficient} with a constant or collinear covariate); the interval uses the other ${used}.`,
    );
  }
  if (B > 0 && used === 0) warnings.push('No bootstrap resample could be used, so no sensitivity interval is given.');
  if (point.status === 'beyond-range') warnings.push(`The point bounds still exclude no effect at Λ = ${limit}, the largest value searched.`);
  if (interval.status === 'beyond-range') warnings.push(`The sensitivity interval still excludes no effect at Λ = ${limit}, the largest value searched.`);

  const coefficients = prepared.columnNames.map((name, k) => Object.freeze({ name, value: prepared.coefficients[k] }));
  return deepFreeze({
    method: METHOD,
    estimand: prepared.estimand,
    inputs: {
      covariates: prepared.columnNames.slice(1),
      lambdas: [...prepared.lambdas],
      bootstrap: B,
      seed: prepared.seed,
      alpha: prepared.alpha,
      trim: prepared.trim,
      lambdaSearchLimit: limit,
    },
    counts: prepared.counts,
    propensityModel: { coefficients, iterations: prepared.iterations, converged: prepared.converged, deviance: prepared.deviance },
    estimate,
    rows,
    tippingLambdaPoint: point.lambda,
    tippingPointStatus: point.status,
    tippingLambdaInterval: interval.lambda,
    tippingIntervalStatus: interval.status,
    bootstrap: {
      requested: B,
      used,
      failed,
      failedSeparation,
      failedNotConverged,
      failedRankDeficient,
      seed: prepared.seed,
      stratified: true as const,
    },
    overlap,
    weights,
    conventions: conventions(prepared),
    references: WEIGHTING_ANALYSIS_REFERENCES,
    warnings,
  });
}

function conventions(prepared: PreparedWeighting): readonly AnalysisConvention[] {
  const list = conventionList();
  list.add('propensity-model', 'Propensity model: logistic regression of treatment on the covariates with an intercept, maximum likelihood by Newton/IRLS with a Householder QR in each step; start and stopping rule as R\'s glm: |ΔD|/(|D| + 0.1) < 1e-8 on the deviance D, at most 25 iterations.');
  list.add('separation', 'Separation: a covariate whose treated and control ranges do not overlap (or only touch) is named and refused; a fit with a fitted propensity within 10ε of 0 or 1 (R\'s glm rule) or without convergence is refused as separation by a combination of covariates.');
  list.add('collinearity', 'Constant or collinear covariates: QR rank test of [1, covariates] at the tolerance of R\'s lm (1e-7).');
  list.add('estimand', prepared.estimand === 'ate'
    ? 'Estimand ATE: weights 1/e for the treated and 1/(1 − e) for controls, normalised within each group (Hájek); effect = treated weighted mean − control weighted mean.'
    : 'Estimand ATT: weight 1 for the treated and e/(1 − e) for controls, normalised within each group (Hájek); effect = treated mean − control weighted mean.');
  list.add('sensitivity-model', prepared.estimand === 'ate'
    ? 'Marginal sensitivity model at Λ: a treated person\'s weight lies in [1 + (1/e − 1)/Λ, 1 + (1/e − 1)·Λ], a control\'s in [1 + o/Λ, 1 + o·Λ], o = e/(1 − e), independently for each person.'
    : 'Marginal sensitivity model at Λ: the treated keep weight 1; a control\'s weight lies in [o/Λ, o·Λ], o = e/(1 − e), independently for each person.');
  list.add('point-bounds', 'Point bounds: exact smallest and largest weighted effect over those weights (treated extreme minus the control group\'s opposite extreme), by a threshold search on the sorted outcomes.');
  list.add('bootstrap', 'Bootstrap: resamples stratified by treatment group (n₁ treated drawn from the treated, n₀ controls from the controls, with replacement); the propensity model is refitted in each (started from the full-data coefficients); resamples with separation, no convergence or a constant/collinear covariate are counted and left out.');
  list.add('random-numbers', 'Random numbers: SplitMix64; resample i uses its own stream seeded from (seed, i), so results do not depend on how the resamples are split into chunks or threads.');
  list.add('sensitivity-interval', 'Sensitivity interval at Λ: from the α/2 quantile of the resampled lower bounds to the 1 − α/2 quantile of the resampled upper bounds; quantile type 7 (Hyndman & Fan 1996; R\'s default).');
  list.add('tipping-point', 'Tipping Λ (point): the smallest Λ at which the point bounds include 0, by bisection in log Λ to 1e-12 relative.');
  list.add('tipping-interval', `Tipping Λ (interval): the smallest Λ at which the sensitivity interval includes 0, located on a grid of ${LAMBDA_GRID_SIZE} log-spaced values from 1 to ${prepared.lambdaSearchLimit} and refined by linear interpolation in log Λ between neighbouring grid values (accurate to a fraction of the grid step).`);
  list.add('overlap-warning', `Overlap warning: estimated propensities below ${LOW_PROPENSITY} or above ${HIGH_PROPENSITY} (common practice, no source).`);
  list.add('missing-values', 'A missing value in the treatment, the outcome or any covariate: the person is left out and counted.');
  if (prepared.trim !== null) {
    list.add('trimming', `Trimming: people with estimated propensity outside [${prepared.trim.below}, ${prepared.trim.above}] are left out and counted, and the propensity model is refitted to those kept; trimming is not repeated within bootstrap resamples.`);
  }
  return list.list();
}

/** Bisection in log Λ for the smallest Λ at which the point bounds include 0. */
function pointTipping(tables: WeightingBoundTables, effect: number, limit: number): { lambda: number | null; status: WeightingTippingStatus } {
  if (effect === 0) return { lambda: 1, status: 'includes-zero-at-one' };
  const excludes = (lambda: number): boolean => {
    const b = weightingEffectBounds(tables, lambda);
    return effect > 0 ? b.lowerBound > 0 : b.upperBound < 0;
  };
  if (excludes(limit)) return { lambda: null, status: 'beyond-range' };
  let lo = 0;
  let hi = Math.log(limit);
  for (let i = 0; i < 200 && hi - lo > 1e-13 * Math.max(1, hi); i++) {
    const mid = (lo + hi) / 2;
    if (excludes(Math.exp(mid))) lo = mid;
    else hi = mid;
  }
  return { lambda: Math.exp(hi), status: 'found' };
}

/** Grid search (bisection over the grid index) and interpolation for the interval's tipping Λ. */
function intervalTipping(
  grid: Float64Array,
  lower: (g: number) => number,
  upper: (g: number) => number,
): { lambda: number | null; status: WeightingTippingStatus } {
  const includes = (g: number) => lower(g) <= 0 && upper(g) >= 0;
  if (includes(0)) return { lambda: 1, status: 'includes-zero-at-one' };
  const last = grid.length - 1;
  if (!includes(last)) return { lambda: null, status: 'beyond-range' };
  let lo = 0; // excludes
  let hi = last; // includes
  while (hi - lo > 1) {
    const mid = (lo + hi) >>> 1;
    if (includes(mid)) hi = mid;
    else lo = mid;
  }
  const a = Math.log(grid[lo]);
  const b = Math.log(grid[hi]);
  const l0 = lower(lo);
  const u0 = upper(lo);
  // Which side crossed: the lower end (from above 0) or the upper end (from below 0).
  const [f0, f1] = l0 > 0 ? [l0, lower(hi)] : [-u0, -upper(hi)];
  const t = f0 > f1 ? Math.min(1, Math.max(0, f0 / (f0 - f1))) : 1;
  return { lambda: Math.exp(a + t * (b - a)), status: 'found' };
}

/** R's type-7 quantile of the values (sorted in place). */
function quantileType7(values: Float64Array, prob: number): number {
  values.sort();
  const m = values.length;
  if (m === 1) return values[0];
  const h = (m - 1) * prob;
  const lo = Math.floor(h);
  const hi = Math.min(lo + 1, m - 1);
  return values[lo] + (h - lo) * (values[hi] - values[lo]);
}

function overlapSummary(prepared: PreparedWeighting): WeightingResult['overlap'] {
  const bins = Array.from({ length: BINS }, (_, k) => ({ from: k / BINS, to: (k + 1) / BINS, treated: 0, control: 0 }));
  let belowLow = 0;
  let aboveHigh = 0;
  const range = [
    { smallest: Infinity, largest: -Infinity },
    { smallest: Infinity, largest: -Infinity },
  ];
  for (let i = 0; i < prepared.size; i++) {
    const e = prepared.propensities[i];
    const t = prepared.treatment[i];
    const bin = bins[Math.min(BINS - 1, Math.floor(e * BINS))];
    if (t === 1) bin.treated++;
    else bin.control++;
    if (e < LOW_PROPENSITY) belowLow++;
    if (e > HIGH_PROPENSITY) aboveHigh++;
    range[t].smallest = Math.min(range[t].smallest, e);
    range[t].largest = Math.max(range[t].largest, e);
  }
  return {
    bins,
    treatedRange: range[1],
    controlRange: range[0],
    belowLow,
    aboveHigh,
    lowThreshold: LOW_PROPENSITY,
    highThreshold: HIGH_PROPENSITY,
  };
}

function weightSummary(prepared: PreparedWeighting, group: 0 | 1): WeightSummary {
  let people = 0;
  let sum = 0;
  let sumSq = 0;
  let smallest = Infinity;
  let largest = -Infinity;
  for (let i = 0; i < prepared.size; i++) {
    if (prepared.treatment[i] !== group) continue;
    const eta = prepared.linearPredictor[i];
    // ATE: 1/e = 1 + exp(−η) (treated), 1/(1 − e) = 1 + exp(η) (control); ATT: 1 (treated), exp(η) (control).
    const w = prepared.estimand === 'ate' ? 1 + Math.exp(group === 1 ? -eta : eta) : group === 1 ? 1 : Math.exp(eta);
    people++;
    sum += w;
    sumSq += w * w;
    smallest = Math.min(smallest, w);
    largest = Math.max(largest, w);
  }
  return { people, smallest, largest, mean: sum / people, effectiveSize: (sum * sum) / sumSq, largestShare: largest / sum };
}

function deepFreeze<T>(value: T): T {
  if (value !== null && typeof value === 'object' && !Object.isFrozen(value) && !ArrayBuffer.isView(value)) {
    for (const v of Object.values(value as object)) deepFreeze(v);
    Object.freeze(value);
  }
  return value;
}
