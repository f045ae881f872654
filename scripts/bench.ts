/**
 * npm run bench — speed and memory of the measurement engine, as ratios
 * against a baseline run in the same process (these machines are noisy).
 *
 * A 15-frame sweep of 4000×3000 JPEG frames is generated once by the
 * synthetic bench (cached under .cache/) and analysed; in the same run the
 * frames are decoded alone with sharp, on the same number of lanes: the floor
 * no analysis can beat. Both paths are warmed up first (untimed), then rounds
 * alternate baseline and analysis; the ratio is the median over rounds. Each
 * round also reports CPU time over all threads, the steadier figure on a busy
 * machine. The last line reads exactly:
 *   bench: analysis/decode ratio R; peak RSS M MB
 */
import os from 'node:os';
import path from 'node:path';
import sharp from 'sharp';
import { cachedBenchMeasurement } from './synth/cached-bench-measurement';
import { measureFolder } from '../server/measure/measure-folder';

const ROUNDS = 7;
const WARM_UP_ANALYSES = 2;
const lanes = Math.max(2, os.availableParallelism());

function log(message: string): void {
  process.stderr.write(`${message}\n`);
}

async function decodeAll(folder: string, files: string[]): Promise<void> {
  let next = 0;
  await Promise.all(
    Array.from({ length: lanes }, async () => {
      while (next < files.length) {
        const file = files[next++];
        // Decode to luminance, the same pixels the engine needs, then drop them.
        await sharp(path.join(folder, file)).greyscale().raw().toBuffer();
      }
    }),
  );
}

function cpuMs(usage: NodeJS.CpuUsage): number {
  return (usage.user + usage.system) / 1000;
}

function median(values: number[]): number {
  const sorted = [...values].sort((a, b) => a - b);
  return sorted[Math.floor(sorted.length / 2)];
}

async function main(): Promise<void> {
  sharp.cache(false);
  log('bench: preparing a 15-frame sweep of 4000×3000 JPEG frames (generated once, then cached)');
  const fixture = await cachedBenchMeasurement(
    'large',
    (s) => ({ ...s, sweeps: [{ ...s.sweeps[0], framesPerFocus: 15 }] }),
    (message) => log(`  ${message}`),
  );
  const files: string[] = fixture.manifest.sweeps[0].frames.map((f: { file: string }) => f.file);
  log(`bench: ${files.length} frames, ${lanes} lanes`);

  // Warm-up, not timed: libvips, and the JIT for both paths (a long-lived analysis worker runs
  // compiled code; the engine's once-per-sweep functions need a second run to be compiled).
  await decodeAll(fixture.folder, files);
  for (let run = 0; run < WARM_UP_ANALYSES; run++) await measureFolder(fixture.folder, { concurrency: lanes });
  const ratios: number[] = [];
  for (let round = 1; round <= ROUNDS; round++) {
    let start = performance.now();
    let cpuStart = process.cpuUsage();
    await decodeAll(fixture.folder, files);
    const decodeMs = performance.now() - start;
    const decodeCpuMs = cpuMs(process.cpuUsage(cpuStart));
    start = performance.now();
    cpuStart = process.cpuUsage();
    const result = await measureFolder(fixture.folder, { concurrency: lanes });
    const analysisMs = performance.now() - start;
    const analysisCpuMs = cpuMs(process.cpuUsage(cpuStart));
    ratios.push(analysisMs / decodeMs);
    const errorPercent = (100 * (result.focalLengthMm - fixture.truth.focalLengthMm)) / fixture.truth.focalLengthMm;
    // CPU time (all threads) beside wall time: on a busy machine the wall ratio also depends on how the scheduler shares the cores.
    log(
      `bench: round ${round}: decode ${decodeMs.toFixed(0)} ms (cpu ${decodeCpuMs.toFixed(0)} ms), analysis ${analysisMs.toFixed(0)} ms (cpu ${analysisCpuMs.toFixed(0)} ms), ratio ${(analysisMs / decodeMs).toFixed(2)}; f = ${result.focalLengthMm.toFixed(3)} mm (truth ${fixture.truth.focalLengthMm} mm, ${errorPercent.toFixed(3)} %)`,
    );
  }
  const peakRssMb = process.resourceUsage().maxRSS / 1024;
  process.stdout.write(`bench: analysis/decode ratio ${median(ratios).toFixed(2)}; peak RSS ${Math.round(peakRssMb)} MB\n`);
}

main().catch((error) => {
  log(`bench: failed: ${error instanceof Error ? error.message : String(error)}`);
  process.exitCode = 1;
});
