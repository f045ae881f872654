import type { PixelRect } from '../types';
import { invariant } from '../image/invariant';
import { ReusableArray } from '../image/reusable-array';

const visitedScratch = new ReusableArray((n) => new Uint8Array(n));

/**
 * Bounding box of the 8-connected component of a mask (non-zero =
 * foreground) that holds the pixel at `seedIndex` (y·width + x), found by
 * filling from that pixel; null when the pixel is background. Gives the box
 * `labelComponents` gives for that component, visiting only its pixels.
 */
export function componentBoundingBox(
  mask: ArrayLike<number>,
  { width, height }: { width: number; height: number },
  seedIndex: number,
): PixelRect | null {
  invariant(mask.length === width * height, 'mask size must be width × height');
  invariant(Number.isInteger(seedIndex) && seedIndex >= 0 && seedIndex < mask.length, 'seed pixel lies inside the mask');
  if (!mask[seedIndex]) return null;
  const visited = visitedScratch.take(mask.length).fill(0);
  let stack = new Int32Array(1024);
  let top = 0;
  stack[top++] = seedIndex;
  visited[seedIndex] = 1;
  let minX = width;
  let minY = height;
  let maxX = -1;
  let maxY = -1;
  while (top > 0) {
    const index = stack[--top];
    const x = index % width;
    const y = (index - x) / width;
    if (x < minX) minX = x;
    if (x > maxX) maxX = x;
    if (y < minY) minY = y;
    if (y > maxY) maxY = y;
    for (let ny = Math.max(0, y - 1); ny <= Math.min(height - 1, y + 1); ny++) {
      for (let nx = Math.max(0, x - 1); nx <= Math.min(width - 1, x + 1); nx++) {
        const neighbour = ny * width + nx;
        if (!mask[neighbour] || visited[neighbour]) continue;
        visited[neighbour] = 1;
        if (top === stack.length) {
          const grown = new Int32Array(stack.length * 2);
          grown.set(stack);
          stack = grown;
        }
        stack[top++] = neighbour;
      }
    }
  }
  return { x: minX, y: minY, width: maxX - minX + 1, height: maxY - minY + 1 };
}
