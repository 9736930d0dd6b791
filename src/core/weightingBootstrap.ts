import { fitLogisticRegression } from './logisticRegression';
import { streamForIndex } from './seededRandom';
import { weightingBoundsWorkspace, weightingBoundTables, weightingEffectBounds } from './weightingBounds';
import type { PreparedWeighting } from './weightingPreparation';

/** Number of Λ values on the search grid of the interval's tipping Λ (log-spaced from 1 to the search limit). */
export const LAMBDA_GRID_SIZE = 801;

/** Outcome of one resample's propensity refit. */
export const ResampleStatus = Object.freeze({
  used: 0,
  /** Some fitted propensity numerically 0 or 1 (separation in the resample). */
  separation: 1,
  /** No convergence within 25 iterations. */
  notConverged: 2,
  /** A covariate became constant or collinear in the resample (e.g. a rare category not drawn). */
  rankDeficient: 3,
} as const);
export type ResampleStatus = (typeof ResampleStatus)[keyof typeof ResampleStatus];

/** Which resamples to compute: indices start, start + 1, …, start + count − 1 (of 0 … B − 1). */
export interface BootstrapChunkRequest {
  readonly start: number;
  readonly count: number;
}

/** Progress and cancel hooks for {@link runBootstrapChunk}. */
export interface BootstrapChunkOptions {
  /** Called after each resample with how many of this chunk are done. */
  readonly onProgress?: (done: number, count: number) => void;
  /** Asked before each resample; when it returns true the chunk stops and returns the resamples done so far. */
  readonly isCancelled?: () => boolean;
}

/**
 * The results of resamples start … start + count − 1. Per-resample arrays are indexed by the position in
 * the chunk; bounds of a failed resample are NaN. Plain typed arrays (transferable between threads).
 */
export interface BootstrapChunk {
  readonly start: number;
  /** Resamples actually computed (less than requested when cancelled). */
  readonly count: number;
  /** {@link ResampleStatus} per resample. */
  readonly status: Uint8Array;
  /** Bounds at the analysis' Λ values: row r, column l at r·L + l (L = number of Λ values). */
  readonly lowerBounds: Float64Array;
  readonly upperBounds: Float64Array;
  /** Bounds on the tipping search grid ({@link lambdaGrid}): row r, column g at r·G + g. */
  readonly gridLowerBounds: Float64Array;
  readonly gridUpperBounds: Float64Array;
}

/**
 * The Λ values on which resampled bounds are kept for the interval's tipping Λ.
 *
 * **Method.** G = {@link LAMBDA_GRID_SIZE} log-spaced values Λ_g = limit^(g/(G − 1)), g = 0 … G − 1 (steps of
 * about 0.58% for the default limit 100); the ends are set to exactly 1 and exactly the limit.
 *
 * **References.** None needed (a grid); its use is described in `analyseWeighting`.
 *
 * **Special cases.** limit = 1 gives G copies of 1.
 *
 * @param limit the search limit, ≥ 1
 */
export function lambdaGrid(limit: number): Float64Array {
  const g = new Float64Array(LAMBDA_GRID_SIZE);
  const step = Math.log(limit) / (LAMBDA_GRID_SIZE - 1);
  for (let k = 0; k < LAMBDA_GRID_SIZE; k++) g[k] = Math.exp(k * step);
  g[0] = 1;
  g[LAMBDA_GRID_SIZE - 1] = limit;
  return g;
}

/**
 * Computes a block of bootstrap resamples of a prepared weighting analysis: for each, the resampled data's
 * propensity model is refitted and the bounds on the weighted effect are found at every requested Λ and on
 * the tipping search grid.
 *
 * **Method.** Resample i (0-based) draws with its own generator `streamForIndex(seed, i)` (SplitMix64), so
 * its result does not depend on how the B resamples are split into chunks or threads. It is stratified by
 * treatment group: first n₁ treated people are drawn with replacement from the n₁ treated, then n₀ controls
 * from the n₀ controls (draw u picks the ⌊u·n₁⌋-th treated person in the order of the data) (so every resample has both groups, of the original sizes); a person drawn k times
 * gets frequency weight k. The logistic propensity model is refitted by Newton/IRLS with those weights,
 * starting from the full-data coefficients; a resample whose fit shows separation (a fitted propensity
 * within 10ε of 0 or 1), does not converge in 25 iterations, or loses rank (a covariate constant or
 * collinear among those drawn) is marked failed and left out. Otherwise its bounds are computed exactly
 * ({@link weightingEffectBounds}) from its own propensities, O(n) once plus O(log n) per Λ.
 *
 * **References.** Zhao Q, Small DS, Bhattacharya BB (2019) Sensitivity analysis for inverse probability
 * weighting estimators via the percentile bootstrap. JRSS-B 81(4):735–761 (the percentile bootstrap over the
 * resampled bounds, refitting the propensity model in each resample) — recalled from memory. Efron B,
 * Tibshirani RJ (1993) An Introduction to the Bootstrap, Chapman & Hall, ch. 13 (percentile intervals).
 *
 * **Special cases.** count = 0 gives an empty chunk. A cancelled chunk holds the resamples finished so far
 * (count shrinks accordingly); the rest can be requested later from start + count.
 *
 * @param prepared from `prepareWeighting`
 * @param request start ≥ 0 and count ≥ 0, whole numbers, start + count ≤ prepared.bootstrap
 * @param options progress and cancel hooks
 * @throws RangeError when the request lies outside 0 … B − 1
 */
