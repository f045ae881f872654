import type { PixelRect } from '../types';

import type { RegionSize } from './choose-region-size';

/** A region of `size` centred on `centre` as nearly as the frame allows, kept inside the width × height frame. */
export function regionAround(centre: { x: number; y: number }, size: RegionSize, width: number, height: number): PixelRect {
  const w = Math.min(size.width, width);
  const h = Math.min(size.height, height);
  const x = Math.round(Math.min(Math.max(0, centre.x - w / 2), width - w));
  const y = Math.round(Math.min(Math.max(0, centre.y - h / 2), height - h));
  return { x, y, width: w, height: h };
}
