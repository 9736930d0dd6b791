import { absorbBlock } from './streamingQr';
import { DEFAULT_COLLINEARITY_TOLERANCE } from './linearModel';

/** Options of {@link fitLogisticRegression}. */
export interface LogisticFitOptions {
  /**
   * Frequency weights, one per row: whole numbers ≥ 0 (a row with weight k counts as k copies of itself, as
   * in a bootstrap resample; weight 0 leaves the row out). Default: 1 for every row.
   */
  readonly weights?: ArrayLike<number>;
  /** Starting coefficients (length p). Default: R's `glm` start, μ = (w·y + 0.5)/(w + 1). */
  readonly start?: ArrayLike<number>;
  /** Largest number of Newton (IRLS) iterations. Default 25 (as R's `glm.control`). */
  readonly maxIterations?: number;
  /** Convergence tolerance on the relative change in deviance. Default 1e-8 (as R's `glm.control`). */
  readonly tolerance?: number;
  /** Rank tolerance of the weighted QR. Default 1e-7 (R's `lm`/`qr` threshold). */
  readonly rankTolerance?: number;
}

/** A fitted logistic regression (maximum likelihood). */
export interface LogisticFit {
  /** Coefficients, one per design column (NaN when the weighted design lost rank). */
  readonly coefficients: Float64Array;
  /** Newton (IRLS) iterations done. */
  readonly iterations: number;
  /** True when the relative change in deviance fell below the tolerance within the iteration limit. */
  readonly converged: boolean;
  /** Residual deviance −2·Σ w·log-likelihood at the coefficients. */
  readonly deviance: number;
  /**
   * True when some fitted probability is numerically 0 or 1 (below 10ε or above 1 − 10ε, ε = 2⁻⁵², the rule
   * behind R's `glm` warning): the sign of perfect or quasi-perfect separation.
   */
  readonly fittedAtBoundary: boolean;
  /** Index of the first design column found to be a linear combination of earlier ones (weighted), or −1. */
  readonly dependentColumn: number;
}

const EPSILON = 2.220446049250313e-16;
/** Rows per Householder block update. */
const BLOCK_ROWS = 512;
/** |η| beyond which R's logistic inverse link is clamped to ε or 1 − ε (−log ε). */
const ETA_LIMIT = 36.04365338911715;

/**
 * Logistic regression by maximum likelihood: P(y = 1 | x) = 1/(1 + exp(−xᵀβ)).
 *
 * **Method.** Newton's method in its iteratively reweighted least-squares form (Fisher scoring, which is
 * Newton's method for the canonical logit link): from η = Xβ, μ = 1/(1 + e^(−η)), working weights
 * W = w·μ(1 − μ) and working response z = η + (y − μ)/(μ(1 − μ)), each step solves the weighted least-squares
 * problem min ‖W^½(z − Xβ)‖ by Householder QR of [W^½X, W^½z] (blocks of rows absorbed as in `StreamingQr`) and back substitution
 * — never the normal equations. (The p×p triangular solve is written out: mathjs' `usolve` treats pivots
 * below its fixed epsilon as zero, which would refuse a covariate measured in very small units.) It stops when |D − D_old|/(|D| + 0.1) < tolerance, D the
 * deviance, or after `maxIterations`; the start and stopping rule, the clamping of μ to [ε, 1 − ε] beyond
 * |η| > −log ε and the boundary rule for fitted values follow R's `glm.fit`, so iteration counts agree with
 * R's `glm(…, family = binomial)`. A design column whose part not explained by the earlier columns (the
 * diagonal of the weighted R) is ≤ rankTolerance × its weighted norm stops the fit (R would drop it).
 *
 * **References.** McCullagh P, Nelder JA (1989) Generalized Linear Models, 2nd ed., Chapman & Hall, §2.5
 * (IRLS) and §4.4 (binary data). Albert A, Anderson JA (1984) On the existence of maximum likelihood
 * estimates in logistic regression models. Biometrika 71(1):1–10 (separation: no finite maximum). R Core
 * Team, R: A language and environment for statistical computing, `glm.fit` and `glm.control` (defaults
 * epsilon = 1e-8, maxit = 25) — recalled from memory.
 *
 * **Special cases.** Under complete or quasi-complete separation the likelihood has no finite maximum: the
 * coefficients drift outwards, `fittedAtBoundary` becomes true and `converged` may be false. A column
 * dependent on earlier ones gives `dependentColumn` ≥ 0 and NaN coefficients. Rows with weight 0 are ignored.
 *
 * @param design n×p row-major design matrix (include a column of ones for an intercept); finite values
 * @param p number of columns, ≥ 1
 * @param response n values, each 0 or 1
 * @param options weights, start, iteration limit and tolerances
 * @throws RangeError when the sizes disagree
 */
