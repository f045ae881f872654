export interface LocatedCentre {
  positionMm: number;
  centrePx: { x: number; y: number };
}

/**
 * The target's centre at a rail position, interpolated piecewise linearly
 * between frames where it was found (and extended along the nearest piece
 * beyond them). Through a sensor sweep the image of a point moves linearly
 * with the sensor's position, so the pieces follow it closely.
 */
export function interpolateTargetCentre(located: readonly LocatedCentre[], positionMm: number): { x: number; y: number } {
  if (located.length === 0) throw new RangeError('located must hold at least one frame where the target was found.');
  const sorted = [...located].sort((a, b) => a.positionMm - b.positionMm);
  if (sorted.length === 1) return { ...sorted[0].centrePx };
  let right = 1;
  while (right < sorted.length - 1 && sorted[right].positionMm < positionMm) right++;
  const a = sorted[right - 1];
  const b = sorted[right];
  const span = b.positionMm - a.positionMm;
  const t = span === 0 ? 0 : (positionMm - a.positionMm) / span;
  return {
    x: a.centrePx.x + t * (b.centrePx.x - a.centrePx.x),
    y: a.centrePx.y + t * (b.centrePx.y - a.centrePx.y),
  };
}
