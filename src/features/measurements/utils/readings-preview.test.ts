import { describe, expect, it } from 'vitest';
import type { Frame } from '@shared/schemas/frames';
import { editedReadingsPreview, startStepReadingsPreview, textReadingsPreview } from '@/features/measurements/utils/readings-preview';

function frame(fileName: string, positionMm: number | null = null): Frame {
  return {
    id: fileName,
    fileName,
    positionMm,
    widthPx: 800,
    heightPx: 600,
    bitDepth: 8,
    byteSize: 1000,
    contentType: 'image/png',
    excluded: false,
    thumbnailUrl: '',
    previewUrl: '',
    originalUrl: '',
    sha256: '',
  };
}

describe('startStepReadingsPreview', () => {
  it('startStepReadingsPreview assigns start + i·step in natural file-name order (frame_2 before frame_10)', () => {
    const frames = ['frame_10.png', 'frame_2.png', 'frame_1.png', 'frame_9.png'].map((n) => frame(n));
    const preview = startStepReadingsPreview({ frames, startText: '447', stepText: '0,25' });
    expect(preview.rows.map((r) => [r.fileName, r.positionMm])).toEqual([
      ['frame_1.png', 447],
      ['frame_2.png', 447.25],
      ['frame_9.png', 447.5],
      ['frame_10.png', 447.75],
    ]);
    expect(preview).toMatchObject({ ready: true, changedCount: 4, fieldProblems: {} });
  });

  it('startStepReadingsPreview leaves no floating-point dust after many 0.1 mm steps', () => {
    const frames = Array.from({ length: 40 }, (_, i) => frame(`f${i + 1}.tif`));
    const preview = startStepReadingsPreview({ frames, startText: '100', stepText: '0.1' });
    expect(preview.rows[39].positionMm).toBe(103.9);
    expect(preview.rows.every((r) => String(r.positionMm).length <= 5)).toBe(true);
  });

  it('startStepReadingsPreview counts only readings that change and names bad fields', () => {
    const frames = [frame('a1.png', 10), frame('a2.png', 10.5)];
    expect(startStepReadingsPreview({ frames, startText: '10', stepText: '0.5' }).changedCount).toBe(0);
    const bad = startStepReadingsPreview({ frames, startText: 'ten', stepText: '0' });
    expect(bad.ready).toBe(false);
    expect(bad.fieldProblems).toEqual({ startMm: 'The first reading must be a number in mm, e.g. 447.0.', stepMm: 'The step must not be zero.' });
  });
});

describe('textReadingsPreview', () => {
  it('textReadingsPreview shows each frame’s reading from a pasted table with a header', () => {
    const frames = [frame('s1.png'), frame('s2.png')];
    const preview = textReadingsPreview({ frames, text: 'file;position\ns2.png;448,5\ns1.png;448.0\n' });
    expect(preview.ready).toBe(true);
    expect(preview.rows.map((r) => [r.fileName, r.positionMm])).toEqual([
      ['s1.png', 448],
      ['s2.png', 448.5],
    ]);
  });

  it('textReadingsPreview reports problems per line and per file: bad number, unknown file, repeat, missing', () => {
    const frames = [frame('s1.png'), frame('s2.png'), frame('s3.png')];
    const preview = textReadingsPreview({ frames, text: 's1.png\t448\ns1.png\t449\ns9.png\t450\ns2.png\tabc\n' });
    expect(preview.ready).toBe(false);
    expect(preview.lineProblems).toEqual([{ line: 4, message: 'Line 4: the reading "abc" for s2.png is not a number.' }]);
    expect(Object.keys(preview.fileProblems).sort()).toEqual(['s1.png', 's2.png', 's3.png', 's9.png']);
    expect(preview.fileProblems['s1.png']).toBe('s1.png has 2 readings (lines 1 and 2); give exactly one.');
    expect(preview.fileProblems['s9.png']).toMatch(/^s9.png \(line 3\) is not a frame of this sweep/);
  });
});

describe('editedReadingsPreview', () => {
  it('editedReadingsPreview takes typed cells over stored readings and names an empty or wrong cell', () => {
    const frames = [frame('a.png', 1), frame('b.png', 2), frame('c.png')];
    const ok = editedReadingsPreview({ frames, cellTexts: { 'b.png': '2.5', 'c.png': '3' } });
    expect(ok).toMatchObject({ ready: true, changedCount: 2 });
    const bad = editedReadingsPreview({ frames, cellTexts: { 'b.png': 'x' } });
    expect(bad.fileProblems).toEqual({ 'b.png': 'The reading of b.png must be a number in mm.', 'c.png': 'c.png has no reading.' });
  });
});
