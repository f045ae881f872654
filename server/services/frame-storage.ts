/**
 * Storing a sweep's frames: the one path every image takes into Paraxia (the
 * upload route, the demo seed, scripts). The bytes are streamed to object
 * storage while they are counted, hashed and their type read from the first
 * bytes; the stored original is then decoded to prove it whole and to make
 * its thumbnail and preview; only then is the frame row written. On any
 * failure every object written for the frame is deleted again.
 */
import { createHash, randomUUID, type Hash } from 'node:crypto';
import { Readable } from 'node:stream';
import { and, eq } from 'drizzle-orm';
import {
  FRAME_MAX_BYTES,
  FRAME_MAX_PIXELS,
  frameContentTypes,
  frameImageFormatNames,
  frameImageUrl,
  sanitiseFrameFileName,
  type Frame,
  type FrameImageFormat,
  type FrameRendition,
} from '../../shared/schemas/frames';
import { canChangeFrames } from '../../shared/schemas/measurements';
import type { Database } from '../db/client';
import { numericSettings, type Env, type NumericSettingRange } from '../env';
import { auditEvents, frames, lenses, measurements, sweeps, workOrders } from '../db/schema';
import { HttpError } from '../http-error';
import { HttpStatus } from '../http-status';
import { invariant } from '../invariant';
import { isUniqueViolation } from './equipment';
import { renderFrameImages } from './frame-images';
import type { Logger } from './logger';
import type { ObjectStorage } from './object-storage';

/* ------------------------------- settings -------------------------------- */

export interface FrameUploadSettings {
  /** Largest original accepted, bytes. */
  maxBytes: number;
  /** Largest image accepted, pixels. */
  maxPixels: number;
}

export const defaultFrameUploadSettings: FrameUploadSettings = { maxBytes: FRAME_MAX_BYTES, maxPixels: FRAME_MAX_PIXELS };

const settingLimits: Record<keyof FrameUploadSettings, NumericSettingRange> = {
  maxBytes: numericSettings.PARAXIA_FRAME_MAX_BYTES,
  maxPixels: numericSettings.PARAXIA_FRAME_MAX_PIXELS,
};

/** Fills the defaults and checks the upload settings, throwing a sentence that names the bad option. */
export function checkFrameUploadOptions(options: Partial<FrameUploadSettings> = {}): FrameUploadSettings {
  const checked = { ...defaultFrameUploadSettings };
  for (const key of Object.keys(settingLimits) as (keyof FrameUploadSettings)[]) {
    const value = options[key];
    if (value === undefined) continue;
    const { min, max } = settingLimits[key];
    if (typeof value !== 'number' || !Number.isInteger(value) || value < min || value > max) {
      throw new Error(`${key} must be a whole number from ${min} to ${max}, got ${String(value)}.`);
    }
    checked[key] = value;
  }
  return checked;
}

/** The limits PARAXIA_FRAME_MAX_BYTES and PARAXIA_FRAME_MAX_PIXELS set (checked by server/env.ts; default 80 MiB, 60 MP). */
export function frameUploadSettingsFromEnv(env: Pick<Env, 'PARAXIA_FRAME_MAX_BYTES' | 'PARAXIA_FRAME_MAX_PIXELS'>): FrameUploadSettings {
  return { maxBytes: env.PARAXIA_FRAME_MAX_BYTES, maxPixels: env.PARAXIA_FRAME_MAX_PIXELS };
}

/* ------------------------------ object keys ------------------------------ */

const ORIGINAL_EXTENSIONS: Record<FrameImageFormat, string> = { png: 'png', jpeg: 'jpg', tiff: 'tif' };

export interface SweepLocation {
  organisationId: string;
  workOrderId: string;
  measurementId: string;
  sweepId: string;
}

