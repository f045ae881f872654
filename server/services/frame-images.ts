/**
 * Decoding an uploaded frame once, from object storage, to prove it is a
 * whole image and to make what people look at: a thumbnail for the strip and
 * a preview for the viewer, both JPEG.
 */
import sharp, { type Metadata } from 'sharp';
import {
  FRAME_PREVIEW_MAX_SIDE_PX,
  FRAME_THUMBNAIL_MAX_SIDE_PX,
  frameImageFormatNames,
  type FrameImageFormat,
} from '../../shared/schemas/frames';
import { HttpError } from '../http-error';
import { HttpStatus } from '../http-status';
import type { ObjectStorage } from './object-storage';

// Each frame is decoded once here; libvips's operation cache would only hold memory.
sharp.cache(false);

export const FRAME_RENDITION_CONTENT_TYPE = 'image/jpeg';
const RENDITION_JPEG_QUALITY = 85;

export interface FrameImageInfo {
  widthPx: number;
  heightPx: number;
  bitDepth: 8 | 16;
}

export interface RenderFrameImagesOptions {
  fileName: string;
  /** The format the file's first bytes showed; the decoder must agree. */
  format: FrameImageFormat;
  originalKey: string;
  thumbnailKey: string;
  previewKey: string;
  maxPixels: number;
}

const SHARP_FORMATS: Record<FrameImageFormat, string> = { png: 'png', jpeg: 'jpeg', tiff: 'tiff' };

function bitDepthOf(depth: string | undefined): 8 | 16 | null {
  if (depth === 'uchar' || depth === 'char') return 8;
  if (depth === 'ushort' || depth === 'short') return 16;
  return null;
}

const SAMPLE_NAMES: Record<string, string> = {
  uint: '32-bit integer',
  int: '32-bit integer',
  float: '32-bit floating-point',
  double: '64-bit floating-point',
  complex: 'complex',
  dpcomplex: 'complex',
};

function decoderMessage(error: unknown): string {
  const raw = error instanceof Error ? error.message : String(error);
  // libvips prefixes its loader's name ("VipsJpeg: ", "vipspng: "); people need the rest.
  return raw.replace(/^\s*vips\w*:\s*/i, '').split('\n')[0].trim().replace(/\.$/, '') || 'unknown decoder error';
}

function undecodable(fileName: string, error: unknown, maxPixels: number): HttpError {
  const detail = decoderMessage(error);
  if (/pixel limit/i.test(detail)) {
    return new HttpError(
      HttpStatus.BAD_REQUEST,
      `frame ${fileName} was refused: it has more than ${maxPixels / 1_000_000} megapixels, the most Paraxia accepts.`,
      { frame: `${fileName} has more than ${maxPixels / 1_000_000} megapixels.` },
    );
  }
  const message = `frame ${fileName} could not be decoded: ${detail}.`;
  return new HttpError(HttpStatus.BAD_REQUEST, message, { frame: message });
}

/** Share of pixels let clip at each end of a display stretch, so one hot pixel cannot set the white level. */
const DISPLAY_CLIP_FRACTION = 0.001;

/**
 * 16-bit samples to 8-bit display levels: a linear stretch between the
 * 0.1 % and 99.9 % points of the histogram. (sharp's normalise() works on
 * L* of a Lab conversion and left the darkest pixels of a 12-bit-range frame
 * at grey 43, hence this.)
 */
export function stretchForDisplay(samples: Uint16Array): Uint8Array {
  const histogram = new Uint32Array(65536);
  for (const value of samples) histogram[value]++;
  const clipCount = Math.floor(samples.length * DISPLAY_CLIP_FRACTION);
  let low = 0;
  for (let seen = 0; low < 65535 && seen + histogram[low] <= clipCount; low++) seen += histogram[low];
  let high = 65535;
  for (let seen = 0; high > low && seen + histogram[high] <= clipCount; high--) seen += histogram[high];
  const scale = high > low ? 255 / (high - low) : 0;
  const out = new Uint8Array(samples.length);
  for (let i = 0; i < samples.length; i++) {
    const level = (samples[i] - low) * scale;
    out[i] = level <= 0 ? 0 : level >= 255 ? 255 : Math.round(level);
  }
  return out;
}

