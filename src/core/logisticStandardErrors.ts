import { create, invDependencies } from 'mathjs';

const math = create({ invDependencies });

/**
 * Standard errors of the coefficients of a fitted logistic regression, from the inverse of the observed
 * (= expected, for the canonical logit link) information matrix.
 *
 * **Method.** I = XᵀWX with W = diag(eᵢ(1 − eᵢ)) (times the frequency weight of each row when given), summed
 * row by row; its inverse by mathjs' `inv` (LU decomposition with partial pivoting, Gauss–Jordan); the
 * standard error of βₖ is √(I⁻¹)ₖₖ. This is the dispersion-1 covariance that R's `summary.glm` reports for
 * the binomial family. The p×p inverse is a small dense problem (p = number of design columns), where a
 * general matrix library is the right tool; the fit itself stays on the QR of `fitLogisticRegression`.
 *
 * **References.** McCullagh P, Nelder JA (1989) Generalized Linear Models, 2nd ed., Chapman & Hall, §4.4
 * (the information matrix of a GLM) — recalled from memory. R Core Team, `summary.glm` (R base, stats).
 *
 * **Special cases.** A singular information matrix (a constant design column, or every eᵢ(1 − eᵢ) zero) gives
 * null for every standard error; a diagonal entry of the inverse that is not positive (rounding on an almost
 * singular matrix) gives null for that coefficient.
 *
 * @param design n×p row-major design matrix (finite numbers)
 * @param columnCount p ≥ 1
 * @param propensities fitted probabilities eᵢ in [0, 1], one per row
 * @param weights optional frequency weights ≥ 0, one per row
 * @throws RangeError when the lengths do not match
 */
export function logisticStandardErrors(
  design: Float64Array,
  columnCount: number,
  propensities: Float64Array,
  weights: Float64Array | null = null,
): (number | null)[] {
  const p = columnCount;
  const n = propensities.length;
  if (!(Number.isInteger(p) && p >= 1) || design.length !== n * p || (weights !== null && weights.length !== n)) {
    throw new RangeError(`design has ${design.length} values; expected ${n} rows × ${p} columns`);
  }
  const information: number[][] = Array.from({ length: p }, () => new Array<number>(p).fill(0));
  for (let i = 0, base = 0; i < n; i++, base += p) {
    const e = propensities[i];
    const w = e * (1 - e) * (weights === null ? 1 : weights[i]);
    if (w === 0) continue;
    for (let j = 0; j < p; j++) {
      const xj = design[base + j] * w;
      for (let k = 0; k <= j; k++) information[j][k] += xj * design[base + k];
    }
  }
  for (let j = 0; j < p; j++) for (let k = j + 1; k < p; k++) information[j][k] = information[k][j];
  let inverse: number[][];
  try {
    inverse = math.inv(information) as number[][];
  } catch {
    return new Array<number | null>(p).fill(null);
  }
  return inverse.map((row, k) => {
    const v = row[k];
    return Number.isFinite(v) && v > 0 ? Math.sqrt(v) : null;
  });
}