/** Everything stored for a sweep lives under this prefix (the admin's storage page sums by it). */
export function sweepObjectPrefix(location: SweepLocation): string {
  return `orgs/${location.organisationId}/work-orders/${location.workOrderId}/measurements/${location.measurementId}/sweeps/${location.sweepId}/`;
}

export interface FrameObjectKeys {
  prefix: string;
  original: string;
  thumbnail: string;
  preview: string;
}

export function frameObjectKeys(location: SweepLocation & { frameId: string; format: FrameImageFormat }): FrameObjectKeys {
  const prefix = `${sweepObjectPrefix(location)}${location.frameId}/`;
  return {
    prefix,
    original: `${prefix}original.${ORIGINAL_EXTENSIONS[location.format]}`,
    thumbnail: `${prefix}thumbnail.jpg`,
    preview: `${prefix}preview.jpg`,
  };
}

/* ------------------------------ sweep context ---------------------------- */

export interface SweepContext extends SweepLocation {
  /** 0-based order of the sweep within its measurement. */
  sweepPosition: number;
  measurementNumber: string;
  measurementStatus: (typeof measurements.$inferSelect)['status'];
}

export function sweepNotFound(sweepId: string): HttpError {
  return new HttpError(HttpStatus.NOT_FOUND, `There is no sweep with id ${sweepId}.`);
}

export async function loadSweepContext(db: Database, sweepId: string): Promise<SweepContext> {
  const [row] = await db
    .select({
      sweepId: sweeps.id,
      sweepPosition: sweeps.position,
      measurementId: measurements.id,
      measurementNumber: measurements.number,
      measurementStatus: measurements.status,
      workOrderId: workOrders.id,
      organisationId: workOrders.organisationId,
    })
    .from(sweeps)
    .innerJoin(measurements, eq(measurements.id, sweeps.measurementId))
    .innerJoin(lenses, eq(lenses.id, measurements.lensId))
    .innerJoin(workOrders, eq(workOrders.id, lenses.workOrderId))
    .where(eq(sweeps.id, sweepId));
  if (!row) throw sweepNotFound(sweepId);
  return row;
}

/** A sentence for why frames of this measurement cannot change now, or null when they can. */
export function frameChangeRefusal(context: Pick<SweepContext, 'measurementNumber' | 'measurementStatus'>, what: string): string | null {
  if (canChangeFrames(context.measurementStatus)) return null;
  if (context.measurementStatus === 'analysing') {
    return `Measurement ${context.measurementNumber} is being analysed; ${what} once the analysis has finished.`;
  }
  return `Measurement ${context.measurementNumber} is ${context.measurementStatus}, so its frames can no longer change (${what} is refused).`;
}

/* ------------------------------ frame rows -------------------------------- */

export type FrameRow = typeof frames.$inferSelect;

export function toFrame(row: FrameRow): Frame {
  invariant(row.bitDepth === 8 || row.bitDepth === 16, `frame ${row.id} has bit depth ${row.bitDepth}, not 8 or 16`);
  return {
    id: row.id,
    fileName: row.fileName,
    positionMm: row.positionMm,
    widthPx: row.widthPx,
    heightPx: row.heightPx,
    bitDepth: row.bitDepth,
    byteSize: row.byteSize,
    contentType: row.contentType,
    excluded: row.excluded,
    thumbnailUrl: frameImageUrl(row.id, 'thumbnail'),
    previewUrl: frameImageUrl(row.id, 'preview'),
    originalUrl: row.purgedAt ? null : frameImageUrl(row.id, 'original'),
    sha256: row.sha256,
  };
}

/** The object key of a frame's rendition; null when it is not kept (an original purged by retention). */
export function frameRenditionKey(row: FrameRow, rendition: FrameRendition): string | null {
  if (rendition === 'original') return row.purgedAt ? null : row.objectKey;
  if (rendition === 'thumbnail') return row.thumbnailKey;
  return row.previewKey;
}

/* ----------------------------- byte inspection ---------------------------- */

