import { mkdtempSync, writeFileSync } from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import sharp from 'sharp';
import { describe, expect, it } from 'vitest';
import { findTruncation } from './find-truncation';
import { SharpFrameSource } from './sharp-frame-source';

async function sampleImage(format: 'jpeg' | 'png'): Promise<Buffer> {
  const pixels = Buffer.alloc(256 * 192 * 3);
  for (let i = 0; i < pixels.length; i++) pixels[i] = (i * 37) % 251;
  const image = sharp(pixels, { raw: { width: 256, height: 192, channels: 3 } });
  return format === 'jpeg' ? image.jpeg({ quality: 90 }).toBuffer() : image.png().toBuffer();
}

describe('findTruncation', () => {
  const folder = mkdtempSync(path.join(os.tmpdir(), 'paraxia-truncation-'));

  it('passes whole JPEG and PNG files, and a JPEG with a short trailer after its end marker', async () => {
    for (const format of ['jpeg', 'png'] as const) {
      const file = path.join(folder, `whole.${format}`);
      writeFileSync(file, await sampleImage(format));
      expect(await findTruncation(file)).toBeNull();
    }
    const withTrailer = path.join(folder, 'trailer.jpeg');
    writeFileSync(withTrailer, Buffer.concat([await sampleImage('jpeg'), Buffer.from('maker trailer')]));
    expect(await findTruncation(withTrailer)).toBeNull();
  });

  it('names a JPEG or PNG cut off in its last tenth, where a region read near the top would not notice', async () => {
    for (const format of ['jpeg', 'png'] as const) {
      const whole = await sampleImage(format);
      const file = path.join(folder, `cut.${format}`);
      writeFileSync(file, whole.subarray(0, Math.floor(whole.length * 0.9)));
      expect(await findTruncation(file)).toMatch(/cut off/);
    }
  });

  it('makes the frame source refuse a cut-off JPEG before any region is decoded', async () => {
    const whole = await sampleImage('jpeg');
    writeFileSync(path.join(folder, 'frame.jpg'), whole.subarray(0, Math.floor(whole.length * 0.95)));
    const source = new SharpFrameSource(folder);
    await expect(source.readRegion('frame.jpg', { x: 0, y: 0, width: 16, height: 16 })).rejects.toThrow(/cut off/);
  });
});
