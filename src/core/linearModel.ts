import { type InputProblem, inputProblem, throwIfProblems } from './inputProblem';
import { StreamingQr } from './streamingQr';

/**
 * Everything a least-squares fit needs from the data, in p² numbers: the upper-triangular R of the augmented
 * design matrix (all chosen columns, typically [intercept, covariates…, treatment, outcome]), with
 * RᵀR = XᵀX, and the number of rows. Any regression of one of these columns on any others follows from R
 * alone (see {@link fitLeastSquares}).
 */
export interface TriangularDesign {
  /** Names of the p columns, in the order of R's columns. */
  readonly columnNames: readonly string[];
  /** R, p×p row-major, upper triangular: RᵀR equals the cross-product matrix XᵀX of the columns. */
  readonly r: Float64Array;
  /** Number of rows n behind R. */
  readonly rowCount: number;
  /** Name of the column that is 1 in every row (the intercept), or null when there is none. */
  readonly interceptColumn: string | null;
}

/** Which regression to fit from a {@link TriangularDesign}. */
export interface LeastSquaresSpec {
  /** The response column's name. */
  readonly response: string;
  /** The predictor columns' names (include the intercept column to fit an intercept). */
  readonly predictors: readonly string[];
  /**
   * Relative tolerance for collinearity: a predictor whose part not explained by the earlier predictors has
   * norm ≤ tolerance × its own norm (its centred norm when the intercept is a predictor) is reported as a
   * linear combination of them. Default 1e-7 (the threshold of R's `lm`/`qr`, which however compares with
   * the uncentred norm: see the special cases of {@link fitLeastSquares}).
   */
  readonly tolerance?: number;
}

/** A least-squares fit; per-coefficient arrays follow `predictors`' order. Frozen. */
export interface LeastSquaresFit {
  readonly method: string;
  readonly references: readonly string[];
  readonly response: string;
  readonly predictors: readonly string[];
  readonly coefficients: readonly number[];
  readonly standardErrors: readonly number[];
  readonly tValues: readonly number[];
  /** Partial R² of each predictor with the response given the others: t²/(t² + df). */
  readonly partialR2: readonly number[];
  /** Number of rows n. */
  readonly rowCount: number;
  /** n − number of predictors. */
  readonly residualDf: number;
  /** Residual sum of squares. */
  readonly residualSumOfSquares: number;
  /** √(RSS/df). */
  readonly residualSd: number;
  /** Total sum of squares: about the mean when the intercept is a predictor, about 0 otherwise (as R's lm). */
  readonly totalSumOfSquares: number;
  /** 1 − RSS/TSS. */
  readonly rSquared: number;
  readonly hasIntercept: boolean;
  readonly warnings: readonly string[];
}

const METHOD =
  'Least squares from the triangular factor R of the design (RᵀR = XᵀX): the chosen columns of R are ' +
  're-triangularised by Householder QR, the coefficients solve the triangular system, and the residual sum of ' +
  'squares is the squared norm of what remains of the response column.';
const REFERENCES = Object.freeze([
  'G. H. Golub and C. F. Van Loan, Matrix Computations, 4th ed., Johns Hopkins University Press, 2013, §5.3 (the full-rank least-squares problem via QR) and §5.5 (the rank-deficient least-squares problem).',
  'N. R. Draper and H. Smith, Applied Regression Analysis, 3rd ed., Wiley, 1998 (standard errors, t statistics, R², extra sums of squares).',
]);

/** Variation of the response below this fraction of its norm is rounding noise (constant response, exact fit). */
const RESPONSE_TOLERANCE = 1e-11;

/** Default collinearity tolerance (R's `lm` uses `tol = 1e-7` in its QR). */
export const DEFAULT_COLLINEARITY_TOLERANCE = 1e-7;

/**
 * Builds a {@link TriangularDesign} from rows held in memory (small data, tests). For large data use
 * {@link StreamingQr} chunk by chunk, or the CSV accumulator in `src/methods/regression/regressionData.ts`.
 *
 * @param columnNames the names of the columns of each row
 * @param rows the rows (each of length columnNames.length)
 * @param options.intercept when true (default) a constant column named `interceptName` is put first
 */
