/**
 * The upper tail of the standard normal distribution, Q(z) = 1 − Φ(z), accurate in relative terms far into
 * the tail (where 1 − Φ(z) computed by subtraction would lose every digit).
 *
 * **Method.** For |z| < 2: Q(z) = ½ − φ(z)·(z + z³/3 + z⁵/(3·5) + …), a series of positive terms (no
 * alternating cancellation). For z ≥ 2: Laplace's continued fraction for the Mills ratio,
 * Q(z) = φ(z) / (z + 1/(z + 2/(z + 3/(z + …)))), evaluated by the modified Lentz algorithm. For z ≤ −2,
 * Q(z) = 1 − Q(−z).
 *
 * **References.** Marsaglia G. (2004) Evaluating the normal distribution. J Stat Softw 11(4):1–11 (the series).
 * Abramowitz M, Stegun IA (1964) Handbook of Mathematical Functions, 26.2.14 (the continued fraction).
 * Lentz WJ (1976) Appl Opt 15:668–671; Press WH et al. (2007) Numerical Recipes 3rd ed., §5.2 (modified Lentz).
 *
 * **Special cases.** NaN → NaN; +Infinity → 0; −Infinity → 1; underflows to 0 beyond z ≈ 38.5.
 *
 * @param z any real number
 */
export function upperNormalTail(z: number): number {
  if (Number.isNaN(z)) return NaN;
  if (z === Infinity) return 0;
  if (z === -Infinity) return 1;
  if (z <= -2) return 1 - upperNormalTail(-z);
  if (z < 2) return 0.5 - normalDensity(z) * positiveSeries(z);
  if (z > 40) return 0;
  return normalDensity(z) * millsContinuedFraction(z);
}

/** The standard normal density. */
export function normalDensity(z: number): number {
  return Math.exp(-0.5 * z * z) / Math.sqrt(2 * Math.PI);
}

/** z + z³/3 + z⁵/(3·5) + … (Marsaglia 2004): ∫₀^z φ = φ(z)·this. */
function positiveSeries(z: number): number {
  const z2 = z * z;
  let term = z;
  let sum = z;
  for (let k = 3; k < 200; k += 2) {
    term *= z2 / k;
    const next = sum + term;
    if (next === sum) break;
    sum = next;
  }
  return sum;
}

/** 1/(z + 1/(z + 2/(z + …))) by the modified Lentz algorithm. */
function millsContinuedFraction(z: number): number {
  const tiny = 1e-300;
  let f = z;
  let c = z;
  let d = 0;
  for (let k = 1; k < 500; k++) {
    d = z + k * d;
    if (d === 0) d = tiny;
    c = z + k / c;
    if (c === 0) c = tiny;
    d = 1 / d;
    const delta = c * d;
    f *= delta;
    if (Math.abs(delta - 1) < 1e-16) break;
  }
  return 1 / f;
}

/**
 * The standard normal quantile z with Q(z) = p (upper tail), found by Newton steps on `upperNormalTail` from
 * a rational starting value; relative accuracy near machine precision.
 *
 * **Method.** Start: Abramowitz & Stegun 26.2.23; refinement: Newton's method on Q(z) − p in log space
 * (d log Q/dz = −φ/Q).
 *
 * **References.** Abramowitz M, Stegun IA (1964) Handbook of Mathematical Functions, 26.2.23.
 *
 * **Special cases.** p outside [0, 1] or NaN → NaN; p = 0 → +Infinity; p = 1 → −Infinity; p = ½ → 0.
 *
 * @param p an upper-tail probability in [0, 1]
 */
export function upperNormalQuantile(p: number): number {
  if (!(p >= 0 && p <= 1)) return NaN;
  if (p === 0) return Infinity;
  if (p === 1) return -Infinity;
  if (p === 0.5) return 0;
  if (p > 0.5) return -upperNormalQuantile(1 - p);
  const t = Math.sqrt(-2 * Math.log(p));
  let z = t - (2.515517 + 0.802853 * t + 0.010328 * t * t) / (1 + 1.432788 * t + 0.189269 * t * t + 0.001308 * t * t * t);
  for (let i = 0; i < 50; i++) {
    const q = upperNormalTail(z);
    if (q === 0) break;
    const step = (Math.log(q) - Math.log(p)) * (q / normalDensity(z));
    z += step;
    if (Math.abs(step) <= 1e-15 * Math.max(1, Math.abs(z))) break;
  }
  return z;
}
