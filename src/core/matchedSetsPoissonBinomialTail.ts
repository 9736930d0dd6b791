/**
 * The exact upper tail P(B₁ + … + B_K ≥ t) of a sum of independent Bernoulli(pᵢ) variables (the
 * Poisson-binomial distribution), accurate in relative terms in both tails.
 *
 * **Method.** Dynamic programming over the Bernoullis, one at a time, on a Float64Array. The tail is never
 * formed by subtraction: when t ≤ K − t + 1 the recursion tracks P(sum = j) for j = 0 … t − 1 and collects
 * everything that reaches t in one absorbing cell, which is the answer; otherwise it tracks the number of
 * failures F = K − sum for j = 0 … K − t (absorbing the rest) and the answer is Σ_{j ≤ K − t} P(F = j). Every
 * update is a sum of non-negative products, so each cell keeps its relative accuracy. Cost O(K·min(t, K − t))
 * time, O(min(t, K − t)) memory. Probabilities of partial sums below 10⁻³⁰⁰ are set to 0 (which keeps the loop
 * out of slow subnormal arithmetic): the result is low by at most K·10⁻³⁰⁰ in absolute terms, so tails below
 * about 10⁻²⁸⁰ lose relative accuracy and those below 10⁻³⁰⁰ may come out as 0.
 *
 * **References.** Hong Y (2013) On computing the distribution function for the Poisson binomial distribution.
 * Comput Stat Data Anal 59:41–51 (the recursive method; recalled from memory). Rosenbaum PR (2002)
 * Observational Studies, 2nd ed., Springer, ch. 4 (the bounding distribution of a count in matched sets as a
 * sum of independent Bernoullis).
 *
 * **Special cases.** t ≤ 0 → 1; t > K → 0; pᵢ = 0 or 1 are exact; NaN in t or any pᵢ → NaN.
 *
 * @param p success probabilities, each in [0, 1]
 * @param t the observed count (an integer; a fractional t is rounded up)
 * @param q failure probabilities 1 − pᵢ, when known more precisely than by subtraction (pᵢ close to 1)
 */
export function poissonBinomialUpperTail(p: ArrayLike<number>, t: number, q?: ArrayLike<number>): number {
  const K = p.length;
  if (Number.isNaN(t)) return NaN;
  for (let i = 0; i < K; i++) if (Number.isNaN(p[i]) || (q && Number.isNaN(q[i]))) return NaN;
  const need = Math.ceil(t);
  if (need <= 0) return 1;
  if (need > K) return 0;
  const failureOf = (i: number): number => (q ? q[i] : 1 - p[i]);
  if (need <= K - need + 1) {
    // P(sum ≥ need): cells 0 … need − 1 exact, cell `need` absorbs.
    return Math.min(1, trackCounts(K, need, (i) => p[i], failureOf)[need]);
  }
  // P(F ≤ K − need) with F the number of failures: cells 0 … K − need exact, cell K − need + 1 absorbs.
  const m = K - need;
  const g = trackCounts(K, m + 1, failureOf, (i) => p[i]);
  let sum = 0;
  for (let j = 0; j <= m; j++) sum += g[j];
  return Math.min(1, sum);
}

const NEGLIGIBLE = 1e-300;

/**
 * Distribution of the number of "hits" (probability `hit(i)`, complement `miss(i)`) over K Bernoullis: cells
 * 0 … cap − 1 exact, cell `cap` absorbing everything at or above cap.
 */
function trackCounts(K: number, cap: number, hit: (i: number) => number, miss: (i: number) => number): Float64Array {
  const g = new Float64Array(cap + 1);
  g[0] = 1;
  let top = 0; // the highest non-absorbing cell that can be non-zero so far
  for (let i = 0; i < K; i++) {
    const h = hit(i);
    const m = miss(i);
    g[cap] += g[cap - 1] * h;
    const upper = Math.min(top + 1, cap - 1);
    for (let j = upper; j >= 1; j--) {
      const v = g[j] * m + g[j - 1] * h;
      g[j] = v < NEGLIGIBLE ? 0 : v;
    }
    const v0 = g[0] * m;
    g[0] = v0 < NEGLIGIBLE ? 0 : v0;
    top = upper;
  }
  return g;
}