export function designFromRows(
  columnNames: readonly string[],
  rows: readonly (readonly number[])[],
  options: { intercept?: boolean; interceptName?: string } = {},
): TriangularDesign {
  const intercept = options.intercept ?? true;
  const interceptName = options.interceptName ?? INTERCEPT_NAME;
  const names = intercept ? [interceptName, ...columnNames] : [...columnNames];
  const qr = new StreamingQr(names.length);
  const row = new Float64Array(names.length);
  for (const values of rows) {
    let k = 0;
    if (intercept) row[k++] = 1;
    for (const v of values) row[k++] = v;
    qr.addRow(row);
  }
  return Object.freeze({
    columnNames: Object.freeze(names),
    r: qr.triangle(),
    rowCount: qr.rowCount,
    interceptColumn: intercept ? interceptName : null,
  });
}

/** The name this library gives the intercept column. */
export const INTERCEPT_NAME = '(intercept)';

/** One predictor found to be a linear combination of earlier ones. */
export interface CollinearColumn {
  readonly column: string;
  /** The earlier columns it is a combination of (empty when the column is zero in every row). */
  readonly combinationOf: readonly string[];
}

/** The result of re-triangularising chosen columns of R: the kept predictors and the response's remainder. */
interface Retriangulated {
  /** Indices (into the requested predictor list) of the predictors kept, in processing order. */
  kept: number[];
  /** R of the kept predictors, rank×rank row-major. */
  rKept: Float64Array;
  /** Qᵀy restricted to the kept predictors (length rank). */
  z: Float64Array;
  /** √RSS of the response on the kept predictors (kept as a norm: RSS itself may overflow for huge data). */
  residualNorm: number;
  collinear: CollinearColumn[];
}

/**
 * Re-triangularises the columns `order` (predictor indices into the design, in processing order) followed
 * by `response`, skipping any predictor that is (numerically) a linear combination of those before it.
 *
 * A predictor is skipped when the norm of its part not explained by the earlier predictors is at most
 * `tolerance` times its reference norm. The reference norm is its own (uncentred) norm, except after the
 * intercept (processed first): then it is the column's centred norm (its norm after the intercept's
 * reflection), so that a column offset far from zero (1e9 + x, x varying by ±3) is judged on its variation,
 * not its offset; it is called constant only when its centred norm is at rounding level, 8·ε·√n times its
 * raw norm. This departs from R's `lm`, whose pivoted QR compares with the uncentred norm at tol = 1e-7 and so
 * drops a column offset by 1e9 whose values vary by ±3; here its coefficient is estimated (as it is for the
 * same column without the offset, to which least squares is invariant).
 */
function retriangulate(design: TriangularDesign, order: readonly number[], response: number, tolerance: number): Retriangulated {
  const p = design.columnNames.length;
  const q = order.length + 1;
  const cols = [...order, response];
  // A = R[:, cols], p rows × q columns, column-major for convenient column work.
  const a = new Float64Array(p * q);
  const norms = new Float64Array(q);
  for (let c = 0; c < q; c++) {
    const j = cols[c];
    let big = 0;
    for (let i = 0; i <= j && i < p; i++) big = Math.max(big, Math.abs(design.r[i * p + j]));
    let s = 0;
    for (let i = 0; i <= j && i < p; i++) {
      const v = design.r[i * p + j];
      a[c * p + i] = v;
      if (big > 0) s += (v / big) * (v / big);
    }
    norms[c] = big * Math.sqrt(s);
  }
  const keptSlots: number[] = [];
  const collinear: CollinearColumn[] = [];
  const interceptIndex = design.interceptColumn === null ? -1 : design.columnNames.indexOf(design.interceptColumn);
  // Set once the intercept is processed first: each later column's norm after its reflection (centred norm).
  let centred: Float64Array | null = null;
  const roundingLevel = 8 * Number.EPSILON * Math.sqrt(Math.max(1, design.rowCount));
  let rank = 0;
  for (let c = 0; c < q - 1; c++) {
    const residual = columnNorm(a, c * p, rank, p);
    const reference = centred ? centred[c] : norms[c];
    const atRoundingLevel = centred !== null && !(centred[c] > roundingLevel * norms[c]);
    if (atRoundingLevel || !(residual > tolerance * reference)) {
      collinear.push(describeCollinear(design, a, p, keptSlots, c, cols, order, norms));
      continue;
    }
    // Householder reflection zeroing A[rank+1.., c]; applied to every later column (including the response).
    const base = c * p;
    const alpha = a[base + rank];
    const beta = alpha >= 0 ? -residual : residual;
    const tau = (beta - alpha) / beta;
    const scale = 1 / (alpha - beta);
    for (let i = rank + 1; i < p; i++) a[base + i] *= scale;
    for (let d = c + 1; d < q; d++) {
      const other = d * p;
      let w = a[other + rank];
      for (let i = rank + 1; i < p; i++) w += a[base + i] * a[other + i];
      w *= tau;
      a[other + rank] -= w;
      for (let i = rank + 1; i < p; i++) a[other + i] -= w * a[base + i];
    }
    a[base + rank] = beta;
    for (let i = rank + 1; i < p; i++) a[base + i] = 0;
    keptSlots.push(c);
    rank++;
    if (c === 0 && cols[0] === interceptIndex) {
      centred = new Float64Array(q);
      for (let d = 1; d < q; d++) centred[d] = columnNorm(a, d * p, 1, p);
    }
  }
  const rKept = new Float64Array(rank * rank);
  for (let i = 0; i < rank; i++) {
    for (let k = i; k < rank; k++) rKept[i * rank + k] = a[keptSlots[k] * p + i];
  }
  const responseBase = (q - 1) * p;
  const z = new Float64Array(rank);
  for (let i = 0; i < rank; i++) z[i] = a[responseBase + i];
  const residualNorm = columnNorm(a, responseBase, rank, p);
  return { kept: keptSlots, rKept, z, residualNorm, collinear };
}

