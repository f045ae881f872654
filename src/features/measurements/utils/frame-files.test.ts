import { describe, expect, it } from 'vitest';
import type { Frame } from '@shared/schemas/frames';
import type { SweepDetail } from '@shared/schemas/measurements';
import { frameGeometry, framesByManifestFile } from '@/features/measurements/utils/frame-files';

const frame = (id: string, fileName: string, widthPx = 4000, heightPx = 3000): Frame => ({
  id,
  fileName,
  positionMm: 1,
  widthPx,
  heightPx,
  bitDepth: 8,
  byteSize: 1,
  contentType: 'image/png',
  excluded: false,
  thumbnailUrl: `/api/frames/${id}/thumbnail`,
  previewUrl: `/api/frames/${id}/preview`,
  originalUrl: null,
  sha256: '',
});
const sweep = (position: number, frames: Frame[]): SweepDetail => ({
  id: `s${position}`,
  position,
  moving: 'sensor',
  objectPositionMm: 0,
  lensPositionMm: 300,
  sensorPositionMm: null,
  frames,
});

describe('framesByManifestFile', () => {
  it('framesByManifestFile tells apart frames of the same name in different sweeps by their sweep folder', () => {
    const map = framesByManifestFile([sweep(1, [frame('b1', '0001.png')]), sweep(0, [frame('a1', '0001.png')])]);
    expect(map.get('s1/0001.png')?.id).toBe('a1');
    expect(map.get('s2/0001.png')?.id).toBe('b1');
  });
});

describe('frameGeometry', () => {
  it('frameGeometry gives the thumbnail scale of a 320 px long side and never enlarges a small frame', () => {
    expect(frameGeometry([sweep(0, [frame('a', 'a.png')])], 320)).toEqual({ frameWidthPx: 4000, frameHeightPx: 3000, thumbnailScale: 0.08 });
    expect(frameGeometry([sweep(0, [frame('a', 'a.png', 300, 200)])], 320)?.thumbnailScale).toBe(1);
    expect(frameGeometry([sweep(0, [])], 320)).toBeNull();
  });
});
