/**
 * The binomial upper tail P(X ≥ k), X ~ Binomial(n, p), accurate in relative terms in both tails, in a fixed
 * amount of work whatever n (tested to n = 10¹²).
 *
 * **Method.** P(X ≥ k) = I_p(k, n − k + 1), the regularised incomplete beta function, always evaluated on the
 * side that is the smaller tail so that no small result is formed by subtraction from 1: for k > np directly;
 * otherwise as 1 − P(Y ≥ n − k + 1), Y ~ Binomial(n, 1 − p), which is then at most about ½ (the median is at
 * least ⌊np⌋). Writing t = p − δ in the beta integral,
 *
 *   I_p(k, n − k + 1) = (k/p)·f(k)·∫₀ᵖ exp(g(δ)) dδ,
 *   g(δ) = (k − 1)·log(1 − δ/p) + (n − k)·log(1 + δ/q),
 *
 * with f(k) = C(n, k)pᵏqⁿ⁻ᵏ the point probability. g is concave, g(0) = 0, and for k > np it rises by at most 1
 * before falling, so the integrand is a single smooth bump of known height. The integral is taken by 40-point
 * Gauss–Legendre quadrature on panels whose ends are the points where g has fallen by 3, 6, 9, … (found by
 * bisection) until it is below −66 (e⁻⁶⁶ ≈ 2e-29, beyond double precision relative to the bump): a fixed
 * cost of a few hundred logarithms. The first-order parts of g cancel near the mean, so g is formed as
 * δ·(np + q − k)/(pq) + (k − 1)·r(−δ/p) + (n − k)·r(δ/q) with r(x) = log(1 + x) − x from a series in
 * x/(2 + x) and np + q − k in double-double arithmetic. f(k) uses Loader's saddle-point form,
 * log f = s(n) − s(k) − s(n − k) − b(k, np) − b(n − k, nq) − ½·log(2πk(n − k)/n), with s the Stirling-series
 * remainder and b(x, M) = x·log(x/M) + M − x from its series in (x − M)/(x + M); x − np is formed exactly
 * (Dekker's product), which keeps f accurate to a few ulps of its exponent even at n = 10¹².
 *
 * Of p and q the smaller is taken as given and the other as its exact complement (carried in double-double),
 * so the answer is the tail for one exact success probability even when the two arguments do not add up to
 * exactly 1 in floating point. (At large n the tail is sensitive to p itself: a change of one unit in the last
 * place of p changes it by about |k − np|·2⁻⁵³/p relative, which no method can avoid.)
 *
 * **References.** Abramowitz M, Stegun IA (1964) Handbook of Mathematical Functions, 26.5.24 (binomial tail
 * as an incomplete beta function). Loader C (2000) Fast and accurate computation of binomial probabilities,
 * technical note, Bell Labs (the saddle-point form with the deviance b and the Stirling remainder s; recalled
 * from memory). Dekker TJ (1971) A floating-point technique for extending the available precision. Numer
 * Math 18:224–242 (exact products). Golub GH, Welsch JH (1969) Calculation of Gauss quadrature rules. Math
 * Comp 23:221–230 (Gauss–Legendre nodes; here by Newton's method on the Legendre polynomial). Rosenbaum PR
 * (2002) Observational Studies, 2nd ed., §4.3.2 (the sign test's bounding binomial distribution).
 *
 * **Special cases.** NaN → NaN; k ≤ 0 → 1; k > n → 0; p = 0 → 0 (for k ≥ 1); q = 0 → 1 (for k ≤ n); k = n
 * gives pⁿ; non-integer k is rounded up (P(X ≥ k) = P(X ≥ ⌈k⌉)). Results below the smallest double (about
 * 5e-324) are 0; between that and 2e-308 they keep the reduced precision of subnormal numbers.
 *
 * @param k the threshold (an integer; fractions are rounded up)
 * @param n number of trials, a non-negative integer up to 2⁵³
 * @param p success probability in [0, 1]
 * @param q 1 − p, passed separately to keep precision when p is close to 1
 */
export function binomialUpperTail(k: number, n: number, p: number, q = 1 - p): number {
  if (Number.isNaN(k) || Number.isNaN(n) || Number.isNaN(p) || Number.isNaN(q)) return NaN;
  k = Math.ceil(k);
  if (k <= 0) return 1;
  if (k > n) return 0;
  if (p <= 0) return 0;
  if (q <= 0) return 1;
  // The smaller probability is exact; the larger is its complement in double-double.
  const probability: Probability = p <= q ? { p, pLow: 0, q: 1 - p, qLow: 0 } : { p: 1 - q, pLow: 0, q, qLow: 0 };
  if (p <= q) probability.qLow = (1 - probability.q) - p;
  else probability.pLow = (1 - probability.p) - q;
  // k > np? Compare exactly: np = hi + lo.
  const [hi, lo] = product(n, probability.p);
  const excess = k - hi - (lo + n * probability.pLow);
  if (excess > 0) return Math.min(1, smallUpperTail(k, n, probability));
  const mirrored: Probability = { p: probability.q, pLow: probability.qLow, q: probability.p, qLow: probability.pLow };
  return Math.max(0, 1 - smallUpperTail(n - k + 1, n, mirrored));
}