/** ‖A[from..p-1, column]‖ with rescaling (the data may be huge or tiny). */
function columnNorm(a: Float64Array, base: number, from: number, p: number): number {
  let big = 0;
  for (let i = from; i < p; i++) big = Math.max(big, Math.abs(a[base + i]));
  if (big === 0 || !Number.isFinite(big)) return big;
  let s = 0;
  for (let i = from; i < p; i++) {
    const v = a[base + i] / big;
    s += v * v;
  }
  return big * Math.sqrt(s);
}

/** Names the earlier kept columns that a dependent column is a combination of. */
function describeCollinear(
  design: TriangularDesign,
  a: Float64Array,
  p: number,
  keptSlots: readonly number[],
  c: number,
  cols: readonly number[],
  order: readonly number[],
  norms: Float64Array,
): CollinearColumn {
  const column = design.columnNames[order[c]];
  if (norms[c] === 0 || keptSlots.length === 0) return Object.freeze({ column, combinationOf: Object.freeze([]) });
  const rank = keptSlots.length;
  // Solve R_kept · coef = A[0..rank-1, c] by back substitution.
  const coef = new Float64Array(rank);
  for (let i = rank - 1; i >= 0; i--) {
    let s = a[c * p + i];
    for (let k = i + 1; k < rank; k++) s -= a[keptSlots[k] * p + i] * coef[k];
    coef[i] = s / a[keptSlots[i] * p + i];
  }
  const involved: string[] = [];
  for (let i = 0; i < rank; i++) {
    if (Math.abs(coef[i]) * norms[keptSlots[i]] > 1e-6 * norms[c]) involved.push(design.columnNames[cols[keptSlots[i]]]);
  }
  return Object.freeze({ column, combinationOf: Object.freeze(involved) });
}

function collinearMessage(item: CollinearColumn, interceptColumn: string | null): string {
  const { column, combinationOf } = item;
  if (combinationOf.length === 0) return `"${column}" is zero in every row used, so its effect cannot be estimated.`;
  if (interceptColumn !== null && combinationOf.length === 1 && combinationOf[0] === interceptColumn) {
    return `"${column}" is constant in every row used, so its effect cannot be separated from the intercept.`;
  }
  const others = combinationOf.filter((name) => name !== interceptColumn).map((name) => `"${name}"`);
  const list = others.length === 1 ? others[0] : `${others.slice(0, -1).join(', ')} and ${others[others.length - 1]}`;
  const withIntercept = combinationOf.includes(interceptColumn ?? '\u0000') ? ' (and the intercept)' : '';
  return `"${column}" is a linear combination of ${list}${withIntercept}, so the effects cannot be separated; drop one of them.`;
}

/** Processing order: the intercept first (as R's lm), then the predictors as given. */
function processingOrder(design: TriangularDesign, predictors: readonly string[]): number[] {
  const idx = predictors.map((name) => design.columnNames.indexOf(name));
  const ic = design.interceptColumn === null ? -1 : design.columnNames.indexOf(design.interceptColumn);
  const positions = idx.map((_, i) => i);
  positions.sort((x, y) => Number(idx[y] === ic) - Number(idx[x] === ic));
  return positions;
}

/**
 * Checks a least-squares request against a design: known and distinct columns, response not among the
 * predictors, more rows than predictors, no predictor collinear with others, a response that varies.
 *
 * Fields: `response`, `predictors` (column problems; the message names the columns), `rowCount`.
 */