export function fitLogisticRegression(
  design: ArrayLike<number>,
  p: number,
  response: ArrayLike<number>,
  options: LogisticFitOptions = {},
): LogisticFit {
  const n = response.length;
  if (!Number.isInteger(p) || p < 1 || design.length !== n * p) throw new RangeError('design must hold n·p values');
  const weights = options.weights;
  if (weights !== undefined && weights.length !== n) throw new RangeError('weights must have one value per row');
  const maxIterations = options.maxIterations ?? 25;
  const tolerance = options.tolerance ?? 1e-8;
  const rankTolerance = options.rankTolerance ?? DEFAULT_COLLINEARITY_TOLERANCE;

  const eta = new Float64Array(n);
  if (options.start !== undefined) {
    linearPredictor(design, p, options.start, eta, weights);
  } else {
    for (let i = 0; i < n; i++) {
      const w = weights === undefined ? 1 : weights[i];
      const mu = (w * response[i] + 0.5) / (w + 1);
      eta[i] = Math.log(mu / (1 - mu));
    }
  }
  let devOld = deviance(eta, response, weights);
  const beta = new Float64Array(p);
  const q = p + 1;
  const r = new Float64Array(q * q);
  const block = new Float64Array(BLOCK_ROWS * q);
  let iterations = 0;
  let converged = false;
  let dev = devOld;
  for (let iter = 1; iter <= maxIterations; iter++) {
    iterations = iter;
    // Rows of [W^½X, W^½z] go straight into a column-major block absorbed by Householder QR (as StreamingQr).
    r.fill(0);
    let filled = 0;
    for (let i = 0; i < n; i++) {
      const w = weights === undefined ? 1 : weights[i];
      if (!(w > 0)) continue;
      const e = clampEta(eta[i]);
      const mu = 1 / (1 + Math.exp(-e));
      const variance = mu * (1 - mu);
      const dmu = Math.max(variance, EPSILON);
      const z = eta[i] + (response[i] - mu) / dmu;
      const s = Math.sqrt((w * dmu * dmu) / variance);
      const base = i * p;
      for (let k = 0, at = filled; k < p; k++, at += BLOCK_ROWS) block[at] = s * design[base + k];
      block[p * BLOCK_ROWS + filled] = s * z;
      if (++filled === BLOCK_ROWS) {
        absorbBlock(r, block, BLOCK_ROWS, BLOCK_ROWS, q);
        filled = 0;
      }
    }
    if (filled > 0) absorbBlock(r, block, filled, BLOCK_ROWS, q);
    const dependent = dependentColumn(r, q, p, rankTolerance);
    if (dependent >= 0) {
      beta.fill(NaN);
      return Object.freeze({ coefficients: beta, iterations, converged: false, deviance: NaN, fittedAtBoundary: false, dependentColumn: dependent });
    }
    // Back substitution R[0:p, 0:p]·β = R[0:p, p] (the pivots were checked above).
    for (let i = p - 1; i >= 0; i--) {
      let v = r[i * q + p];
      for (let k = i + 1; k < p; k++) v -= r[i * q + k] * beta[k];
      beta[i] = v / r[i * q + i];
    }
    linearPredictor(design, p, beta, eta, weights);
    dev = deviance(eta, response, weights);
    if (Math.abs(dev - devOld) / (Math.abs(dev) + 0.1) < tolerance) {
      converged = true;
      break;
    }
    devOld = dev;
  }
  let fittedAtBoundary = false;
  const low = 10 * EPSILON;
  for (let i = 0; i < n; i++) {
    if (weights !== undefined && !(weights[i] > 0)) continue;
    const mu = 1 / (1 + Math.exp(-clampEta(eta[i])));
    if (mu < low || mu > 1 - low) {
      fittedAtBoundary = true;
      break;
    }
  }
  return Object.freeze({ coefficients: beta, iterations, converged, deviance: dev, fittedAtBoundary, dependentColumn: -1 });
}