/** A success probability p + pLow and its complement q + qLow, each as an unevaluated double-double sum. */
interface Probability {
  p: number;
  pLow: number;
  q: number;
  qLow: number;
}

/** P(X ≥ k) for 1 ≤ k ≤ n when k > np (the integrand of the beta integral then falls from its start). */
function smallUpperTail(k: number, n: number, pr: Probability): number {
  const { p, q } = pr;
  const logP = pr.pLow === 0 ? Math.log(p) : Math.log1p(-q);
  const logQ = pr.qLow === 0 ? Math.log(q) : Math.log1p(-p);
  if (k === n) return Math.exp(n * logP);
  // Exact deviation d = k − np and c = np + q − k (the slope of g at 0 times pq).
  const [hi, lo] = product(n, p);
  const d = k - hi - (lo + n * pr.pLow);
  const c = q + pr.qLow - d;
  const logPoint =
    stirlingRemainder(n) -
    stirlingRemainder(k) -
    stirlingRemainder(n - k) -
    deviance(k, d, hi) -
    deviance(n - k, -d, n - hi) -
    0.5 * (LOG_2PI + Math.log(k) + Math.log1p(-k / n));
  const a = k - 1;
  const b = n - k;
  const slope = c / (p * q);
  const g = (delta: number): number => {
    if (delta >= p) return a > 0 ? -Infinity : b * Math.log1p(delta / q);
    return delta * slope + a * logOnePlusMinusX(-delta / p) + b * logOnePlusMinusX(delta / q);
  };
  const integral = bumpIntegral(g, slope, a / (p * p) + b / (q * q), p);
  return Math.exp(Math.log(k) - logP + logPoint + Math.log(integral));
}

/**
 * ∫₀ᴸ exp(g) for a concave g with g(0) = 0 that rises by at most ~1: composite Gauss–Legendre on panels
 * between the points where g has fallen 3, 6, … below its maximum, down to −66 or the end of the range.
 * `slope` = g′(0), `curvature` = −g″(0) (a first scale for the search), `end` = the end of the range.
 */
function bumpIntegral(g: (x: number) => number, slope: number, curvature: number, end: number): number {
  // The maximum: at 0 unless the slope there is positive (then g′ = 0 a little way in, found by bisection on g).
  let top = 0;
  let gTop = 0;
  const scale = Math.min(end, 1 / Math.max(Math.abs(slope), Math.sqrt(curvature), 1e-300));
  if (slope > 0) {
    let a = 0;
    let b = Math.min(end, Math.max(scale, slope / curvature) * 4);
    for (let i = 0; i < 200 && b - a > 1e-15 * b; i++) {
      const m1 = a + (b - a) / 3;
      const m2 = b - (b - a) / 3;
      if (g(m1) < g(m2)) a = m1;
      else b = m2;
    }
    top = (a + b) / 2;
    gTop = Math.max(0, g(top));
  }
  // Panel ends: where g = gTop − 3j, j = 1, 2, …, searched to the right of the maximum.
  const ends: number[] = [0];
  let left = top;
  let step = scale;
  for (let level = gTop - 3; ; level -= 3) {
    // Bracket the crossing of `level` in [left, right].
    let right = Math.min(end, left + step);
    while (right < end && g(right) > level) {
      left = right;
      step *= 2;
      right = Math.min(end, left + step);
    }
    if (g(right) > level) {
      ends.push(end);
      break;
    }
    let a = left;
    let b = right;
    // The ends need not be precise (any panels give a valid rule): a few per cent of the panel suffices.
    const start = ends[ends.length - 1];
    for (let i = 0; i < 100 && b - a > 0.02 * (b - start); i++) {
      const m = (a + b) / 2;
      if (g(m) > level) a = m;
      else b = m;
    }
    ends.push(b);
    left = b;
    step = Math.max(b - ends[ends.length - 2], 1e-300);
    if (level < -66) break;
  }
  let total = 0;
  for (let i = 1; i < ends.length; i++) {
    const a = ends[i - 1];
    const b = ends[i];
    const half = (b - a) / 2;
    const mid = (a + b) / 2;
    let panel = 0;
    for (let j = 0; j < GAUSS_NODES.length; j++) {
      panel += GAUSS_WEIGHTS[j] * (Math.exp(g(mid - half * GAUSS_NODES[j])) + Math.exp(g(mid + half * GAUSS_NODES[j])));
    }
    total += panel * half;
  }
  return total;
}

