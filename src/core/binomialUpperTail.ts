/**
 * The binomial upper tail P(X ≥ k), X ~ Binomial(n, p), accurate in relative terms in both tails.
 *
 * **Method.** Direct summation of probabilities, always over the side of the distribution that is the
 * smaller tail, so that no result is formed by subtracting from 1 when it is small: for k > n·p the terms
 * j = k…n are summed from their largest (j = k) downwards with the ratio
 * P(j + 1)/P(j) = (n − j)/(j + 1)·p/q; otherwise 1 − P(X ≤ k − 1) with the lower tail summed the same way
 * (then P(X ≥ k) ≥ ½, because the median is at least ⌊np⌋). The first term is formed in log space with
 * log C(n, j) = Σ log((n − j' + i)/i), i = 1…j', j' = min(j, n − j), which is accurate to a few ulps per term.
 *
 * **References.** Johnson NL, Kemp AW, Kotz S (2005) Univariate Discrete Distributions, 3rd ed., Wiley, §3.2
 * (the pmf and its term ratio); Rosenbaum PR (2002) Observational Studies, 2nd ed., §4.3.2 (the sign test's
 * bounding binomial distribution).
 *
 * **Special cases.** NaN → NaN; k ≤ 0 → 1; k > n → 0; p = 0 → [k ≤ 0]; p = 1 → 1 for k ≤ n; results below
 * about 1e-308 underflow to 0.
 *
 * @param k an integer threshold
 * @param n number of trials (a non-negative integer)
 * @param p success probability in [0, 1]
 * @param q 1 − p, passed separately to keep precision when p is close to 1
 */
export function binomialUpperTail(k: number, n: number, p: number, q = 1 - p): number {
  if (Number.isNaN(k) || Number.isNaN(n) || Number.isNaN(p) || Number.isNaN(q)) return NaN;
  if (k <= 0) return 1;
  if (k > n) return 0;
  if (p === 0) return 0;
  if (q === 0) return 1;
  if (k > n * p) return sumTerms(k, n, p, q, +1);
  return Math.max(0, 1 - sumTerms(k - 1, n, p, q, -1));
}

/** Σ of binomial probabilities from j = start moving in `direction` until the terms stop mattering. */
function sumTerms(start: number, n: number, p: number, q: number, direction: 1 | -1): number {
  const logFirst = logChoose(n, start) + start * Math.log(p) + (n - start) * Math.log(q);
  const odds = p / q;
  let term = 1;
  let sum = 1;
  if (direction > 0) {
    for (let j = start; j < n; j++) {
      term *= ((n - j) / (j + 1)) * odds;
      sum += term;
      if (term < sum * 1e-17) break;
    }
  } else {
    for (let j = start; j > 0; j--) {
      term *= (j / (n - j + 1)) / odds;
      sum += term;
      if (term < sum * 1e-17) break;
    }
  }
  return Math.exp(logFirst + Math.log(sum));
}

/** log C(n, k) as a sum of logs of ratios (accurate to a few ulps per term; no lgamma needed). */
export function logChoose(n: number, k: number): number {
  const small = Math.min(k, n - k);
  let sum = 0;
  for (let i = 1; i <= small; i++) sum += Math.log((n - small + i) / i);
  return sum;
}