/**
 * Fitted probabilities 1/(1 + exp(−xᵀβ)) for every row of a design.
 *
 * **Method.** η = Xβ, then the logistic function written to avoid overflow (exp of a non-positive number
 * only); no clamping, so probabilities may round to exactly 0 or 1 for |η| > 37.
 *
 * **References.** McCullagh P, Nelder JA (1989) Generalized Linear Models, 2nd ed., Chapman & Hall, §4.3.
 *
 * **Special cases.** NaN coefficients give NaN probabilities.
 *
 * @param design n×p row-major design matrix
 * @param p number of columns, ≥ 1
 * @param coefficients p values
 * @param out where to write (length n); a new array when omitted
 */
export function logisticProbabilities(
  design: ArrayLike<number>,
  p: number,
  coefficients: ArrayLike<number>,
  out: Float64Array = new Float64Array(design.length / p),
): Float64Array {
  linearPredictor(design, p, coefficients, out);
  for (let i = 0; i < out.length; i++) {
    const e = out[i];
    if (e >= 0) out[i] = 1 / (1 + Math.exp(-e));
    else {
      const t = Math.exp(e);
      out[i] = t / (1 + t);
    }
  }
  return out;
}

/** η = Xβ; rows with weight 0 (when weights are given) are skipped and left as they were. */
function linearPredictor(design: ArrayLike<number>, p: number, beta: ArrayLike<number>, out: Float64Array, weights?: ArrayLike<number>): void {
  const n = out.length;
  for (let i = 0, base = 0; i < n; i++, base += p) {
    if (weights !== undefined && !(weights[i] > 0)) continue;
    let s = 0;
    for (let k = 0; k < p; k++) s += design[base + k] * beta[k];
    out[i] = s;
  }
}

function clampEta(e: number): number {
  return e < -ETA_LIMIT ? -ETA_LIMIT : e > ETA_LIMIT ? ETA_LIMIT : e;
}

/** log(1 + eˣ) without overflow. */
function softplus(x: number): number {
  return x > 0 ? x + Math.log1p(Math.exp(-x)) : Math.log1p(Math.exp(x));
}

/** Binomial deviance −2Σ w[y log μ + (1 − y) log(1 − μ)], with μ clamped as R's inverse link. */
function deviance(eta: Float64Array, y: ArrayLike<number>, weights: ArrayLike<number> | undefined): number {
  let d = 0;
  for (let i = 0; i < eta.length; i++) {
    const w = weights === undefined ? 1 : weights[i];
    if (!(w > 0)) continue;
    const e = clampEta(eta[i]);
    d += w * (y[i] === 1 ? softplus(-e) : softplus(e));
  }
  return 2 * d;
}

/** First column j < p whose diagonal in R is ≤ tol × the column's norm; −1 when none. */
function dependentColumn(r: Float64Array, q: number, p: number, tol: number): number {
  for (let j = 0; j < p; j++) {
    let big = 0;
    for (let i = 0; i <= j; i++) big = Math.max(big, Math.abs(r[i * q + j]));
    if (big === 0) return j;
    let s = 0;
    for (let i = 0; i <= j; i++) s += (r[i * q + j] / big) ** 2;
    if (!(Math.abs(r[j * q + j]) > tol * big * Math.sqrt(s))) return j;
  }
  return -1;
}