export function runBootstrapChunk(prepared: PreparedWeighting, request: BootstrapChunkRequest, options: BootstrapChunkOptions = {}): BootstrapChunk {
  const { start, count } = request;
  if (!(Number.isInteger(start) && Number.isInteger(count) && start >= 0 && count >= 0 && start + count <= prepared.bootstrap)) {
    throw new RangeError(`resamples ${start} to ${start + count - 1} are outside 0 to ${prepared.bootstrap - 1}`);
  }
  const n = prepared.size;
  const p = prepared.columnCount;
  const lambdas = prepared.lambdas;
  const L = lambdas.length;
  const grid = lambdaGrid(prepared.lambdaSearchLimit);
  const G = grid.length;
  const status = new Uint8Array(count);
  const lowerBounds = new Float64Array(count * L);
  const upperBounds = new Float64Array(count * L);
  const gridLowerBounds = new Float64Array(count * G);
  const gridUpperBounds = new Float64Array(count * G);
  const weights = new Float64Array(n);
  const eta = new Float64Array(n);
  const treatedPeople = prepared.treatedOrder;
  const controlPeople = prepared.controlOrder;
  const n1 = treatedPeople.length;
  const n0 = controlPeople.length;
  // Draws pick the k-th treated (control) person in data order, so a resample does not depend on the outcomes.
  const treatedInDataOrder = new Int32Array(n1);
  const controlInDataOrder = new Int32Array(n0);
  for (let i = 0, a = 0, b = 0; i < n; i++) {
    if (prepared.treatment[i] === 1) treatedInDataOrder[a++] = i;
    else controlInDataOrder[b++] = i;
  }
  const workspace = weightingBoundsWorkspace(n1, n0);
  const response = prepared.treatment;
  let done = 0;
  for (let r = 0; r < count; r++) {
    if (options.isCancelled?.()) break;
    const rng = streamForIndex(prepared.seed, start + r);
    weights.fill(0);
    for (let k = 0; k < n1; k++) weights[treatedInDataOrder[rng.nextIndex(n1)]]++;
    for (let k = 0; k < n0; k++) weights[controlInDataOrder[rng.nextIndex(n0)]]++;
    const fit = fitLogisticRegression(prepared.design, p, response, { weights, start: prepared.coefficients });
    let s: ResampleStatus = ResampleStatus.used;
    if (fit.dependentColumn >= 0) s = ResampleStatus.rankDeficient;
    else if (fit.fittedAtBoundary) s = ResampleStatus.separation;
    else if (!fit.converged) s = ResampleStatus.notConverged;
    status[r] = s;
    if (s !== ResampleStatus.used) {
      lowerBounds.fill(NaN, r * L, (r + 1) * L);
      upperBounds.fill(NaN, r * L, (r + 1) * L);
      gridLowerBounds.fill(NaN, r * G, (r + 1) * G);
      gridUpperBounds.fill(NaN, r * G, (r + 1) * G);
    } else {
      const beta = fit.coefficients;
      const x = prepared.design;
      for (let i = 0, base = 0; i < n; i++, base += p) {
        if (weights[i] === 0) continue; // not drawn: its η is never read
        let v = 0;
        for (let k = 0; k < p; k++) v += x[base + k] * beta[k];
        eta[i] = v;
      }
      const tables = weightingBoundTables(prepared.estimand, prepared.outcome, treatedPeople, controlPeople, eta, weights, workspace);
      for (let l = 0; l < L; l++) {
        const b = weightingEffectBounds(tables, lambdas[l]);
        lowerBounds[r * L + l] = b.lowerBound;
        upperBounds[r * L + l] = b.upperBound;
      }
      for (let g = 0; g < G; g++) {
        const b = weightingEffectBounds(tables, grid[g]);
        gridLowerBounds[r * G + g] = b.lowerBound;
        gridUpperBounds[r * G + g] = b.upperBound;
      }
    }
    done = r + 1;
    options.onProgress?.(done, count);
  }
  if (done === count) return { start, count, status, lowerBounds, upperBounds, gridLowerBounds, gridUpperBounds };
  return {
    start,
    count: done,
    status: status.slice(0, done),
    lowerBounds: lowerBounds.slice(0, done * L),
    upperBounds: upperBounds.slice(0, done * L),
    gridLowerBounds: gridLowerBounds.slice(0, done * G),
    gridUpperBounds: gridUpperBounds.slice(0, done * G),
  };
}

/**
 * Splits resamples 0 … total − 1 into `parts` consecutive requests of nearly equal size (for worker threads).
 *
 * **Method.** The first total mod parts requests get ⌈total/parts⌉ resamples, the rest ⌊total/parts⌋; empty
 * requests are left out.
 *
 * **References.** None (bookkeeping).
 *
 * **Special cases.** total = 0 gives no requests; parts > total gives `total` requests of one resample.
 *
 * @param total B, a whole number ≥ 0
 * @param parts a whole number ≥ 1
 * @throws RangeError when either is not such a number
 */
export function splitBootstrap(total: number, parts: number): BootstrapChunkRequest[] {
  if (!(Number.isInteger(total) && total >= 0 && Number.isInteger(parts) && parts >= 1)) {
    throw new RangeError('total must be a whole number ≥ 0 and parts a whole number ≥ 1');
  }
  const requests: BootstrapChunkRequest[] = [];
  const base = Math.floor(total / parts);
  const extra = total % parts;
  let start = 0;
  for (let k = 0; k < parts; k++) {
    const count = base + (k < extra ? 1 : 0);
    if (count > 0) requests.push(Object.freeze({ start, count }));
    start += count;
  }
  return requests;
}
