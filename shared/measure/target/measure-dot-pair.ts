import type { GreyImage, TargetPolarity } from '../types';
import { invariant } from '../image/invariant';
import { fitPlane, type Plane } from './fit-plane';
import { robustStdDev } from './robust-statistics';

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

/**
 * Background plane of one dot, from a ring just outside its window (pixels
 * inside the other dot's window left out), refitted once without 3-σ outliers.
 * Each dot gets its own plane: one plane through both would miss the curvature
 * of vignetting between them and tilt both centroids.
 */
function fitLocalBackground(image: GreyImage, centres: PointPx[], windowRadiiPx: number[], k: 0 | 1): { plane: Plane; noiseStdDev: number } {
  const xs: number[] = [];
  const ys: number[] = [];
  const values: number[] = [];
  const centre = centres[k];
  const inner = windowRadiiPx[k] + 1;
  const outer = inner + Math.max(4, 0.5 * windowRadiiPx[k]);
  const x0 = Math.max(0, Math.floor(centre.x - outer));
  const x1 = Math.min(image.width - 1, Math.ceil(centre.x + outer));
  const y0 = Math.max(0, Math.floor(centre.y - outer));
  const y1 = Math.min(image.height - 1, Math.ceil(centre.y + outer));
  const other = centres[1 - k];
  const otherExclusionSq = (windowRadiiPx[1 - k] + 1) ** 2;
  // A ring of a few thousand pixels fixes a plane well; sample big rings on a sparser grid.
  const ringArea = Math.PI * (outer * outer - inner * inner);
  const step = Math.max(1, Math.floor(Math.sqrt(ringArea / 20_000)));
  for (let y = y0; y <= y1; y += step) {
    for (let x = x0; x <= x1; x += step) {
      const r = Math.sqrt((x - centre.x) ** 2 + (y - centre.y) ** 2);
      if (r < inner || r > outer) continue;
      if ((x - other.x) ** 2 + (y - other.y) ** 2 < otherExclusionSq) continue;
      xs.push(x);
      ys.push(y);
      values.push(image.data[y * image.width + x]);
    }
  }
  if (values.length < 20) {
    throw new RangeError(
      `The ${image.width}×${image.height} region leaves too little background around the dots; widen the region.`,
    );
  }
  let plane = fitPlane(xs, ys, values);
  const residuals = values.map((v, i) => v - (plane.offset + plane.slopeX * xs[i] + plane.slopeY * ys[i]));
  const noiseStdDev = robustStdDev(residuals);
  const keep = residuals.map((r) => Math.abs(r) <= 3 * noiseStdDev || noiseStdDev === 0);
  if (keep.filter(Boolean).length >= 20) {
    plane = fitPlane(xs.filter((_, i) => keep[i]), ys.filter((_, i) => keep[i]), values.filter((_, i) => keep[i]));
  }
  return { plane, noiseStdDev };
}

interface WindowMoments {
  mass: number;
  x: number;
  y: number;
}

/** Background-subtracted signal of a dot. A dark dot is a shadow on the lit background and is vignetted
 * with it, so its signal is taken relative to the background (scaled back to intensity at `centre`);
 * that removes the background's weighting of the centroid. A light dot is simply background-subtracted. */
function makeSignal(sign: number, plane: Plane, centre: PointPx) {
  const levelAtCentre = plane.offset + plane.slopeX * centre.x + plane.slopeY * centre.y;
  if (sign > 0) return (value: number, background: number) => value - background;
  return (value: number, background: number) => ((background - value) / background) * levelAtCentre;
}

/**
 * Signal-weighted centroid in a disc window whose edge pixels are weighted by
 * how much of them the disc covers, so the window moves smoothly with its centre.
 */
function centroidInWindow(image: GreyImage, centre: PointPx, radiusPx: number, sign: number, plane: Plane): WindowMoments {
  const signalOf = makeSignal(sign, plane, centre);
  const reach = radiusPx + 0.5;
  const x0 = Math.max(0, Math.floor(centre.x - reach));
  const x1 = Math.min(image.width - 1, Math.ceil(centre.x + reach));
  const y0 = Math.max(0, Math.floor(centre.y - reach));
  const y1 = Math.min(image.height - 1, Math.ceil(centre.y + reach));
  let mass = 0;
  let sx = 0;
  let sy = 0;
  for (let y = y0; y <= y1; y++) {
    const dy = y - centre.y;
    const rowOffset = y * image.width;
    const rowBackground = plane.offset + plane.slopeY * y;
    for (let x = x0; x <= x1; x++) {
      const dx = x - centre.x;
      const weight = reach - Math.sqrt(dx * dx + dy * dy);
      if (weight <= 0) continue;
      const signal = signalOf(image.data[rowOffset + x], rowBackground + plane.slopeX * x) * (weight < 1 ? weight : 1);
      mass += signal;
      sx += signal * dx;
      sy += signal * dy;
    }
  }
  return { mass, x: centre.x + sx / mass, y: centre.y + sy / mass };
}

