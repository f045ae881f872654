import { invariant } from '../image/invariant';

export interface Plane {
  /** Value at (0, 0). */
  offset: number;
  slopeX: number;
  slopeY: number;
}

/** Least-squares plane v = offset + slopeX·x + slopeY·y through the points (coordinates centred for stability). */
export function fitPlane(xs: ArrayLike<number>, ys: ArrayLike<number>, values: ArrayLike<number>): Plane {
  const n = values.length;
  invariant(n >= 3 && xs.length === n && ys.length === n, 'a plane needs three or more points');
  let mx = 0;
  let my = 0;
  let mv = 0;
  for (let k = 0; k < n; k++) {
    mx += xs[k];
    my += ys[k];
    mv += values[k];
  }
  mx /= n;
  my /= n;
  mv /= n;
  let sxx = 0;
  let sxy = 0;
  let syy = 0;
  let sxv = 0;
  let syv = 0;
  for (let k = 0; k < n; k++) {
    const dx = xs[k] - mx;
    const dy = ys[k] - my;
    const dv = values[k] - mv;
    sxx += dx * dx;
    sxy += dx * dy;
    syy += dy * dy;
    sxv += dx * dv;
    syv += dy * dv;
  }
  const determinant = sxx * syy - sxy * sxy;
  let slopeX = 0;
  let slopeY = 0;
  if (determinant > 1e-12 * (sxx * syy + 1e-300)) {
    slopeX = (sxv * syy - syv * sxy) / determinant;
    slopeY = (syv * sxx - sxv * sxy) / determinant;
  }
  return { offset: mv - slopeX * mx - slopeY * my, slopeX, slopeY };
}
