/**
 * Reproducible random numbers for Monte Carlo propagation and for tests.
 *
 * Generator: xoshiro128** (Blackman & Vigna, 2018), state seeded from one
 * 32-bit integer through SplitMix32. Uniforms carry 53 random bits. Normal
 * deviates: Marsaglia's polar method. Gamma deviates: Marsaglia & Tsang
 * (2000), with the U^(1/a) boost for shape < 1. Student t: Bailey's polar
 * method (Math. Comp. 62 (1994) 779–781): for (U, V) uniform on the unit disc
 * and S = U² + V², T = U·√(ν(S^(−2/ν) − 1)/S) has the t distribution with ν
 * degrees of freedom.
 *
 * For Monte Carlo propagation, whole arrays are filled at once: normals by
 * the ziggurat method with 128 layers in Doornik's form (J. A. Doornik, "An
 * Improved Ziggurat Method to Generate Normal Random Samples", 2005: the
 * layer index from a uniform of its own), which needs a logarithm or an
 * exponential only in about 1 draw in 80; t deviates by Bailey's method in
 * one loop. These are streams of their own, not the same numbers as the
 * one-at-a-time methods give.
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
  /** Fills `out` with standard normal deviates (ziggurat). */
  fillNormal(out: Float64Array): void;
  /** Fills `out` with Student t deviates with ν degrees of freedom (ν = Infinity: `fillNormal`). */
  fillStudentT(out: Float64Array, degreesOfFreedom: number): void;
}

// Ziggurat tables (Doornik 2005, ZIGNOR): layer edges x₀ … x₁₂₈ (x₀ is the
// base strip's equivalent width V/f(R), x₁ = R, x₁₂₈ = 0) and the share of
// each layer that lies wholly under the density, xᵢ₊₁/xᵢ.
const ZIGGURAT_LAYERS = 128;
const ZIGGURAT_R = 3.442619855899;
const ZIGGURAT_V = 9.91256303526217e-3;
const zigguratEdges = new Float64Array(ZIGGURAT_LAYERS + 1);
const zigguratInnerShare = new Float64Array(ZIGGURAT_LAYERS);
{
  let f = Math.exp(-0.5 * ZIGGURAT_R * ZIGGURAT_R);
  zigguratEdges[0] = ZIGGURAT_V / f;
  zigguratEdges[1] = ZIGGURAT_R;
  zigguratEdges[ZIGGURAT_LAYERS] = 0;
  for (let i = 2; i < ZIGGURAT_LAYERS; i++) {
    zigguratEdges[i] = Math.sqrt(-2 * Math.log(ZIGGURAT_V / zigguratEdges[i - 1] + f));
    f = Math.exp(-0.5 * zigguratEdges[i] * zigguratEdges[i]);
  }
  for (let i = 0; i < ZIGGURAT_LAYERS; i++) zigguratInnerShare[i] = zigguratEdges[i + 1] / zigguratEdges[i];
}

function rotateLeft(value: number, bits: number): number {
  return (value << bits) | (value >>> (32 - bits));
}

export function createSeededRandom(seed: number): SeededRandom {
  return new Xoshiro128StarStar(seed);
}

// A class rather than closures over `let` variables: its fields are updated in
// place, where a closure's captured double (the spare normal) is boxed anew on
// every write, and a Monte Carlo run draws about a million deviates. The raw
// 32-bit outputs are made in blocks, with the state in local variables, and
// handed out in the same order.
class Xoshiro128StarStar implements SeededRandom {
  private s0: number;
  private s1: number;
  private s2: number;
  private s3: number;
  private readonly block = new Uint32Array(1024);
  private blockIndex = 1024;
  private spareNormal = 0;
  private hasSpareNormal = false;

  constructor(seed: number) {
    let splitMixState = seed | 0;
    const splitMix32 = () => {
      splitMixState = (splitMixState + 0x9e3779b9) | 0;
      let z = splitMixState;
      z = Math.imul(z ^ (z >>> 16), 0x85ebca6b);
      z = Math.imul(z ^ (z >>> 13), 0xc2b2ae35);
      return (z ^ (z >>> 16)) >>> 0;
    };
    // Kept as signed 32-bit integers (the same bits), which the engine stores without boxing.
    this.s0 = splitMix32() | 0;
    this.s1 = splitMix32() | 0;
    this.s2 = splitMix32() | 0;
    this.s3 = splitMix32() | 0;
    if ((this.s0 | this.s1 | this.s2 | this.s3) === 0) this.s0 = 1;
  }

  private refillBlock(): void {
    this.fillRaw(this.block);
    this.blockIndex = 0;
  }

  /** Fills `out` with the generator's next 32-bit outputs, in order, with the state in local variables. */
  private fillRaw(out: Uint32Array): void {
    let { s0, s1, s2, s3 } = this;
    for (let i = 0; i < out.length; i++) {
      out[i] = Math.imul(rotateLeft(Math.imul(s1, 5), 7), 9);
      const t = s1 << 9;
      s2 ^= s0;
      s3 ^= s1;
      s1 ^= s2;
      s0 ^= s3;
      s2 ^= t;
      s3 = rotateLeft(s3, 11);
    }
    this.s0 = s0;
    this.s1 = s1;
    this.s2 = s2;
    this.s3 = s3;
  }

  private nextUint32(): number {
    if (this.blockIndex === this.block.length) this.refillBlock();
    return this.block[this.blockIndex++];
  }

  nextUniform(): number {
    // × 2⁻⁵³ is exactly ÷ 2⁵³.
    return ((this.nextUint32() >>> 5) * 67108864 + (this.nextUint32() >>> 6)) * 1.1102230246251565e-16;
  }