/**
 * Streams the original from storage into one decoder, checks its header
 * (format, at most `maxPixels`, 8- or 16-bit samples), then decodes it in
 * full twice from that one input to write the thumbnail (≤ 320 px) and the
 * preview (≤ 1600 px). 16-bit frames are reduced to luminance and stretched
 * for display (stretchForDisplay), since a 12-bit sensor in a 16-bit file
 * would otherwise look black. Any failure is an HttpError naming the file;
 * renditions already written are left for the caller to delete.
 */
export async function renderFrameImages(storage: ObjectStorage, options: RenderFrameImagesOptions): Promise<FrameImageInfo> {
  const { fileName } = options;
  const { stream } = await storage.getObjectStream(options.originalKey);
  const decoder = sharp({ limitInputPixels: options.maxPixels, failOn: 'warning' });
  stream.on('error', (error) => decoder.destroy(error));
  stream.pipe(decoder);

  let metadata: Metadata;
  try {
    metadata = await decoder.metadata();
  } catch (error) {
    throw undecodable(fileName, error, options.maxPixels);
  }
  if (metadata.format !== SHARP_FORMATS[options.format]) {
    throw new HttpError(
      HttpStatus.UNSUPPORTED_MEDIA_TYPE,
      `frame ${fileName} could not be decoded as ${frameImageFormatNames[options.format]}.`,
    );
  }
  const widthPx = metadata.width ?? 0;
  const heightPx = metadata.height ?? 0;
  if (widthPx < 1 || heightPx < 1) throw undecodable(fileName, new Error('the image has no pixels'), options.maxPixels);
  const bitDepth = bitDepthOf(metadata.depth);
  if (bitDepth === null) {
    const samples = SAMPLE_NAMES[metadata.depth ?? ''] ?? `"${metadata.depth}"`;
    const message = `frame ${fileName} has ${samples} samples; Paraxia reads 8-bit and 16-bit images.`;
    throw new HttpError(HttpStatus.UNSUPPORTED_MEDIA_TYPE, message, { frame: message });
  }

  const rendition = async (maxSidePx: number) => {
    const resized = decoder.clone().resize(maxSidePx, maxSidePx, { fit: 'inside', withoutEnlargement: true });
    if (bitDepth === 16) {
      const { data, info } = await resized.removeAlpha().toColourspace('grey16').raw({ depth: 'ushort' }).toBuffer({ resolveWithObject: true });
      const levels = stretchForDisplay(new Uint16Array(data.buffer, data.byteOffset, data.length / 2));
      return sharp(levels, { raw: { width: info.width, height: info.height, channels: 1 } })
        .toColourspace('b-w')
        .jpeg({ quality: RENDITION_JPEG_QUALITY })
        .toBuffer();
    }
    const pipeline = (metadata.channels ?? 1) <= 2 ? resized.toColourspace('b-w') : resized;
    return pipeline.jpeg({ quality: RENDITION_JPEG_QUALITY }).toBuffer();
  };

  let thumbnail: Buffer;
  let preview: Buffer;
  try {
    [thumbnail, preview] = await Promise.all([rendition(FRAME_THUMBNAIL_MAX_SIDE_PX), rendition(FRAME_PREVIEW_MAX_SIDE_PX)]);
  } catch (error) {
    throw undecodable(fileName, error, options.maxPixels);
  }

  await storage.putObject(options.thumbnailKey, thumbnail, { contentType: FRAME_RENDITION_CONTENT_TYPE });
  await storage.putObject(options.previewKey, preview, { contentType: FRAME_RENDITION_CONTENT_TYPE });
  return { widthPx, heightPx, bitDepth };
}
