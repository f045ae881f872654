import type { GreyImage, PixelRect, TargetPolarity } from '../types';
import { clampRect } from '../image/clamp-rect';
import { invariant } from '../image/invariant';
import { fitLineTotalLeastSquares } from './fit-line-total-least-squares';
import { labelComponents } from './label-components';
import { median } from './robust-statistics';

type PointPx = { x: number; y: number };

export interface MeasureSquareOptions {
  polarity: TargetPolarity;
  /** Roughly the square's extent (e.g. a detection's bounding box, in this image's coordinates). */
  approximateBoundingBox: PixelRect;
  /** Share of each side left out at both ends, where the corners round the edge; default 0.15. */
  cornerMarginFraction?: number;
}

export interface SquareEdgeLine {
  pointPx: PointPx;
  directionUnit: PointPx;
}

export interface SquareMeasurement {
  /** Mean distance between opposite sides. */
  sizePx: number;
  /** The two opposite-side distances (sides 0–2 and 1–3). */
  oppositeSideDistancesPx: [number, number];
  /** Corner-to-corner length of each side. */
  sideLengthsPx: number[];
  /** Corner k joins side k and side k + 1. */
  cornersPx: PointPx[];
  /** Tilt of the square, in (−π/4, π/4]. */
  angleRad: number;
  /** Sides in order: outward normal at angleRad + k·π/2 (right, lower, left, upper in image axes). */
  edgeLines: SquareEdgeLine[];
  /** Sub-pixel edge points used for each side. */
  edgePointCounts: number[];
  /** Scatter of each side's points about its line. */
  edgeResidualRmsPx: number[];
  /** Median Gaussian-equivalent width of the edges, perpendicular to them. */
  edgeBlurSigmaPx: number;
}

const POLARITIES: readonly TargetPolarity[] = ['dark-on-light', 'light-on-dark'];

export function checkMeasureSquareOptions(image: GreyImage, options: MeasureSquareOptions): Required<MeasureSquareOptions> {
  if (!options || !POLARITIES.includes(options.polarity)) {
    throw new RangeError(`polarity must be one of ${POLARITIES.join(', ')} (got ${String(options?.polarity)}).`);
  }
  const box = options.approximateBoundingBox;
  if (!box || ![box.x, box.y, box.width, box.height].every(Number.isFinite) || box.width < 8 || box.height < 8) {
    throw new RangeError('approximateBoundingBox must be a rect {x, y, width, height} of at least 8×8 pixels.');
  }
  const inside = clampRect(box, image.width, image.height);
  if (inside.width < 8 || inside.height < 8) {
    throw new RangeError(
      `approximateBoundingBox (x=${box.x}, y=${box.y}, width=${box.width}, height=${box.height}) must lie inside the ${image.width}×${image.height} image.`,
    );
  }
  const cornerMarginFraction = options.cornerMarginFraction ?? 0.15;
  if (!(cornerMarginFraction >= 0.05 && cornerMarginFraction <= 0.4)) {
    throw new RangeError(`cornerMarginFraction must be from 0.05 to 0.4 (got ${cornerMarginFraction}).`);
  }
  return { polarity: options.polarity, approximateBoundingBox: inside, cornerMarginFraction };
}

interface SideGuess {
  /** A point on the side's line. */
  pointPx: PointPx;
  /** Outward unit normal. */
  normal: PointPx;
  /** Half the side's length. */
  halfLengthPx: number;
}

interface EdgeScan {
  xs: number[];
  ys: number[];
  /** Gaussian-equivalent edge width perpendicular to the side, per point, from the 25–75 % rise. */
  sigmas: number[];
}

/**
 * Sub-pixel edge points along the central part of one side: along each pixel
 * row (for a side nearer vertical) or column, the centroid of the profile's
 * first difference inside a window around the predicted crossing, as in the
 * edge location step of ISO 12233. Rows whose window is cut by the image
 * border within 3 px of the predicted edge, or that hold less than half the
 * step, are skipped.
 */