/** The first bytes of each format (PNG spec §5.2; JFIF/ITU-T T.81 SOI marker; TIFF 6.0 header). */
export function sniffImageFormat(head: Uint8Array): FrameImageFormat | null {
  const starts = (bytes: number[]) => head.length >= bytes.length && bytes.every((byte, i) => head[i] === byte);
  if (starts([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a])) return 'png';
  if (starts([0xff, 0xd8, 0xff])) return 'jpeg';
  if (starts([0x49, 0x49, 0x2a, 0x00]) || starts([0x4d, 0x4d, 0x00, 0x2a])) return 'tiff';
  return null;
}

const SNIFF_BYTES = 16;

function formatBytes(bytes: number): string {
  if (bytes >= 1024 * 1024) return `${Number((bytes / (1024 * 1024)).toFixed(1))} MiB`;
  if (bytes >= 1024) return `${Number((bytes / 1024).toFixed(1))} KiB`;
  return `${bytes} bytes`;
}

export function frameTooLarge(fileName: string, maxBytes: number): HttpError {
  const message = `frame ${fileName} is larger than the ${formatBytes(maxBytes)} upload limit.`;
  return new HttpError(HttpStatus.PAYLOAD_TOO_LARGE, message, { frame: message });
}

interface InspectedUpload {
  format: FrameImageFormat;
  /** The whole file again, head included; counted and hashed as it is read. */
  body: Readable;
  /** Valid once `body` has been read to its end. */
  totals(): { byteSize: number; sha256: string };
}

/** Reads the first bytes to learn the format, then hands back a stream of the whole file that enforces the size limit. */
async function inspectUpload(stream: Readable, options: { fileName: string; expected: FrameImageFormat; maxBytes: number }): Promise<InspectedUpload> {
  const iterator = stream[Symbol.asyncIterator]() as AsyncIterator<Buffer | string>;
  const hash: Hash = createHash('sha256');
  let byteSize = 0;
  const take = (chunk: Buffer | string): Buffer => {
    const bytes = typeof chunk === 'string' ? Buffer.from(chunk) : chunk;
    byteSize += bytes.length;
    if (byteSize > options.maxBytes) throw frameTooLarge(options.fileName, options.maxBytes);
    hash.update(bytes);
    return bytes;
  };

  const headChunks: Buffer[] = [];
  let headLength = 0;
  let ended = false;
  while (headLength < SNIFF_BYTES) {
    const next = await iterator.next();
    if (next.done) {
      ended = true;
      break;
    }
    const bytes = take(next.value);
    headChunks.push(bytes);
    headLength += bytes.length;
  }
  const head = Buffer.concat(headChunks);
  if (head.length === 0) {
    throw new HttpError(HttpStatus.BAD_REQUEST, `frame ${options.fileName} is empty (0 bytes).`, { frame: `${options.fileName} is empty.` });
  }
  const format = sniffImageFormat(head);
  if (format === null) {
    const message = `frame ${options.fileName} is not a PNG, JPEG or TIFF image: its first bytes match none of them.`;
    throw new HttpError(HttpStatus.UNSUPPORTED_MEDIA_TYPE, message, { frame: message });
  }
  if (format !== options.expected) {
    const message = `frame ${options.fileName} holds a ${frameImageFormatNames[format]} image, not ${frameImageFormatNames[options.expected]} as its name says; rename it or upload the right file.`;
    throw new HttpError(HttpStatus.UNSUPPORTED_MEDIA_TYPE, message, { frame: message });
  }

  async function* whole(): AsyncGenerator<Buffer> {
    yield head;
    if (ended) return;
    for (;;) {
      const next = await iterator.next();
      if (next.done) return;
      yield take(next.value);
    }
  }
  return {
    format,
    body: Readable.from(whole(), { objectMode: false }),
    totals: () => ({ byteSize, sha256: hash.digest('hex') }),
  };
}

/* -------------------------------- storing --------------------------------- */

