import type { GreyImage, TargetPolarity } from '../types';
import { invariant } from '../image/invariant';
import { fitPlane, type Plane } from './fit-plane';
import { robustStdDevInPlace } from './robust-statistics';
import { boxAround, discWindowMoments, dotSignalCovers, dotSignalOver, planeLevelAt, ringSignalSums, type DotSignal } from './dot-signal';

type PointPx = { x: number; y: number };

export interface MeasureDotPairOptions {
  polarity: TargetPolarity;
  approximateCentresPx: [PointPx, PointPx];
  /** Largest window radius around each dot; it is also kept within half the dot spacing. */
  searchRadiusPx: number;
  /** Iteration stops when neither centre moves more than this; default 1e-4 px. */
  tolerancePx?: number;
  /** Default 100. */
  maxIterations?: number;
}

export interface DotPairMeasurement {
  /** Distance between the two centroids. */
  sizePx: number;
  centresPx: [PointPx, PointPx];
  /** The window radius used around each dot. */
  windowRadiiPx: [number, number];
  /** Mean of the local background levels under the two dots. */
  backgroundLevel: number;
  /** Standard deviation of the background around the dots. */
  backgroundNoiseStdDev: number;
  iterations: number;
}

const POLARITIES: readonly TargetPolarity[] = ['dark-on-light', 'light-on-dark'];

function isPoint(p: unknown): p is PointPx {
  return typeof p === 'object' && p !== null && Number.isFinite((p as PointPx).x) && Number.isFinite((p as PointPx).y);
}

export function checkMeasureDotPairOptions(image: GreyImage, options: MeasureDotPairOptions): Required<MeasureDotPairOptions> {
  if (!options || !POLARITIES.includes(options.polarity)) {
    throw new RangeError(`polarity must be one of ${POLARITIES.join(', ')} (got ${String(options?.polarity)}).`);
  }
  const centres = options.approximateCentresPx;
  if (!Array.isArray(centres) || centres.length !== 2 || !centres.every(isPoint)) {
    throw new RangeError('approximateCentresPx must be two points {x, y} with finite coordinates.');
  }
  for (const c of centres) {
    if (c.x < 0 || c.y < 0 || c.x > image.width - 1 || c.y > image.height - 1) {
      throw new RangeError(
        `approximateCentresPx (${c.x}, ${c.y}) must lie inside the ${image.width}×${image.height} image.`,
      );
    }
  }
  if (Math.hypot(centres[0].x - centres[1].x, centres[0].y - centres[1].y) < 4) {
    throw new RangeError('approximateCentresPx must be at least 4 px apart.');
  }
  if (!(Number.isFinite(options.searchRadiusPx) && options.searchRadiusPx >= 2)) {
    throw new RangeError(`searchRadiusPx must be a number of at least 2 (got ${options.searchRadiusPx}).`);
  }
  const filled = { tolerancePx: 1e-4, maxIterations: 100, ...options };
  if (!(filled.tolerancePx > 0)) throw new RangeError(`tolerancePx must be positive (got ${filled.tolerancePx}).`);
  if (!(Number.isInteger(filled.maxIterations) && filled.maxIterations >= 1)) {
    throw new RangeError(`maxIterations must be a whole number of at least 1 (got ${filled.maxIterations}).`);
  }
  return filled;
}

/** Grid samples of a background ring. */
interface RingSamples {
  xs: Float64Array;
  ys: Float64Array;
  values: Float64Array;
  residuals: Float64Array;
  scratch: Float64Array;
}

/**
 * Reused from one ring to the next, and from one measurement to the next, so
 * each frame does not hand the garbage collector another megabyte (JavaScript
 * runs one call at a time, so no two rings share them at once).
 */
let ringSamples: RingSamples | null = null;

function ringSamplesWithCapacity(capacity: number): RingSamples {
  if (ringSamples && ringSamples.xs.length >= capacity) return ringSamples;
  ringSamples = {
    xs: new Float64Array(capacity),
    ys: new Float64Array(capacity),
    values: new Float64Array(capacity),
    residuals: new Float64Array(capacity),
    scratch: new Float64Array(capacity),
  };
  return ringSamples;
}

