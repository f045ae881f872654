/**
 * Reproducible random numbers for Monte Carlo propagation and for tests.
 *
 * Generator: xoshiro128** (Blackman & Vigna, 2018), state seeded from one
 * 32-bit integer through SplitMix32. Uniforms carry 53 random bits. Normal
 * deviates: Marsaglia's polar method. Gamma deviates: Marsaglia & Tsang
 * (2000), with the U^(1/a) boost for shape < 1. Student t: Z / √(χ²_ν / ν).
 */
export interface SeededRandom {
  /** Uniform on [0, 1). */
  nextUniform(): number;
  /** Standard normal. */
  nextNormal(): number;
  /** Gamma with the given shape and unit scale. */
  nextGamma(shape: number): number;
  /** Student t with ν degrees of freedom (ν = Infinity: standard normal). */
  nextStudentT(degreesOfFreedom: number): number;
}

function rotateLeft(value: number, bits: number): number {
  return (value << bits) | (value >>> (32 - bits));
}

export function createSeededRandom(seed: number): SeededRandom {
  let splitMixState = seed | 0;
  const splitMix32 = () => {
    splitMixState = (splitMixState + 0x9e3779b9) | 0;
    let z = splitMixState;
    z = Math.imul(z ^ (z >>> 16), 0x85ebca6b);
    z = Math.imul(z ^ (z >>> 13), 0xc2b2ae35);
    return (z ^ (z >>> 16)) >>> 0;
  };
  let s0 = splitMix32();
  let s1 = splitMix32();
  let s2 = splitMix32();
  let s3 = splitMix32();
  if ((s0 | s1 | s2 | s3) === 0) s0 = 1;

  const nextUint32 = () => {
    const result = Math.imul(rotateLeft(Math.imul(s1, 5), 7), 9) >>> 0;
    const t = s1 << 9;
    s2 ^= s0;
    s3 ^= s1;
    s1 ^= s2;
    s0 ^= s3;
    s2 ^= t;
    s3 = rotateLeft(s3, 11);
    return result;
  };
  const nextUniform = () => ((nextUint32() >>> 5) * 67108864 + (nextUint32() >>> 6)) / 9007199254740992;

  let spareNormal: number | null = null;
  const nextNormal = () => {
    if (spareNormal !== null) {
      const value = spareNormal;
      spareNormal = null;
      return value;
    }
    let u: number;
    let v: number;
    let s: number;
    do {
      u = 2 * nextUniform() - 1;
      v = 2 * nextUniform() - 1;
      s = u * u + v * v;
    } while (s >= 1 || s === 0);
    const factor = Math.sqrt((-2 * Math.log(s)) / s);
    spareNormal = v * factor;
    return u * factor;
  };

  const nextGamma = (shape: number): number => {
    if (shape < 1) {
      let u = nextUniform();
      while (u === 0) u = nextUniform();
      return nextGamma(shape + 1) * Math.pow(u, 1 / shape);
    }
    const d = shape - 1 / 3;
    const c = 1 / Math.sqrt(9 * d);
    for (;;) {
      let x: number;
      let v: number;
      do {
        x = nextNormal();
        v = 1 + c * x;
      } while (v <= 0);
      v = v * v * v;
      const u = nextUniform();
      if (u < 1 - 0.0331 * x * x * x * x) return d * v;
      if (Math.log(u) < 0.5 * x * x + d * (1 - v + Math.log(v))) return d * v;
    }
  };

  const nextStudentT = (degreesOfFreedom: number) => {
    const z = nextNormal();
    if (degreesOfFreedom === Infinity) return z;
    const chiSquare = 2 * nextGamma(degreesOfFreedom / 2);
    return z / Math.sqrt(chiSquare / degreesOfFreedom);
  };

  return { nextUniform, nextNormal, nextGamma, nextStudentT };
}
