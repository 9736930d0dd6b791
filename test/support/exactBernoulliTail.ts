/**
 * P(Σ wᵢBᵢ ≥ t) in exact rational arithmetic for p = a/2ᵐ: the generating function Π ((2ᵐ − a) + a·x^wᵢ)
 * expanded in BigInt (integer coefficients, no rounding), then one division to ~36 significant bits beyond
 * double precision. An independent route for tests: no floating point until the final quotient.
 */
export function exactBernoulliTail(weights: readonly number[], t: number, a: bigint, m: bigint): number {
  const b = (1n << m) - a;
  const total = weights.reduce((x, y) => x + y, 0);
  let f: bigint[] = new Array(total + 1).fill(0n);
  f[0] = 1n;
  let reach = 0;
  for (const w of weights) {
    const g: bigint[] = new Array(total + 1).fill(0n);
    for (let s = 0; s <= reach; s++) {
      if (f[s] === 0n) continue;
      g[s] += f[s] * b;
      g[s + w] += f[s] * a;
    }
    reach += w;
    f = g;
  }
  let numerator = 0n;
  for (let s = Math.max(0, Math.ceil(t)); s <= total; s++) numerator += f[s];
  if (numerator === 0n) return 0;
  const shiftBits = m * BigInt(weights.length);
  const extra = BigInt(Math.max(0, Number(shiftBits) - numerator.toString(2).length + 120));
  return Number((numerator << extra) >> shiftBits) * 2 ** -Number(extra);
}