interface Ring {
  cx: number;
  cy: number;
  inner: number;
  outer: number;
  /** Centre and squared radius of the other dot's window, left out. */
  otherX: number;
  otherY: number;
  otherExclusionSq: number;
  x0: number;
  x1: number;
  y0: number;
  y1: number;
  step: number;
}

/**
 * Takes the ring's pixels on the grid x0 + i·step, y0 + j·step into `samples`
 * (row by row) and returns how many. Each row visits only the grid points of
 * the ring's two chords; 1 px margins keep every point the exact test takes.
 */
function sampleRing(image: GreyImage, ring: Ring, samples: RingSamples): number {
  const { cx, cy, inner, outer, otherX, otherY, otherExclusionSq } = ring;
  // Whole numbers as 32-bit integers (see accumulateFocusSums in focus-measure.ts).
  const x0 = ring.x0 | 0;
  const x1 = ring.x1 | 0;
  const y0 = ring.y0 | 0;
  const y1 = ring.y1 | 0;
  const step = ring.step | 0;
  const { xs, ys, values } = samples;
  const { data } = image;
  const width = image.width | 0;
  let count = 0;
  for (let y = y0; y <= y1; y += step) {
    const dySq = (y - cy) ** 2;
    const outerHalf = Math.sqrt(Math.max(0, outer * outer - dySq)) + 1;
    const innerHalf = dySq < inner * inner ? Math.sqrt(inner * inner - dySq) - 1 : 0;
    const last = Math.min(x1, cx + outerHalf);
    let x = (x0 + Math.max(0, Math.ceil((cx - outerHalf - x0) / step)) * step) | 0;
    while (x <= last) {
      if (innerHalf > 0 && x > cx - innerHalf && x < cx + innerHalf) {
        x = (x0 + Math.ceil((cx + innerHalf - x0) / step) * step) | 0;
        continue;
      }
      const r = Math.sqrt((x - cx) ** 2 + dySq);
      if (r >= inner && r <= outer && (x - otherX) ** 2 + (y - otherY) ** 2 >= otherExclusionSq) {
        xs[count] = x;
        ys[count] = y;
        values[count] = data[y * width + x];
        count++;
      }
      x += step;
    }
  }
  return count;
}

/**
 * Background plane of one dot, from a ring just outside its window (pixels
 * inside the other dot's window left out), refitted once without 3-σ outliers.
 * Each dot gets its own plane: one plane through both would miss the curvature
 * of vignetting between them and tilt both centroids.
 */
function fitLocalBackground(
  image: GreyImage,
  centres: PointPx[],
  windowRadiiPx: number[],
  k: 0 | 1,
): { plane: Plane; noiseStdDev: number } {
  const centre = centres[k];
  const other = centres[1 - k];
  const inner = windowRadiiPx[k] + 1;
  const outer = inner + Math.max(4, 0.5 * windowRadiiPx[k]);
  const box = boxAround(image, centre.x, centre.y, outer);
  // A ring of a few thousand pixels fixes a plane well. The grid is sized from the ring's
  // bounding square, so it holds at most ~20 000 points however big the ring (about half
  // of them fall in the ring).
  const squareArea = (box.x1 - box.x0 + 1) * (box.y1 - box.y0 + 1);
  const ring: Ring = {
    cx: centre.x,
    cy: centre.y,
    inner,
    outer,
    otherX: other.x,
    otherY: other.y,
    otherExclusionSq: (windowRadiiPx[1 - k] + 1) ** 2,
    ...box,
    step: Math.max(1, Math.floor(Math.sqrt(squareArea / 20_000))),
  };
  const samples = ringSamplesWithCapacity(
    (Math.floor((ring.x1 - ring.x0) / ring.step) + 1) * (Math.floor((ring.y1 - ring.y0) / ring.step) + 1),
  );
  const count = sampleRing(image, ring, samples);
  if (count < 20) {
    throw new RangeError(
      `The ${image.width}×${image.height} region leaves too little background around the dots; widen the region.`,
    );
  }
  const { xs, ys, values } = samples;
  let plane = fitPlane(xs.subarray(0, count), ys.subarray(0, count), values.subarray(0, count));
  planeResiduals(samples, count, plane);
  const noiseStdDev = robustStdDevInPlace(samples.scratch, count);
  const kept = keepSamplesWithin(samples, count, noiseStdDev === 0 ? Infinity : 3 * noiseStdDev);
  if (kept >= 20 && kept < count) {
    plane = fitPlane(xs.subarray(0, kept), ys.subarray(0, kept), values.subarray(0, kept));
  }
  return { plane, noiseStdDev };
}

