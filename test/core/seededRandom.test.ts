import { describe, expect, test } from 'vitest';
import fc from 'fast-check';
import { SplitMix64, isSeed, streamForIndex } from '../../src/core/seededRandom';

const MASK = (1n << 64n) - 1n;
const GAMMA = 0x9e3779b97f4a7c15n;

/** SplitMix64 written directly with BigInt (an independent transcription of the published algorithm). */
function bigMix(state: bigint): bigint {
  let z = state & MASK;
  z = ((z ^ (z >> 30n)) * 0xbf58476d1ce4e5b9n) & MASK;
  z = ((z ^ (z >> 27n)) * 0x94d049bb133111ebn) & MASK;
  return z ^ (z >> 31n);
}

describe('published reference stream', () => {
  test('seed 1234567 gives the first five outputs of the published stream', () => {
    // Rosetta Code, "Pseudo-random numbers/Splitmix64" (task statement), seed 1234567
    const g = new SplitMix64(1234567);
    expect([1, 2, 3, 4, 5].map(() => g.nextBigInt())).toEqual([
      6457827717110365317n,
      3203168211198807973n,
      9817491932198370423n,
      4593380528125082431n,
      16408922859458223821n,
    ]);
  });
  test('seed 987654321: counts of floor(5u) over 100,000 draws match the published table', () => {
    // Rosetta Code, "Pseudo-random numbers/Splitmix64", second part of the task (values recalled from memory)
    const g = new SplitMix64(987654321);
    const counts = [0, 0, 0, 0, 0];
    for (let i = 0; i < 100_000; i++) counts[Math.floor(g.nextDouble() * 5)]++;
    expect(counts).toEqual([20027, 19892, 20073, 19978, 20030]);
  });
});

describe('reference values: an independent BigInt transcription', () => {
  test('the 32-bit-halves arithmetic equals 64-bit integer arithmetic for many seeds', () => {
    fc.assert(
      fc.property(fc.integer({ min: 0, max: Number.MAX_SAFE_INTEGER }), (seed) => {
        const g = new SplitMix64(seed);
        let state = BigInt(seed);
        for (let i = 0; i < 20; i++) {
          state = (state + GAMMA) & MASK;
          expect(g.nextBigInt()).toBe(bigMix(state));
        }
      }),
      { numRuns: 200 },
    );
  });
  test('streamForIndex(seed, i) starts from output i of the seed stream', () => {
    fc.assert(
      fc.property(fc.integer({ min: 0, max: Number.MAX_SAFE_INTEGER }), fc.integer({ min: 0, max: Number.MAX_SAFE_INTEGER - 1 }), (seed, index) => {
        const childState = bigMix((BigInt(seed) + BigInt(index + 1) * GAMMA) & MASK);
        const g = streamForIndex(seed, index);
        expect(g.nextBigInt()).toBe(bigMix((childState + GAMMA) & MASK));
      }),
      { numRuns: 200 },
    );
  });
  test('streamForIndex(seed, i) for i = 0..4 equals the outputs of new SplitMix64(seed) used as states', () => {
    const parent = new SplitMix64(42);
    for (let i = 0; i < 5; i++) {
      const [hi, lo] = parent.nextHalves();
      expect(streamForIndex(42, i).nextDouble()).toBe(SplitMix64.fromHalves(hi, lo).nextDouble());
    }
  });
});

describe('special values', () => {
  test('seed 0 and the largest safe integer are accepted', () => {
    expect(() => new SplitMix64(0)).not.toThrow();
    expect(() => new SplitMix64(Number.MAX_SAFE_INTEGER)).not.toThrow();
  });
  test('nextDouble is in [0, 1) and nextIndex(n) in [0, n)', () => {
    const g = new SplitMix64(7);
    for (let i = 0; i < 10_000; i++) {
      const u = g.nextDouble();
      expect(u >= 0 && u < 1).toBe(true);
      const k = g.nextIndex(3);
      expect(k === 0 || k === 1 || k === 2).toBe(true);
    }
  });
});

describe('invariants', () => {
  test('a fixed seed reproduces the same stream', () => {
    fc.assert(
      fc.property(fc.integer({ min: 0, max: 2 ** 40 }), (seed) => {
        const a = new SplitMix64(seed);
        const b = new SplitMix64(seed);
        for (let i = 0; i < 10; i++) expect(a.nextDouble()).toBe(b.nextDouble());
      }),
    );
  });
});

describe('validation', () => {
  test.each([-1, 0.5, NaN, Infinity, 2 ** 53])('seed %s is refused', (seed) => {
    expect(() => new SplitMix64(seed)).toThrow(RangeError);
    expect(() => streamForIndex(seed, 0)).toThrow(RangeError);
    expect(isSeed(seed)).toBe(false);
  });
  test('a negative index is refused', () => {
    expect(() => streamForIndex(1, -1)).toThrow(RangeError);
  });
});
