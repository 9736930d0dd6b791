/**
 * Streaming QR factorisation: the upper-triangular factor R of a tall matrix whose rows arrive in blocks.
 *
 * **Method.** The rows are buffered into blocks of `blockRows` rows. Each full block B is absorbed by a
 * Householder QR of the stacked matrix [R; B], exploiting that R is already upper triangular: the j-th
 * reflection only touches row j of R and the j-th column of B, so a block of m rows costs about m·p² flops
 * and the memory held is p² + m·p numbers whatever the number of rows. Because the reflections are
 * orthogonal, RᵀR = XᵀX for all rows X absorbed so far, and R is the R of a QR factorisation of X (up to the
 * signs of its rows, which are made non-negative on the diagonal when read). Reflections are built as in
 * LAPACK's `dlarfg` (τ = (β − α)/β, v = x/(α − β), β = −sign(α)‖x‖), which never squares the data except in
 * a norm that is rescaled when it would overflow or underflow, so magnitudes from 1e-150 to 1e150 are safe.
 *
 * **References.**
 * - G. H. Golub and C. F. Van Loan, *Matrix Computations*, 4th ed., Johns Hopkins University Press, 2013:
 *   §5.1 (Householder reflections), §5.2 (Householder QR), §6.5 (updating a QR factorisation when rows are
 *   appended).
 * - E. Anderson et al., *LAPACK Users' Guide*, 3rd ed., SIAM, 1999: the elementary reflector `dlarfg`.
 *
 * **Special cases.** A column inserted with {@link StreamingQr.insertZeroColumn} is zero in every row
 * absorbed before (used when a new category level appears mid-stream). NaN or infinite inputs propagate into
 * R (the caller drops missing rows before adding them). No rows: R is all zeros.
 */
export class StreamingQr {
  private columns: number;
  private readonly blockRows: number;
  private r: Float64Array;
  private block: Float64Array;
  private buffered = 0;
  private rows = 0;

  /**
   * @param columnCount number of columns p ≥ 1 (the augmented design: intercept, predictors, responses)
   * @param blockRows rows buffered per Householder update (default 512)
   */
  constructor(columnCount: number, blockRows = 512) {
    if (!Number.isInteger(columnCount) || columnCount < 1) throw new RangeError('columnCount must be a positive integer');
    if (!Number.isInteger(blockRows) || blockRows < 1) throw new RangeError('blockRows must be a positive integer');
    this.columns = columnCount;
    this.blockRows = blockRows;
    this.r = new Float64Array(columnCount * columnCount);
    this.block = new Float64Array(blockRows * columnCount);
  }

  /** The number of columns p. */
  get columnCount(): number {
    return this.columns;
  }

  /** The number of rows absorbed so far (including buffered ones). */
  get rowCount(): number {
    return this.rows + this.buffered;
  }

  /** Adds one row of p values. */
  addRow(values: ArrayLike<number>): void {
    const p = this.columns;
    const m = this.blockRows;
    const block = this.block;
    // The block is stored column by column, so the reflections run down long contiguous columns.
    for (let k = 0, at = this.buffered; k < p; k++, at += m) block[at] = values[k];
    if (++this.buffered === m) this.flush();
  }

  /** Adds `rowCount` rows stored row-major (p values per row) in `values`. */
  addRows(values: ArrayLike<number>, rowCount: number): void {
    const p = this.columns;
    const row = new Float64Array(p);
    for (let i = 0; i < rowCount; i++) {
      for (let k = 0; k < p; k++) row[k] = values[i * p + k];
      this.addRow(row);
    }
  }

  /**
   * Inserts a column at `index` that is zero in every row absorbed so far. R keeps its triangular shape: a
   * zero column and a zero row are inserted at `index` (rows after it shift down, as their columns shift right).
   */
  insertZeroColumn(index: number): void {
    const p = this.columns;
    if (!Number.isInteger(index) || index < 0 || index > p) throw new RangeError('index out of range');
    this.flush();
    const q = p + 1;
    const r = new Float64Array(q * q);
    for (let i = 0; i < p; i++) {
      const ni = i < index ? i : i + 1;
      for (let k = i; k < p; k++) {
        const nk = k < index ? k : k + 1;
        r[ni * q + nk] = this.r[i * p + k];
      }
    }
    this.columns = q;
    this.r = r;
    this.block = new Float64Array(this.blockRows * q);
  }

