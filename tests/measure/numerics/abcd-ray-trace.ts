/**
 * Independent paraxial ray trace for checking the focal-length solvers, with
 * 2 × 2 ray-transfer matrices acting on (height y, reduced angle n·u), after
 * A. Gerrard and J. M. Burch, "Introduction to Matrix Methods in Optics"
 * (Wiley, 1975), chapter III:
 *   translation by t in a medium of index n: [[1, t/n], [0, 1]]
 *   refraction at radius R from n₁ to n₂:    [[1, 0], [−(n₂ − n₁)/R, 1]]
 *   thin lens of focal length f:              [[1, 0], [−1/f, 1]]
 * It shares no code with shared/measure/solvers on purpose.
 */

export type RayMatrix = [[number, number], [number, number]];

export function multiplyRayMatrices(later: RayMatrix, earlier: RayMatrix): RayMatrix {
  return [
    [later[0][0] * earlier[0][0] + later[0][1] * earlier[1][0], later[0][0] * earlier[0][1] + later[0][1] * earlier[1][1]],
    [later[1][0] * earlier[0][0] + later[1][1] * earlier[1][0], later[1][0] * earlier[0][1] + later[1][1] * earlier[1][1]],
  ];
}

export function translation(distanceMm: number, index = 1): RayMatrix {
  return [
    [1, distanceMm / index],
    [0, 1],
  ];
}

export function refraction(radiusMm: number, indexBefore: number, indexAfter: number): RayMatrix {
  const power = Number.isFinite(radiusMm) ? (indexAfter - indexBefore) / radiusMm : 0;
  return [
    [1, 0],
    [-power, 1],
  ];
}

export function thinLensMatrix(focalLengthMm: number): RayMatrix {
  return [
    [1, 0],
    [-1 / focalLengthMm, 1],
  ];
}

/** One element on the rail: a thick lens (two spherical surfaces) or an ideal thin lens. */
export type OpticalElement =
  | { kind: 'thick'; frontVertexMm: number; frontRadiusMm: number; rearRadiusMm: number; thicknessMm: number; index: number }
  | { kind: 'thin'; positionMm: number; focalLengthMm: number };

function elementStartMm(e: OpticalElement): number {
  return e.kind === 'thick' ? e.frontVertexMm : e.positionMm;
}
function elementEndMm(e: OpticalElement): number {
  return e.kind === 'thick' ? e.frontVertexMm + e.thicknessMm : e.positionMm;
}

export interface OpticalSystem {
  /** Matrix from the first vertex to the last vertex. */
  matrix: RayMatrix;
  firstVertexMm: number;
  lastVertexMm: number;
}

/** Builds the vertex-to-vertex matrix of elements in air, in the order light meets them. */
export function buildSystem(elements: OpticalElement[]): OpticalSystem {
  const sorted = elements.slice().sort((a, b) => elementStartMm(a) - elementStartMm(b));
  let matrix: RayMatrix = [
    [1, 0],
    [0, 1],
  ];
  let currentMm = elementStartMm(sorted[0]);
  for (const element of sorted) {
    const gap = elementStartMm(element) - currentMm;
    if (gap < -1e-12) throw new Error('elements overlap');
    matrix = multiplyRayMatrices(translation(gap), matrix);
    if (element.kind === 'thin') {
      matrix = multiplyRayMatrices(thinLensMatrix(element.focalLengthMm), matrix);
    } else {
      matrix = multiplyRayMatrices(refraction(element.frontRadiusMm, 1, element.index), matrix);
      matrix = multiplyRayMatrices(translation(element.thicknessMm, element.index), matrix);
      matrix = multiplyRayMatrices(refraction(element.rearRadiusMm, element.index, 1), matrix);
    }
    currentMm = elementEndMm(element);
  }
  return { matrix, firstVertexMm: elementStartMm(sorted[0]), lastVertexMm: currentMm };
}

/** Effective focal length −1/C (in air). */
export function systemFocalLengthMm(system: OpticalSystem): number {
  return -1 / system.matrix[1][0];
}

/** Rail positions of the principal planes H and H′ (planes of unit magnification). */
export function principalPlanesMm(system: OpticalSystem): { frontMm: number; rearMm: number } {
  const [[a], [c, d]] = system.matrix;
  return { frontMm: system.firstVertexMm + (d - 1) / c, rearMm: system.lastVertexMm + (1 - a) / c };
}

/** Object-to-plane matrix: object at objectMm, then the system, then air to planeMm. */
export function objectToPlaneMatrix(system: OpticalSystem, objectMm: number, planeMm: number): RayMatrix {
  const before = translation(system.firstVertexMm - objectMm);
  const after = translation(planeMm - system.lastVertexMm);
  return multiplyRayMatrices(after, multiplyRayMatrices(system.matrix, before));
}

/**
 * Image of an object point: the plane where B of the object-to-plane matrix
 * vanishes (all rays from the point meet), and the lateral magnification A there.
 */
export function imageOf(system: OpticalSystem, objectMm: number): { imageMm: number; magnification: number } {
  // B(z) is linear in the plane position z: B(z) = B₀ + (z − z₀)·D₀ with z₀ the last vertex.
  const atVertex = objectToPlaneMatrix(system, objectMm, system.lastVertexMm);
  const imageMm = system.lastVertexMm - atVertex[0][1] / atVertex[1][1];
  const toImage = objectToPlaneMatrix(system, objectMm, imageMm);
  return { imageMm, magnification: toImage[0][0] };
}

/** Shifts every element by the same rail distance (a lens carrier moving). */
export function shiftElements(elements: OpticalElement[], shiftMm: number): OpticalElement[] {
  return elements.map((e) =>
    e.kind === 'thick' ? { ...e, frontVertexMm: e.frontVertexMm + shiftMm } : { ...e, positionMm: e.positionMm + shiftMm },
  );
}

/**
 * Lens-carrier shifts (from the elements' current place) at which an object at
 * objectMm is sharp on a sensor at sensorMm: roots of B(shift) found by
 * bisection on a fine scan, so nothing from the lens equation is assumed.
 */
export function sharpCarrierShiftsMm(elements: OpticalElement[], objectMm: number, sensorMm: number, fromMm: number, toMm: number): number[] {
  const b = (shift: number) => objectToPlaneMatrix(buildSystem(shiftElements(elements, shift)), objectMm, sensorMm)[0][1];
  const roots: number[] = [];
  const steps = 4000;
  let previousShift = fromMm;
  let previousB = b(fromMm);
  for (let k = 1; k <= steps; k++) {
    const shift = fromMm + ((toMm - fromMm) * k) / steps;
    const value = b(shift);
    if (Math.sign(value) !== Math.sign(previousB)) {
      let low = previousShift;
      let high = shift;
      let lowValue = previousB;
      for (let i = 0; i < 200; i++) {
        const mid = 0.5 * (low + high);
        const midValue = b(mid);
        if (Math.sign(midValue) === Math.sign(lowValue)) {
          low = mid;
          lowValue = midValue;
        } else {
          high = mid;
        }
        if (high - low < 1e-13 * Math.max(1, Math.abs(mid))) break;
      }
      roots.push(0.5 * (low + high));
    }
    previousShift = shift;
    previousB = value;
  }
  return roots;
}
