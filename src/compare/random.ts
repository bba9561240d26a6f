/**
 * A seeded pseudo-random generator for the Monte Carlo: xoshiro128** 1.1
 * (Blackman & Vigna 2021, "Scrambled linear pseudorandom number generators",
 * ACM Trans. Math. Softw. 47, 36), a 128-bit-state generator of 32-bit words
 * that passes the usual statistical batteries and runs on 32-bit integer
 * arithmetic, which JavaScript does exactly (Math.imul, >>>). Its state is
 * filled from the seed by SplitMix64 (Steele, Lea & Flood 2014, "Fast
 * splittable pseudorandom number generators", OOPSLA '14), as the generator's
 * authors advise, so that nearby seeds give unrelated streams.
 *
 * On top: uniform doubles with 53 random bits, normal deviates by Marsaglia's
 * polar method (Marsaglia & Bray 1964, SIAM Review 6, 260), and split-normal
 * deviates for asymmetric errors (see {@link Random.splitNormal}).
 */
import { InputError } from '../core/errors.js';

const MASK64 = (1n << 64n) - 1n;

/**
 * SplitMix64 output function: advances a 64-bit state by the golden-ratio
 * increment and returns the mixed value (Steele, Lea & Flood 2014). BigInt is
 * used, which is slow but runs only when a generator is seeded.
 * Returns `[next state, output]`.
 */
export function splitMix64(state: bigint): [bigint, bigint] {
  const s = (state + 0x9e3779b97f4a7c15n) & MASK64;
  let z = s;
  z = ((z ^ (z >> 30n)) * 0xbf58476d1ce4e5b9n) & MASK64;
  z = ((z ^ (z >> 27n)) * 0x94d049bb133111ebn) & MASK64;
  return [s, z ^ (z >> 31n)];
}

function rotl(x: number, k: number): number {
  return (x << k) | (x >>> (32 - k));
}

/** 2^-53, the spacing of the uniform doubles. */
const TWO_POW_M53 = 1 / 9007199254740992;

/**
 * The generator. Not cryptographic. One instance is one stream; the same seed
 * gives the same stream on every platform (integer arithmetic only, and
 * Math.log/sqrt for the deviates, which are correctly rounded in practice).
 *
 * @example
 * const rng = new Random(1);
 * const u = rng.uniform();      // in [0, 1)
 * const z = rng.normal();       // standard normal
 */
export class Random {
  private readonly s = new Uint32Array(4);
  private spare = 0;
  private hasSpare = false;

  /**
   * @param seed a non-negative integer below 2^53 (SplitMix64 fills the 128-bit
   *   state from it), or an explicit 4-word state (for reference vectors; not all zero).
   * @param stream a small non-negative integer naming an independent stream of the
   *   same seed (0 is the plain seed); ignored for an explicit state.
   */
  constructor(seed: number | readonly [number, number, number, number], stream = 0) {
    if (typeof seed === 'number') {
      if (!(Number.isSafeInteger(seed) && seed >= 0)) {
        throw new InputError(`seed is ${seed}, expected an integer from 0 to 2^53 - 1`, { keyword: 'seed' });
      }
      // A stream number moves the SplitMix64 starting point by an odd 64-bit
      // constant, giving unrelated streams for the parts of one run.
      let st = (BigInt(seed) + BigInt(stream >>> 0) * 0x632be59bd9b4e019n) & MASK64;
      for (let i = 0; i < 2; i++) {
        const [next, out] = splitMix64(st);
        st = next;
        this.s[2 * i] = Number(out & 0xffffffffn);
        this.s[2 * i + 1] = Number(out >> 32n);
      }
    } else {
      for (let i = 0; i < 4; i++) this.s[i] = seed[i] >>> 0;
    }
    if ((this.s[0] | this.s[1] | this.s[2] | this.s[3]) === 0) {
      // The all-zero state is a fixed point of the linear engine.
      throw new InputError('the generator state is all zero', { keyword: 'seed' }, 'choose another seed');
    }
  }

  /** Next 32-bit output as an unsigned integer (xoshiro128** 1.1, the authors' next()). */
  nextUint32(): number {
    const s = this.s;
    const result = Math.imul(rotl(Math.imul(s[1], 5), 7), 9) >>> 0;
    const t = s[1] << 9;
    s[2] ^= s[0];
    s[3] ^= s[1];
    s[1] ^= s[2];
    s[0] ^= s[3];
    s[2] ^= t;
    s[3] = rotl(s[3], 11);
    return result;
  }

  /** Uniform double in [0, 1) with 53 random bits (two outputs: top 27 and top 26 bits). */
  uniform(): number {
    const a = this.nextUint32() >>> 5, b = this.nextUint32() >>> 6;
    return (a * 67108864 + b) * TWO_POW_M53;
  }

  /**
   * Standard normal deviate by Marsaglia's polar method (Marsaglia & Bray 1964):
   * draw (v1, v2) uniform in the unit disc, s = v1^2 + v2^2, then
   * v1 sqrt(-2 ln s / s) and v2 sqrt(-2 ln s / s) are independent N(0, 1).
   * The second one is kept for the next call.
   */
  normal(): number {
    if (this.hasSpare) {
      this.hasSpare = false;
      return this.spare;
    }
    let v1: number, v2: number, s: number;
    do {
      v1 = 2 * this.uniform() - 1;
      v2 = 2 * this.uniform() - 1;
      s = v1 * v1 + v2 * v2;
    } while (s >= 1 || s === 0);
    const f = Math.sqrt((-2 * Math.log(s)) / s);
    this.spare = v2 * f;
    this.hasSpare = true;
    return v1 * f;
  }

  /**
   * Split-normal deviate (Wallis 2014, Statistical Science 29, 106, eq. 1): the
   * density is A exp(-(x - mode)^2 / (2 sigmaLow^2)) below the mode and
   * A exp(-(x - mode)^2 / (2 sigmaHigh^2)) above, A = sqrt(2/pi) / (sigmaLow + sigmaHigh),
   * so the mode is the most probable value, the side below carries probability
   * sigmaLow / (sigmaLow + sigmaHigh) and the side above sigmaHigh / (sigmaLow + sigmaHigh).
   * Drawn as: pick the side with those probabilities, then mode -/+ sigma |z|.
   * This is how skyspan reads a value quoted as "mode -sigmaLow +sigmaHigh".
   * sigmaLow = sigmaHigh gives the normal distribution. Sigmas must be >= 0.
   */
  splitNormal(mode: number, sigmaLow: number, sigmaHigh: number): number {
    const total = sigmaLow + sigmaHigh;
    if (total === 0) return mode;
    const z = Math.abs(this.normal());
    return this.uniform() * total < sigmaLow ? mode - sigmaLow * z : mode + sigmaHigh * z;
  }

  /** Uniform integer in [0, n) for 1 <= n <= 2^32 (modulo after rejecting the incomplete top range, so every value is equally likely; common practice, no source). */
  integer(n: number): number {
    if (!(n >= 1 && n <= 4294967296 && Number.isInteger(n))) throw new RangeError(`integer(n): n = ${n} out of range`);
    const limit = 4294967296 - (4294967296 % n);
    let x: number;
    do { x = this.nextUint32(); } while (x >= limit);
    return x % n;
  }

  /** Copy of the 4-word state (for tests and for reporting a run's starting point). */
  state(): [number, number, number, number] {
    return [this.s[0], this.s[1], this.s[2], this.s[3]];
  }
}
