import { describe, expect, it } from 'vitest';
import { fitFrameView, framePixelAt, panFrameView, zoomFrameViewAt } from '@/features/measurement-result/components/frame-view-transform';

describe('frame view transform', () => {
  it('fitFrameView shows the whole frame centred at the largest scale that fits', () => {
    const view = fitFrameView({ frameWidthPx: 1600, frameHeightPx: 1200, viewportWidthPx: 1000, viewportHeightPx: 600 });
    expect(view.scale).toBe(0.5);
    expect(view.offsetXPx).toBe(100);
    expect(view.offsetYPx).toBe(0);
    expect(framePixelAt(view, 500, 300)).toEqual({ xPx: 800, yPx: 600 });
  });

  it('zoomFrameViewAt keeps the frame pixel under the anchor in place', () => {
    const view = { scale: 0.5, offsetXPx: 100, offsetYPx: 0 };
    const before = framePixelAt(view, 321, 123);
    const zoomed = zoomFrameViewAt({ view, factor: 3, anchorXPx: 321, anchorYPx: 123, minScale: 0.1, maxScale: 16 });
    expect(zoomed.scale).toBe(1.5);
    const after = framePixelAt(zoomed, 321, 123);
    expect(after.xPx).toBeCloseTo(before.xPx, 10);
    expect(after.yPx).toBeCloseTo(before.yPx, 10);
  });

  it('zoomFrameViewAt clamps the scale to its limits', () => {
    const view = { scale: 8, offsetXPx: 0, offsetYPx: 0 };
    expect(zoomFrameViewAt({ view, factor: 10, anchorXPx: 0, anchorYPx: 0, minScale: 0.25, maxScale: 16 }).scale).toBe(16);
    expect(zoomFrameViewAt({ view, factor: 0.001, anchorXPx: 0, anchorYPx: 0, minScale: 0.25, maxScale: 16 }).scale).toBe(0.25);
  });

  it('panFrameView moves the frame with the pointer', () => {
    expect(panFrameView({ scale: 2, offsetXPx: 10, offsetYPx: 20 }, -5, 7)).toEqual({ scale: 2, offsetXPx: 5, offsetYPx: 27 });
  });

  it('the view functions name the bad option', () => {
    expect(() => fitFrameView({ frameWidthPx: 0, frameHeightPx: 1200, viewportWidthPx: 10, viewportHeightPx: 10 })).toThrow(
      'fitFrameView: option "frameWidthPx" must be a positive number; got 0.',
    );
    expect(() => zoomFrameViewAt({ view: { scale: 1, offsetXPx: 0, offsetYPx: 0 }, factor: -1, anchorXPx: 0, anchorYPx: 0, minScale: 1, maxScale: 2 })).toThrow(
      'zoomFrameViewAt: option "factor" must be a positive number; got -1.',
    );
  });
});
