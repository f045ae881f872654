import { describe, expect, it } from 'vitest';
import type { TargetDetection } from '../target/detect-target';
import { chooseRegionSize } from './choose-region-size';
import { dotBackgroundReachPx } from './measure-sweep-frame';

function dotPair(a: { x: number; y: number }, b: { x: number; y: number }, dotRadiusPx: number, blurPx: number): TargetDetection {
  const blob = (c: { x: number; y: number }) => ({
    centroidPx: c,
    areaPx: Math.PI * dotRadiusPx * dotRadiusPx,
    boundingBox: { x: c.x - dotRadiusPx, y: c.y - dotRadiusPx, width: 2 * dotRadiusPx, height: 2 * dotRadiusPx },
    contrast: 100,
  });
  const reach = dotRadiusPx + blurPx;
  const x0 = Math.min(a.x, b.x) - reach;
  const y0 = Math.min(a.y, b.y) - reach;
  const box = { x: x0, y: y0, width: Math.abs(a.x - b.x) + 2 * reach, height: Math.abs(a.y - b.y) + 2 * reach };
  return {
    pattern: 'dot-pair',
    polarity: 'dark-on-light',
    boundingBox: box,
    blurExtentBox: box,
    centrePx: { x: (a.x + b.x) / 2, y: (a.y + b.y) / 2 },
    blobs: [blob(a), blob(b)],
  };
}

describe('chooseRegionSize', () => {
  it('gives a horizontal dot pair a band: the square the extent needs across, and the dots’ background rings down', () => {
    const detection = dotPair({ x: 1000, y: 1500 }, { x: 1886, y: 1500 }, 88, 60);
    const size = chooseRegionSize([detection]);
    const square = Math.ceil((886 + 2 * 148) * 1.3 + 16);
    expect(size.width).toBe(square);
    // Window 2.5 × 88 = 220 px, ring to 1.5 × 220 + 1 px, sampling margin: the band holds both dots' rings.
    expect(dotBackgroundReachPx(detection)).toBe(220 + 1 + 110 + 2);
    expect(size.height).toBe(Math.ceil(2 * (220 + 1 + 110 + 2)));
    expect(size.height).toBeLessThan(0.6 * size.width);
  });

  it('turns the band for a vertical pair, never exceeds the square, and keeps a square target square', () => {
    const vertical = chooseRegionSize([dotPair({ x: 500, y: 400 }, { x: 500, y: 1286 }, 88, 60)]);
    const horizontal = chooseRegionSize([dotPair({ x: 400, y: 500 }, { x: 1286, y: 500 }, 88, 60)]);
    expect(vertical).toEqual({ width: horizontal.height, height: horizontal.width });
    // Dots large against their spacing: the rings would reach past the square, which caps them.
    const crowded = chooseRegionSize([dotPair({ x: 400, y: 500 }, { x: 700, y: 500 }, 120, 10)]);
    expect(crowded.height).toBeLessThanOrEqual(crowded.width);
    const square: TargetDetection = {
      ...dotPair({ x: 0, y: 0 }, { x: 1, y: 0 }, 1, 0),
      pattern: 'square',
      blobs: [],
      blurExtentBox: { x: 100, y: 100, width: 300, height: 280 },
    };
    expect(chooseRegionSize([square])).toEqual({ width: Math.ceil(300 * 1.3 + 16), height: Math.ceil(280 * 1.3 + 16) });
  });

  it('takes the widest of several frames along each axis and adds the slack to extents and rings', () => {
    const sharp = dotPair({ x: 1000, y: 1500 }, { x: 1886, y: 1500 }, 60, 10);
    const blurred = dotPair({ x: 1000, y: 1500 }, { x: 1886, y: 1500 }, 88, 120);
    const both = chooseRegionSize([sharp, blurred]);
    expect(both).toEqual(chooseRegionSize([blurred]));
    const slack = chooseRegionSize([blurred], 4);
    expect(slack.width - both.width).toBeGreaterThanOrEqual(5);
    expect(slack.height - both.height).toBe(8);
  });
});
