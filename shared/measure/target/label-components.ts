import type { PixelRect } from '../types';
import { invariant } from '../image/invariant';

export interface ConnectedComponent {
  /** 1-based label, as stored in `labels`. */
  label: number;
  areaPx: number;
  boundingBox: PixelRect;
  /** Mean position of the component's pixels (pixel centres at whole coordinates). */
  centroidPx: { x: number; y: number };
  touchesBorder: boolean;
  /** Index (y·width + x) of the component's first pixel in scan order. */
  firstPixelIndex: number;
}

export interface ComponentLabelling {
  /** 0 for background, else the component's label. */
  labels: Int32Array;
  components: ConnectedComponent[];
}

/**
 * 8-connected component labelling of a mask (non-zero = foreground) by the
 * classic two-pass scan with a union–find table of provisional labels.
 */
export function labelComponents(mask: ArrayLike<number>, { width, height }: { width: number; height: number }): ComponentLabelling {
  invariant(mask.length === width * height, 'mask size must be width × height');
  const labels = new Int32Array(width * height);
  const parent: number[] = [0];
  const find = (label: number): number => {
    let root = label;
    while (parent[root] !== root) root = parent[root];
    while (parent[label] !== root) {
      const next = parent[label];
      parent[label] = root;
      label = next;
    }
    return root;
  };
  const union = (a: number, b: number): number => {
    const ra = find(a);
    const rb = find(b);
    if (ra === rb) return ra;
    const low = ra < rb ? ra : rb;
    parent[ra] = low;
    parent[rb] = low;
    return low;
  };

  for (let y = 0; y < height; y++) {
    for (let x = 0; x < width; x++) {
      const index = y * width + x;
      if (!mask[index]) continue;
      let label = x > 0 ? labels[index - 1] : 0;
      if (y > 0) {
        const up = index - width;
        const upLeft = x > 0 ? labels[up - 1] : 0;
        const upCentre = labels[up];
        const upRight = x < width - 1 ? labels[up + 1] : 0;
        if (upLeft !== 0 && upLeft !== label) label = label === 0 ? upLeft : union(label, upLeft);
        if (upCentre !== 0 && upCentre !== label) label = label === 0 ? upCentre : union(label, upCentre);
        if (upRight !== 0 && upRight !== label) label = label === 0 ? upRight : union(label, upRight);
      }
      if (label === 0) {
        label = parent.length;
        parent.push(label);
      }
      labels[index] = label;
    }
  }

  const provisionalCount = parent.length;
  const finalLabel = new Int32Array(provisionalCount);
  let componentCount = 0;
  for (let label = 1; label < provisionalCount; label++) {
    const root = find(label);
    if (finalLabel[root] === 0) finalLabel[root] = ++componentCount;
    finalLabel[label] = finalLabel[root];
  }
  const area = new Float64Array(componentCount + 1);
  const sumX = new Float64Array(componentCount + 1);
  const sumY = new Float64Array(componentCount + 1);
  const minX = new Int32Array(componentCount + 1).fill(width);
  const minY = new Int32Array(componentCount + 1).fill(height);
  const maxX = new Int32Array(componentCount + 1).fill(-1);
  const maxY = new Int32Array(componentCount + 1).fill(-1);
  const firstPixel = new Int32Array(componentCount + 1).fill(-1);
  for (let y = 0, index = 0; y < height; y++) {
    for (let x = 0; x < width; x++, index++) {
      if (labels[index] === 0) continue;
      const label = finalLabel[labels[index]];
      labels[index] = label;
      if (firstPixel[label] < 0) firstPixel[label] = index;
      area[label]++;
      sumX[label] += x;
      sumY[label] += y;
      if (x < minX[label]) minX[label] = x;
      if (x > maxX[label]) maxX[label] = x;
      if (y < minY[label]) minY[label] = y;
      if (y > maxY[label]) maxY[label] = y;
    }
  }
  const components: ConnectedComponent[] = [];
  for (let label = 1; label <= componentCount; label++) {
    components.push({
      label,
      areaPx: area[label],
      boundingBox: { x: minX[label], y: minY[label], width: maxX[label] - minX[label] + 1, height: maxY[label] - minY[label] + 1 },
      centroidPx: { x: sumX[label] / area[label], y: sumY[label] / area[label] },
      touchesBorder: minX[label] === 0 || minY[label] === 0 || maxX[label] === width - 1 || maxY[label] === height - 1,
      firstPixelIndex: firstPixel[label],
    });
  }
  return { labels, components };
}