function scanSide(
  image: GreyImage,
  side: SideGuess,
  levels: { target: number; background: number },
  windowHalfWidthPx: number,
  marginPx: number,
): EdgeScan {
  const contrast = levels.target - levels.background;
  const scanRows = Math.abs(side.normal.x) >= Math.abs(side.normal.y);
  const along = scanRows ? side.normal.x : side.normal.y;
  const across = scanRows ? side.normal.y : side.normal.x;
  // First differences point inside → outside: positive after this sign.
  const differenceSign = -Math.sign(contrast) * Math.sign(along);
  const tangent = { x: -side.normal.y, y: side.normal.x };
  const reach = Math.max(side.halfLengthPx - marginPx, 1);
  const ends = [-reach, reach].map((t) => (scanRows ? side.pointPx.y + t * tangent.y : side.pointPx.x + t * tangent.x));
  const lineStart = Math.ceil(Math.min(...ends));
  const lineEnd = Math.floor(Math.max(...ends));
  const lineLimit = scanRows ? image.height - 1 : image.width - 1;
  const sampleLimit = scanRows ? image.width - 1 : image.height - 1;
  const scan: EdgeScan = { xs: [], ys: [], sigmas: [] };
  const minStep = 0.5 * Math.abs(contrast);
  const lowLevel = Math.min(differenceSign * levels.target, differenceSign * levels.background);
  const sample = (line: number, i: number) =>
    differenceSign * (scanRows ? image.data[line * image.width + i] : image.data[i * image.width + line]);
  const riseFraction = (line: number, i: number) => (sample(line, i) - lowLevel) / Math.abs(contrast);
  for (let line = Math.max(lineStart, 0); line <= Math.min(lineEnd, lineLimit); line++) {
    const lineOffset = line - (scanRows ? side.pointPx.y : side.pointPx.x);
    const predicted = (scanRows ? side.pointPx.x : side.pointPx.y) - (lineOffset * across) / along;
    // A window cut by the image border is kept when the predicted edge is still well inside it.
    const lo = Math.max(Math.round(predicted) - windowHalfWidthPx, 0);
    const hi = Math.min(Math.round(predicted) + windowHalfWidthPx, sampleLimit);
    if (predicted - lo < 3 || hi - predicted < 3) continue;
    let mass = 0;
    let first = 0;
    for (let i = lo; i < hi; i++) {
      const a = scanRows ? image.data[line * image.width + i] : image.data[i * image.width + line];
      const b = scanRows ? image.data[line * image.width + i + 1] : image.data[(i + 1) * image.width + line];
      const d = differenceSign * (b - a);
      const position = i + 0.5;
      mass += d;
      first += d * position;
    }
    if (!(mass >= minStep)) continue;
    const edge = first / mass;
    // Width from where the profile crosses 25 % and 75 % of the step (IQR of a Gaussian = 1.349 σ):
    // a second moment over a wide window would be swamped by noise far from the edge.
    let below = Math.min(Math.floor(edge), hi);
    while (below > lo && riseFraction(line, below) > 0.25) below--;
    let above = Math.max(Math.ceil(edge), lo);
    while (above < hi && riseFraction(line, above) < 0.75) above++;
    const crossing = (i: number, j: number, level: number) => {
      const a = riseFraction(line, i);
      const b = riseFraction(line, j);
      return b === a ? i : i + ((level - a) / (b - a)) * (j - i);
    };
    const x25 = below < hi ? crossing(below, below + 1, 0.25) : below;
    const x75 = above > lo ? crossing(above - 1, above, 0.75) : above;
    scan.xs.push(scanRows ? edge : line);
    scan.ys.push(scanRows ? line : edge);
    scan.sigmas.push((Math.max(x75 - x25, 0) / 1.349) * Math.abs(along));
  }
  return scan;
}

/** Line through the scan points, after leaving out points more than 4 robust σ off a first fit. */
function fitSideLine(scan: EdgeScan) {
  let line = fitLineTotalLeastSquares(scan.xs, scan.ys);
  const distances = scan.xs.map((x, k) => Math.abs(-(x - line.pointPx.x) * line.directionUnit.y + (scan.ys[k] - line.pointPx.y) * line.directionUnit.x));
  const limit = Math.max(4 * 1.4826 * median(distances), 0.02);
  const keep = distances.map((d) => d <= limit);
  const kept = keep.filter(Boolean).length;
  if (kept >= 3 && kept < scan.xs.length) {
    line = fitLineTotalLeastSquares(scan.xs.filter((_, k) => keep[k]), scan.ys.filter((_, k) => keep[k]));
  }
  return { line, pointCount: kept };
}

function intersect(a: SquareEdgeLine, b: SquareEdgeLine): PointPx {
  const determinant = a.directionUnit.x * b.directionUnit.y - a.directionUnit.y * b.directionUnit.x;
  invariant(Math.abs(determinant) > 1e-6, 'adjacent sides of a square are not parallel');
  const dx = b.pointPx.x - a.pointPx.x;
  const dy = b.pointPx.y - a.pointPx.y;
  const s = (dx * b.directionUnit.y - dy * b.directionUnit.x) / determinant;
  return { x: a.pointPx.x + s * a.directionUnit.x, y: a.pointPx.y + s * a.directionUnit.y };
}

