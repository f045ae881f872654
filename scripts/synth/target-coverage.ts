/**
 * Area coverage of the target's sharp geometric image on the pixel grid.
 * Pixel (i, j) covers [i − ½, i + ½] × [j − ½, j + ½] (pixel centres at
 * integers). Pixels that an edge crosses are supersampled 16 × 16.
 */

export type SensorFeature =
  | { kind: 'disc'; centreXPx: number; centreYPx: number; radiusPx: number }
  /** A convex polygon, vertices in either winding. */
  | { kind: 'polygon'; verticesPx: Array<[number, number]> };

/** A rectangle of per-pixel values; (x0, y0) is the top-left pixel index, possibly outside the frame. */
export interface CoverageRegion {
  x0: number;
  y0: number;
  widthPx: number;
  heightPx: number;
  values: Float64Array;
}

const SUBSAMPLES = 16;
const HALF_DIAGONAL_PX = Math.SQRT1_2 + 1e-9;

/** Signed distance-like inside test for a feature: > 0 inside, in pixels. */
function insideDistance(feature: SensorFeature): (x: number, y: number) => number {
  if (feature.kind === 'disc') {
    const { centreXPx: cx, centreYPx: cy, radiusPx: r } = feature;
    return (x, y) => r - Math.hypot(x - cx, y - cy);
  }
  const v = feature.verticesPx;
  let twiceArea = 0;
  for (let i = 0; i < v.length; i++) {
    const [x1, y1] = v[i];
    const [x2, y2] = v[(i + 1) % v.length];
    twiceArea += x1 * y2 - x2 * y1;
  }
  const orientation = Math.sign(twiceArea);
  if (v.length < 3 || orientation === 0) throw new Error('invariant: a polygon feature needs three or more vertices enclosing an area');
  const edges = v.map(([x1, y1], i) => {
    const [x2, y2] = v[(i + 1) % v.length];
    const length = Math.hypot(x2 - x1, y2 - y1);
    // Inward unit normal for the polygon's winding.
    return { x1, y1, nx: (-(y2 - y1) * orientation) / length, ny: ((x2 - x1) * orientation) / length };
  });
  return (x, y) => {
    let min = Infinity;
    for (const e of edges) {
      const d = (x - e.x1) * e.nx + (y - e.y1) * e.ny;
      if (d < min) min = d;
    }
    return min;
  };
}

function featureBounds(feature: SensorFeature): { minX: number; minY: number; maxX: number; maxY: number } {
  if (feature.kind === 'disc') {
    const { centreXPx: cx, centreYPx: cy, radiusPx: r } = feature;
    return { minX: cx - r, minY: cy - r, maxX: cx + r, maxY: cy + r };
  }
  const xs = feature.verticesPx.map((p) => p[0]);
  const ys = feature.verticesPx.map((p) => p[1]);
  return { minX: Math.min(...xs), minY: Math.min(...ys), maxX: Math.max(...xs), maxY: Math.max(...ys) };
}

/** Coverage (0..1) of one feature over its bounding box widened by marginPx on every side. */
export function rasteriseFeatureCoverage(feature: SensorFeature, marginPx: number): CoverageRegion {
  const bounds = featureBounds(feature);
  const x0 = Math.floor(bounds.minX) - marginPx - 1;
  const y0 = Math.floor(bounds.minY) - marginPx - 1;
  const widthPx = Math.ceil(bounds.maxX) + marginPx + 2 - x0;
  const heightPx = Math.ceil(bounds.maxY) + marginPx + 2 - y0;
  const values = new Float64Array(widthPx * heightPx);
  const inside = insideDistance(feature);
  for (let j = 0; j < heightPx; j++) {
    const y = y0 + j;
    if (y + 0.5 < bounds.minY || y - 0.5 > bounds.maxY) continue;
    for (let i = 0; i < widthPx; i++) {
      const x = x0 + i;
      const d = inside(x, y);
      if (d >= HALF_DIAGONAL_PX) {
        values[j * widthPx + i] = 1;
      } else if (d > -HALF_DIAGONAL_PX) {
        let hits = 0;
        for (let sy = 0; sy < SUBSAMPLES; sy++) {
          const py = y - 0.5 + (sy + 0.5) / SUBSAMPLES;
          for (let sx = 0; sx < SUBSAMPLES; sx++) {
            if (inside(x - 0.5 + (sx + 0.5) / SUBSAMPLES, py) > 0) hits++;
          }
        }
        values[j * widthPx + i] = hits / (SUBSAMPLES * SUBSAMPLES);
      }
    }
  }
  return { x0, y0, widthPx, heightPx, values };
}