/** log(1 + x) − x without cancellation: −x²/(2 + x) + 2Σ v^(2j+1)/(2j + 1), v = x/(2 + x), for x in (−½, 1]. */
function logOnePlusMinusX(x: number): number {
  if (x < -0.5 || x > 1) return Math.log1p(x) - x;
  const v = x / (2 + x);
  const v2 = v * v;
  let term = 2 * v * v2;
  let sum = 0;
  for (let j = 3; j < 200; j += 2) {
    const next = sum + term / j;
    if (next === sum) break;
    sum = next;
    term *= v2;
  }
  return -(x * x) / (2 + x) + sum;
}

/**
 * b(x, M) = x·log(x/M) + M − x (the deviance of a Poisson/binomial count x from its mean M), given the exact
 * difference d = x − M and M to double precision, `mean` (Loader 2000). Series in v = d/(x + M) when |v| < 0.4.
 */
function deviance(x: number, d: number, mean: number): number {
  const sum = x + mean;
  if (sum === 0) return 0;
  const v = d / sum;
  if (Math.abs(v) < 0.4) {
    const v2 = v * v;
    let s = d * v;
    let term = 2 * x * v;
    for (let j = 3; j < 400; j += 2) {
      term *= v2;
      const next = s + term / j;
      if (next === s) break;
      s = next;
    }
    return s;
  }
  if (x === 0) return mean;
  return x * Math.log(x / mean) - d;
}

/**
 * s(n) = log n! − (n + ½)·log n + n − ½·log 2π, the remainder of Stirling's formula: its asymptotic series
 * (Bernoulli numbers) for n ≥ 16, and s(n) = s(n + 1) − 1 + (n + ½)·log(1 + 1/n) below. s(0) = 0 (by
 * convention; only used where its term cancels).
 */
function stirlingRemainder(n: number): number {
  if (n <= 0) return 0;
  if (n >= 16) {
    const inv = 1 / n;
    const inv2 = inv * inv;
    return inv * (1 / 12 - inv2 * (1 / 360 - inv2 * (1 / 1260 - inv2 * (1 / 1680 - inv2 * (1 / 1188 - inv2 * (691 / 360360))))));
  }
  let s = stirlingRemainder(16);
  for (let m = 15; m >= n; m--) s = s - 1 + (m + 0.5) * Math.log1p(1 / m);
  return s;
}

/** a·b as an exact sum hi + lo (Dekker's product with Veltkamp splitting). */
function product(a: number, b: number): [number, number] {
  const hi = a * b;
  const [a1, a2] = split(a);
  const [b1, b2] = split(b);
  const lo = a2 * b2 - (((hi - a1 * b1) - a2 * b1) - a1 * b2);
  return [hi, lo];
}

function split(a: number): [number, number] {
  const c = 134217729 * a; // 2^27 + 1
  const high = c - (c - a);
  return [high, a - high];
}

const LOG_2PI = Math.log(2 * Math.PI);

/** Positive nodes and weights of 40-point Gauss–Legendre quadrature on [−1, 1] (Newton on P₄₀). */
const [GAUSS_NODES, GAUSS_WEIGHTS] = ((order: number): [Float64Array, Float64Array] => {
  const half = order / 2;
  const nodes = new Float64Array(half);
  const weights = new Float64Array(half);
  for (let i = 0; i < half; i++) {
    let x = Math.cos((Math.PI * (i + 0.75)) / (order + 0.5));
    let derivative = 0;
    for (let iteration = 0; iteration < 100; iteration++) {
      let p0 = 1;
      let p1 = x;
      for (let j = 2; j <= order; j++) {
        const p2 = ((2 * j - 1) * x * p1 - (j - 1) * p0) / j;
        p0 = p1;
        p1 = p2;
      }
      derivative = (order * (x * p1 - p0)) / (x * x - 1);
      const dx = p1 / derivative;
      x -= dx;
      if (Math.abs(dx) < 1e-17) break;
    }
    nodes[i] = x;
    weights[i] = 2 / ((1 - x * x) * derivative * derivative);
  }
  return [nodes, weights];
})(40);

/** log C(n, k) as a sum of logs of ratios (accurate to a few ulps per term; no lgamma needed). O(min(k, n − k)). */
export function logChoose(n: number, k: number): number {
  const small = Math.min(k, n - k);
  let sum = 0;
  for (let i = 1; i <= small; i++) sum += Math.log((n - small + i) / i);
  return sum;
}
