import { stat } from 'node:fs/promises';
import path from 'node:path';
import sharp, { type Sharp } from 'sharp';
import type { GreyImage, PixelRect } from '../../shared/measure/types';
import type { FrameSource, ReducedFrame } from '../../shared/measure/engine/frame-source';
import { FrameMissingError, FrameUnreadableError } from '../../shared/measure/engine/measurement-error';
import { findTruncation } from './find-truncation';

// libvips keeps decoded images in an operation cache by default; frames are
// read once each, so the cache only costs memory.
sharp.cache(false);

/**
 * Longest side of the reduced copy used to find the target. 320 px (was 640)
 * quarters the pixels the detection works through; the target still spans
 * tens of reduced pixels on the bench's frames, and the coarser blur-extent
 * step moved the generated presets' focal lengths by under 2 × 10⁻⁶. A target
 * under about three reduced pixels (a dot of ~40 px on a 4000 px frame) is
 * no longer found.
 */
export const REDUCED_LONG_SIDE_PX = 320;

export interface DecodedRaw {
  image: GreyImage;
}

/**
 * Float32 pixel arrays the engine has finished with (`recycle`), reused for
 * the next image of the same size: a sweep's regions all share one size, and
 * a fresh 8 MB array per frame costs page faults and garbage collections.
 */
class PixelArrayPool {
  private readonly free: Float32Array[] = [];

  take(length: number): Float32Array {
    const index = this.free.findIndex((array) => array.length === length);
    return index >= 0 ? this.free.splice(index, 1)[0] : new Float32Array(length);
  }

  give(array: Float32Array): void {
    // Regions being decoded, waiting and measured: six arrays cover two lanes (see analyseSweepFromLocatingSubset).
    if (this.free.length < 6 && !this.free.includes(array)) this.free.push(array);
  }
}

/**
 * Luminance at full precision: 16-bit files stay 16-bit (grey16 + ushort;
 * `greyscale()` alone would scale them to 0–255), colour is reduced to
 * luminance, alpha is dropped.
 */
async function toGreyImage(pipeline: Sharp, sixteenBit: boolean, pool: PixelArrayPool): Promise<GreyImage> {
  const grey = sixteenBit ? pipeline.toColourspace('grey16') : pipeline.greyscale();
  const { data, info } = await grey.removeAlpha().raw(sixteenBit ? { depth: 'ushort' } : {}).toBuffer({ resolveWithObject: true });
  const pixels = info.width * info.height;
  const channels = info.channels;
  const samples = sixteenBit ? new Uint16Array(data.buffer, data.byteOffset, data.length / 2) : data;
  const out = pool.take(pixels);
  if (channels === 1) {
    // One channel (the usual case): `set` converts natively, several times faster than a loop.
    out.set(samples);
  } else {
    for (let i = 0, j = 0; i < pixels; i++, j += channels) out[i] = samples[j];
  }
  return { width: info.width, height: info.height, data: out, maxValue: sixteenBit ? 65535 : 255 };
}

function isSixteenBit(depth: string | undefined): boolean {
  return depth === 'ushort' || depth === 'short' || depth === 'uint' || depth === 'int';
}

/** Frames read from files in a measurement folder with sharp. */
export class SharpFrameSource implements FrameSource {
  private readonly headers = new Map<string, { width: number; height: number; sixteenBit: boolean }>();
  private readonly pixelArrays = new PixelArrayPool();

  /** `reducedLongSidePx`: see REDUCED_LONG_SIDE_PX. */
  constructor(
    private readonly folder: string,
    private readonly reducedLongSidePx: number = REDUCED_LONG_SIDE_PX,
  ) {}

  resolve(file: string): string {
    return path.join(this.folder, file);
  }

  private async header(file: string) {
    const cached = this.headers.get(file);
    if (cached) return cached;
    const full = this.resolve(file);
    try {
      await stat(full);
    } catch {
      throw new FrameMissingError(file);
    }
    const truncation = await findTruncation(full);
    if (truncation) throw new FrameUnreadableError(file, truncation);
    try {
      const meta = await sharp(full).metadata();
      if (!meta.width || !meta.height) throw new Error('no image dimensions');
      const header = { width: meta.width, height: meta.height, sixteenBit: isSixteenBit(meta.depth) };
      this.headers.set(file, header);
      return header;
    } catch (error) {
      throw new FrameUnreadableError(file, describe(error));
    }
  }

  async readReduced(file: string): Promise<ReducedFrame> {
    const header = await this.header(file);
    const factor = Math.max(1, Math.ceil(Math.max(header.width, header.height) / this.reducedLongSidePx));
    const width = Math.max(1, Math.floor(header.width / factor));
    const height = Math.max(1, Math.floor(header.height / factor));
    try {
      let pipeline = sharp(this.resolve(file));
      if (factor > 1) pipeline = pipeline.resize({ width, height, fit: 'fill', kernel: 'linear' });
      const image = await toGreyImage(pipeline, header.sixteenBit, this.pixelArrays);
      // Integer factor: the reduced copy drops the last (width mod factor) columns, well below what locating needs.
      return { image, factor, fullWidth: header.width, fullHeight: header.height };
    } catch (error) {
      throw new FrameUnreadableError(file, describe(error));
    }
  }

  async readRegion(file: string, rect: PixelRect): Promise<GreyImage> {
    const header = await this.header(file);
    try {
      const pipeline = sharp(this.resolve(file)).extract({ left: rect.x, top: rect.y, width: rect.width, height: rect.height });
      return await toGreyImage(pipeline, header.sixteenBit, this.pixelArrays);
    } catch (error) {
      throw new FrameUnreadableError(file, describe(error));
    }
  }

  recycle(image: GreyImage): void {
    this.pixelArrays.give(image.data);
  }

  /** Whole frame at full resolution (used by the benchmark's decode-only baseline and thumbnails). */
  async readFull(file: string): Promise<GreyImage> {
    const header = await this.header(file);
    try {
      return await toGreyImage(sharp(this.resolve(file)), header.sixteenBit, this.pixelArrays);
    } catch (error) {
      throw new FrameUnreadableError(file, describe(error));
    }
  }
}

function describe(error: unknown): string {
  const message = error instanceof Error ? error.message : String(error);
  return message.split('\n')[0].replace(/^Input file /, '').trim() || 'unknown decoder error';
}
