/**
 * Seeded pseudo-random numbers for the synthetic bench. xoshiro128** (Blackman
 * & Vigna, 2018) seeded through splitmix32, so that every frame owns its own
 * stream derived from (scenario seed, sweep, frame, purpose) and the output
 * does not depend on the order or concurrency in which frames are rendered.
 */
export interface SeededRandom {
  /** Uniform on [0, 1). */
  uniform(): number;
  /** Standard normal deviate (ziggurat method, Marsaglia & Tsang, J. Stat. Software 5(8), 2000, 128 layers). */
  normal(): number;
  /** Poisson deviate; exact (Knuth's product method) for small means, normal approximation above 30. */
  poisson(mean: number): number;
  /** Fills a byte array with uniform random bytes. */
  fillBytes(bytes: Uint8Array): void;
}

const ZIGGURAT_R = 3.442619855899;

/** Layer tables of the 128-layer ziggurat for the standard normal (Marsaglia & Tsang 2000, their constants). */
const ZIGGURAT = (() => {
  const layers = 128;
  const scale = 2 ** 24;
  const area = 9.91256303526217e-3;
  const k = new Float64Array(layers);
  const w = new Float64Array(layers);
  const f = new Float64Array(layers);
  let dn = ZIGGURAT_R;
  let tn = dn;
  const q = area / Math.exp(-0.5 * dn * dn);
  k[0] = (dn / q) * scale;
  k[1] = 0;
  w[0] = q / scale;
  w[layers - 1] = dn / scale;
  f[0] = 1;
  f[layers - 1] = Math.exp(-0.5 * dn * dn);
  for (let i = layers - 2; i >= 1; i--) {
    dn = Math.sqrt(-2 * Math.log(area / dn + Math.exp(-0.5 * dn * dn)));
    k[i + 1] = (dn / tn) * scale;
    tn = dn;
    f[i] = Math.exp(-0.5 * dn * dn);
    w[i] = dn / scale;
  }
  return { k, w, f };
})();

function splitmix32(state: number): () => number {
  let s = state >>> 0;
  return () => {
    s = (s + 0x9e3779b9) >>> 0;
    let z = s;
    z = Math.imul(z ^ (z >>> 16), 0x85ebca6b) >>> 0;
    z = Math.imul(z ^ (z >>> 13), 0xc2b2ae35) >>> 0;
    return (z ^ (z >>> 16)) >>> 0;
  };
}

/** Mixes any number of integer keys into one 32-bit seed. */
export function mixSeed(...keys: number[]): number {
  let h = 0x2545f491;
  for (const key of keys) {
    const next = splitmix32((h ^ Math.imul(key | 0, 0x27d4eb2d)) >>> 0);
    h = next() ^ next();
  }
  return h >>> 0;
}

export function createSeededRandom(...keys: number[]): SeededRandom {
  const init = splitmix32(mixSeed(...keys));
  // State in a typed array keeps the arithmetic in 32-bit integers (no boxed doubles).
  const state = new Uint32Array([init(), init(), init(), init()]);
  if ((state[0] | state[1] | state[2] | state[3]) === 0) state[0] = 1;

  const nextUint32 = (): number => {
    const s1 = state[1];
    const product = Math.imul(s1, 5);
    const result = Math.imul((product << 7) | (product >>> 25), 9) >>> 0;
    const t = s1 << 9;
    state[2] ^= state[0];
    state[3] ^= s1;
    state[1] ^= state[2];
    state[0] ^= state[3];
    state[2] ^= t;
    const s3 = state[3];
    state[3] = (s3 << 11) | (s3 >>> 21);
    return result;
  };
  const uniform = (): number => nextUint32() / 4294967296;

  const normal = (): number => {
    for (;;) {
      const bits = nextUint32();
      const layer = bits & 127;
      // A signed 25-bit integer from the bits the layer index did not use.
      const hz = (bits | 0) >> 7;
      const x = hz * ZIGGURAT.w[layer];
      if (Math.abs(hz) < ZIGGURAT.k[layer]) return x;
      if (layer === 0) {
        // The tail beyond r (Marsaglia 1964 tail method).
        let tx: number, ty: number;
        do {
          tx = -Math.log(1 - uniform()) / ZIGGURAT_R;
          ty = -Math.log(1 - uniform());
        } while (ty + ty < tx * tx);
        return hz > 0 ? ZIGGURAT_R + tx : -ZIGGURAT_R - tx;
      }
      if (ZIGGURAT.f[layer] + uniform() * (ZIGGURAT.f[layer - 1] - ZIGGURAT.f[layer]) < Math.exp(-0.5 * x * x)) return x;
    }
  };

  const poisson = (mean: number): number => {
    if (mean <= 0) return 0;
    if (mean > 30) return Math.max(0, mean + Math.sqrt(mean) * normal());
    const limit = Math.exp(-mean);
    let k = 0;
    let product = uniform();
    while (product > limit) {
      k++;
      product *= uniform();
    }
    return k;
  };

  const fillBytes = (bytes: Uint8Array): void => {
    for (let i = 0; i < bytes.length; i += 4) {
      const word = nextUint32();
      for (let j = 0; j < 4 && i + j < bytes.length; j++) bytes[i + j] = (word >>> (8 * j)) & 0xff;
    }
  };

  return { uniform, normal, poisson, fillBytes };
}
