import { type InputProblem, inputProblem, throwIfProblems } from './inputProblem';
import { INTERCEPT_NAME, type TriangularDesign } from './linearModel';

/**
 * Summary statistics of the chosen variables, for data too large or too private to move: the row count and
 * either raw sums and cross-products (what one SQL `SELECT COUNT(*), SUM(a), SUM(a*b) …` returns) or means and
 * the covariance matrix.
 */
export type CrossProductInput = RawCrossProductInput | CovarianceInput;

/** n, Σx_j and Σx_i·x_j over the rows with every variable present. */
export interface RawCrossProductInput {
  readonly kind: 'cross-products';
  readonly columnNames: readonly string[];
  readonly rowCount: number;
  /** Σ x_j, one per column. */
  readonly sums: readonly number[];
  /** Σ x_i x_j, a symmetric matrix (k×k). */
  readonly crossProducts: readonly (readonly number[])[];
  /** Put an intercept column first in the design (default true). */
  readonly intercept?: boolean;
}

/** n, the means and the sample covariance matrix (denominator n − 1). */
export interface CovarianceInput {
  readonly kind: 'covariance';
  readonly columnNames: readonly string[];
  readonly rowCount: number;
  readonly means: readonly number[];
  /** Sample covariances, denominator n − 1 (as R's `cov` and SQL's `COVAR_SAMP`). */
  readonly covariance: readonly (readonly number[])[];
  readonly intercept?: boolean;
}

/** Relative asymmetry tolerated in a supplied matrix (rounding in the user's database or export). */
const SYMMETRY_TOLERANCE = 1e-8;
/** A Cholesky pivot below this fraction of its diagonal entry is numerically zero (a collinear column). */
const PIVOT_TOLERANCE = 1e-13;
/** A pivot below −this fraction of its diagonal entry means the matrix cannot come from real data. */
const NEGATIVE_PIVOT_TOLERANCE = 1e-8;

/**
 * Checks summary statistics: names distinct and matching the matrix size, finite numbers, a symmetric matrix
 * with non-negative diagonal, n a whole number > 1.
 *
 * Fields: `columnNames`, `rowCount`, `sums`, `crossProducts`, `means`, `covariance` (with `[i][j]` indices).
 */
export function validateCrossProducts(input: CrossProductInput): InputProblem[] {
  const problems: InputProblem[] = [];
  const k = input.columnNames.length;
  if (k === 0) problems.push(inputProblem('columnNames', 'empty', 'needs at least one variable.'));
  const seen = new Set<string>();
  input.columnNames.forEach((name, i) => {
    if (seen.has(name)) problems.push(inputProblem(`columnNames[${i}]`, 'chosen-twice', `"${name}" is named twice.`, name));
    if (name === INTERCEPT_NAME) problems.push(inputProblem(`columnNames[${i}]`, 'reserved-name', `"${name}" is the name of the intercept; rename the variable.`, name));
    seen.add(name);
  });
  if (!(Number.isInteger(input.rowCount) && input.rowCount >= 2)) {
    problems.push(inputProblem('rowCount', 'not-a-count', 'must be a whole number of rows, at least 2.', input.rowCount));
  }
  const vectorName = input.kind === 'cross-products' ? 'sums' : 'means';
  const vector = input.kind === 'cross-products' ? input.sums : input.means;
  const matrixName = input.kind === 'cross-products' ? 'crossProducts' : 'covariance';
  const matrix = input.kind === 'cross-products' ? input.crossProducts : input.covariance;
  if (!Array.isArray(vector) || vector.length !== k) {
    problems.push(inputProblem(vectorName, 'wrong-length', `needs one number per variable (${k}).`, vector));
  } else {
    vector.forEach((v, i) => {
      if (!Number.isFinite(v)) problems.push(inputProblem(`${vectorName}[${i}]`, 'not-finite', 'must be a finite number.', v));
    });
  }
  if (!Array.isArray(matrix) || matrix.length !== k || matrix.some((row) => !Array.isArray(row) || row.length !== k)) {
    problems.push(inputProblem(matrixName, 'wrong-shape', `must be a square matrix with one row and column per variable (${k}×${k}).`, matrix));
    return problems;
  }
  for (let i = 0; i < k; i++) {
    for (let j = 0; j < k; j++) {
      const v = matrix[i][j];
      if (!Number.isFinite(v)) {
        problems.push(inputProblem(`${matrixName}[${i}][${j}]`, 'not-finite', 'must be a finite number.', v));
        continue;
      }
      if (j > i && Number.isFinite(matrix[j][i])) {
        const scale = Math.sqrt(Math.abs(matrix[i][i] * matrix[j][j]));
        if (Math.abs(v - matrix[j][i]) > SYMMETRY_TOLERANCE * Math.max(scale, Math.abs(v))) {
          problems.push(
            inputProblem(`${matrixName}[${i}][${j}]`, 'not-symmetric', `must equal ${matrixName}[${j}][${i}] (the matrix is symmetric).`, v),
          );
        }
      }
    }
    if (matrix[i][i] < 0) problems.push(inputProblem(`${matrixName}[${i}][${i}]`, 'negative', 'must not be negative (a sum of squares or a variance).', matrix[i][i]));
  }
  return problems;
}