  nextNormal(): number {
    if (this.hasSpareNormal) {
      this.hasSpareNormal = false;
      return this.spareNormal;
    }
    let u: number;
    let v: number;
    let s: number;
    do {
      u = 2 * this.nextUniform() - 1;
      v = 2 * this.nextUniform() - 1;
      s = u * u + v * v;
    } while (s >= 1 || s === 0);
    const factor = Math.sqrt((-2 * Math.log(s)) / s);
    this.spareNormal = v * factor;
    this.hasSpareNormal = true;
    return u * factor;
  }

  nextGamma(shape: number): number {
    if (shape < 1) {
      let u = this.nextUniform();
      while (u === 0) u = this.nextUniform();
      return this.nextGamma(shape + 1) * Math.pow(u, 1 / shape);
    }
    const d = shape - 1 / 3;
    const c = 1 / Math.sqrt(9 * d);
    for (;;) {
      let x: number;
      let v: number;
      do {
        x = this.nextNormal();
        v = 1 + c * x;
      } while (v <= 0);
      v = v * v * v;
      const u = this.nextUniform();
      if (u < 1 - 0.0331 * x * x * x * x) return d * v;
      if (Math.log(u) < 0.5 * x * x + d * (1 - v + Math.log(v))) return d * v;
    }
  }

  nextStudentT(degreesOfFreedom: number): number {
    if (degreesOfFreedom === Infinity) return this.nextNormal();
    // Bailey's polar method: one point of the unit disc gives one exact t deviate, where
    // Z/√(χ²/ν) needs a normal and a gamma deviate (about twice the work per draw).
    let u: number;
    let s: number;
    do {
      u = 2 * this.nextUniform() - 1;
      const v = 2 * this.nextUniform() - 1;
      s = u * u + v * v;
    } while (s >= 1 || s === 0);
    // ν·(s^(−2/ν) − 1) through expm1, which keeps its digits when ν is large.
    return u * Math.sqrt((degreesOfFreedom * Math.expm1((-2 / degreesOfFreedom) * Math.log(s))) / s);
  }

  /** Uniforms for the fill methods: made in blocks with the state in local variables, used from `uniformAt`. */
  private readonly uniforms = new Float64Array(4096);
  private uniformAt = 4096;

  /** Raw outputs behind `uniforms`, two per uniform. */
  private readonly uniformBits = new Uint32Array(2 * 4096);

  /** Refills `uniforms`, each from two 32-bit outputs as in `nextUniform`. */
  private refillUniforms(): void {
    const uniforms = this.uniforms;
    const bits = this.uniformBits;
    this.fillRaw(bits);
    for (let i = 0; i < uniforms.length; i++) {
      uniforms[i] = ((bits[2 * i] >>> 5) * 67108864 + (bits[2 * i + 1] >>> 6)) * 1.1102230246251565e-16;
    }
    this.uniformAt = 0;
  }

  fillNormal(out: Float64Array): void {
    const edges = zigguratEdges;
    const innerShare = zigguratInnerShare;
    const uniforms = this.uniforms;
    let at = this.uniformAt;
    for (let n = 0; n < out.length; n++) {
      for (;;) {
        if (at + 3 > uniforms.length) {
          this.refillUniforms();
          at = 0;
        }
        const u = 2 * uniforms[at++] - 1;
        // The layer from a uniform of its own (Doornik's correction of the original method).
        const layer = (uniforms[at++] * ZIGGURAT_LAYERS) | 0;
        // Wholly under the density: about 98.8 % of draws end here.
        if (Math.abs(u) < innerShare[layer]) {
          out[n] = u * edges[layer];
          break;
        }
        if (layer === 0) {
          this.uniformAt = at;
          out[n] = this.normalTail(u < 0);
          at = this.uniformAt;
          break;
        }
        const x = u * edges[layer];
        const above = Math.exp(-0.5 * (edges[layer] * edges[layer] - x * x));
        const below = Math.exp(-0.5 * (edges[layer + 1] * edges[layer + 1] - x * x));
        if (below + uniforms[at++] * (above - below) < 1) {
          out[n] = x;
          break;
        }
      }
    }
    this.uniformAt = at;
  }

  /** The next of the fill methods' uniforms. */
  private fillUniform(): number {
    if (this.uniformAt === this.uniforms.length) this.refillUniforms();
    return this.uniforms[this.uniformAt++];
  }

  /** A normal deviate beyond ±R (Marsaglia's tail method). */
  private normalTail(negative: boolean): number {
    let x: number;
    let y: number;
    do {
      x = Math.log(this.fillUniform()) / ZIGGURAT_R;
      y = Math.log(this.fillUniform());
    } while (!(-2 * y >= x * x));
    return negative ? x - ZIGGURAT_R : ZIGGURAT_R - x;
  }

  fillStudentT(out: Float64Array, degreesOfFreedom: number): void {
    if (degreesOfFreedom === Infinity) {
      this.fillNormal(out);
      return;
    }
    const exponent = -2 / degreesOfFreedom;
    const uniforms = this.uniforms;
    let at = this.uniformAt;
    for (let n = 0; n < out.length; n++) {
      let u: number;
      let s: number;
      do {
        if (at + 2 > uniforms.length) {
          this.refillUniforms();
          at = 0;
        }
        u = 2 * uniforms[at++] - 1;
        const v = 2 * uniforms[at++] - 1;
        s = u * u + v * v;
      } while (s >= 1 || s === 0);
      out[n] = u * Math.sqrt((degreesOfFreedom * Math.expm1(exponent * Math.log(s))) / s);
    }
    this.uniformAt = at;
  }
}
