import { mkdir, writeFile } from 'node:fs/promises';
import path from 'node:path';
import type { BenchScenario, BenchTruth } from './bench-scenario';
import { encodeFrame } from './encode-frame';
import { planBenchMeasurement, RANDOM_PURPOSE, type PlannedFrame } from './plan-bench-measurement';
import { renderBenchFrame } from './render-bench-frame';
import { createSeededRandom } from './seeded-random';
import type { ResolvedBenchScenario } from './check-bench-scenario-options';

const UNDECODABLE_BYTES = 32_768;

async function frameFileBytes(scenario: ResolvedBenchScenario, frame: PlannedFrame): Promise<Buffer> {
  const bytesRandom = createSeededRandom(scenario.seed, frame.sweepIndex, frame.frameIndex, RANDOM_PURPOSE.spoiledBytes);
  if (frame.badFrame === 'undecodable') {
    const bytes = new Uint8Array(UNDECODABLE_BYTES);
    bytesRandom.fillBytes(bytes);
    // A leading zero byte rules out every image signature (PNG 0x89, JPEG 0xFF, TIFF 'I'/'M').
    bytes[0] = 0;
    return Buffer.from(bytes);
  }
  const { camera } = scenario;
  const noiseRandom = createSeededRandom(scenario.seed, frame.sweepIndex, frame.frameIndex, RANDOM_PURPOSE.sensorNoise);
  let pixels: Uint8Array | Uint16Array;
  if (frame.badFrame === 'pure-noise') {
    const maxDn = camera.bitDepth === 16 ? 65535 : 255;
    pixels = camera.bitDepth === 16 ? new Uint16Array(camera.widthPx * camera.heightPx) : new Uint8Array(camera.widthPx * camera.heightPx);
    for (let k = 0; k < pixels.length; k++) pixels[k] = Math.floor(noiseRandom.uniform() * (maxDn + 1));
  } else {
    pixels = renderBenchFrame({
      scenario,
      sweepIndex: frame.sweepIndex,
      positionMm: frame.positionMm,
      exposureGain: frame.exposureGain,
      targetVisible: frame.badFrame !== 'target-lost',
      random: noiseRandom,
    }).pixels;
  }
  const encoded = await encodeFrame({
    pixels,
    widthPx: camera.widthPx,
    heightPx: camera.heightPx,
    format: camera.format,
    jpegQuality: camera.jpegQuality,
  });
  return frame.badFrame === 'truncated' ? encoded.subarray(0, Math.floor(encoded.length / 2)) : encoded;
}

/**
 * Renders a through-focus measurement of a simulated bench with known truth
 * and writes it as a measurement folder: measurement.json (the manifest of
 * measurement-manifest.md), the frames it names, and truth.json. Frames are
 * rendered one at a time while the previous one is encoded and written.
 */
export async function generateBenchMeasurement(
  options: BenchScenario & { outputFolder: string; onProgress?: (message: string) => void },
): Promise<{ folder: string; manifest: object; truth: BenchTruth }> {
  const { outputFolder, onProgress, ...scenarioInput } = options;
  if (typeof outputFolder !== 'string' || outputFolder.trim() === '') throw new Error('outputFolder must name a folder to write into.');
  const plan = planBenchMeasurement(scenarioInput);
  const folder = path.resolve(outputFolder);
  for (let s = 0; s < plan.scenario.sweeps.length; s++) await mkdir(path.join(folder, `s${s + 1}`), { recursive: true });

  let pendingWrite: Promise<void> | null = null;
  for (const [k, frame] of plan.frames.entries()) {
    const bytes = frameFileBytes(plan.scenario, frame);
    // Let the previous frame finish before starting to hold a third one in memory.
    if (pendingWrite) await pendingWrite;
    pendingWrite = bytes.then((buffer) => writeFile(path.join(folder, frame.file), buffer));
    // Marks the rejection as seen; the await above or below still rethrows it.
    pendingWrite.catch(() => undefined);
    onProgress?.(`frame ${k + 1}/${plan.frames.length} ${frame.file} at ${frame.positionMm} mm${frame.badFrame ? ` (${frame.badFrame})` : ''}`);
  }
  if (pendingWrite) await pendingWrite;

  await writeFile(path.join(folder, 'truth.json'), `${JSON.stringify(plan.truth, null, 2)}\n`);
  await writeFile(path.join(folder, 'measurement.json'), `${JSON.stringify(plan.manifest, null, 2)}\n`);
  return { folder, manifest: plan.manifest, truth: plan.truth };
}