export function validateLeastSquares(design: TriangularDesign, spec: LeastSquaresSpec): InputProblem[] {
  const problems = structuralProblems(design, spec);
  if (problems.length > 0) return problems;
  const fitted = computeFit(design, spec);
  return fitted.problems;
}

function structuralProblems(design: TriangularDesign, spec: LeastSquaresSpec): InputProblem[] {
  const problems: InputProblem[] = [];
  const names = design.columnNames;
  const list = names.map((name) => `"${name}"`).join(', ');
  if (!names.includes(spec.response)) {
    problems.push(inputProblem('response', 'unknown-column', `there is no column named "${spec.response}" (columns: ${list}).`, spec.response));
  }
  const seen = new Set<string>();
  spec.predictors.forEach((name, i) => {
    if (!names.includes(name)) {
      problems.push(inputProblem(`predictors[${i}]`, 'unknown-column', `there is no column named "${name}" (columns: ${list}).`, name));
    } else if (name === spec.response) {
      problems.push(inputProblem(`predictors[${i}]`, 'response-as-predictor', `"${name}" is the response; it cannot also be a predictor.`, name));
    } else if (seen.has(name)) {
      problems.push(inputProblem(`predictors[${i}]`, 'chosen-twice', `"${name}" is chosen twice.`, name));
    }
    seen.add(name);
  });
  const tolerance = spec.tolerance ?? DEFAULT_COLLINEARITY_TOLERANCE;
  if (!(tolerance >= 0 && tolerance < 1)) {
    problems.push(inputProblem('tolerance', 'outside-interval', 'must be at least 0 and below 1.', tolerance));
  }
  if (!(Number.isInteger(design.rowCount) && design.rowCount > spec.predictors.length)) {
    problems.push(
      inputProblem(
        'rowCount',
        'too-few-rows',
        `needs more rows than coefficients to estimate standard errors: ${design.rowCount} rows, ${spec.predictors.length} coefficients.`,
        design.rowCount,
      ),
    );
  }
  return problems;
}

interface ComputedFit {
  problems: InputProblem[];
  fit?: LeastSquaresFit;
}

function computeFit(design: TriangularDesign, spec: LeastSquaresSpec): ComputedFit {
  const tolerance = spec.tolerance ?? DEFAULT_COLLINEARITY_TOLERANCE;
  const positions = processingOrder(design, spec.predictors);
  const order = positions.map((i) => design.columnNames.indexOf(spec.predictors[i]));
  const response = design.columnNames.indexOf(spec.response);
  const tri = retriangulate(design, order, response, tolerance);
  const problems: InputProblem[] = tri.collinear.map((item) =>
    inputProblem(
      `predictors[${spec.predictors.indexOf(item.column)}]`,
      item.combinationOf.length === 0 ? 'zero-column' : isConstant(item, design) ? 'constant' : 'collinear',
      collinearMessage(item, design.interceptColumn),
      item.column,
    ),
  );
  const hasIntercept = design.interceptColumn !== null && spec.predictors.includes(design.interceptColumn);
  const rank = tri.kept.length;
  // Total sum of squares: about the mean with an intercept (processed first), about zero without.
  const totalNorm = scaledHypot([tri.residualNorm, ...tri.z.subarray(hasIntercept ? 1 : 0)]);
  // The response's own norm: variation below rounding level of it means a constant response.
  const responseNorm = scaledHypot([tri.residualNorm, ...tri.z]);
  if (hasIntercept && !(totalNorm > RESPONSE_TOLERANCE * responseNorm)) {
    problems.push(inputProblem('response', 'constant', `"${spec.response}" is constant in every row used, so there is nothing to explain.`, spec.response));
  } else if (!hasIntercept && !(totalNorm > 0)) {
    problems.push(inputProblem('response', 'zero-column', `"${spec.response}" is zero in every row used, so there is nothing to explain.`, spec.response));
  }
  if (problems.length > 0) return { problems };

  // Coefficients: back substitution R b = z; covariance ∝ R⁻¹R⁻ᵀ.
  const b = new Float64Array(rank);
  for (let i = rank - 1; i >= 0; i--) {
    let s = tri.z[i];
    for (let k = i + 1; k < rank; k++) s -= tri.rKept[i * rank + k] * b[k];
    b[i] = s / tri.rKept[i * rank + i];
  }
  const rInv = upperTriangularInverse(tri.rKept, rank);
  const n = design.rowCount;
  const df = n - rank;
  const residualNorm = tri.residualNorm;
  const sigma = residualNorm / Math.sqrt(df);
  const warnings: string[] = [];
  if (!(residualNorm > RESPONSE_TOLERANCE * totalNorm)) {
    warnings.push('The predictors fit the response exactly (no residual variation beyond rounding): standard errors are zero or meaningless.');
  }

  const count = spec.predictors.length;
  const coefficients = new Array<number>(count);
  const standardErrors = new Array<number>(count);
  const tValues = new Array<number>(count);
  const partialR2 = new Array<number>(count);
  for (let slot = 0; slot < rank; slot++) {
    const userIndex = positions[tri.kept[slot]];
    let s = 0;
    let big = 0;
    for (let k = slot; k < rank; k++) big = Math.max(big, Math.abs(rInv[slot * rank + k]));
    for (let k = slot; k < rank; k++) {
      const v = rInv[slot * rank + k] / big;
      s += v * v;
    }
    const se = sigma * big * Math.sqrt(s);
    const t = b[slot] / se;
    coefficients[userIndex] = b[slot];
    standardErrors[userIndex] = se;
    tValues[userIndex] = t;
    partialR2[userIndex] = partialR2FromT(t, df);
  }
  const fit: LeastSquaresFit = Object.freeze({
    method: METHOD,
    references: REFERENCES,
    response: spec.response,
    predictors: Object.freeze([...spec.predictors]),
    coefficients: Object.freeze(coefficients),
    standardErrors: Object.freeze(standardErrors),
    tValues: Object.freeze(tValues),
    partialR2: Object.freeze(partialR2),
    rowCount: n,
    residualDf: df,
    residualSumOfSquares: residualNorm * residualNorm,
    residualSd: sigma,
    totalSumOfSquares: totalNorm * totalNorm,
    rSquared: 1 - (residualNorm / totalNorm) ** 2,
    hasIntercept,
    warnings: Object.freeze(warnings),
  });
  return { problems: [], fit };
}

