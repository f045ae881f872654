import { renderToStaticMarkup } from 'react-dom/server';
import { describe, expect, it } from 'vitest';
import type { FrameAnalysis } from '@shared/schemas/measurement-result';
import { FrameStrip, bestFocusFrameFiles } from '@/features/measurement-result/components/frame-strip';
import { FrameViewer } from '@/features/measurement-result/components/frame-viewer';
import { scaleOverlay } from '@/features/measurement-result/components/frame-overlay-drawing';
import {
  SAMPLE_FRAME_SIZE,
  SAMPLE_THUMBNAIL_SCALE,
  sampleDisplacementResult,
  sampleResult,
} from '@/features/measurement-result/fixtures/sample-result';

const frame = (file: string, positionMm: number, status: 'used' | 'rejected' = 'used'): FrameAnalysis => ({
  file,
  positionMm,
  status,
  focusValue: 1,
  sizePx: 100,
  mtf50CyclesPerPixel: null,
  saturatedFraction: 0,
  meanLevel: 0.5,
  overlay: null,
  focusResidual: null,
});

describe('bestFocusFrameFiles', () => {
  it('bestFocusFrameFiles picks the used frame nearest each best focus, skipping a nearer rejected one', () => {
    const frames = [frame('a', 10), frame('b', 10.5, 'rejected'), frame('c', 11), frame('d', 20), frame('e', 21)];
    expect(bestFocusFrameFiles(frames, [10.45])).toEqual(['a']);
    expect(bestFocusFrameFiles(frames, [10.9, 20.7])).toEqual(['c', 'e']);
  });
});

describe('FrameStrip', () => {
  const sweep = sampleResult.sweeps[0];
  const html = renderToStaticMarkup(
    <FrameStrip
      sweep={sweep}
      sweepLabel="sweep 1"
      frameWidthPx={SAMPLE_FRAME_SIZE.widthPx}
      frameHeightPx={SAMPLE_FRAME_SIZE.heightPx}
      thumbnailScale={SAMPLE_THUMBNAIL_SCALE}
      thumbnailUrl={(file) => `/thumbs/${file}`}
      frameUrl={(file) => `/frames/${file}`}
    />,
  );

  it('FrameStrip edges the frame nearest best focus in the signal colour and names it', () => {
    const [bestFile] = bestFocusFrameFiles(sweep.frames!, [sweep.bestFocusPositionMm!]);
    expect(html).toMatch(new RegExp(`<li class="shrink-0" data-best-focus="true"><button[^>]*class="[^"]*border-focus[^"]*"[^>]*data-file="${bestFile}"`));
    expect(html.match(/data-best-focus="true"/g)).toHaveLength(1);
    expect(html).toContain('best focus z₀');
  });

  it('FrameStrip dims rejected frames and prints their reason', () => {
    for (const rejection of sweep.framesRejected) {
      expect(html).toMatch(new RegExp(`data-file="${rejection.file}" data-status="rejected"`));
    }
    expect(html).toContain('Rejected · saturated');
    expect(html).toContain('Rejected · outlier');
    expect(html).toContain('opacity-40 grayscale');
  });

  it('FrameStrip draws the square target over a thumbnail at the thumbnail scale', () => {
    const withOverlay = sweep.frames!.find((f) => f.overlay)!;
    const expected = withOverlay.overlay!.pointsPx.map((p) => `${p.x * SAMPLE_THUMBNAIL_SCALE},${p.y * SAMPLE_THUMBNAIL_SCALE}`).join(' ');
    expect(html).toContain(`points="${expected}"`);
    expect(html).toContain(`src="/thumbs/${withOverlay.file}"`);
    expect(html).toContain(`width="${SAMPLE_FRAME_SIZE.widthPx * SAMPLE_THUMBNAIL_SCALE}"`);
  });

  it('FrameStrip draws dot centres as crosshair circles for a dot-pair target', () => {
    const dots = sampleDisplacementResult.sweeps[0];
    const markup = renderToStaticMarkup(
      <FrameStrip
        sweep={dots}
        sweepLabel="sweep 1"
        frameWidthPx={SAMPLE_FRAME_SIZE.widthPx}
        frameHeightPx={SAMPLE_FRAME_SIZE.heightPx}
        thumbnailScale={0.1}
        thumbnailUrl={(file) => file}
        frameUrl={(file) => file}
      />,
    );
    const first = dots.frames!.find((f) => f.overlay)!;
    const centre = first.overlay!.pointsPx[0];
    expect(markup).toContain(`cx="${centre.x * 0.1}" cy="${centre.y * 0.1}"`);
    expect(markup.match(/data-best-focus="true"/g)).toHaveLength(2);
  });

  it('scaleOverlay scales the region, points and radius by the same factor', () => {
    const overlay = { pattern: 'dot-pair' as const, regionPx: { x: 100, y: 50, width: 400, height: 200 }, pointsPx: [{ x: 200, y: 150 }], radiusPx: 20 };
    expect(scaleOverlay(overlay, 0.25)).toEqual({
      pattern: 'dot-pair',
      regionPx: { x: 25, y: 12.5, width: 100, height: 50 },
      pointsPx: [{ x: 50, y: 37.5 }],
      radiusPx: 5,
    });
  });
});

describe('FrameViewer', () => {
  it('FrameViewer is a labelled modal dialog with zoom, stepping and close controls and the frame readings', () => {
    const sweep = sampleResult.sweeps[0];
    const frames = [...sweep.frames!].sort((a, b) => a.positionMm - b.positionMm);
    const html = renderToStaticMarkup(
      <FrameViewer
        frames={frames}
        index={3}
        onIndexChange={() => {}}
        onClose={() => {}}
        sweep={sweep}
        sweepLabel="sweep 1"
        frameUrl={(file) => `/frames/${file}`}
        frameWidthPx={1600}
        frameHeightPx={1200}
        bestFocusFiles={[]}
      />,
    );
    expect(html).toMatch(/<dialog[^>]*aria-labelledby="[^"]+"[^>]*aria-modal="true"/);
    for (const label of ['Previous frame (Page Up)', 'Next frame (Page Down)', 'Zoom in (+)', 'Zoom out (−)', 'Fit the whole frame (0)', 'Close the frame viewer (Esc)']) {
      expect(html).toContain(`aria-label="${label}"`);
    }
    expect(html).toContain('src="/frames/s1/0004.png"');
    expect(html).toContain('rejected: saturated (clipped highlights)');
    expect(html).toContain('>450.791<');
  });
});
