/**
 * Generated bench measurements for tests and the benchmark, cached under
 * .cache/ keyed by the scenario and the generator's own source, so a second
 * run reuses them and a change to the generator makes new ones.
 */
import { createHash } from 'node:crypto';
import { existsSync, readdirSync, readFileSync } from 'node:fs';
import { mkdir, rename, rm } from 'node:fs/promises';
import path from 'node:path';
import { generateBenchMeasurement } from './generate-bench-measurement';
import { benchPresets, type BenchPresetName } from './presets';
import type { BenchScenario, BenchTruth } from './bench-scenario';

const root = path.resolve(import.meta.dirname, '../..');
const cacheRoot = path.join(root, '.cache', 'bench-measurements');

function generatorFingerprint(): string {
  const folder = path.join(root, 'scripts', 'synth');
  const hash = createHash('sha256');
  for (const name of readdirSync(folder).filter((n) => n.endsWith('.ts') && !n.endsWith('.test.ts')).sort()) {
    hash.update(name).update(readFileSync(path.join(folder, name)));
  }
  return hash.digest('hex').slice(0, 12);
}

const fingerprint = generatorFingerprint();

export interface CachedBenchMeasurement {
  folder: string;
  truth: BenchTruth;
  manifest: Record<string, any>;
}

/** A generated measurement folder for a preset, optionally changed; cached between runs. */
export async function cachedBenchMeasurement(
  preset: BenchPresetName,
  change: (s: BenchScenario) => BenchScenario = (s) => s,
  onProgress?: (message: string) => void,
): Promise<CachedBenchMeasurement> {
  const scenario = change(structuredClone(benchPresets[preset]));
  const key = createHash('sha256').update(JSON.stringify(scenario)).update(fingerprint).digest('hex').slice(0, 16);
  const folder = path.join(cacheRoot, `${preset}-${key}`);
  if (!existsSync(path.join(folder, 'truth.json'))) {
    const staging = `${folder}.partial-${process.pid}`;
    await rm(staging, { recursive: true, force: true });
    await mkdir(staging, { recursive: true });
    await generateBenchMeasurement({ ...scenario, outputFolder: staging, onProgress });
    await rm(folder, { recursive: true, force: true });
    await rename(staging, folder);
  }
  return {
    folder,
    truth: JSON.parse(readFileSync(path.join(folder, 'truth.json'), 'utf8')),
    manifest: JSON.parse(readFileSync(path.join(folder, 'measurement.json'), 'utf8')),
  };
}
