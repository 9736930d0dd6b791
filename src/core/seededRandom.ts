/**
 * A seeded pseudo-random number generator (SplitMix64) whose streams are reproducible on every platform, and
 * independent per-index streams for resampling (resample i of a seed gets its own stream, so work split into
 * chunks in any way draws exactly the same numbers).
 *
 * **Method.** SplitMix64: a 64-bit Weyl sequence (state += 0x9e3779b97f4a7c15) followed by the avalanche mix
 * z ← (z ⊕ z≫30)·0xbf58476d1ce4e5b9, z ← (z ⊕ z≫27)·0x94d049bb133111eb, output z ⊕ z≫31. JavaScript numbers
 * hold 53 bits, so the state is kept as two unsigned 32-bit halves and the 64-bit products modulo 2⁶⁴ are
 * built from 16-bit partial products (every partial product is exact in a double).
 *
 * **References.** Steele GL Jr, Lea D, Flood CH (2014) Fast splittable pseudorandom number generators.
 * Proceedings of OOPSLA '14, ACM, 453–472, doi:10.1145/2660193.2660195 (SplitMix; the mixing constants are
 * those of Stafford's "Mix13", as used by java.util.SplittableRandom). Reference stream: Rosetta Code task
 * "Pseudo-random numbers/Splitmix64" (seed 1234567: 6457827717110365317, 3203168211198807973, …).
 *
 * **Special cases.** A seed must be a whole number in [0, 2⁵³ − 1] (the integers a JavaScript number holds
 * exactly); it is read as the unsigned 64-bit integer of the same value.
 */
export class SplitMix64 {
  private hi: number;
  private lo: number;

  /**
   * @param seed a whole number in [0, 2⁵³ − 1]
   * @throws RangeError when the seed is not such a number
   */
  constructor(seed: number) {
    if (!isSeed(seed)) throw new RangeError('seed must be a whole number from 0 to 2^53 - 1');
    this.hi = Math.floor(seed / 4294967296) >>> 0;
    this.lo = seed >>> 0;
  }

  /** A generator started from a 64-bit state given as its high and low unsigned 32-bit halves. */
  static fromHalves(hi: number, lo: number): SplitMix64 {
    const g = new SplitMix64(0);
    g.hi = hi >>> 0;
    g.lo = lo >>> 0;
    return g;
  }

  /** The next 64-bit output, as [high 32 bits, low 32 bits] (unsigned). */
  nextHalves(): [number, number] {
    this.step();
    return [outHi, outLo];
  }

  /** The next 64-bit output as a BigInt (for tests and display; slower than the other methods). */
  nextBigInt(): bigint {
    this.step();
    return (BigInt(outHi) << 32n) | BigInt(outLo);
  }

  /** A double in [0, 1): the top 53 bits of the next output divided by 2⁵³. */
  nextDouble(): number {
    this.step();
    return (outHi * 2097152 + (outLo >>> 11)) / 9007199254740992;
  }

  /**
   * A whole number in [0, n): ⌊u·n⌋ for u = {@link nextDouble}. The bias against an exactly uniform draw is
   * below n/2⁵³ (under 1e-9 for n below 10⁷), far below anything a resampling estimate can show.
   *
   * @param n a whole number ≥ 1
   */
  nextIndex(n: number): number {
    this.step();
    return Math.floor(((outHi * 2097152 + (outLo >>> 11)) / 9007199254740992) * n);
  }

  private step(): void {
    // state += golden gamma (mod 2^64)
    let lo = this.lo + 0x7f4a7c15;
    const carry = lo > 0xffffffff ? 1 : 0;
    lo >>>= 0;
    const hi = (this.hi + 0x9e3779b9 + carry) >>> 0;
    this.hi = hi;
    this.lo = lo;
    mix(hi, lo);
  }
}

