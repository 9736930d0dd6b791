/**
 * The discrete Fourier transform X_k = Σ_s x_s·e^{−2πi·ks/M}, k = 0…M − 1, in place, for M a power of two.
 *
 * **Method.** Iterative radix-2 decimation in time (bit-reversal permutation, then log₂M passes of butterflies);
 * the twiddle factors of each pass are computed directly from cos and sin of 2πj/len (not by repeated
 * multiplication), so the rounding error grows like ε·log₂M.
 *
 * **References.** Cooley JW, Tukey JW (1965) An algorithm for the machine calculation of complex Fourier
 * series. Math Comp 19(90):297–301.
 *
 * **Special cases.** M = 1 leaves the input unchanged.
 *
 * @param re real parts (length M, a power of two), overwritten with the transform's real parts
 * @param im imaginary parts (same length), overwritten
 * @throws RangeError when the lengths differ or are not a power of two
 */
export function fastFourierTransform(re: Float64Array, im: Float64Array): void {
  const m = re.length;
  if (im.length !== m || m === 0 || (m & (m - 1)) !== 0) throw new RangeError('fastFourierTransform needs two arrays of the same power-of-two length');
  for (let i = 1, j = 0; i < m; i++) {
    let bit = m >> 1;
    for (; j & bit; bit >>= 1) j ^= bit;
    j ^= bit;
    if (i < j) {
      const tr = re[i];
      re[i] = re[j];
      re[j] = tr;
      const ti = im[i];
      im[i] = im[j];
      im[j] = ti;
    }
  }
  const cosTable = new Float64Array(m >> 1);
  const sinTable = new Float64Array(m >> 1);
  for (let j = 0; j < m >> 1; j++) {
    cosTable[j] = Math.cos((2 * Math.PI * j) / m);
    sinTable[j] = -Math.sin((2 * Math.PI * j) / m);
  }
  for (let len = 2; len <= m; len <<= 1) {
    const half = len >> 1;
    const stride = m / len;
    for (let start = 0; start < m; start += len) {
      for (let j = 0; j < half; j++) {
        const wr = cosTable[j * stride];
        const wi = sinTable[j * stride];
        const a = start + j;
        const b = a + half;
        const xr = re[b] * wr - im[b] * wi;
        const xi = re[b] * wi + im[b] * wr;
        re[b] = re[a] - xr;
        im[b] = im[a] - xi;
        re[a] += xr;
        im[a] += xi;
      }
    }
  }
}