/** Radius beyond which a dot's ring-averaged signal has fallen to the noise or 2 % of its peak. */
function signalRadius(image: GreyImage, centre: PointPx, maxRadiusPx: number, sign: number, plane: Plane, noiseStdDev: number): number {
  const signalOf = makeSignal(sign, plane, centre);
  const ringCount = Math.max(1, Math.floor(maxRadiusPx));
  const sums = new Float64Array(ringCount);
  const counts = new Float64Array(ringCount);
  const x0 = Math.max(0, Math.floor(centre.x - maxRadiusPx));
  const x1 = Math.min(image.width - 1, Math.ceil(centre.x + maxRadiusPx));
  const y0 = Math.max(0, Math.floor(centre.y - maxRadiusPx));
  const y1 = Math.min(image.height - 1, Math.ceil(centre.y + maxRadiusPx));
  for (let y = y0; y <= y1; y++) {
    for (let x = x0; x <= x1; x++) {
      const ring = Math.floor(Math.sqrt((x - centre.x) ** 2 + (y - centre.y) ** 2));
      if (ring >= ringCount) continue;
      sums[ring] += signalOf(image.data[y * image.width + x], plane.offset + plane.slopeX * x + plane.slopeY * y);
      counts[ring]++;
    }
  }
  let peak = 0;
  let peakRing = 0;
  for (let ring = 0; ring < ringCount; ring++) {
    const mean = counts[ring] ? sums[ring] / counts[ring] : 0;
    if (mean > peak) {
      peak = mean;
      peakRing = ring;
    }
  }
  for (let ring = peakRing; ring < ringCount; ring++) {
    if (!counts[ring]) continue;
    const mean = sums[ring] / counts[ring];
    if (mean < Math.max(0.02 * peak, (3 * noiseStdDev) / Math.sqrt(counts[ring]))) return ring + 1;
  }
  return maxRadiusPx;
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
  const centres: PointPx[] = approximateCentresPx.map((c) => ({ ...c }));
  const spacing = Math.hypot(centres[0].x - centres[1].x, centres[0].y - centres[1].y);
  const largestRadius = Math.min(searchRadiusPx, 0.5 * spacing);
  let radii = [largestRadius, largestRadius];
  let backgrounds = [fitLocalBackground(image, centres, radii, 0), fitLocalBackground(image, centres, radii, 1)];

  const insideRadius = (c: PointPx, radius: number) =>
    Math.max(1, Math.min(radius, c.x - 0.5, c.y - 0.5, image.width - 1.5 - c.x, image.height - 1.5 - c.y));

  let iterations = 0;
  const iterate = (limit: number, stopShiftPx: number) => {
    for (let step = 0; step < limit; step++) {
      iterations++;
      let largestShift = 0;
      for (let k = 0; k < 2; k++) {
        const moments = centroidInWindow(image, centres[k], insideRadius(centres[k], radii[k]), sign, backgrounds[k].plane);
        if (!(moments.mass > 0) || !Number.isFinite(moments.x) || !Number.isFinite(moments.y)) {
          throw new RangeError(
            `No ${polarity} dot found near (${approximateCentresPx[k].x.toFixed(1)}, ${approximateCentresPx[k].y.toFixed(1)}).`,
          );
        }
        largestShift = Math.max(largestShift, Math.hypot(moments.x - centres[k].x, moments.y - centres[k].y));
        centres[k] = { x: moments.x, y: moments.y };
      }
      if (largestShift < stopShiftPx) return;
    }
  };

  iterate(10, Math.max(tolerancePx, 0.01));
  radii = centres.map((c, k) =>
    Math.min(largestRadius, 1.25 * signalRadius(image, c, largestRadius, sign, backgrounds[k].plane, backgrounds[k].noiseStdDev) + 3),
  );
  backgrounds = [fitLocalBackground(image, centres, radii, 0), fitLocalBackground(image, centres, radii, 1)];
  iterate(maxIterations, tolerancePx);

  const sizePx = Math.hypot(centres[0].x - centres[1].x, centres[0].y - centres[1].y);
  invariant(Number.isFinite(sizePx), 'dot-pair size is finite');
  const levelAt = (k: number) => {
    const { plane } = backgrounds[k];
    return plane.offset + plane.slopeX * centres[k].x + plane.slopeY * centres[k].y;
  };
  return {
    sizePx,
    centresPx: [centres[0], centres[1]],
    windowRadiiPx: [insideRadius(centres[0], radii[0]), insideRadius(centres[1], radii[1])],
    backgroundLevel: (levelAt(0) + levelAt(1)) / 2,
    backgroundNoiseStdDev: (backgrounds[0].noiseStdDev + backgrounds[1].noiseStdDev) / 2,
    iterations,
  };
}
