import type { PixelRect } from '../types';
import type { SquareMeasurement } from '../target/measure-square';

export interface SquareEdgeRectsOptions {
  /** Extent across the edge, measured from the edge line, at every point along it (the rect is wider by the tilt's drift). */
  widthPx: number;
  /** Share of each side's length the rect covers, centred on the side; default 0.6 (keeps clear of the rounded corners). */
  lengthFraction?: number;
}

/**
 * One rect per side of a measured square (in edgeLines order), each holding
 * the middle part of that side with `widthPx / 2` on either side of the edge
 * all along it, for slantedEdgeMtf. A near-vertical side gets a rect taller
 * than wide, a near-horizontal one the reverse. Rects are not clamped to any
 * image: use clampRect with the image's size.
 */
export function squareEdgeRects(
  square: Pick<SquareMeasurement, 'edgeLines' | 'cornersPx' | 'sideLengthsPx'>,
  options: SquareEdgeRectsOptions,
): PixelRect[] {
  const { widthPx } = options;
  const lengthFraction = options.lengthFraction ?? 0.6;
  if (!(Number.isFinite(widthPx) && widthPx >= 8)) {
    throw new RangeError(`widthPx must be a number of at least 8 (got ${widthPx}).`);
  }
  if (!(lengthFraction > 0 && lengthFraction <= 0.8)) {
    throw new RangeError(`lengthFraction must be above 0 and at most 0.8 (got ${lengthFraction}).`);
  }
  const shortestSide = Math.min(...square.sideLengthsPx);
  if (widthPx > shortestSide) {
    throw new RangeError(`widthPx (${widthPx}) must not exceed the square's side (${shortestSide.toFixed(1)} px).`);
  }
  return square.edgeLines.map((line, k) => {
    const a = square.cornersPx[(k + 3) % 4];
    const b = square.cornersPx[k];
    const middle = { x: (a.x + b.x) / 2, y: (a.y + b.y) / 2 };
    const span = lengthFraction * square.sideLengthsPx[k];
    const { x: ux, y: uy } = line.directionUnit;
    const nearVertical = Math.abs(uy) >= Math.abs(ux);
    const alongExtent = span * (nearVertical ? Math.abs(uy) : Math.abs(ux));
    const acrossExtent = widthPx + span * (nearVertical ? Math.abs(ux) : Math.abs(uy));
    const width = Math.round(nearVertical ? acrossExtent : alongExtent);
    const height = Math.round(nearVertical ? alongExtent : acrossExtent);
    return { x: Math.round(middle.x - width / 2), y: Math.round(middle.y - height / 2), width, height };
  });
}
