// Seeded pseudo-random numbers for Monte Carlo sweeps.
//
// Generator: xoshiro128** by D. Blackman and S. Vigna ("Scrambled linear pseudorandom number
// generators", ACM Transactions on Mathematical Software 47(4), 2021; public-domain reference code
// xoshiro128starstar.c): 128 bits of state, 32-bit outputs, period 2^128 − 1.
// Seeding: SplitMix64 (G. Steele, D. Lea, C. Flood, "Fast splittable pseudorandom number generators",
// OOPSLA 2014), as the xoshiro authors recommend, fills the state from a 64-bit key.
//
// Every Monte Carlo sample gets its own generator, keyed by (seed, sample index): a sample's values
// do not depend on which worker runs it, on the number of workers or on the shard.

const MASK64 = (1n << 64n) - 1n;

/** SplitMix64: the next output and state from a 64-bit state (BigInt, used only for seeding). */
export function splitMix64(state: bigint): { value: bigint; state: bigint } {
  const s = (state + 0x9e3779b97f4a7c15n) & MASK64;
  let z = s;
  z = ((z ^ (z >> 30n)) * 0xbf58476d1ce4e5b9n) & MASK64;
  z = ((z ^ (z >> 27n)) * 0x94d049bb133111ebn) & MASK64;
  return { value: z ^ (z >> 31n), state: s };
}

export class Xoshiro128ss {
  private s0: number;
  private s1: number;
  private s2: number;
  private s3: number;

  /** From four 32-bit words (not all zero). */
  constructor(state: readonly [number, number, number, number]) {
    [this.s0, this.s1, this.s2, this.s3] = state.map((x) => x >>> 0) as [number, number, number, number];
    if ((this.s0 | this.s1 | this.s2 | this.s3) === 0) throw new RangeError('xoshiro128**: the state must not be all zero');
  }

  /** The generator for sample `sample` of a run seeded with `seed` (both whole numbers ≥ 0). */
  static forSample(seed: number, sample: number): Xoshiro128ss {
    if (!Number.isSafeInteger(seed) || seed < 0) throw new RangeError(`seed must be a whole number ≥ 0, got ${seed}`);
    // Key: seed in the high 32 bits (mixed if larger), sample index in the low 32 bits.
    let st = ((BigInt(seed) << 32n) ^ BigInt(sample >>> 0)) & MASK64;
    const words: number[] = [];
    for (let k = 0; k < 2; k++) {
      const r = splitMix64(st);
      st = r.state;
      words.push(Number(r.value & 0xffffffffn), Number(r.value >> 32n));
    }
    if ((words[0]! | words[1]! | words[2]! | words[3]!) === 0) words[0] = 1;
    return new Xoshiro128ss(words as [number, number, number, number]);
  }

  get state(): [number, number, number, number] {
    return [this.s0, this.s1, this.s2, this.s3];
  }

  /** Next 32-bit output (unsigned). */
  nextUint32(): number {
    const s1 = this.s1;
    const result = Math.imul(rotl(Math.imul(s1, 5), 7), 9) >>> 0;
    const t = s1 << 9;
    this.s2 ^= this.s0;
    this.s3 ^= this.s1;
    this.s1 ^= this.s2;
    this.s0 ^= this.s3;
    this.s2 ^= t;
    this.s3 = rotl(this.s3, 11);
    this.s0 >>>= 0;
    this.s1 >>>= 0;
    this.s2 >>>= 0;
    this.s3 >>>= 0;
    return result;
  }

  /** Uniform in [0, 1) with 53 random bits (two outputs). */
  nextFloat(): number {
    const hi = this.nextUint32() >>> 5; // 27 bits
    const lo = this.nextUint32() >>> 6; // 26 bits
    return (hi * 67108864 + lo) / 9007199254740992;
  }

  /** Uniform in [−1, 1). */
  nextSigned(): number {
    return 2 * this.nextFloat() - 1;
  }

  /**
   * Standard normal deviate by the Box–Muller transform (G. E. P. Box, M. E. Muller, "A note on the
   * generation of random normal deviates", Ann. Math. Statist. 29, 1958): one of the pair is used.
   */
  nextNormal(): number {
    const u1 = 1 - this.nextFloat(); // (0, 1]
    const u2 = this.nextFloat();
    return Math.sqrt(-2 * Math.log(u1)) * Math.cos(2 * Math.PI * u2);
  }
}

function rotl(x: number, k: number): number {
  return (x << k) | (x >>> (32 - k));
}
