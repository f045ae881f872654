import type { GreyImage } from '../types';
import type { Plane } from './fit-plane';

/**
 * One dot's signal over a disc of pixels, relative to its background plane.
 * A dark dot is a shadow on the lit background and is vignetted with it, so
 * its signal is (background − value) / background, which removes the
 * background's weighting of the centroid (callers scale it back to intensity
 * at the dot); a light dot's signal is value − background.
 *
 * Only running sums along each row of the disc are kept, of the signal and
 * of signal × column (a pixel's own signal is the step between neighbouring
 * entries). They let the mass and first moments of a disc window be summed
 * over each row's fully covered span in constant time, so iterating a
 * centroid costs a few operations per row instead of one per pixel. Rows are
 * stored in the disc's bounding box; only each row's chord is filled.
 */
export interface DotSignal {
  /** The box, inclusive, in image pixels. */
  x0: number;
  y0: number;
  x1: number;
  y1: number;
  /** Only the disc of this radius around (centreX, centreY) is filled (the box's corners are not needed). */
  centreX: number;
  centreY: number;
  radiusPx: number;
  plane: Plane;
  /** +1: value − background (light dot); −1: (background − value) / background (dark dot). */
  sign: number;
  /**
   * Per box row, width + 1 entries: entry (b − x0 + 1) minus entry (a − x0) is
   * the signal summed over columns a … b of that row, both within its chord.
   */
  runningSum: Float64Array;
  /** As `runningSum`, of signal × (x − x0). Only differences along a chord are meaningful. */
  runningMoment: Float64Array;
}

/** The box of pixels around (cx, cy) within `reachPx`, clamped to the image. */
export function boxAround(image: GreyImage, cx: number, cy: number, reachPx: number) {
  return {
    x0: Math.max(0, Math.floor(cx - reachPx)),
    x1: Math.min(image.width - 1, Math.ceil(cx + reachPx)),
    y0: Math.max(0, Math.floor(cy - reachPx)),
    y1: Math.min(image.height - 1, Math.ceil(cy + reachPx)),
  };
}

/**
 * Buffers for the running sums, reused from one measurement to the next:
 * they are megabytes for a big dot, and fresh ones each frame would make the
 * garbage collector run often. Slot k serves dot k; a `DotSignal` stays valid
 * until the next `dotSignalOver` for the same slot (JavaScript runs one call
 * at a time, so no two measurements interleave).
 */
const bufferSlots: Float64Array[][] = [[], []];

function slotBuffers(slot: number, length: number): [Float64Array, Float64Array] {
  const buffers = bufferSlots[slot];
  if (!buffers[0] || buffers[0].length < length) {
    buffers[0] = new Float64Array(length);
    buffers[1] = new Float64Array(length);
  }
  return [buffers[0].subarray(0, length), buffers[1].subarray(0, length)];
}

/** The signal of dot `slot` (0 or 1) over the disc of `radiusPx` around (cx, cy); see `DotSignal`. */
export function dotSignalOver(image: GreyImage, plane: Plane, sign: number, cx: number, cy: number, radiusPx: number, slot: 0 | 1): DotSignal {
  const box = boxAround(image, cx, cy, radiusPx);
  const width = box.x1 - box.x0 + 1;
  const height = box.y1 - box.y0 + 1;
  const [runningSum, runningMoment] = slotBuffers(slot, (width + 1) * height);
  const dot: DotSignal = { ...box, centreX: cx, centreY: cy, radiusPx, plane, sign, runningSum, runningMoment };
  fillDotSignal(image, dot);
  return dot;
}