function distanceToLine(point: PointPx, line: SquareEdgeLine): number {
  return Math.abs(-(point.x - line.pointPx.x) * line.directionUnit.y + (point.y - line.pointPx.y) * line.directionUnit.x);
}

/** Tilt in (−π/4, π/4] from the 4th harmonic of the gradient direction, weighted by |∇I|² (no per-pixel trig). */
function dominantEdgeAngle(image: GreyImage, rect: PixelRect, step: number): number {
  let re = 0;
  let im = 0;
  const w = image.width;
  const d = image.data;
  for (let y = rect.y + 1; y < rect.y + rect.height - 1; y += step) {
    for (let x = rect.x + 1; x < rect.x + rect.width - 1; x += step) {
      const o = y * w + x;
      const gx = d[o - w + 1] - d[o - w - 1] + 2 * (d[o + 1] - d[o - 1]) + d[o + w + 1] - d[o + w - 1];
      const gy = d[o + w - 1] - d[o - w - 1] + 2 * (d[o + w] - d[o - w]) + d[o + w + 1] - d[o - w + 1];
      const magnitudeSq = gx * gx + gy * gy;
      if (magnitudeSq === 0) continue;
      const c2 = gx * gx - gy * gy;
      const s2 = 2 * gx * gy;
      re += (c2 * c2 - s2 * s2) / magnitudeSq;
      im += (2 * c2 * s2) / magnitudeSq;
    }
  }
  return Math.atan2(im, re) / 4;
}

/**
 * Size of a filled square: sub-pixel edge points along the central part of
 * each side, a total-least-squares line per side, size = mean distance
 * between opposite sides (independent of the square's tilt). Two passes: the
 * first from the thresholded blob and the gradient direction with a wide
 * window, the second along the fitted lines with a window sized to the blur.
 */
