/**
 * Special functions for the Student t and normal distributions.
 *
 * - logGamma: Lanczos approximation, g = 7, 9 coefficients (relative error
 *   about 1e-15), with the reflection formula below 1/2.
 * - regularizedIncompleteBeta: continued fraction evaluated by the modified
 *   Lentz method (Numerical Recipes, 3rd ed., §6.4), using the symmetry
 *   I_x(a,b) = 1 − I_{1−x}(b,a) on the side where the fraction converges fast.
 *   Takes x and 1 − x separately so callers can pass both without cancellation.
 * - regularizedUpperIncompleteGamma: series / continued fraction (NR §6.2),
 *   used for erfc(x) = Q(1/2, x²).
 */

const LANCZOS_G = 7;
const LANCZOS_COEFFICIENTS = [
  0.99999999999980993, 676.5203681218851, -1259.1392167224028, 771.32342877765313, -176.61502916214059,
  12.507343278686905, -0.13857109526572012, 9.9843695780195716e-6, 1.5056327351493116e-7,
];

export function logGamma(x: number): number {
  if (x < 0.5) {
    // Γ(x)Γ(1 − x) = π / sin(πx)
    return Math.log(Math.PI / Math.abs(Math.sin(Math.PI * x))) - logGamma(1 - x);
  }
  const z = x - 1;
  let sum = LANCZOS_COEFFICIENTS[0];
  for (let i = 1; i < LANCZOS_COEFFICIENTS.length; i++) sum += LANCZOS_COEFFICIENTS[i] / (z + i);
  const t = z + LANCZOS_G + 0.5;
  return 0.5 * Math.log(2 * Math.PI) + (z + 0.5) * Math.log(t) - t + Math.log(sum);
}

/**
 * ln B(a, b). For large a with small b, lnΓ(a) − lnΓ(a + b) is formed from
 * Stirling's series of the difference, which keeps its digits where the two
 * large logarithms would cancel.
 */
export function logBeta(a: number, b: number): number {
  const large = Math.max(a, b);
  const small = Math.min(a, b);
  if (large > 1e4 && small < 50) {
    return logGamma(small) + logGammaRatio(large, small);
  }
  return logGamma(a) + logGamma(b) - logGamma(a + b);
}

/** lnΓ(a) − lnΓ(a + b) for large a, from Stirling's series (Abramowitz & Stegun 6.1.40), term by term. */
function logGammaRatio(a: number, b: number): number {
  const stirlingCorrection = (x: number) => {
    const x2 = x * x;
    return (1 / (12 * x)) * (1 - (1 / (30 * x2)) * (1 - (2 / (7 * x2)) * (1 - 3 / (4 * x2))));
  };
  const c = a + b;
  // (a − ½)ln a − a − [(c − ½)ln c − c], written with log1p(b/a)
  const main = (a - 0.5) * -Math.log1p(b / a) - b * Math.log(c) + b;
  return main + stirlingCorrection(a) - stirlingCorrection(c);
}

const TINY = 1e-300;

function betaContinuedFraction(x: number, a: number, b: number): number {
  const qab = a + b;
  const qap = a + 1;
  const qam = a - 1;
  let c = 1;
  let d = 1 - (qab * x) / qap;
  if (Math.abs(d) < TINY) d = TINY;
  d = 1 / d;
  let h = d;
  for (let m = 1; m <= 100000; m++) {
    const m2 = 2 * m;
    let aa = (m * (b - m) * x) / ((qam + m2) * (a + m2));
    d = 1 + aa * d;
    if (Math.abs(d) < TINY) d = TINY;
    c = 1 + aa / c;
    if (Math.abs(c) < TINY) c = TINY;
    d = 1 / d;
    h *= d * c;
    aa = (-(a + m) * (qab + m) * x) / ((a + m2) * (qap + m2));
    d = 1 + aa * d;
    if (Math.abs(d) < TINY) d = TINY;
    c = 1 + aa / c;
    if (Math.abs(c) < TINY) c = TINY;
    d = 1 / d;
    const delta = d * c;
    h *= delta;
    if (Math.abs(delta - 1) < 1e-16) return h;
  }
  return h;
}

/**
 * I_x(a, b), the regularised incomplete beta function. `complementX` must
 * equal 1 − x; pass it when you can compute it without cancellation.
 */
export function regularizedIncompleteBeta(x: number, a: number, b: number, complementX = 1 - x): number {
  if (x <= 0) return 0;
  if (complementX <= 0) return 1;
  const logFront = a * Math.log(x) + b * Math.log(complementX) - logBeta(a, b);
  if (x < (a + 1) / (a + b + 2)) {
    return (Math.exp(logFront) * betaContinuedFraction(x, a, b)) / a;
  }
  return 1 - (Math.exp(logFront) * betaContinuedFraction(complementX, b, a)) / b;
}

/** 1 − I_x(a, b), computed directly on the side where it is small. */
export function complementedIncompleteBeta(x: number, a: number, b: number, complementX = 1 - x): number {
  return regularizedIncompleteBeta(complementX, b, a, x);
}

/** Q(a, x) = Γ(a, x)/Γ(a), the regularised upper incomplete gamma function. */
export function regularizedUpperIncompleteGamma(a: number, x: number): number {
  if (x <= 0) return 1;
  const logFront = -x + a * Math.log(x) - logGamma(a);
  if (x < a + 1) {
    let term = 1 / a;
    let sum = term;
    for (let n = 1; n < 100000; n++) {
      term *= x / (a + n);
      sum += term;
      if (Math.abs(term) < Math.abs(sum) * 1e-17) break;
    }
    return 1 - sum * Math.exp(logFront);
  }
  let b = x + 1 - a;
  let c = 1 / TINY;
  let d = 1 / b;
  let h = d;
  for (let i = 1; i < 100000; i++) {
    const an = -i * (i - a);
    b += 2;
    d = an * d + b;
    if (Math.abs(d) < TINY) d = TINY;
    c = b + an / c;
    if (Math.abs(c) < TINY) c = TINY;
    d = 1 / d;
    const delta = d * c;
    h *= delta;
    if (Math.abs(delta - 1) < 1e-16) break;
  }
  return Math.exp(logFront) * h;
}

/** Upper tail of the standard normal distribution, 1 − Φ(z), accurate far into both tails. */
export function normalUpperTail(z: number): number {
  const half = 0.5 * regularizedUpperIncompleteGamma(0.5, (z * z) / 2);
  return z >= 0 ? half : 1 - half;
}

export function normalDensity(z: number): number {
  return Math.exp(-0.5 * z * z) / Math.sqrt(2 * Math.PI);
}