  /** A copy of R (p×p, row-major, upper triangular, non-negative diagonal) after absorbing every row given. */
  triangle(): Float64Array {
    this.flush();
    const p = this.columns;
    const out = Float64Array.from(this.r);
    for (let i = 0; i < p; i++) {
      if (out[i * p + i] < 0) for (let k = i; k < p; k++) out[i * p + k] = -out[i * p + k];
    }
    return out;
  }

  /** Absorbs the buffered rows into R. */
  private flush(): void {
    const m = this.buffered;
    if (m === 0) return;
    absorbBlock(this.r, this.block, m, this.blockRows, this.columns);
    this.rows += m;
    this.buffered = 0;
  }
}

/**
 * Replaces R (p×p upper triangular, row-major) by the R factor of [R; B], where B holds m rows of p values
 * stored column by column (B[i, k] = b[k·stride + i], stride ≥ m). B is overwritten.
 */
export function absorbBlock(r: Float64Array, b: Float64Array, m: number, stride: number, p: number): void {
  for (let j = 0; j < p; j++) {
    const cj = j * stride;
    // The column below the diagonal: B[0..m-1, j].
    let sigma = 0;
    for (let i = 0; i < m; i++) sigma += b[cj + i] * b[cj + i];
    // A zero sum of squares is a zero column only when every value is 0: tiny values (1e-300) underflow when
    // squared, and such a column goes through the scaled norm like any other.
    if (sigma === 0 && allZero(b, cj, m)) continue;
    const alpha = r[j * p + j];
    let xnorm: number;
    if (sigma === Infinity || sigma < 1e-280 || !Number.isFinite(alpha) || Math.abs(alpha) > 1e140) {
      xnorm = scaledNorm(b, cj, m, alpha);
    } else {
      xnorm = Math.sqrt(alpha * alpha + sigma);
    }
    if (!(xnorm > 0) || !Number.isFinite(xnorm)) {
      // NaN or infinite data: let it propagate rather than compute with nonsense.
      if (Number.isNaN(xnorm) || xnorm === Infinity) r[j * p + j] = NaN;
      continue;
    }
    const beta = alpha >= 0 ? -xnorm : xnorm;
    const tau = (beta - alpha) / beta;
    const scale = 1 / (alpha - beta);
    for (let i = 0; i < m; i++) b[cj + i] *= scale;
    // For each later column k: w = R[j,k] + Σ_i v_i B[i,k] (v_0 = 1 on row j of R); then subtract τ·w·v.
    for (let k = j + 1; k < p; k++) {
      const ck = k * stride;
      let w = r[j * p + k];
      for (let i = 0; i < m; i++) w += b[cj + i] * b[ck + i];
      w *= tau;
      r[j * p + k] -= w;
      for (let i = 0; i < m; i++) b[ck + i] -= w * b[cj + i];
    }
    r[j * p + j] = beta;
  }
}

/** Whether B[0..m-1] of the column starting at `base` is 0 throughout. */
function allZero(b: Float64Array, base: number, m: number): boolean {
  for (let i = 0; i < m; i++) if (b[base + i] !== 0) return false;
  return true;
}

/** √(α² + Σ B[i,j]²) without overflow or underflow (column j starts at `base`). */
function scaledNorm(b: Float64Array, base: number, m: number, alpha: number): number {
  let big = Math.abs(alpha);
  for (let i = 0; i < m; i++) big = Math.max(big, Math.abs(b[base + i]));
  if (big === 0 || !Number.isFinite(big)) return big;
  let sum = (alpha / big) * (alpha / big);
  for (let i = 0; i < m; i++) {
    const x = b[base + i] / big;
    sum += x * x;
  }
  return big * Math.sqrt(sum);
}

/**
 * The R factor (q×q, row-major, non-negative diagonal) of a small dense matrix A (rows×q, row-major), by
 * Householder QR; used to re-triangularise selected columns of a stored R. When rows < q the missing rows
 * of R are zero.
 */
export function triangularFactor(a: ArrayLike<number>, rows: number, q: number): Float64Array {
  const r = new Float64Array(q * q);
  const b = new Float64Array(rows * q);
  for (let i = 0; i < rows; i++) for (let k = 0; k < q; k++) b[k * rows + i] = a[i * q + k];
  absorbBlock(r, b, rows, rows, q);
  for (let i = 0; i < q; i++) {
    if (r[i * q + i] < 0) for (let k = i; k < q; k++) r[i * q + k] = -r[i * q + k];
  }
  return r;
}