/**
 * The generator for resample `index` of a seeded analysis: SplitMix64 started from the index-th output of the
 * SplitMix64 stream of `seed` (output k is mix(seed + (k + 1)·γ), computed directly, so any index is reached
 * in constant time). Resample i therefore draws the same numbers whichever chunk or thread computes it.
 *
 * **Method.** As {@link SplitMix64}; the per-index state is the k-th output, the usual way of seeding one
 * generator per task from SplitMix64 (Steele, Lea & Flood 2014).
 *
 * **References.** Steele GL Jr, Lea D, Flood CH (2014), see {@link SplitMix64}.
 *
 * **Special cases.** index 0 gives the generator seeded by the first output of the seed's stream.
 *
 * @param seed a whole number in [0, 2⁵³ − 1]
 * @param index a whole number in [0, 2⁵³ − 1]
 * @throws RangeError when either is not such a number
 */
export function streamForIndex(seed: number, index: number): SplitMix64 {
  if (!isSeed(seed)) throw new RangeError('seed must be a whole number from 0 to 2^53 - 1');
  if (!isSeed(index)) throw new RangeError('index must be a whole number from 0 to 2^53 - 1');
  const k = index + 1;
  // (k·γ) mod 2^64 with k < 2^53 split into halves, then + seed.
  const kHi = Math.floor(k / 4294967296) >>> 0;
  const kLo = k >>> 0;
  mul64(kHi, kLo, 0x9e3779b9, 0x7f4a7c15);
  let lo = mulLo + (seed >>> 0);
  const carry = lo > 0xffffffff ? 1 : 0;
  lo >>>= 0;
  const hi = (mulHi + (Math.floor(seed / 4294967296) >>> 0) + carry) >>> 0;
  mix(hi, lo);
  return SplitMix64.fromHalves(outHi, outLo);
}

/**
 * Whether a value can seed {@link SplitMix64}.
 *
 * **Method.** `Number.isSafeInteger(value) && value ≥ 0`.
 *
 * **References.** None (a type check).
 *
 * **Special cases.** −0 counts as 0 (accepted); NaN, ±Infinity, fractions and 2⁵³ are refused.
 *
 * @param value anything
 */
export function isSeed(value: unknown): value is number {
  return typeof value === 'number' && Number.isSafeInteger(value) && value >= 0;
}

// Scratch registers (module-level, so the hot path allocates nothing).
let mulHi = 0;
let mulLo = 0;
let outHi = 0;
let outLo = 0;

/** (aHi:aLo)·(bHi:bLo) mod 2⁶⁴ into mulHi:mulLo. */
function mul64(aHi: number, aLo: number, bHi: number, bLo: number): void {
  const a0 = aLo & 0xffff;
  const a1 = aLo >>> 16;
  const b0 = bLo & 0xffff;
  const b1 = bLo >>> 16;
  const p00 = a0 * b0;
  const p01 = a0 * b1;
  const p10 = a1 * b0;
  const p11 = a1 * b1;
  const mid = (p00 >>> 16) + (p01 & 0xffff) + (p10 & 0xffff);
  const carryHi = p11 + (p01 >>> 16) + (p10 >>> 16) + (mid >>> 16);
  mulLo = Math.imul(aLo, bLo) >>> 0;
  mulHi = (carryHi + Math.imul(aHi, bLo) + Math.imul(aLo, bHi)) >>> 0;
}

/** The SplitMix64 output function of the state hi:lo, into outHi:outLo. */
function mix(hi: number, lo: number): void {
  // z ^= z >>> 30; z *= 0xbf58476d1ce4e5b9
  let zLo = (lo ^ ((lo >>> 30) | (hi << 2))) >>> 0;
  let zHi = (hi ^ (hi >>> 30)) >>> 0;
  mul64(zHi, zLo, 0xbf58476d, 0x1ce4e5b9);
  // z ^= z >>> 27; z *= 0x94d049bb133111eb
  zLo = (mulLo ^ ((mulLo >>> 27) | (mulHi << 5))) >>> 0;
  zHi = (mulHi ^ (mulHi >>> 27)) >>> 0;
  mul64(zHi, zLo, 0x94d049bb, 0x133111eb);
  // z ^= z >>> 31
  outLo = (mulLo ^ ((mulLo >>> 31) | (mulHi << 1))) >>> 0;
  outHi = (mulHi ^ (mulHi >>> 31)) >>> 0;
}
