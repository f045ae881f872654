import { invariant } from '../image/invariant';

export interface FittedLine {
  /** Mean of the points: a point on the line. */
  pointPx: { x: number; y: number };
  /** Unit vector along the line. */
  directionUnit: { x: number; y: number };
  /** Root-mean-square perpendicular distance of the points from the line. */
  residualRmsPx: number;
}

/**
 * Total-least-squares (orthogonal) line: through the centroid, along the
 * principal axis of the points' scatter, so errors in x and y count alike.
 */
export function fitLineTotalLeastSquares(xs: ArrayLike<number>, ys: ArrayLike<number>): FittedLine {
  const n = xs.length;
  invariant(n >= 2 && ys.length === n, 'a line needs two or more points');
  let mx = 0;
  let my = 0;
  for (let k = 0; k < n; k++) {
    mx += xs[k];
    my += ys[k];
  }
  mx /= n;
  my /= n;
  let sxx = 0;
  let sxy = 0;
  let syy = 0;
  for (let k = 0; k < n; k++) {
    const dx = xs[k] - mx;
    const dy = ys[k] - my;
    sxx += dx * dx;
    sxy += dx * dy;
    syy += dy * dy;
  }
  const angle = 0.5 * Math.atan2(2 * sxy, sxx - syy);
  const direction = { x: Math.cos(angle), y: Math.sin(angle) };
  let sumSq = 0;
  for (let k = 0; k < n; k++) {
    const distance = -(xs[k] - mx) * direction.y + (ys[k] - my) * direction.x;
    sumSq += distance * distance;
  }
  return { pointPx: { x: mx, y: my }, directionUnit: direction, residualRmsPx: Math.sqrt(sumSq / n) };
}