export interface StoreFrameDeps {
  db: Database;
  storage: ObjectStorage;
  log: Logger;
}

export interface StoreFrameOptions {
  sweepId: string;
  /** The name as uploaded; it is sanitised (see sanitiseFrameFileName). */
  fileName: string;
  stream: Readable;
  /** Defaults: 80 MiB, 60 MP. */
  settings?: Partial<FrameUploadSettings>;
  actorId?: string | null;
  ip?: string | null;
}

/** Stops reading an upload that failed; the request's remaining bytes are drained by the caller (multer does). */
function discard(stream: Readable): void {
  stream.on('error', () => {});
  if (!stream.destroyed) stream.destroy();
}

async function deleteObjectsQuietly(deps: StoreFrameDeps, keys: FrameObjectKeys): Promise<void> {
  const known = [keys.original, keys.thumbnail, keys.preview];
  let listed: string[] = [];
  try {
    listed = (await deps.storage.listObjects(keys.prefix)).map((item) => item.key);
  } catch (error) {
    deps.log.error('Listing a failed frame upload’s objects for clean-up failed.', { prefix: keys.prefix, error });
  }
  for (const key of new Set([...known, ...listed])) {
    try {
      await deps.storage.deleteObject(key);
    } catch (error) {
      deps.log.error('Deleting an object of a failed frame upload failed; it is orphaned.', { key, error });
    }
  }
}

function duplicateFrame(fileName: string, context: SweepContext): HttpError {
  const message = `Sweep ${context.sweepPosition + 1} of measurement ${context.measurementNumber} already has a frame named ${fileName}; delete that frame first or rename the file.`;
  return new HttpError(HttpStatus.CONFLICT, message, { frame: message });
}

/**
 * Stores one frame of a sweep from a stream: the same path the upload route
 * takes. Returns the new frame; throws an HttpError naming the file for a
 * user error (wrong type, too large, undecodable, duplicate name, measurement
 * not open for frames), after deleting whatever it had written.
 */
