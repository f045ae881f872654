import type { GreyImage, PixelRect } from '../types';
import { checkRectInsideImage } from '../image/check-rect';
import { invariant } from '../image/invariant';

export interface SlantedEdgeMtfOptions {
  /** Region holding one straight edge that crosses it fully; the whole image when absent. */
  rect?: PixelRect;
  /** Edge-spread-function bins per pixel; default 4 as in ISO 12233. */
  oversampling?: number;
  /** Highest frequency reported; default 1 cycle/pixel. */
  maxFrequencyCyclesPerPixel?: number;
}

export interface SlantedEdgeMtf {
  /** Frequency where the MTF first falls to 0.5 (linear between samples). */
  mtf50CyclesPerPixel: number;
  /** True when the MTF stays above 0.5 up to the highest frequency reported; mtf50 is then that frequency. */
  mtf50BeyondRange: boolean;
  /** Angle of the edge line from the nearer pixel axis, in (−π/4, π/4]; same convention as measureSquare's angleRad
   * (the direction angle atan2(dy, dx) of a near-horizontal edge; a near-vertical edge's, less π/2). */
  edgeAngleRad: number;
  /** Whether the edge runs nearer the columns ('near-vertical') or the rows. */
  edgeOrientation: 'near-vertical' | 'near-horizontal';
  /** Frequencies perpendicular to the edge. */
  frequenciesCyclesPerPixel: number[];
  mtf: number[];
}

export function checkSlantedEdgeMtfOptions(image: GreyImage, options: SlantedEdgeMtfOptions = {}) {
  const rect = checkRectInsideImage(image, options.rect, { minSizePx: 8 });
  const oversampling = options.oversampling ?? 4;
  if (!Number.isInteger(oversampling) || oversampling < 2 || oversampling > 8) {
    throw new RangeError(`oversampling must be a whole number from 2 to 8 (got ${options.oversampling}).`);
  }
  const maxFrequencyCyclesPerPixel = options.maxFrequencyCyclesPerPixel ?? 1;
  if (!(maxFrequencyCyclesPerPixel > 0 && maxFrequencyCyclesPerPixel <= oversampling / 2)) {
    throw new RangeError(
      `maxFrequencyCyclesPerPixel must be above 0 and at most oversampling / 2 (got ${options.maxFrequencyCyclesPerPixel}).`,
    );
  }
  return { rect, oversampling, maxFrequencyCyclesPerPixel };
}

/** Least-squares straight line c = a + b·row over the rows flagged usable. */
function fitEdgeLine(centroids: Float64Array, usable: Uint8Array): { a: number; b: number } {
  let n = 0;
  let sr = 0;
  let sc = 0;
  for (let r = 0; r < centroids.length; r++) {
    if (!usable[r]) continue;
    n++;
    sr += r;
    sc += centroids[r];
  }
  const mr = sr / n;
  const mc = sc / n;
  let srr = 0;
  let src = 0;
  for (let r = 0; r < centroids.length; r++) {
    if (!usable[r]) continue;
    srr += (r - mr) ** 2;
    src += (r - mr) * (centroids[r] - mc);
  }
  const b = srr > 0 ? src / srr : 0;
  return { a: mc - b * mr, b };
}

/**
 * Spatial frequency response of a slanted edge by the e-SFR method of
 * ISO 12233:2017: per row, the centroid of the first difference (Hamming-
 * windowed about the first line fit in a second pass) locates the edge; a
 * least-squares line through the centroids gives its position and tilt;
 * every pixel is binned by its perpendicular distance from that line into an
 * edge spread function oversampled `oversampling` times; the ESF is
 * differentiated (central difference), Hamming-windowed about the line spread
 * function's centroid, Fourier-transformed, normalised to 1 at zero
 * frequency, and divided by the central difference's own response
 * sin(2πfΔ)/(2πfΔ) (capped at 10). The transform is evaluated on a grid four
 * times finer than the ESF length gives (zero padding), so MTF50 is not
 * limited by the frequency step. Frequencies are perpendicular to the edge.
 * The pixel aperture is part of what is measured and is not divided out.
 * The Hamming window narrows the line spread slightly: for a Gaussian blur of
 * σ px and an edge region W px across, MTF50 reads high by about 9·(σ/W)²
 * (0.5 % at W = 40σ, 2 % at W = 21σ), so give the region room.
 */
