import sharp from 'sharp';
import type { FrameFormat } from './bench-scenario';
import { encodeGrey16Tiff } from './encode-grey16-tiff';

export const FRAME_EXTENSIONS: Record<FrameFormat, string> = { png8: 'png', png16: 'png', jpeg: 'jpg', tiff16: 'tif' };

export interface EncodeFrameOptions {
  pixels: Uint8Array | Uint16Array;
  widthPx: number;
  heightPx: number;
  format: FrameFormat;
  jpegQuality: number;
}

/** Encodes a greyscale frame in the requested file format. */
export async function encodeFrame(options: EncodeFrameOptions): Promise<Buffer> {
  const { pixels, widthPx, heightPx, format } = options;
  const sixteenBit = format === 'png16' || format === 'tiff16';
  if (sixteenBit !== pixels instanceof Uint16Array) {
    throw new Error(`invariant: ${format} needs ${sixteenBit ? '16' : '8'}-bit pixels`);
  }
  if (format === 'tiff16') return encodeGrey16Tiff({ pixels: pixels as Uint16Array, widthPx, heightPx });
  const raw = { raw: { width: widthPx, height: heightPx, channels: 1 as const } };
  if (format === 'png16') return sharp(pixels, raw).toColourspace('grey16').png().toBuffer();
  // Without 'b-w' sharp writes one-channel raw input as RGB.
  if (format === 'png8') return sharp(pixels, raw).toColourspace('b-w').png().toBuffer();
  return sharp(pixels, raw).toColourspace('b-w').jpeg({ quality: options.jpegQuality }).toBuffer();
}