// The loops below are functions of their own, ending in nothing that needs type
// feedback: code after a long loop that has never run deoptimises the loop's
// compiled (on-stack-replaced) form, and here that would happen on every frame.

/** Residuals of the samples from the plane, into `residuals` and (as scratch for the MAD) `scratch`. */
function planeResiduals(samples: RingSamples, count: number, plane: Plane): void {
  const { xs, ys, values, residuals, scratch } = samples;
  const { offset, slopeX, slopeY } = plane;
  for (let i = 0; i < count; i++) {
    const residual = values[i] - (offset + slopeX * xs[i] + slopeY * ys[i]);
    residuals[i] = residual;
    scratch[i] = residual;
  }
}

/** Moves the samples whose residual is within ±limit to the front, in order; returns how many. */
function keepSamplesWithin(samples: RingSamples, count: number, limit: number): number {
  const { xs, ys, values, residuals } = samples;
  let kept = 0;
  for (let i = 0; i < count; i++) {
    if (!(Math.abs(residuals[i]) <= limit)) continue;
    xs[kept] = xs[i];
    ys[kept] = ys[i];
    values[kept] = values[i];
    kept++;
  }
  return kept;
}

/** Radius beyond which a dot's ring-averaged signal has fallen to the noise or 2 % of its peak. */
function signalRadius(dot: DotSignal, image: GreyImage, centre: PointPx, maxRadiusPx: number, levelScale: number, noiseStdDev: number): number {
  const ringCount = Math.max(1, Math.floor(maxRadiusPx));
  const sums = new Float64Array(ringCount);
  const counts = new Float64Array(ringCount);
  ringSignalSums(dot, image, centre.x, centre.y, sums, counts);
  let peak = 0;
  let peakRing = 0;
  for (let ring = 0; ring < ringCount; ring++) {
    const mean = counts[ring] ? (levelScale * sums[ring]) / counts[ring] : 0;
    if (mean > peak) {
      peak = mean;
      peakRing = ring;
    }
  }
  for (let ring = peakRing; ring < ringCount; ring++) {
    if (!counts[ring]) continue;
    const mean = (levelScale * sums[ring]) / counts[ring];
    if (mean < Math.max(0.02 * peak, (3 * noiseStdDev) / Math.sqrt(counts[ring]))) return ring + 1;
  }
  return maxRadiusPx;
}

/** Beyond the window, room for the centre to move before a dot's signal disc must be rebuilt. */
function signalDiscMarginPx(radiusPx: number): number {
  return Math.max(4, 0.05 * radiusPx);
}

/**
 * Centre-to-centre distance of two round dots: background-subtracted,
 * intensity-weighted centroids (dark dots are inverted about the local
 * background plane), each iterated in a disc window centred on its own
 * estimate. A symmetric blur keeps each centroid in place, so this holds off
 * focus as long as one dot's blur does not reach half-way to the other.
 */