/**
 * The triangular design (R with RᵀR = XᵀX of [intercept, variables…]) from summary statistics, so that the
 * same least-squares fits and sub-regressions as on raw data follow (`fitLeastSquares`).
 *
 * **Method.** The cross-product matrix of [1, x_1 … x_k] is formed centred: with means m and centred
 * cross-products C (C = S − n·m·mᵀ from raw sums, or (n − 1)·covariance), XᵀX = [[n, n·mᵀ], [n·m, C + n·m·mᵀ]], whose
 * Cholesky factor is R = [[√n, √n·mᵀ], [0, chol(C)]]; chol(C) is computed by the outer-product Cholesky
 * algorithm with a check on every pivot: a pivot below 1e-13 of its diagonal entry marks a column that is a
 * linear combination of earlier ones (its row of R is set to zero, and the least-squares fit then names
 * it); a clearly negative pivot means the matrix cannot come from real data. Working with C rather than the
 * raw matrix avoids one cancellation; note that raw sums of large numbers with small spread already lose
 * digits in the user's database — the covariance form avoids that.
 *
 * **References.** G. H. Golub and C. F. Van Loan, Matrix Computations, 4th ed., Johns Hopkins University
 * Press, 2013, §4.2 (Cholesky factorisation of positive (semi)definite matrices) and §5.3 (least squares by
 * the normal equations, and why their accuracy is worse than QR's).
 *
 * **Special cases.** A zero-variance variable gives a zero row (reported as constant when used in a fit).
 *
 * @throws InputError (fields as {@link validateCrossProducts}) for malformed input, or `crossProducts` /
 *   `covariance` with code `not-positive-semidefinite` when no real data could give the matrix.
 */
export function designFromCrossProducts(input: CrossProductInput): TriangularDesign {
  throwIfProblems(validateCrossProducts(input));
  const k = input.columnNames.length;
  const n = input.rowCount;
  const intercept = input.intercept ?? true;
  const means = new Float64Array(k);
  const centred = new Float64Array(k * k);
  if (input.kind === 'cross-products') {
    for (let i = 0; i < k; i++) means[i] = input.sums[i] / n;
    for (let i = 0; i < k; i++) {
      for (let j = 0; j < k; j++) {
        const s = (input.crossProducts[i][j] + input.crossProducts[j][i]) / 2;
        centred[i * k + j] = intercept ? s - input.sums[i] * means[j] : s;
      }
    }
  } else {
    for (let i = 0; i < k; i++) means[i] = input.means[i];
    for (let i = 0; i < k; i++) {
      for (let j = 0; j < k; j++) {
        const c = ((input.covariance[i][j] + input.covariance[j][i]) / 2) * (n - 1);
        centred[i * k + j] = intercept ? c : c + n * means[i] * means[j];
      }
    }
  }
  const matrixName = input.kind === 'cross-products' ? 'crossProducts' : 'covariance';
  const chol = pivotCheckedCholesky(centred, k, matrixName);
  const offset = intercept ? 1 : 0;
  const p = k + offset;
  const r = new Float64Array(p * p);
  if (intercept) {
    const root = Math.sqrt(n);
    r[0] = root;
    for (let j = 0; j < k; j++) r[j + 1] = root * means[j];
  }
  for (let i = 0; i < k; i++) for (let j = i; j < k; j++) r[(i + offset) * p + j + offset] = chol[i * k + j];
  return Object.freeze({
    columnNames: Object.freeze(intercept ? [INTERCEPT_NAME, ...input.columnNames] : [...input.columnNames]),
    r,
    rowCount: n,
    interceptColumn: intercept ? INTERCEPT_NAME : null,
  });
}

/** Upper Cholesky factor U (UᵀU = A) of a symmetric k×k matrix, with zero rows for numerically zero pivots. */
function pivotCheckedCholesky(a: Float64Array, k: number, field: string): Float64Array {
  const work = Float64Array.from(a);
  const u = new Float64Array(k * k);
  for (let j = 0; j < k; j++) {
    const diagonal = a[j * k + j];
    const pivot = work[j * k + j];
    if (pivot < -NEGATIVE_PIVOT_TOLERANCE * diagonal || (diagonal === 0 && pivot < 0)) {
      throwIfProblems([
        inputProblem(
          field,
          'not-positive-semidefinite',
          'cannot come from real data: after accounting for the earlier variables, variable ' +
            `${j + 1} would have a negative sum of squares (check that the matrix was copied whole and unrounded).`,
        ),
      ]);
    }
    if (!(pivot > PIVOT_TOLERANCE * diagonal) || pivot === 0) continue; // zero row: collinear or constant
    const root = Math.sqrt(pivot);
    u[j * k + j] = root;
    for (let c = j + 1; c < k; c++) u[j * k + c] = work[j * k + c] / root;
    for (let i = j + 1; i < k; i++) {
      for (let c = i; c < k; c++) work[i * k + c] -= u[j * k + i] * u[j * k + c];
    }
  }
  return u;
}