export async function storeFrameFromStream(deps: StoreFrameDeps, options: StoreFrameOptions): Promise<Frame> {
  const settings = checkFrameUploadOptions(options.settings);
  const sanitised = sanitiseFrameFileName(options.fileName);
  if (!sanitised.ok) {
    discard(options.stream);
    const status = /must end in/.test(sanitised.message) ? HttpStatus.UNSUPPORTED_MEDIA_TYPE : HttpStatus.BAD_REQUEST;
    throw new HttpError(status, sanitised.message, { frame: sanitised.message });
  }
  const { fileName, format: expected } = sanitised;

  let context: SweepContext;
  try {
    context = await loadSweepContext(deps.db, options.sweepId);
    const refusal = frameChangeRefusal(context, `uploading ${fileName}`);
    if (refusal) throw new HttpError(HttpStatus.CONFLICT, refusal);
    const [existing] = await deps.db
      .select({ id: frames.id })
      .from(frames)
      .where(and(eq(frames.sweepId, context.sweepId), eq(frames.fileName, fileName)));
    if (existing) throw duplicateFrame(fileName, context);
  } catch (error) {
    discard(options.stream);
    throw error;
  }

  const frameId = randomUUID();
  let keys: FrameObjectKeys | null = null;
  try {
    const inspected = await inspectUpload(options.stream, { fileName, expected, maxBytes: settings.maxBytes });
    keys = frameObjectKeys({ ...context, frameId, format: inspected.format });
    const contentType = frameContentTypes[inspected.format];

    let streamFailure: unknown = null;
    inspected.body.on('error', (error) => {
      streamFailure ??= error;
    });
    try {
      await deps.storage.putObject(keys.original, inspected.body, { contentType });
    } catch (error) {
      throw streamFailure ?? error;
    }
    if (streamFailure) throw streamFailure;
    const { byteSize, sha256 } = inspected.totals();

    const image = await renderFrameImages(deps.storage, {
      fileName,
      format: inspected.format,
      originalKey: keys.original,
      thumbnailKey: keys.thumbnail,
      previewKey: keys.preview,
      maxPixels: settings.maxPixels,
    });

    const storedKeys = keys;
    const row = await deps.db.transaction(async (tx) => {
      // Locking the measurement makes the status check and the insert one step against a concurrent analysis request.
      const [measurement] = await tx
        .select({ status: measurements.status, number: measurements.number })
        .from(measurements)
        .where(eq(measurements.id, context.measurementId))
        .for('update');
      if (!measurement) throw sweepNotFound(options.sweepId);
      const refusal = frameChangeRefusal({ measurementNumber: measurement.number, measurementStatus: measurement.status }, `uploading ${fileName}`);
      if (refusal) throw new HttpError(HttpStatus.CONFLICT, refusal);
      const [inserted] = await tx
        .insert(frames)
        .values({
          id: frameId,
          sweepId: context.sweepId,
          fileName,
          objectKey: storedKeys.original,
          thumbnailKey: storedKeys.thumbnail,
          previewKey: storedKeys.preview,
          contentType,
          byteSize,
          widthPx: image.widthPx,
          heightPx: image.heightPx,
          bitDepth: image.bitDepth,
          sha256,
        })
        .returning();
      await tx.update(measurements).set({ updatedAt: new Date() }).where(eq(measurements.id, context.measurementId));
      await tx.insert(auditEvents).values({
        actorId: options.actorId ?? null,
        action: 'frame.uploaded',
        subjectType: 'measurement',
        subjectId: context.measurementId,
        details: { frameId, sweepId: context.sweepId, fileName, byteSize, sha256, widthPx: image.widthPx, heightPx: image.heightPx, bitDepth: image.bitDepth },
        ip: options.ip ?? null,
      });
      return inserted;
    });
    return toFrame(row);
  } catch (error) {
    discard(options.stream);
    if (keys) await deleteObjectsQuietly(deps, keys);
    if (isUniqueViolation(error)) throw duplicateFrame(fileName, context);
    throw error;
  }
}

/** Deletes a frame's stored objects (original, thumbnail, preview and anything else under its prefix). */
export async function deleteFrameObjects(deps: StoreFrameDeps, row: Pick<FrameRow, 'objectKey' | 'thumbnailKey' | 'previewKey'>): Promise<void> {
  const prefix = row.objectKey.slice(0, row.objectKey.lastIndexOf('/') + 1);
  invariant(prefix.length > 0, `frame object key ${row.objectKey} has no prefix`);
  await deleteObjectsQuietly(deps, {
    prefix,
    original: row.objectKey,
    thumbnail: row.thumbnailKey ?? row.objectKey,
    preview: row.previewKey ?? row.objectKey,
  });
}

/**
 * Takes back a frame this request had just stored (its row and objects),
 * when the rest of the upload request fails after the file was taken in.
 */
export async function discardStoredFrame(deps: StoreFrameDeps, frameId: string, actor: { actorId: string | null; ip?: string | null }): Promise<void> {
  const row = await deps.db.transaction(async (tx) => {
    const [deleted] = await tx.delete(frames).where(eq(frames.id, frameId)).returning();
    if (!deleted) return null;
    const [sweep] = await tx.select({ measurementId: sweeps.measurementId }).from(sweeps).where(eq(sweeps.id, deleted.sweepId));
    await tx.insert(auditEvents).values({
      actorId: actor.actorId,
      action: 'frame.upload-withdrawn',
      subjectType: 'measurement',
      subjectId: sweep?.measurementId ?? null,
      details: { frameId, sweepId: deleted.sweepId, fileName: deleted.fileName, reason: 'the rest of the upload request failed' },
      ip: actor.ip ?? null,
    });
    return deleted;
  });
  if (row) await deleteFrameObjects(deps, row);
}
