import type { PixelRect } from '../types';

/** A side × side square centred on `centre` as nearly as the frame allows, kept inside the width × height frame. */
export function regionAround(centre: { x: number; y: number }, side: number, width: number, height: number): PixelRect {
  const w = Math.min(side, width);
  const h = Math.min(side, height);
  const x = Math.round(Math.min(Math.max(0, centre.x - w / 2), width - w));
  const y = Math.round(Math.min(Math.max(0, centre.y - h / 2), height - h));
  return { x, y, width: w, height: h };
}