export function measureDotPair(image: GreyImage, options: MeasureDotPairOptions): DotPairMeasurement {
  const { polarity, approximateCentresPx, searchRadiusPx, tolerancePx, maxIterations } = checkMeasureDotPairOptions(image, options);
  const sign = polarity === 'light-on-dark' ? 1 : -1;
  const centres: PointPx[] = approximateCentresPx.map((c) => ({ x: c.x, y: c.y }));
  const spacing = Math.hypot(centres[0].x - centres[1].x, centres[0].y - centres[1].y);
  const largestRadius = Math.min(searchRadiusPx, 0.5 * spacing);
  let radii = [largestRadius, largestRadius];
  let backgrounds = [fitLocalBackground(image, centres, radii, 0), fitLocalBackground(image, centres, radii, 1)];
  const signals: (DotSignal | null)[] = [null, null];
  /** The dot's signal disc for its current plane, rebuilt when the window has moved out of it. */
  const signalFor = (k: number, reachPx: number): DotSignal => {
    const { x, y } = centres[k];
    const current = signals[k];
    if (current && current.plane === backgrounds[k].plane && dotSignalCovers(current, x, y, reachPx)) return current;
    signals[k] = dotSignalOver(image, backgrounds[k].plane, sign, x, y, reachPx + 2 + signalDiscMarginPx(reachPx), k === 0 ? 0 : 1);
    return signals[k] as DotSignal;
  };
  // A dark dot's relative signal, scaled back to intensity at its centre.
  const levelScale = (k: number) => (sign > 0 ? 1 : planeLevelAt(backgrounds[k].plane, centres[k].x, centres[k].y));

  const insideRadius = (c: PointPx, radius: number) =>
    Math.max(1, Math.min(radius, c.x - 0.5, c.y - 0.5, image.width - 1.5 - c.x, image.height - 1.5 - c.y));

  const moments = new Float64Array(3);
  let iterations = 0;
  const iterate = (limit: number, stopShiftPx: number) => {
    for (let step = 0; step < limit; step++) {
      iterations++;
      let largestShift = 0;
      for (let k = 0; k < 2; k++) {
        const { x, y } = centres[k];
        const reachPx = insideRadius(centres[k], radii[k]) + 0.5;
        discWindowMoments(signalFor(k, reachPx), image, x, y, reachPx, moments);
        const mass = levelScale(k) * moments[0];
        const next = { x: x + moments[1] / moments[0], y: y + moments[2] / moments[0] };
        if (!(mass > 0) || !Number.isFinite(next.x) || !Number.isFinite(next.y)) {
          throw new RangeError(
            `No ${polarity} dot found near (${approximateCentresPx[k].x.toFixed(1)}, ${approximateCentresPx[k].y.toFixed(1)}).`,
          );
        }
        largestShift = Math.max(largestShift, Math.hypot(next.x - x, next.y - y));
        centres[k] = next;
      }
      if (largestShift < stopShiftPx) return;
    }
  };

  iterate(10, Math.max(tolerancePx, 0.01));
  radii = centres.map((c, k) => {
    const rings = Math.max(1, Math.floor(largestRadius));
    const radius = signalRadius(signalFor(k, rings), image, c, largestRadius, levelScale(k), backgrounds[k].noiseStdDev);
    return Math.min(largestRadius, 1.25 * radius + 3);
  });
  backgrounds = [fitLocalBackground(image, centres, radii, 0), fitLocalBackground(image, centres, radii, 1)];
  iterate(maxIterations, tolerancePx);

  const sizePx = Math.hypot(centres[0].x - centres[1].x, centres[0].y - centres[1].y);
  invariant(Number.isFinite(sizePx), 'dot-pair size is finite');
  const levelAt = (k: number) => planeLevelAt(backgrounds[k].plane, centres[k].x, centres[k].y);
  return {
    sizePx,
    centresPx: [centres[0], centres[1]],
    windowRadiiPx: [insideRadius(centres[0], radii[0]), insideRadius(centres[1], radii[1])],
    backgroundLevel: (levelAt(0) + levelAt(1)) / 2,
    backgroundNoiseStdDev: (backgrounds[0].noiseStdDev + backgrounds[1].noiseStdDev) / 2,
    iterations,
  };
}