// The loop lives apart from the object it fills so that nothing after it needs
// type feedback the first time round (on-stack-replaced code would deoptimise there).
function fillDotSignal(image: GreyImage, dot: DotSignal): void {
  const { data } = image;
  // Whole numbers as 32-bit integers (see accumulateFocusSums in focus-measure.ts).
  const imageWidth = image.width | 0;
  const x0 = dot.x0 | 0;
  const y0 = dot.y0 | 0;
  const x1 = dot.x1 | 0;
  const y1 = dot.y1 | 0;
  const { sign, runningSum, runningMoment, centreX, centreY, radiusPx } = dot;
  const { offset, slopeX, slopeY } = dot.plane;
  const width = x1 - x0 + 1;
  for (let y = y0; y <= y1; y++) {
    const rowBackground = offset + slopeY * y;
    const source = y * imageWidth;
    const running = (y - y0) * (width + 1);
    // The row's chord of the disc, with 2 px to spare; the sums start from zero at its first pixel.
    const half = Math.sqrt(Math.max(0, radiusPx * radiusPx - (y - centreY) * (y - centreY))) + 2;
    const first = (Math.max(x0, Math.floor(centreX - half)) - x0) | 0;
    const last = (Math.min(x1, Math.ceil(centreX + half)) - x0) | 0;
    runningSum[running + first] = 0;
    runningMoment[running + first] = 0;
    let sum = 0;
    let moment = 0;
    for (let i = first; i <= last; i++) {
      const x = x0 + i;
      const value = data[source + x];
      const background = rowBackground + slopeX * x;
      const s = sign > 0 ? value - background : (background - value) / background;
      sum += s;
      moment += s * i;
      runningSum[running + i + 1] = sum;
      runningMoment[running + i + 1] = moment;
    }
  }
}

/**
 * True when a window or the rings of radius `reachPx` around (cx, cy) lie in
 * the filled disc: the sums read pixels up to 2 px beyond that radius.
 */
export function dotSignalCovers(dot: DotSignal, cx: number, cy: number, reachPx: number): boolean {
  return Math.hypot(cx - dot.centreX, cy - dot.centreY) + reachPx + 2 <= dot.radiusPx;
}

/** The background plane's level at (x, y). */
export function planeLevelAt(plane: Plane, x: number, y: number): number {
  return plane.offset + plane.slopeX * x + plane.slopeY * y;
}

/**
 * Sums of coverage × signal, × (x − cx) and × (y − cy) over the pixels of a
 * disc window of radius `reachPx` − ½ around (cx, cy), where a pixel's
 * coverage is reachPx − distance, clipped to 0…1, so the window moves
 * smoothly with its centre. Written to `moments` as [mass, x moment, y moment].
 * The window must lie inside the filled disc (see `dotSignalCovers`).
 */
export function discWindowMoments(dot: DotSignal, image: GreyImage, cx: number, cy: number, reachPx: number, moments: Float64Array): void {
  const { runningSum, runningMoment } = dot;
  const bx0 = dot.x0 | 0;
  const by0 = dot.y0 | 0;
  const boxWidth = (dot.x1 - bx0 + 1) | 0;
  const window = boxAround(image, cx, cy, reachPx);
  const x0 = window.x0 | 0;
  const x1 = window.x1 | 0;
  const y0 = window.y0 | 0;
  const y1 = window.y1 | 0;
  const reachSq = reachPx * reachPx;
  // Pixels this far in are fully covered (the 1e-9 margin covers rounding), so they need no square root.
  const fullSq = reachPx > 1 ? (reachPx - 1) * (reachPx - 1) * (1 - 1e-9) : -1;
  let mass = 0;
  let momentX = 0;
  let momentY = 0;
  for (let y = y0; y <= y1; y++) {
    const dy = y - cy;
    const dySq = dy * dy;
    if (dySq >= reachSq) continue;
    const half = Math.sqrt(reachSq - dySq) + 1;
    const from = Math.max(x0, Math.floor(cx - half)) | 0;
    const to = Math.min(x1, Math.ceil(cx + half)) | 0;
    let fullFrom = to + 1;
    let fullTo = to;
    if (fullSq > dySq) {
      const fullHalf = Math.sqrt(fullSq - dySq);
      fullFrom = Math.max(from, Math.ceil(cx - fullHalf)) | 0;
      fullTo = Math.min(to, Math.floor(cx + fullHalf)) | 0;
      if (fullFrom > fullTo) {
        fullFrom = to + 1;
        fullTo = to;
      }
    }
    // Index of pixel x's running-sum entry; the pixel's own signal is the step from it to the next.
    const running = (y - by0) * (boxWidth + 1) - bx0;
    let rowMass = 0;
    let rowMomentX = 0;
    for (let x = from; x < fullFrom && x <= to; x++) {
      const dx = x - cx;
      const weight = reachPx - Math.sqrt(dx * dx + dySq);
      if (weight <= 0) continue;
      const s = (runningSum[running + x + 1] - runningSum[running + x]) * (weight < 1 ? weight : 1);
      rowMass += s;
      rowMomentX += s * dx;
    }
    if (fullFrom <= fullTo) {
      const spanMass = runningSum[running + fullTo + 1] - runningSum[running + fullFrom];
      const spanMoment = runningMoment[running + fullTo + 1] - runningMoment[running + fullFrom];
      rowMass += spanMass;
      rowMomentX += spanMoment - (cx - bx0) * spanMass;
      for (let x = fullTo + 1; x <= to; x++) {
        const dx = x - cx;
        const weight = reachPx - Math.sqrt(dx * dx + dySq);
        if (weight <= 0) continue;
        const s = (runningSum[running + x + 1] - runningSum[running + x]) * (weight < 1 ? weight : 1);
        rowMass += s;
        rowMomentX += s * dx;
      }
    }
    mass += rowMass;
    momentX += rowMomentX;
    momentY += rowMass * dy;
  }
  moments[0] = mass;
  moments[1] = momentX;
  moments[2] = momentY;
}

