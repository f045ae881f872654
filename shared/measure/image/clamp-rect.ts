import type { PixelRect } from '../types';

/**
 * The part of `rect` that lies inside a `width` × `height` image, with its
 * corners rounded to whole pixels (x and x + width are rounded separately, so
 * a fractional rect keeps its size). May be empty (width or height 0).
 */
export function clampRect(rect: PixelRect, width: number, height: number): PixelRect {
  const x0 = Math.min(Math.max(Math.round(rect.x), 0), width);
  const y0 = Math.min(Math.max(Math.round(rect.y), 0), height);
  const x1 = Math.min(Math.max(Math.round(rect.x + rect.width), x0), width);
  const y1 = Math.min(Math.max(Math.round(rect.y + rect.height), y0), height);
  return { x: x0, y: y0, width: x1 - x0, height: y1 - y0 };
}