export function slantedEdgeMtf(image: GreyImage, options: SlantedEdgeMtfOptions = {}): SlantedEdgeMtf {
  const { rect, oversampling, maxFrequencyCyclesPerPixel } = checkSlantedEdgeMtfOptions(image, options);
  const stride = image.width;
  const data = image.data;

  let horizontalVariation = 0;
  let verticalVariation = 0;
  for (let y = rect.y; y < rect.y + rect.height - 1; y++) {
    for (let x = rect.x; x < rect.x + rect.width - 1; x++) {
      const o = y * stride + x;
      horizontalVariation += Math.abs(data[o + 1] - data[o]);
      verticalVariation += Math.abs(data[o + stride] - data[o]);
    }
  }
  const nearVertical = horizontalVariation >= verticalVariation;
  // Work on "rows" that cross the edge: image rows for a near-vertical edge, image columns otherwise.
  const rowCount = nearVertical ? rect.height : rect.width;
  const rowLength = nearVertical ? rect.width : rect.height;
  const values = new Float64Array(rowCount * rowLength);
  for (let r = 0; r < rowCount; r++) {
    for (let i = 0; i < rowLength; i++) {
      const x = nearVertical ? rect.x + i : rect.x + r;
      const y = nearVertical ? rect.y + r : rect.y + i;
      values[r * rowLength + i] = data[y * stride + x];
    }
  }

  let totalStep = 0;
  for (let r = 0; r < rowCount; r++) totalStep += values[r * rowLength + rowLength - 1] - values[r * rowLength];
  const stepSign = totalStep >= 0 ? 1 : -1;

  const centroids = new Float64Array(rowCount);
  const masses = new Float64Array(rowCount);
  const usable = new Uint8Array(rowCount);
  const locateEdges = (line: { a: number; b: number } | null) => {
    for (let r = 0; r < rowCount; r++) {
      let mass = 0;
      let first = 0;
      const centre = line ? line.a + line.b * r : 0;
      for (let i = 0; i < rowLength - 1; i++) {
        const position = i + 0.5;
        const window = line ? 0.54 + 0.46 * Math.cos((Math.PI * (position - centre)) / rowLength) : 1;
        const d = stepSign * (values[r * rowLength + i + 1] - values[r * rowLength + i]) * window;
        mass += d;
        first += d * position;
      }
      masses[r] = mass;
      centroids[r] = first / mass;
    }
    const sortedMasses = Float64Array.from(masses).sort();
    const typical = sortedMasses[rowCount >> 1];
    let count = 0;
    for (let r = 0; r < rowCount; r++) {
      usable[r] = masses[r] > 0.5 * typical && centroids[r] > 1 && centroids[r] < rowLength - 2 ? 1 : 0;
      count += usable[r];
    }
    return { typical, count };
  };

  let located = locateEdges(null);
  let noiseSum = 0;
  for (let r = 0; r < rowCount; r++) {
    for (let i = 0; i < Math.min(3, rowLength - 1); i++) noiseSum += Math.abs(values[r * rowLength + i + 1] - values[r * rowLength + i]);
  }
  const edgeEndNoise = noiseSum / (rowCount * Math.min(3, rowLength - 1));
  if (!(located.typical > 0) || located.count < Math.max(4, rowCount / 2) || Math.abs(totalStep / rowCount) < 5 * edgeEndNoise) {
    throw new RangeError(
      `No usable edge in rect (x=${rect.x}, y=${rect.y}, width=${rect.width}, height=${rect.height}): it must hold one straight edge crossing it from side to side.`,
    );
  }
  let line = fitEdgeLine(centroids, usable);
  located = locateEdges(line);
  if (located.count < Math.max(4, rowCount / 2)) {
    throw new RangeError(
      `No usable edge in rect (x=${rect.x}, y=${rect.y}, width=${rect.width}, height=${rect.height}): the edge is not straight or leaves the region.`,
    );
  }
  line = fitEdgeLine(centroids, usable);

  const cosTilt = 1 / Math.sqrt(1 + line.b * line.b);
  // Distances covered by every row, so no ESF bin mixes in fewer rows at its ends.
  const edgeAtFirst = line.a;
  const edgeAtLast = line.a + line.b * (rowCount - 1);
  const commonLow = (0 - Math.min(edgeAtFirst, edgeAtLast)) * cosTilt;
  const commonHigh = (rowLength - 1 - Math.max(edgeAtFirst, edgeAtLast)) * cosTilt;
  if (commonLow > -3 || commonHigh < 3) {
    throw new RangeError(
      `No usable edge in rect (x=${rect.x}, y=${rect.y}, width=${rect.width}, height=${rect.height}): the edge must stay at least 3 px from the region's sides along its whole length.`,
    );
  }
  const binCount = Math.floor((commonHigh - commonLow) * oversampling) + 1;
  const sums = new Float64Array(binCount);
  const counts = new Float64Array(binCount);
  for (let r = 0; r < rowCount; r++) {
    const edge = line.a + line.b * r;
    for (let i = 0; i < rowLength; i++) {
      const bin = Math.round(((i - edge) * cosTilt - commonLow) * oversampling);
      if (bin < 0 || bin >= binCount) continue;
      sums[bin] += values[r * rowLength + i];
      counts[bin]++;
    }
  }
  let emptyBins = 0;
  for (let k = 0; k < binCount; k++) if (counts[k] === 0) emptyBins++;
  const edgeAngleRad = Math.atan(line.b) * (nearVertical ? -1 : 1);
  if (emptyBins > 0.25 * binCount) {
    throw new RangeError(
      `The edge in rect (x=${rect.x}, y=${rect.y}, width=${rect.width}, height=${rect.height}) is tilted only ${((Math.abs(edgeAngleRad) * 180) / Math.PI).toFixed(2)}° from the pixel grid; ${oversampling}× oversampling needs a few degrees or more rows.`,
    );
  }
  const esf = new Float64Array(binCount);
  for (let k = 0; k < binCount; k++) esf[k] = counts[k] ? sums[k] / counts[k] : NaN;
  for (let k = 0; k < binCount; k++) {
    if (!Number.isNaN(esf[k])) continue;
    let below = k - 1;
    while (below >= 0 && Number.isNaN(esf[below])) below--;
    let above = k + 1;
    while (above < binCount && Number.isNaN(esf[above])) above++;
    if (below < 0) esf[k] = esf[above];
    else if (above >= binCount) esf[k] = esf[below];
    else esf[k] = esf[below] + ((esf[above] - esf[below]) * (k - below)) / (above - below);
  }

  const lsf = new Float64Array(binCount);
  for (let k = 1; k < binCount - 1; k++) lsf[k] = (stepSign * (esf[k + 1] - esf[k - 1])) / 2;
  let lsfMass = 0;
  let lsfFirst = 0;
  for (let k = 0; k < binCount; k++) {
    lsfMass += lsf[k];
    lsfFirst += k * lsf[k];
  }
  invariant(lsfMass > 0, 'a located edge has a positive line spread');
  const lsfCentre = lsfFirst / lsfMass;
  const halfWindow = Math.max(lsfCentre, binCount - 1 - lsfCentre);
  for (let k = 0; k < binCount; k++) lsf[k] *= 0.54 + 0.46 * Math.cos((Math.PI * (k - lsfCentre)) / halfWindow);

  let paddedLength = 1;
  while (paddedLength < binCount) paddedLength *= 2;
  paddedLength *= 4;
  const frequencyStep = oversampling / paddedLength;
  const frequencyCount = Math.floor(maxFrequencyCyclesPerPixel / frequencyStep + 1e-9) + 1;
  const binSpacingPx = 1 / oversampling;
  const frequenciesCyclesPerPixel: number[] = [];
  const mtf: number[] = [];
  let zeroFrequency = 0;
  for (let j = 0; j < frequencyCount; j++) {
    const f = j * frequencyStep;
    let re = 0;
    let im = 0;
    const omega = 2 * Math.PI * f * binSpacingPx;
    // e^{−iω(k − c)} by rotation from k = 0: no trigonometry per sample.
    const stepCos = Math.cos(omega);
    const stepSin = Math.sin(omega);
    let c = Math.cos(omega * lsfCentre);
    let sn = Math.sin(omega * lsfCentre);
    for (let k = 0; k < binCount; k++) {
      re += lsf[k] * c;
      im += lsf[k] * sn;
      const nextC = c * stepCos + sn * stepSin;
      sn = sn * stepCos - c * stepSin;
      c = nextC;
    }
    const modulus = Math.hypot(re, im);
    if (j === 0) zeroFrequency = modulus;
    const derivativeResponse = j === 0 ? 1 : Math.sin(omega) / omega;
    const correction = Math.min(1 / derivativeResponse, 10);
    frequenciesCyclesPerPixel.push(f);
    mtf.push((modulus / zeroFrequency) * (derivativeResponse > 0 ? correction : 10));
  }

  let mtf50CyclesPerPixel = frequenciesCyclesPerPixel[frequencyCount - 1];
  let mtf50BeyondRange = true;
  for (let j = 1; j < frequencyCount; j++) {
    if (mtf[j] < 0.5) {
      const t = (mtf[j - 1] - 0.5) / (mtf[j - 1] - mtf[j]);
      mtf50CyclesPerPixel = frequenciesCyclesPerPixel[j - 1] + t * frequencyStep;
      mtf50BeyondRange = false;
      break;
    }
  }
  return {
    mtf50CyclesPerPixel,
    mtf50BeyondRange,
    edgeAngleRad,
    edgeOrientation: nearVertical ? 'near-vertical' : 'near-horizontal',
    frequenciesCyclesPerPixel,
    mtf,
  };
}