/**
 * Signal summed per whole-pixel ring of distance from (cx, cy), out to
 * `sums.length` rings, with the pixel count of each ring. The rings must lie
 * inside the filled disc (see `dotSignalCovers`).
 */
export function ringSignalSums(dot: DotSignal, image: GreyImage, cx: number, cy: number, sums: Float64Array, counts: Float64Array): void {
  const bx0 = dot.x0 | 0;
  const by0 = dot.y0 | 0;
  const boxWidth = (dot.x1 - bx0 + 1) | 0;
  const ringCount = sums.length;
  const rings = boxAround(image, cx, cy, ringCount);
  const x0 = rings.x0 | 0;
  const x1 = rings.x1 | 0;
  const y0 = rings.y0 | 0;
  const y1 = rings.y1 | 0;
  for (let y = y0; y <= y1; y++) {
    const dySq = (y - cy) ** 2;
    if (dySq >= ringCount * ringCount) continue;
    const running = (y - by0) * (boxWidth + 1) - bx0;
    // Outward from the column nearest the centre the distance only grows on each side.
    const centreColumn = Math.min(x1, Math.max(x0, Math.round(cx))) | 0;
    addRingSide(dot.runningSum, running, cx, dySq, centreColumn, x1, 1, sums, counts);
    addRingSide(dot.runningSum, running, cx, dySq, centreColumn - 1, x0, -1, sums, counts);
  }
}

/**
 * One side of a row, from column `first` outward (`direction` ±1) to `last`:
 * the ring index is carried along and stepped whenever the squared distance
 * reaches the next whole radius squared, which is floor(√d²) without a square
 * root per pixel; each run of pixels in one ring is summed from the running
 * sums in one step.
 */
function addRingSide(
  runningSum: Float64Array,
  running: number,
  cx: number,
  dySq: number,
  first: number,
  last: number,
  direction: 1 | -1,
  sums: Float64Array,
  counts: Float64Array,
): void {
  const ringCount = sums.length;
  if (direction > 0 ? first > last : first < last) return;
  let ring = Math.floor(Math.sqrt((first - cx) ** 2 + dySq));
  if (ring >= ringCount) return;
  let nextSq = (ring + 1) * (ring + 1);
  let runStart = first;
  for (let x = first; direction > 0 ? x <= last : x >= last; x += direction) {
    const distanceSq = (x - cx) ** 2 + dySq;
    if (distanceSq < nextSq) continue;
    addRun(runningSum, running, runStart, x - direction, ring, sums, counts);
    while (distanceSq >= nextSq) {
      ring++;
      nextSq = (ring + 1) * (ring + 1);
    }
    if (ring >= ringCount) return;
    runStart = x;
  }
  addRun(runningSum, running, runStart, last, ring, sums, counts);
}

/** Adds the pixels between columns a and b (either order, inclusive) to ring `ring`. */
function addRun(runningSum: Float64Array, running: number, a: number, b: number, ring: number, sums: Float64Array, counts: Float64Array): void {
  const low = a < b ? a : b;
  const high = a < b ? b : a;
  sums[ring] += runningSum[running + high + 1] - runningSum[running + low];
  counts[ring] += high - low + 1;
}
