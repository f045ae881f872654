/**
 * Timing of the image operators on frame-sized inputs (not a test: wall-clock
 * times are not asserted anywhere). Run: node --import tsx tests/measure/image/bench-image-operators.ts
 */
import { focusMeasures } from '../../../shared/measure/focus/focus-measure';
import { downsampleImage } from '../../../shared/measure/image/downsample-image';
import { slantedEdgeMtf } from '../../../shared/measure/mtf/slanted-edge-mtf';
import { detectTarget } from '../../../shared/measure/target/detect-target';
import { measureDotPair } from '../../../shared/measure/target/measure-dot-pair';
import { measureSquare } from '../../../shared/measure/target/measure-square';
import type { GreyImage } from '../../../shared/measure/types';
import { addNoise, renderDots, renderEdge, renderSquare } from './render-scene';

function timeMs(label: string, repeats: number, run: () => unknown): void {
  run();
  const times: number[] = [];
  for (let k = 0; k < repeats; k++) {
    const start = performance.now();
    run();
    times.push(performance.now() - start);
  }
  times.sort((a, b) => a - b);
  console.log(`${label}: median ${times[times.length >> 1].toFixed(1)} ms, min ${times[0].toFixed(1)} ms`);
}

function bigFrame(width: number, height: number): GreyImage {
  const data = new Float32Array(width * height);
  for (let k = 0; k < data.length; k++) data[k] = 1000 + ((k * 2654435761) % 977);
  return { width, height, data, maxValue: 65535 };
}

const region = addNoise(
  renderEdge({ width: 1500, height: 1500, normalAngleRad: 0.1, edgePointPx: { x: 750, y: 750 }, sigmaPx: 3, backgroundLevel: 1000, targetLevel: 20000, maxValue: 65535 }),
  30,
  1,
);
timeMs('focusMeasures, all four operators, 1500×1500 region', 15, () => focusMeasures(region));
const frame = bigFrame(4000, 3000);
timeMs('downsampleImage ×8, 4000×3000 frame', 10, () => downsampleImage(frame, { factor: 8 }));


const squareFrame = addNoise(
  renderSquare({ width: 4000, height: 3000, centrePx: { x: 2000.3, y: 1500.6 }, sidePx: 1000, angleRad: 0.08, sigmaPx: 4, backgroundLevel: 2000, targetLevel: 40000, supersampling: 1 }),
  200,
  2,
);
const reducedSquare = downsampleImage(squareFrame, { factor: 8 });
timeMs('detectTarget (square) on the 500×375 reduced copy', 10, () => detectTarget(reducedSquare, { pattern: 'square' }));
const squareCrop = { width: 1400, height: 1400, data: new Float32Array(1400 * 1400), maxValue: 65535 };
for (let y = 0; y < 1400; y++) squareCrop.data.set(squareFrame.data.subarray((800 + y) * 4000 + 1300, (800 + y) * 4000 + 2700), y * 1400);
timeMs('measureSquare on a 1400×1400 crop (1000 px square)', 5, () =>
  measureSquare(squareCrop, { polarity: 'light-on-dark', approximateBoundingBox: { x: 150, y: 150, width: 1100, height: 1100 } }));
timeMs('slantedEdgeMtf on a 200×600 edge region', 5, () => slantedEdgeMtf(squareCrop, { rect: { x: 1100, y: 400, width: 200, height: 600 } }));

const dotPair = addNoise(
  renderDots({ width: 1500, height: 900, centresPx: [{ x: 400.2, y: 450.1 }, { x: 1100.7, y: 440.3 }], radiusPx: 120, sigmaPx: 6, backgroundLevel: 40000, targetLevel: 5000, supersampling: 1 }),
  300,
  3,
);
timeMs('measureDotPair on a 1500×900 crop (dots 240 px across, 700 px apart)', 5, () =>
  measureDotPair(dotPair, { polarity: 'dark-on-light', approximateCentresPx: [{ x: 405, y: 446 }, { x: 1095, y: 444 }], searchRadiusPx: 350 }));
