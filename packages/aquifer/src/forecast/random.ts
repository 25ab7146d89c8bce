/**
 * A small seeded pseudo-random generator for reproducible Monte Carlo: xoshiro128** (Blackman and Vigna 2018)
 * seeded by SplitMix64 (Steele, Lea and Flood 2014), uniform doubles with 53 random bits, and standard normal
 * deviates by the Marsaglia polar method (Marsaglia and Bray 1964).
 *
 * Only integer operations (Math.imul, shifts, BigInt for seeding) and IEEE arithmetic decide the uniform stream, so
 * the same seed gives the same uniforms everywhere. The normals also use Math.log and Math.sqrt: sqrt is
 * correctly rounded by the standard; log is not required to be, so normal deviates are bit-identical on the same
 * JavaScript engine (V8 everywhere for Node and Chromium) and may differ in the last bit between engines.
 *
 * Sources: Blackman, D. and Vigna, S. (2018), "Scrambled linear pseudorandom number generators", ACM TOMS 47(4)
 * (2021), reference code xoshiro128starstar.c; Steele, G.L., Lea, D. and Flood, C.H. (2014), "Fast splittable
 * pseudorandom number generators", OOPSLA; Marsaglia, G. and Bray, T.A. (1964), SIAM Review 6(3), 260-264.
 */

const MASK64 = (1n << 64n) - 1n;

/** SplitMix64 step: returns [next state, output], both 64-bit unsigned BigInts. */
function splitMix64(state: bigint): [bigint, bigint] {
  const next = (state + 0x9e3779b97f4a7c15n) & MASK64;
  let z = next;
  z = ((z ^ (z >> 30n)) * 0xbf58476d1ce4e5b9n) & MASK64;
  z = ((z ^ (z >> 27n)) * 0x94d049bb133111ebn) & MASK64;
  return [next, z ^ (z >> 31n)];
}

function rotl(x: number, k: number): number {
  return ((x << k) | (x >>> (32 - k))) >>> 0;
}

/** A seeded stream of uniform and normal deviates. */
export interface RandomStream {
  /** Next 32-bit unsigned integer of xoshiro128**. */
  nextUint32(): number;
  /** Uniform double in [0, 1) with 53 random bits. */
  nextUniform(): number;
  /** Standard normal deviate (mean 0, variance 1). */
  nextNormal(): number;
}

/**
 * A random stream for an integer seed (any safe integer, negative allowed). The four 32-bit words of state are
 * the high and low halves of two SplitMix64 outputs from the seed (taken modulo 2^64). Source: as in the module.
 */
export function seededRandom(seed: number): RandomStream {
  if (!Number.isSafeInteger(seed)) {
    throw new RangeError(`seededRandom: seed is ${seed}; give an integer between -(2^53 - 1) and 2^53 - 1.`);
  }
  let sm = BigInt.asUintN(64, BigInt(seed));
  const words: number[] = [];
  for (let k = 0; k < 2; k++) {
    const [next, out] = splitMix64(sm);
    sm = next;
    words.push(Number(out >> 32n), Number(out & 0xffffffffn));
  }
  const s = Uint32Array.from(words);
  if (s[0] === 0 && s[1] === 0 && s[2] === 0 && s[3] === 0) s[0] = 1;
  let spare: number | null = null;

  const nextUint32 = (): number => {
    const result = Math.imul(rotl(Math.imul(s[1]!, 5) >>> 0, 7), 9) >>> 0;
    const t = (s[1]! << 9) >>> 0;
    s[2]! ^= s[0]!;
    s[3]! ^= s[1]!;
    s[1]! ^= s[2]!;
    s[0]! ^= s[3]!;
    s[2]! ^= t;
    s[3] = rotl(s[3]!, 11);
    return result;
  };
  const nextUniform = (): number => {
    const a = nextUint32() >>> 5;
    const b = nextUint32() >>> 6;
    return (a * 67108864 + b) / 9007199254740992;
  };
  const nextNormal = (): number => {
    if (spare !== null) {
      const value = spare;
      spare = null;
      return value;
    }
    for (;;) {
      const u = 2 * nextUniform() - 1;
      const v = 2 * nextUniform() - 1;
      const q = u * u + v * v;
      if (q > 0 && q < 1) {
        const factor = Math.sqrt((-2 * Math.log(q)) / q);
        spare = v * factor;
        return u * factor;
      }
    }
  };
  return { nextUint32, nextUniform, nextNormal };
}

