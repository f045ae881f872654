/**
 * Student t distribution: upper tail, quantile and the GUM coverage factor.
 *
 * The quantile inverts the tail probability Q(t) = ½·I_{ν/(ν+t²)}(ν/2, ½)
 * by Newton steps on ln Q (which is close to linear in t in both the body and
 * the heavy tail), kept inside a bracket and falling back to bisection.
 * Start: Cornish–Fisher expansion about the normal quantile (Abramowitz &
 * Stegun 26.7.5), which alone is used for ν > 1e7.
 */
import { InvalidOptionError } from '../fit/invalid-option-error';
import { logBeta, normalDensity, normalUpperTail, regularizedIncompleteBeta } from './special-functions';

function checkDegreesOfFreedom(degreesOfFreedom: number, optionName = 'degreesOfFreedom'): void {
  if (!(degreesOfFreedom > 0)) {
    throw new InvalidOptionError(`Option ${optionName} must be a positive number or Infinity (got ${degreesOfFreedom}).`);
  }
}

/** P(T > t) for Student's t with ν degrees of freedom (ν = Infinity: standard normal). */
export function studentTUpperTail(t: number, degreesOfFreedom: number): number {
  checkDegreesOfFreedom(degreesOfFreedom);
  if (Number.isNaN(t)) return NaN;
  if (degreesOfFreedom === Infinity) return normalUpperTail(t);
  if (t === Infinity) return 0;
  if (t === -Infinity) return 1;
  const t2 = t * t;
  const denominator = degreesOfFreedom + t2;
  const half = 0.5 * regularizedIncompleteBeta(degreesOfFreedom / denominator, degreesOfFreedom / 2, 0.5, t2 / denominator);
  return t >= 0 ? half : 1 - half;
}

/** P(T ≤ t). */
export function studentTCumulative(t: number, degreesOfFreedom: number): number {
  return studentTUpperTail(-t, degreesOfFreedom);
}

export function studentTDensity(t: number, degreesOfFreedom: number): number {
  if (degreesOfFreedom === Infinity) return normalDensity(t);
  const logNormaliser = -0.5 * Math.log(degreesOfFreedom) - logBeta(degreesOfFreedom / 2, 0.5);
  return Math.exp(logNormaliser - ((degreesOfFreedom + 1) / 2) * Math.log1p((t * t) / degreesOfFreedom));
}

/** Rough upper-tail normal quantile, |error| < 4.5e-4 (Abramowitz & Stegun 26.2.23); a starting point only. */
function roughNormalUpperQuantile(tailProbability: number): number {
  const s = Math.sqrt(-2 * Math.log(tailProbability));
  return s - (2.515517 + 0.802853 * s + 0.010328 * s * s) / (1 + 1.432788 * s + 0.189269 * s * s + 0.001308 * s * s * s);
}

/** Cornish–Fisher expansion of the t quantile in powers of 1/ν (Abramowitz & Stegun 26.7.5). */
function cornishFisher(z: number, nu: number): number {
  const z2 = z * z;
  const g1 = (z * (z2 + 1)) / 4;
  const g2 = (z * ((5 * z2 + 16) * z2 + 3)) / 96;
  const g3 = (z * (((3 * z2 + 19) * z2 + 17) * z2 - 15)) / 384;
  const g4 = (z * ((((79 * z2 + 776) * z2 + 1482) * z2 - 1920) * z2 - 945)) / 92160;
  return z + g1 / nu + g2 / nu ** 2 + g3 / nu ** 3 + g4 / nu ** 4;
}

/** Positive root of tail(t) = target, for a decreasing tail with density `density`. */
function invertUpperTail(
  tail: (t: number) => number,
  density: (t: number) => number,
  target: number,
  start: number,
): number {
  const logTarget = Math.log(target);
  let low = 0;
  let high = Math.max(start, 1e-300);
  let grow = 0;
  while (tail(high) >= target) {
    low = high;
    high *= 2;
    if (++grow > 2000) return Infinity;
  }
  let t = start > low && start < high ? start : 0.5 * (low + high);
  for (let iteration = 0; iteration < 200; iteration++) {
    const q = tail(t);
    if (q > target) low = t;
    else high = t;
    const g = Math.log(q) - logTarget;
    if (g === 0) return t;
    const slope = -density(t) / q;
    let next = t - g / slope;
    if (!(next > low && next < high) || !Number.isFinite(next)) next = 0.5 * (low + high);
    if (Math.abs(next - t) <= 4 * Number.EPSILON * Math.abs(next) || high - low <= 4 * Number.EPSILON * high) return next;
    t = next;
  }
  return t;
}

/** The t with P(T ≤ t) = probability, for Student's t with ν degrees of freedom (ν = Infinity: normal). */
export function studentTQuantile(probability: number, degreesOfFreedom: number): number {
  checkDegreesOfFreedom(degreesOfFreedom);
  if (!(probability >= 0 && probability <= 1)) {
    throw new InvalidOptionError(`Option probability must lie between 0 and 1 (got ${probability}).`);
  }
  if (probability === 0) return -Infinity;
  if (probability === 1) return Infinity;
  if (probability === 0.5) return 0;
  const sign = probability > 0.5 ? 1 : -1;
  const tailProbability = probability > 0.5 ? 1 - probability : probability;
  const nu = degreesOfFreedom;
  // Cauchy: t = cot(π·q); the cotangent keeps its digits where tan(π(½ − q)) would not.
  if (nu === 1) return sign / Math.tan(Math.PI * tailProbability);
  if (nu === 2) {
    const twoTail = 2 * tailProbability;
    return sign * Math.sqrt(2 / (twoTail * (2 - twoTail)) - 2);
  }
  const z = invertUpperTail(normalUpperTail, normalDensity, tailProbability, roughNormalUpperQuantile(tailProbability));
  if (nu === Infinity) return sign * z;
  if (nu > 1e7) return sign * cornishFisher(z, nu);
  const start = nu >= 3 ? cornishFisher(z, nu) : z * 2;
  const t = invertUpperTail(
    (value) => studentTUpperTail(value, nu),
    (value) => studentTDensity(value, nu),
    tailProbability,
    start,
  );
  return sign * t;
}

export interface CoverageFactorOptions {
  degreesOfFreedom: number;
  /** Two-sided coverage probability p (default 0.95). */
  coverageProbability?: number;
}

/** k = t_{(1+p)/2, ν}: the two-sided coverage factor of JCGM 100:2008 G.3. */
export function coverageFactorFor(options: CoverageFactorOptions): number {
  const { degreesOfFreedom, coverageProbability = 0.95 } = options;
  checkDegreesOfFreedom(degreesOfFreedom);
  if (!(coverageProbability > 0 && coverageProbability < 1)) {
    throw new InvalidOptionError(`Option coverageProbability must lie strictly between 0 and 1 (got ${coverageProbability}).`);
  }
  return studentTQuantile((1 + coverageProbability) / 2, degreesOfFreedom);
}
