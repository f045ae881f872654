import { readFile, stat } from 'node:fs/promises';
import path from 'node:path';
import { checkMeasurementManifest, type MeasurementManifest } from '../../shared/schemas/measurement-manifest';
import { MeasurementError } from '../../shared/measure/engine/measurement-error';

/** Reads and validates `<folder>/measurement.json`, and checks that every frame it names exists. */
export async function loadMeasurementFolder(folder: string): Promise<MeasurementManifest> {
  const manifestPath = path.join(folder, 'measurement.json');
  let text: string;
  try {
    text = await readFile(manifestPath, 'utf8');
  } catch {
    throw new MeasurementError('invalid-manifest', `measurement.json not found in ${folder}`);
  }
  let raw: unknown;
  try {
    raw = JSON.parse(text);
  } catch (error) {
    const detail = error instanceof Error ? error.message : 'parse error';
    throw new MeasurementError('invalid-manifest', `invalid manifest: measurement.json is not valid JSON (${detail})`);
  }
  const checked = checkMeasurementManifest(raw);
  if (!checked.ok) throw new MeasurementError('invalid-manifest', checked.message);

  for (const sweep of checked.manifest.sweeps) {
    for (const frame of sweep.frames) {
      try {
        const info = await stat(path.join(folder, frame.file));
        if (!info.isFile()) throw new Error('not a file');
      } catch {
        throw new MeasurementError('missing-file', `frame file not found: ${frame.file}`);
      }
    }
  }
  return checked.manifest;
}
