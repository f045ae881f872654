import { open } from 'node:fs/promises';

/** How far from the end an end marker may sit: some cameras append a short trailer after it. */
const TAIL_BYTES = 64 * 1024;

const JPEG_START = Buffer.from([0xff, 0xd8, 0xff]);
const JPEG_END = Buffer.from([0xff, 0xd9]);
const PNG_START = Buffer.from([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a]);
const PNG_END = Buffer.from('IEND', 'latin1');

/**
 * A sentence when a JPEG or PNG file ends before its end marker (a cut-off
 * copy or transfer), else null. The engine decodes only a region of most
 * frames, and libvips reads sequentially, so a file damaged below that
 * region would otherwise decode "fine"; a damaged file is never evidence.
 * TIFF has no end marker and is left to the decoder.
 */
export async function findTruncation(filePath: string): Promise<string | null> {
  const handle = await open(filePath, 'r');
  try {
    const { size } = await handle.stat();
    const head = Buffer.alloc(Math.min(8, size));
    await handle.read(head, 0, head.length, 0);
    const tailLength = Math.min(TAIL_BYTES, size);
    const tail = Buffer.alloc(tailLength);
    await handle.read(tail, 0, tailLength, size - tailLength);
    if (head.subarray(0, 3).equals(JPEG_START) && tail.lastIndexOf(JPEG_END) < 0) {
      return 'the JPEG data ends before its end-of-image marker (the file is cut off)';
    }
    if (head.equals(PNG_START) && tail.lastIndexOf(PNG_END) < 0) {
      return 'the PNG data ends before its IEND chunk (the file is cut off)';
    }
    return null;
  } finally {
    await handle.close();
  }
}
