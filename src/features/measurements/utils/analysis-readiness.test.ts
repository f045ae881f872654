import { describe, expect, it } from 'vitest';
import type { Frame } from '@shared/schemas/frames';
import type { SweepDetail } from '@shared/schemas/measurements';
import { analysisReadiness } from '@/features/measurements/utils/analysis-readiness';

function frame(fileName: string, positionMm: number | null, excluded = false): Frame {
  return {
    id: fileName,
    fileName,
    positionMm,
    widthPx: 800,
    heightPx: 600,
    bitDepth: 8,
    byteSize: 1000,
    contentType: 'image/png',
    excluded,
    thumbnailUrl: '',
    previewUrl: '',
    originalUrl: '',
    sha256: '',
  };
}

function sweep(position: number, frames: Frame[]): SweepDetail {
  return { id: `s${position}`, position, moving: 'sensor', objectPositionMm: 0, lensPositionMm: 300, sensorPositionMm: null, frames };
}

const five = (prefix: string) => Array.from({ length: 5 }, (_, i) => frame(`${prefix}${i}.png`, 440 + i));
const base = { status: 'draft' as const, latestRunStatus: null, uploadsInFlight: 0 };

describe('analysisReadiness', () => {
  it('analysisReadiness is ready when every sweep has at least 5 included frames, all with readings', () => {
    expect(analysisReadiness({ ...base, sweeps: [sweep(0, five('a')), sweep(1, [...five('b'), frame('x.png', null, true)])] })).toEqual({
      ready: true,
      framesTotal: 10,
    });
  });

  it('analysisReadiness names the sweep short of frames, not counting excluded ones', () => {
    const short = [...five('b').slice(0, 4), frame('b9.png', 450, true)];
    expect(analysisReadiness({ ...base, sweeps: [sweep(0, five('a')), sweep(1, short)] })).toEqual({
      ready: false,
      reason: 'Sweep 2 has 4 frames with readings; it needs at least 5.',
    });
  });

  it('analysisReadiness names the frames still without a rail reading', () => {
    const frames = [...five('a'), ...['n1.png', 'n2.png', 'n3.png', 'n4.png'].map((n) => frame(n, null))];
    expect(analysisReadiness({ ...base, sweeps: [sweep(0, frames)] })).toEqual({
      ready: false,
      reason: 'The sweep has 4 frames without a rail reading (n1.png, n2.png, n3.png and 1 more); enter the readings first.',
    });
  });

  it('analysisReadiness refuses while uploads or a run are under way, and once the measurement is submitted', () => {
    const sweeps = [sweep(0, five('a'))];
    expect(analysisReadiness({ ...base, sweeps, uploadsInFlight: 2 })).toEqual({ ready: false, reason: '2 files are still uploading.' });
    expect(analysisReadiness({ ...base, sweeps, latestRunStatus: 'running' })).toMatchObject({ ready: false });
    expect(analysisReadiness({ ...base, sweeps, status: 'submitted' })).toEqual({
      ready: false,
      reason: 'This measurement is submitted; its analysis can no longer change.',
    });
  });
});
