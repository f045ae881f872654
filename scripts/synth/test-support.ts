/**
 * Independent measurements on rendered frames, for the generator's tests
 * only. Nothing here shares code with the renderer: the optics are traced
 * with 2×2 ray-transfer matrices and the images are measured by plain sums.
 */
import sharp from 'sharp';

/** A paraxial ray [height, angle] through a 2×2 ray-transfer matrix [[A, B], [C, D]]. */
export type RayMatrix = [[number, number], [number, number]];

export function multiply(m: RayMatrix, n: RayMatrix): RayMatrix {
  return [
    [m[0][0] * n[0][0] + m[0][1] * n[1][0], m[0][0] * n[0][1] + m[0][1] * n[1][1]],
    [m[1][0] * n[0][0] + m[1][1] * n[1][0], m[1][0] * n[0][1] + m[1][1] * n[1][1]],
  ];
}

/** Free propagation over d and a thin lens of focal length f (Gerrard & Burch, "Introduction to Matrix Methods in Optics", 1975). */
export const propagate = (dMm: number): RayMatrix => [[1, dMm], [0, 1]];
export const thinLens = (fMm: number): RayMatrix => [[1, 0], [-1 / fMm, 1]];

/**
 * Object at objectMm imaged by a lens whose principal planes sit at
 * frontPlaneMm and rearPlaneMm (a ray leaves H′ at the height it reached H).
 * The image plane is where the system's B element vanishes; B is linear in
 * the last propagation, so two evaluations locate it. Returns the image
 * plane and the signed lateral magnification A (negative: inverted).
 */
export function traceImage(options: { objectMm: number; frontPlaneMm: number; rearPlaneMm: number; focalLengthMm: number }): {
  imagePlaneMm: number;
  signedMagnification: number;
} {
  const system = (afterRearMm: number) =>
    multiply(propagate(afterRearMm), multiply(thinLens(options.focalLengthMm), propagate(options.frontPlaneMm - options.objectMm)));
  const b0 = system(0)[0][1];
  const b1 = system(1)[0][1];
  const distance = -b0 / (b1 - b0);
  return { imagePlaneMm: options.rearPlaneMm + distance, signedMagnification: system(distance)[0][0] };
}

export interface GreyPixels {
  widthPx: number;
  heightPx: number;
  values: Float64Array;
}

export function toGrey(pixels: Uint8Array | Uint16Array, widthPx: number, heightPx: number): GreyPixels {
  return { widthPx, heightPx, values: Float64Array.from(pixels) };
}

/** Decodes a file to luminance with sharp, 16-bit exact (environment.md, sharp section). */
export async function decodeGrey(file: string | Buffer): Promise<GreyPixels & { fileDepth: string | undefined }> {
  const { data, info } = await sharp(file).toColourspace('grey16').raw({ depth: 'ushort' }).toBuffer({ resolveWithObject: true });
  const words = new Uint16Array(data.buffer, data.byteOffset, data.length / 2);
  const { depth } = await sharp(file).metadata();
  return { widthPx: info.width, heightPx: info.height, values: Float64Array.from(words), fileDepth: depth };
}

export interface Window {
  x0: number;
  y0: number;
  x1: number;
  y1: number;
}

export function windowAround(x: number, y: number, halfSizePx: number): Window {
  return { x0: Math.round(x - halfSizePx), y0: Math.round(y - halfSizePx), x1: Math.round(x + halfSizePx), y1: Math.round(y + halfSizePx) };
}

/** Median of the pixels on the window's border: the local background when the window holds the whole blurred feature. */
export function borderMedian(image: GreyPixels, w: Window): number {
  const values: number[] = [];
  for (let x = w.x0; x <= w.x1; x++) values.push(image.values[w.y0 * image.widthPx + x], image.values[w.y1 * image.widthPx + x]);
  for (let y = w.y0 + 1; y < w.y1; y++) values.push(image.values[y * image.widthPx + w.x0], image.values[y * image.widthPx + w.x1]);
  values.sort((a, b) => a - b);
  return values[Math.floor(values.length / 2)];
}

/** Background-subtracted moments of a feature darker (sign −1) or brighter (+1) than the background. */
export function featureMoments(image: GreyPixels, w: Window, sign: 1 | -1): { total: number; x: number; y: number; radialSecondMoment: number } {
  const background = borderMedian(image, w);
  let total = 0, sx = 0, sy = 0;
  for (let y = w.y0; y <= w.y1; y++) {
    for (let x = w.x0; x <= w.x1; x++) {
      const weight = sign * (image.values[y * image.widthPx + x] - background);
      total += weight;
      sx += weight * x;
      sy += weight * y;
    }
  }
  const cx = sx / total, cy = sy / total;
  let r2 = 0;
  for (let y = w.y0; y <= w.y1; y++) {
    for (let x = w.x0; x <= w.x1; x++) {
      const weight = sign * (image.values[y * image.widthPx + x] - background);
      r2 += weight * ((x - cx) ** 2 + (y - cy) ** 2);
    }
  }
  return { total, x: cx, y: cy, radialSecondMoment: r2 / total };
}

/** Mean squared central difference inside a window: a plain sharpness figure. */
export function gradientEnergy(image: GreyPixels, w: Window): number {
  let sum = 0, n = 0;
  for (let y = w.y0 + 1; y < w.y1; y++) {
    for (let x = w.x0 + 1; x < w.x1; x++) {
      const i = y * image.widthPx + x;
      const gx = image.values[i + 1] - image.values[i - 1];
      const gy = image.values[i + image.widthPx] - image.values[i - image.widthPx];
      sum += gx * gx + gy * gy;
      n++;
    }
  }
  return sum / n;
}
