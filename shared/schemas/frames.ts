/**
 * Frames (the images of a sweep) as the API takes and returns them
 * (docs/api-bench.md, "Measurements, sweeps, frames"), with the upload rules
 * the client can check before sending. Shared by server and client; no Node APIs.
 */
import { z } from 'zod';
import { uuidField } from './work-orders';

/** The multipart form field that carries the one image of an upload request. */
export const FRAME_UPLOAD_FIELD = 'frame';
/** Largest image file accepted, in bytes (80 MiB). */
export const FRAME_MAX_BYTES = 80 * 1024 * 1024;
/** Largest image accepted, in pixels (60 megapixels); also guards against decompression bombs. */
export const FRAME_MAX_PIXELS = 60_000_000;
/** Longest side of the thumbnail and of the preview, in pixels. */
export const FRAME_THUMBNAIL_MAX_SIDE_PX = 320;
export const FRAME_PREVIEW_MAX_SIDE_PX = 1600;
/** Longest file name kept, in characters (the extension always survives). */
export const FRAME_FILE_NAME_MAX_LENGTH = 200;

export const frameImageFormats = ['png', 'jpeg', 'tiff'] as const;
export type FrameImageFormat = (typeof frameImageFormats)[number];

export const frameContentTypes: Record<FrameImageFormat, string> = {
  png: 'image/png',
  jpeg: 'image/jpeg',
  tiff: 'image/tiff',
};

/** File-name extensions accepted, lower case, and the format each one promises. */
export const frameFileExtensions: Record<string, FrameImageFormat> = {
  '.png': 'png',
  '.jpg': 'jpeg',
  '.jpeg': 'jpeg',
  '.tif': 'tiff',
  '.tiff': 'tiff',
};

export const FRAME_EXTENSIONS_SENTENCE = '.png, .jpg, .jpeg, .tif or .tiff';

export const frameImageFormatNames: Record<FrameImageFormat, string> = { png: 'PNG', jpeg: 'JPEG', tiff: 'TIFF' };

export interface Frame {
  id: string;
  /** The file name as uploaded, sanitised; unique within its sweep. */
  fileName: string;
  /** Rail reading of this frame, mm; null until readings are given. */
  positionMm: number | null;
  widthPx: number;
  heightPx: number;
  bitDepth: 8 | 16;
  byteSize: number;
  contentType: string;
  /** Left out of the next analysis run by a person. */
  excluded: boolean;
  thumbnailUrl: string;
  previewUrl: string;
  /** null once retention purged the original pixels (thumbnail and preview remain). */
  originalUrl: string | null;
  /** SHA-256 of the original file, lower-case hex. */
  sha256: string;
}

export interface FrameResponse {
  frame: Frame;
}

export const frameIdParams = z.object({ frameId: uuidField('frameId') });
export type FrameIdParams = z.output<typeof frameIdParams>;

export const frameRenditions = ['thumbnail', 'preview', 'original'] as const;
export type FrameRendition = (typeof frameRenditions)[number];

export const updateFrameBody = z.strictObject({
  excluded: z.boolean({ error: 'Field "excluded" must be true or false.' }),
});
export type UpdateFrameBody = z.input<typeof updateFrameBody>;

export type SanitisedFrameFileName =
  | { ok: true; fileName: string; format: FrameImageFormat }
  | { ok: false; message: string };

/* Characters that mean something to a file system or a shell on some system. */
const PATH_CHARACTERS = /[/\\:*?"<>|]/g;
/* Control and invisible format characters (bidi overrides, zero-width spaces). */
const CONTROL_CHARACTERS = /[\p{Cc}\p{Cf}]/gu;

function shown(name: string): string {
  return JSON.stringify(name.replace(CONTROL_CHARACTERS, '\uFFFD'));
}

/**
 * The file name a frame is stored under: the last path segment only, control
 * and path characters removed, surrounding spaces and leading dots trimmed,
 * shortened to FRAME_FILE_NAME_MAX_LENGTH keeping the extension. Refuses a
 * name that is empty afterwards or lacks an image extension.
 */
export function sanitiseFrameFileName(originalName: string): SanitisedFrameFileName {
  const lastSegment = originalName.normalize('NFC').split(/[/\\]/).pop() ?? '';
  const cleaned = lastSegment.replace(CONTROL_CHARACTERS, '').replace(PATH_CHARACTERS, '').trim();
  const dot = cleaned.lastIndexOf('.');
  const extension = dot >= 0 ? cleaned.slice(dot).toLowerCase() : '';
  const format = frameFileExtensions[extension];
  if (!format) {
    return {
      ok: false,
      message: `The file ${shown(originalName)} is not an image Paraxia reads: its name must end in ${FRAME_EXTENSIONS_SENTENCE}.`,
    };
  }
  let stem = cleaned.slice(0, dot).replace(/^[\s.]+/, '').trim();
  if (stem === '') {
    return {
      ok: false,
      message: `The file name ${shown(originalName)} is empty once path and control characters are removed; rename the file.`,
    };
  }
  const room = FRAME_FILE_NAME_MAX_LENGTH - extension.length;
  if (stem.length > room) stem = Array.from(stem).slice(0, room).join('').trim();
  return { ok: true, fileName: `${stem}${cleaned.slice(dot)}`, format };
}

const naturalCollator = new Intl.Collator('en', { numeric: true, sensitivity: 'variant' });

/**
 * Natural order of file names ("frame2" before "frame10"); names the collator
 * counts as equal ("frame01", "frame1") fall back to code-unit order so that
 * the order is total and the same on every machine.
 */
export function compareFrameFileNames(a: string, b: string): number {
  const natural = naturalCollator.compare(a, b);
  if (natural !== 0) return natural;
  return a < b ? -1 : a > b ? 1 : 0;
}

/** Where the server serves a frame's image renditions. */
export function frameImageUrl(frameId: string, rendition: FrameRendition): string {
  return `/api/frames/${frameId}/${rendition}`;
}