export function measureSquare(image: GreyImage, options: MeasureSquareOptions): SquareMeasurement {
  const { polarity, approximateBoundingBox: box, cornerMarginFraction } = checkMeasureSquareOptions(image, options);
  const sign = polarity === 'light-on-dark' ? 1 : -1;
  const boxSize = Math.max(box.width, box.height);
  const grow = Math.max(4, Math.round(0.25 * boxSize));
  const search = clampRect({ x: box.x - grow, y: box.y - grow, width: box.width + 2 * grow, height: box.height + 2 * grow }, image.width, image.height);

  const innerValues: number[] = [];
  const outerValues: number[] = [];
  const ring = Math.round(grow / 2);
  const levelStep = Math.max(1, Math.ceil(Math.sqrt((search.width * search.height) / 200_000)));
  for (let y = search.y; y < search.y + search.height; y += levelStep) {
    for (let x = search.x; x < search.x + search.width; x += levelStep) {
      const value = image.data[y * image.width + x];
      const u = (x - box.x) / box.width;
      const v = (y - box.y) / box.height;
      if (u > 0.35 && u < 0.65 && v > 0.35 && v < 0.65) innerValues.push(value);
      else if (x < box.x - ring || x >= box.x + box.width + ring || y < box.y - ring || y >= box.y + box.height + ring) outerValues.push(value);
    }
  }
  if (outerValues.length < 20) {
    throw new RangeError(`The ${image.width}×${image.height} region leaves too little background around the square; widen the region.`);
  }
  const backgroundLevel = median(outerValues);
  const targetLevel = median(innerValues);
  const contrast = targetLevel - backgroundLevel;
  if (!(sign * contrast > 0)) {
    throw new RangeError(`No ${polarity} square found in approximateBoundingBox (x=${box.x}, y=${box.y}, width=${box.width}, height=${box.height}).`);
  }

  // The blob only seeds the first pass, so a mask on a grid of at most ~300×300 points is enough.
  const mid = (targetLevel + backgroundLevel) / 2;
  const maskStep = Math.max(1, Math.floor(Math.max(search.width, search.height) / 300));
  const maskWidth = Math.ceil(search.width / maskStep);
  const maskHeight = Math.ceil(search.height / maskStep);
  const mask = new Uint8Array(maskWidth * maskHeight);
  for (let j = 0; j < maskHeight; j++) {
    const rowOffset = (search.y + j * maskStep) * image.width + search.x;
    for (let i = 0; i < maskWidth; i++) {
      mask[j * maskWidth + i] = sign * (image.data[rowOffset + i * maskStep] - mid) > 0 ? 1 : 0;
    }
  }
  const { components } = labelComponents(mask, { width: maskWidth, height: maskHeight });
  invariant(components.length > 0, 'a square with contrast has pixels beyond half contrast');
  const blob = components.reduce((a, b) => (b.areaPx > a.areaPx ? b : a));
  const centre = { x: blob.centroidPx.x * maskStep + search.x, y: blob.centroidPx.y * maskStep + search.y };
  const nominalSide = Math.sqrt(blob.areaPx) * maskStep;
  if (nominalSide < 8) {
    throw new RangeError(`The square in approximateBoundingBox is only about ${nominalSide.toFixed(1)} px across; at least 8 px is needed.`);
  }
  const tilt = dominantEdgeAngle(image, search, maskStep);

  let sides: SideGuess[] = [0, 1, 2, 3].map((k) => {
    const normal = { x: Math.cos(tilt + (k * Math.PI) / 2), y: Math.sin(tilt + (k * Math.PI) / 2) };
    return {
      pointPx: { x: centre.x + (nominalSide / 2) * normal.x, y: centre.y + (nominalSide / 2) * normal.y },
      normal,
      halfLengthPx: nominalSide / 2,
    };
  });

  const runPass = (windowHalfWidthPx: number, marginPx: number) =>
    sides.map((side, k) => {
      const scan = scanSide(image, side, { target: targetLevel, background: backgroundLevel }, windowHalfWidthPx, marginPx);
      if (scan.xs.length < 5) {
        throw new RangeError(`Side ${k} of the square has only ${scan.xs.length} usable edge points; is the square cut by the region's border?`);
      }
      return { scan, ...fitSideLine(scan) };
    });

  const wideWindow = Math.max(4, Math.round(0.25 * nominalSide));
  const first = runPass(wideWindow, 0.25 * nominalSide);
  const edgeBlurSigmaPx = median(first.flatMap((f) => f.scan.sigmas));

  const firstLines: SquareEdgeLine[] = first.map((f) => f.line);
  const firstCorners = firstLines.map((line, k) => intersect(line, firstLines[(k + 1) % 4]));
  sides = sides.map((side, k) => {
    const a = firstCorners[(k + 3) % 4];
    const b = firstCorners[k];
    const direction = first[k].line.directionUnit;
    let normal = { x: direction.y, y: -direction.x };
    if (normal.x * side.normal.x + normal.y * side.normal.y < 0) normal = { x: -normal.x, y: -normal.y };
    return { pointPx: { x: (a.x + b.x) / 2, y: (a.y + b.y) / 2 }, normal, halfLengthPx: Math.hypot(a.x - b.x, a.y - b.y) / 2 };
  });
  const side = median(sides.map((s) => 2 * s.halfLengthPx));
  const narrowWindow = Math.min(wideWindow, Math.max(3, Math.ceil(4 * edgeBlurSigmaPx / Math.SQRT1_2 + 3)));
  const margin = Math.min(0.4 * side, Math.max(cornerMarginFraction * side, 3 * edgeBlurSigmaPx + narrowWindow + 2));
  const second = runPass(narrowWindow, margin);

  const edgeLines: SquareEdgeLine[] = second.map((s) => ({ pointPx: s.line.pointPx, directionUnit: s.line.directionUnit }));
  const cornersPx = edgeLines.map((line, k) => intersect(line, edgeLines[(k + 1) % 4]));
  const sideLengthsPx = [0, 1, 2, 3].map((k) => {
    const a = cornersPx[(k + 3) % 4];
    const b = cornersPx[k];
    return Math.hypot(a.x - b.x, a.y - b.y);
  });
  const oppositeSideDistancesPx: [number, number] = [0, 1].map(
    (k) => (distanceToLine(edgeLines[k].pointPx, edgeLines[k + 2]) + distanceToLine(edgeLines[k + 2].pointPx, edgeLines[k])) / 2,
  ) as [number, number];
  let re = 0;
  let im = 0;
  for (const line of edgeLines) {
    const angle = Math.atan2(line.directionUnit.y, line.directionUnit.x);
    re += Math.cos(4 * angle);
    im += Math.sin(4 * angle);
  }
  let angleRad = Math.atan2(im, re) / 4;
  if (angleRad <= -Math.PI / 4) angleRad += Math.PI / 2;
  const sizePx = (oppositeSideDistancesPx[0] + oppositeSideDistancesPx[1]) / 2;
  invariant(Number.isFinite(sizePx), 'square size is finite');
  return {
    sizePx,
    oppositeSideDistancesPx,
    sideLengthsPx,
    cornersPx,
    angleRad,
    edgeLines,
    edgePointCounts: second.map((s) => s.pointCount),
    edgeResidualRmsPx: second.map((s) => s.line.residualRmsPx),
    edgeBlurSigmaPx,
  };
}