function isConstant(item: CollinearColumn, design: TriangularDesign): boolean {
  return design.interceptColumn !== null && item.combinationOf.length === 1 && item.combinationOf[0] === design.interceptColumn;
}

/** Inverse of an upper-triangular k×k matrix (row-major), by back substitution column by column. */
function upperTriangularInverse(r: Float64Array, k: number): Float64Array {
  const inv = new Float64Array(k * k);
  for (let j = 0; j < k; j++) {
    inv[j * k + j] = 1 / r[j * k + j];
    for (let i = j - 1; i >= 0; i--) {
      let s = 0;
      for (let m = i + 1; m <= j; m++) s += r[i * k + m] * inv[m * k + j];
      inv[i * k + j] = -s / r[i * k + i];
    }
  }
  return inv;
}

/**
 * Partial R² of one coefficient with the response, given the other predictors: t²/(t² + df).
 * Special cases: t = ±∞ gives 1; NaN in, NaN out.
 */
export function partialR2FromT(t: number, df: number): number {
  if (!Number.isFinite(t)) return Number.isNaN(t) ? NaN : 1;
  if (t === 0) return 0;
  // 1/(1 + df/t²), with df/t² formed as (df/|t|)/|t| so that |t| above 1e154 does not overflow t².
  const a = Math.abs(t);
  return 1 / (1 + df / a / a);
}

/**
 * The least-squares regression of `response` on `predictors`, computed from R alone.
 *
 * **Method.** XᵀX = RᵀR, so the regression on any subset S of the design's columns only needs R[:, S ∪ {y}]:
 * a Householder QR of that p×(|S|+1) matrix gives the triangular factor R_S and Q_Sᵀy, then β̂ solves
 * R_S β̂ = (Q_Sᵀy)_{1..|S|} and RSS is the squared norm of the rest of the response column. Standard errors
 * are σ̂·‖row j of R_S⁻¹‖ with σ̂² = RSS/(n − |S|); t = β̂/SE; partial R² = t²/(t² + df). With the
 * intercept among the predictors, R² is centred (1 − RSS/Σ(y − ȳ)²); without it, uncentred (1 − RSS/Σy²),
 * both as R's `lm` reports.
 *
 * **References.** G. H. Golub and C. F. Van Loan, Matrix Computations, 4th ed., Johns Hopkins University
 * Press, 2013, §5.3 (least squares via QR) and §5.5 (rank deficiency); N. R. Draper and H. Smith, Applied
 * Regression Analysis, 3rd ed., Wiley, 1998 (t statistics, R²).
 *
 * **Special cases.** An exact fit (RSS = 0, or below 1e-11 of the response's variation) gives zero or
 * rounding-level standard errors and a warning. With the intercept among the predictors, constancy and
 * collinearity of a later predictor are judged relative to its centred norm (a column 1e9 + x with x varying
 * by ±3, or x·1e-300, is not constant; a column is constant only when its centred norm is at rounding level,
 * 8·ε·√n times its raw norm). R's `lm` judges against the uncentred norm and drops such an offset column. RSS and TSS are kept as norms internally, so data up to
 * ~1e300 give finite coefficients, t and R² even where RSS itself overflows.
 *
 * @throws InputError naming the column when a column is unknown or chosen twice, when a predictor is a linear
 *   combination of others (collinear, constant, or zero), when the response is constant, or when n ≤ |S|.
 */
