/**
 * The tolerance job's random numbers: small, published generators implemented here, so a run is
 * reproducible from its seed on any machine and whatever the chunking.
 *
 * - SplitMix64: G. L. Steele, D. Lea, C. H. Flood, "Fast splittable pseudorandom number
 *   generators", OOPSLA 2014; the reference C code is S. Vigna's splitmix64.c
 *   (https://prng.di.unimi.it/splitmix64.c). Used only to seed.
 * - xoshiro128**: D. Blackman, S. Vigna, "Scrambled linear pseudorandom number generators", ACM
 *   Transactions on Mathematical Software 47(4), 2021; reference code xoshiro128starstar.c on the
 *   same site, which recommends seeding it from SplitMix64, as done here.
 * - Normal variates by the Marsaglia polar method: G. Marsaglia, T. A. Bray, "A convenient method
 *   for generating normal variables", SIAM Review 6(3), 1964.
 */

const MASK_64 = (1n << 64n) - 1n;
/** SplitMix64's increment, the odd integer nearest 2^64/φ. */
const GOLDEN_GAMMA = 0x9e3779b97f4a7c15n;

/** SplitMix64's output function (a variant of MurmurHash3's 64-bit finalizer). */
function mix64(state: bigint): bigint {
  let z = state;
  z = ((z ^ (z >> 30n)) * 0xbf58476d1ce4e5b9n) & MASK_64;
  z = ((z ^ (z >> 27n)) * 0x94d049bb133111ebn) & MASK_64;
  return z ^ (z >> 31n);
}

/** The SplitMix64 generator: a 64-bit state advanced by the golden gamma, then mixed. */
export class SplitMix64 {
  private state: bigint;

  /** Seeds with any integer (taken modulo 2^64). */
  constructor(seed: bigint) {
    this.state = BigInt.asUintN(64, seed);
  }

  /** Next 64-bit output, as an unsigned bigint. */
  next(): bigint {
    this.state = (this.state + GOLDEN_GAMMA) & MASK_64;
    return mix64(this.state);
  }
}

/** Rotates a 32-bit word left by k bits. */
function rotl32(x: number, k: number): number {
  return (x << k) | (x >>> (32 - k));
}

/** 2^-53: a 53-bit integer times this is a double in [0, 1). */
const TWO_POW_MINUS_53 = 1 / 9007199254740992;

/**
 * xoshiro128**: 128 bits of state in four 32-bit words, 32-bit outputs. Doubles are built from
 * two outputs (27 + 26 high bits: every double in [0, 1) on the 2^-53 grid, as Java's nextDouble
 * does), normal variates by the Marsaglia polar method.
 */
export class Xoshiro128StarStar {
  private s0: number;
  private s1: number;
  private s2: number;
  private s3: number;
  private spareNormal: number | undefined;

  /**
   * Starts from an explicit state (four 32-bit words, not all zero).
   * @throws RangeError for an all-zero state, from which the generator never leaves.
   */
  constructor(s0: number, s1: number, s2: number, s3: number) {
    if ((s0 | s1 | s2 | s3) === 0) throw new RangeError('xoshiro128**: all-zero state');
    this.s0 = s0 >>> 0;
    this.s1 = s1 >>> 0;
    this.s2 = s2 >>> 0;
    this.s3 = s3 >>> 0;
  }

  /** Seeds the state from two SplitMix64 outputs of `seed` (high word first of each). */
  static fromSeed(seed: bigint): Xoshiro128StarStar {
    const seeder = new SplitMix64(seed);
    const a = seeder.next();
    const b = seeder.next();
    const words = [a >> 32n, a & 0xffffffffn, b >> 32n, b & 0xffffffffn].map(Number);
    // Two SplitMix64 outputs are never both zero for consecutive states (mix64 is a bijection).
    return new Xoshiro128StarStar(words[0] ?? 1, words[1] ?? 0, words[2] ?? 0, words[3] ?? 0);
  }

  /** Next 32-bit output, an unsigned integer. */
  nextUint32(): number {
    const result = Math.imul(rotl32(Math.imul(this.s1, 5), 7), 9) >>> 0;
    const t = this.s1 << 9;
    this.s2 ^= this.s0;
    this.s3 ^= this.s1;
    this.s1 ^= this.s2;
    this.s0 ^= this.s3;
    this.s2 ^= t;
    this.s3 = rotl32(this.s3, 11);
    return result;
  }

  /** A double uniform on [0, 1), on the 2^-53 grid. */
  nextDouble(): number {
    const high = this.nextUint32() >>> 5;
    const low = this.nextUint32() >>> 6;
    return (high * 67108864 + low) * TWO_POW_MINUS_53;
  }

  /** A standard normal variate (mean 0, variance 1) by the Marsaglia polar method. */
  nextNormal(): number {
    const spare = this.spareNormal;
    if (spare !== undefined) {
      this.spareNormal = undefined;
      return spare;
    }
    for (;;) {
      const u = 2 * this.nextDouble() - 1;
      const v = 2 * this.nextDouble() - 1;
      const s = u * u + v * v;
      if (s > 0 && s < 1) {
        const factor = Math.sqrt((-2 * Math.log(s)) / s);
        this.spareNormal = v * factor;
        return u * factor;
      }
    }
  }
}

/** Draws per (sample, parameter) stream; 2^16 parameters per sample is far above any spec's. */
const STREAMS_PER_SAMPLE = 65536n;

/**
 * The random stream of one parameter of one Monte Carlo sample: xoshiro128** seeded (through
 * SplitMix64) from output number sampleIndex·2^16 + parameterIndex + 1 of SplitMix64 started at
 * `seed`. It depends on the seed and the two indices only, so a sample draws the same values
 * whichever chunk computes it, and adding a tolerance leaves the other parameters' draws alone.
 * @throws RangeError for a negative or fractional index, or a parameter index ≥ 2^16.
 */
export function sampleStream(
  seed: number,
  sampleIndex: number,
  parameterIndex: number,
): Xoshiro128StarStar {
  if (!Number.isSafeInteger(seed) || seed < 0) {
    throw new RangeError(`sampleStream: seed must be a non-negative safe integer, got ${seed}`);
  }
  if (!Number.isSafeInteger(sampleIndex) || sampleIndex < 0) {
    throw new RangeError(`sampleStream: bad sample index ${sampleIndex}`);
  }
  if (!Number.isInteger(parameterIndex) || parameterIndex < 0 || parameterIndex >= 65536) {
    throw new RangeError(`sampleStream: bad parameter index ${parameterIndex}`);
  }
  const position = BigInt(sampleIndex) * STREAMS_PER_SAMPLE + BigInt(parameterIndex) + 1n;
  const state = (BigInt(seed) + position * GOLDEN_GAMMA) & MASK_64;
  return Xoshiro128StarStar.fromSeed(mix64(state));
}
