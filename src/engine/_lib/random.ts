// Seeded pseudo-random numbers: xoshiro128** (Blackman & Vigna, "Scrambled linear pseudorandom
// number generators", ACM TOMS 47(4), 2021), seeded through splitmix32. Same seed → same stream
// on every platform (only 32-bit integer arithmetic is used).
import erfcinv from "@stdlib/math-base-special-erfcinv";

// Module-level copies: a global lookup per call (Math.imul) is slow where the engine runs inside a
// sandboxed context (jest's, some hosts'); a module constant is not.
const imul = Math.imul;
const SQRT2 = Math.SQRT2;
const trunc = Math.trunc;

/** A seeded generator of uniforms in (0, 1) and standard normals. */
export interface Random {
  /** Uniform in the open interval (0, 1), with 53 random bits. */
  uniform(): number;
  /** Standard normal, by inversion of the uniform (exact to the quantile function's accuracy). */
  normal(): number;
}

/**
 * Creates a seeded generator. Any finite seed is accepted; it is reduced to 32 bits.
 * @example createRandom(42).uniform() // the same number every time
 */
export function createRandom(seed: number): Random {
  let x = (trunc(seed) >>> 0) ^ 0x9e3779b9;
  const split = (): number => {
    x = (x + 0x9e3779b9) | 0;
    let z = x;
    z = imul(z ^ (z >>> 16), 0x85ebca6b);
    z = imul(z ^ (z >>> 13), 0xc2b2ae35);
    return (z ^ (z >>> 16)) >>> 0;
  };
  let s0 = split(), s1 = split(), s2 = split(), s3 = split();
  if ((s0 | s1 | s2 | s3) === 0) s0 = 1;
  const next = (): number => {
    const result = imul(rotl(imul(s1, 5), 7), 9) >>> 0;
    const t = s1 << 9;
    s2 ^= s0;
    s3 ^= s1;
    s1 ^= s2;
    s0 ^= s3;
    s2 ^= t;
    s3 = rotl(s3, 11);
    return result;
  };
  const uniform = (): number => {
    // 53 bits: 27 from one draw and 26 from the next; +0.5 keeps it off 0.
    const a = next() >>> 5;
    const b = next() >>> 6;
    return (a * 67108864 + b + 0.5) / 9007199254740992;
  };
  return {
    uniform,
    normal: () => -SQRT2 * erfcinv(2 * uniform()),
  };
}

function rotl(v: number, k: number): number {
  return (v << k) | (v >>> (32 - k));
}
