import sharp from 'sharp';
import { describe, expect, it } from 'vitest';
import { encodeFrame } from './encode-frame';
import { encodeGrey16Tiff } from './encode-grey16-tiff';
import { createSeededRandom } from './seeded-random';
import { decodeGrey } from './test-support';

function testPattern(widthPx: number, heightPx: number): Uint16Array {
  const random = createSeededRandom(16);
  const pixels = new Uint16Array(widthPx * heightPx);
  for (let k = 0; k < pixels.length; k++) pixels[k] = Math.floor(random.uniform() * 65536);
  pixels[0] = 0;
  pixels[1] = 65535;
  pixels[2] = 256;
  pixels[3] = 255;
  return pixels;
}

describe('16-bit frame files', () => {
  it('encodeGrey16Tiff writes a TIFF that sharp reads back as 16-bit grey with every value exact', async () => {
    const widthPx = 37, heightPx = 23;
    const pixels = testPattern(widthPx, heightPx);
    const file = encodeGrey16Tiff({ pixels, widthPx, heightPx });
    const meta = await sharp(file).metadata();
    expect(meta).toMatchObject({ format: 'tiff', width: widthPx, height: heightPx, channels: 1, depth: 'ushort' });
    const decoded = await decodeGrey(file);
    expect(decoded.fileDepth).toBe('ushort');
    expect(Array.from(decoded.values)).toEqual(Array.from(pixels));
  });

  it('encodeFrame writes 16-bit PNG that sharp reads back exactly', async () => {
    const widthPx = 41, heightPx = 19;
    const pixels = testPattern(widthPx, heightPx);
    const file = await encodeFrame({ pixels, widthPx, heightPx, format: 'png16', jpegQuality: 90 });
    expect((await sharp(file).metadata()).depth).toBe('ushort');
    expect(Array.from((await decodeGrey(file)).values)).toEqual(Array.from(pixels));
  });

  it('encodeFrame refuses 8-bit pixels for a 16-bit format as an invariant', async () => {
    await expect(encodeFrame({ pixels: new Uint8Array(4), widthPx: 2, heightPx: 2, format: 'tiff16', jpegQuality: 90 })).rejects.toThrow(/^invariant/);
  });
});