export function fitLeastSquares(design: TriangularDesign, spec: LeastSquaresSpec): LeastSquaresFit {
  throwIfProblems(structuralProblems(design, spec));
  const computed = computeFit(design, spec);
  throwIfProblems(computed.problems);
  return computed.fit!;
}

/** Convenience form of {@link fitLeastSquares}: the regression of `response` on `predictors`. */
export function subsetRegression(design: TriangularDesign, response: string, predictors: readonly string[]): LeastSquaresFit {
  return fitLeastSquares(design, { response, predictors });
}

/**
 * Residual sum of squares of `response` on `predictors` (collinear predictors are skipped, as they do not
 * change the fitted values). NaN when a name is unknown.
 */
export function residualSumOfSquares(design: TriangularDesign, response: string, predictors: readonly string[]): number {
  const order = predictors.map((name) => design.columnNames.indexOf(name));
  const y = design.columnNames.indexOf(response);
  if (y < 0 || order.some((i) => i < 0)) return NaN;
  return retriangulate(design, order, y, DEFAULT_COLLINEARITY_TOLERANCE).residualNorm ** 2;
}

/** √(Σ v²) without overflow or underflow. */
function scaledHypot(values: ArrayLike<number>): number {
  let big = 0;
  for (let i = 0; i < values.length; i++) big = Math.max(big, Math.abs(values[i]));
  if (big === 0 || !Number.isFinite(big)) return big;
  let s = 0;
  for (let i = 0; i < values.length; i++) {
    const v = values[i] / big;
    s += v * v;
  }
  return big * Math.sqrt(s);
}

/**
 * Partial R² of a group of predictors with the response, given the other predictors:
 * (RSS_without_group − RSS_full)/RSS_without_group. For a single predictor this equals t²/(t² + df).
 *
 * **References.** N. R. Draper and H. Smith, Applied Regression Analysis, 3rd ed., Wiley, 1998 (the extra
 * sum of squares principle); C. Cinelli and C. Hazlett, "Making sense of sensitivity: extending omitted
 * variable bias", J. R. Stat. Soc. B 82(1):39–67, 2020 (partial R² of a group of covariates, for grouped
 * benchmarks).
 *
 * @throws InputError as {@link fitLeastSquares} for the full model, or when the group is empty or holds a
 *   column that is not a predictor (field `group`).
 */
export function groupPartialR2(
  design: TriangularDesign,
  spec: LeastSquaresSpec & { readonly group: readonly string[] },
): number {
  const full = fitLeastSquares(design, spec);
  const problems: InputProblem[] = [];
  if (spec.group.length === 0) problems.push(inputProblem('group', 'empty', 'needs at least one predictor.'));
  spec.group.forEach((name, i) => {
    if (!spec.predictors.includes(name)) {
      problems.push(inputProblem(`group[${i}]`, 'not-a-predictor', `"${name}" is not one of the predictors.`, name));
    }
  });
  throwIfProblems(problems);
  const reduced = spec.predictors.filter((name) => !spec.group.includes(name));
  const order = reduced.map((name) => design.columnNames.indexOf(name));
  const y = design.columnNames.indexOf(spec.response);
  const reducedNorm = retriangulate(design, order, y, spec.tolerance ?? DEFAULT_COLLINEARITY_TOLERANCE).residualNorm;
  if (!(reducedNorm > 0)) return NaN;
  // (RSS_reduced − RSS_full)/RSS_reduced, as norms (no overflow).
  const ratio = full.residualSd * Math.sqrt(full.residualDf) / reducedNorm;
  return Math.max(0, 1 - ratio * ratio);
}
