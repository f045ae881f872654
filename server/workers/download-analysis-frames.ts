import { createWriteStream } from 'node:fs';
import { mkdir } from 'node:fs/promises';
import path from 'node:path';
import { pipeline } from 'node:stream/promises';
import { S3ServiceException } from '@aws-sdk/client-s3';
import { MeasurementError } from '../../shared/measure/engine/measurement-error';
import { invariant } from '../invariant';
import type { AnalysisFrameObject } from '../services/analysis-runs';
import type { ObjectStorage } from '../services/object-storage';

function isMissingObject(error: unknown): boolean {
  return error instanceof S3ServiceException && (error.name === 'NoSuchKey' || error.$metadata.httpStatusCode === 404);
}

/**
 * Copies every frame a run names from object storage into `folder`, under
 * the file name the manifest uses. Each object is streamed to disk, never
 * held in memory whole; `concurrency` downloads run at once.
 */
export async function downloadAnalysisFrames(options: {
  storage: ObjectStorage;
  files: AnalysisFrameObject[];
  folder: string;
  concurrency?: number;
}): Promise<{ bytes: number }> {
  const root = path.resolve(options.folder);
  const targets = options.files.map((entry) => {
    const target = path.resolve(root, entry.file);
    invariant(target.startsWith(`${root}${path.sep}`), `frame file ${JSON.stringify(entry.file)} stays inside the analysis folder`);
    return { ...entry, target };
  });
  let bytes = 0;
  let next = 0;
  const downloadOne = async (entry: (typeof targets)[number]) => {
    await mkdir(path.dirname(entry.target), { recursive: true });
    let object;
    try {
      object = await options.storage.getObjectStream(entry.objectKey);
    } catch (error) {
      if (isMissingObject(error)) {
        throw new MeasurementError(
          'missing-file',
          `frame ${entry.file} is no longer in storage (its original pixels may have been removed), so it cannot be analysed; exclude or upload it again`,
        );
      }
      throw error;
    }
    await pipeline(object.stream, createWriteStream(entry.target));
    bytes += object.sizeBytes ?? 0;
  };
  const lanes = Array.from({ length: Math.max(1, Math.min(options.concurrency ?? 4, targets.length)) }, async () => {
    while (next < targets.length) {
      const entry = targets[next];
      next += 1;
      await downloadOne(entry);
    }
  });
  await Promise.all(lanes);
  return { bytes };
}
