import type { BenchScenario } from '../../../scripts/synth/bench-scenario';

/**
 * The finite-conjugate preset made small enough for an API test: an
 * 800 × 600 JPEG frame, a 2.4 mm dot pair (so the blurred image stays on
 * the frame at |m| ≈ 0.5) and 15 frames per sweep.
 */
export function smallFiniteConjugate(scenario: BenchScenario, changes: { seed?: number; focalLengthMm?: number; framesPerFocus?: number } = {}): BenchScenario {
  return {
    ...scenario,
    seed: changes.seed ?? scenario.seed,
    lens: { ...scenario.lens, focalLengthMm: changes.focalLengthMm ?? scenario.lens.focalLengthMm },
    camera: { ...scenario.camera, widthPx: 800, heightPx: 600, format: 'jpeg', jpegQuality: 90 },
    target: { ...scenario.target, sizeMm: 2.4, dotDiameterMm: 0.5, centreOffsetMm: { x: 0.1, y: -0.1 } },
    sweeps: scenario.sweeps.map((sweep) => ({ ...sweep, framesPerFocus: changes.framesPerFocus ?? 15, stepMm: 0.35 })),
  };
}

/** The same bench with the target gone from every frame (lamp on, target slide out). */
export function withoutTarget(scenario: BenchScenario): BenchScenario {
  const frames = scenario.sweeps[0].framesPerFocus ?? 25;
  return { ...scenario, badFrames: Array.from({ length: frames }, (_, k) => ({ sweepNumber: 1, frameNumber: k + 1, kind: 'target-lost' as const })) };
}
