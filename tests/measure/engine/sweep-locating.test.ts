/**
 * How a sweep's target is located before its frames are measured: on three
 * frames first, then confirmed in every frame's region, with the sure path
 * (every frame located on its reduced copy) as the fall-back. The contract:
 * the quicker path gives the same verdict per frame as the sure one, and is
 * never used when its region would be too small for some frame's blur.
 */
import { describe, expect, it } from 'vitest';
import type { GreyImage, PixelRect } from '../../../shared/measure/types';
import type { FrameSource, ReducedFrame } from '../../../shared/measure/engine/frame-source';
import { FrameMissingError, FrameUnreadableError } from '../../../shared/measure/engine/measurement-error';
import { analyseSweepFrames, type AnalyseSweepFramesOptions } from '../../../shared/measure/engine/analyse-sweep-frames';
import { analyseSweepFromLocatingSubset, RegionTooSmallForSweep } from '../../../shared/measure/engine/analyse-sweep-from-locating-subset';
import { analyseSweepLocatingEveryFrame } from '../../../shared/measure/engine/analyse-sweep-locating-every-frame';
import { interpolateTargetCentre } from '../../../shared/measure/engine/interpolate-target-centre';
import { downsampleImage } from '../../../shared/measure/image/downsample-image';
import { cropImage } from '../../../shared/measure/image/crop-image';
import { SharpFrameSource } from '../../../server/measure/sharp-frame-source';
import { cachedBenchMeasurement } from '../../../scripts/synth/cached-bench-measurement';
import { addNoise, renderBlank, renderDots } from '../image/render-scene';

const relative = (a: number | null, b: number | null) => Math.abs((a as number) / (b as number) - 1);

/** Frames held in memory; counts how often each kind of read happens. */
class CountingFrameSource implements FrameSource {
  reducedReads: string[] = [];
  regionReads: string[] = [];
  constructor(
    private readonly frames: Map<string, GreyImage>,
    private readonly factor: number,
  ) {}

  async readReduced(file: string): Promise<ReducedFrame> {
    this.reducedReads.push(file);
    const image = this.frames.get(file);
    if (!image) throw new FrameMissingError(file);
    return { image: downsampleImage(image, { factor: this.factor }), factor: this.factor, fullWidth: image.width, fullHeight: image.height };
  }

  async readRegion(file: string, rect: PixelRect): Promise<GreyImage> {
    this.regionReads.push(file);
    const image = this.frames.get(file);
    if (!image) throw new FrameMissingError(file);
    return cropImage(image, rect);
  }
}

/** A dark dot pair on a bright field, blurred by `sigmaPx`, drifting 2 px right per frame (as off-axis through a sensor sweep). */
function dotPairFrame(index: number, sigmaPx: number): GreyImage {
  const drift = 2 * index;
  const sharp = renderDots({
    width: 480, height: 360, centresPx: [{ x: 200 + drift, y: 180 }, { x: 280 + drift, y: 182 }], radiusPx: 12, sigmaPx,
    backgroundLevel: 200, targetLevel: 30, maxValue: 255, supersampling: 2,
  });
  return addNoise(sharp, 2, 100 + index);
}

function overExposed(image: GreyImage): GreyImage {
  return { ...image, data: image.data.map((v) => Math.min(255, Math.round(1.5 * v))) };
}

function sweepOptions(source: FrameSource, files: string[]): AnalyseSweepFramesOptions {
  return {
    frames: files.map((file, i) => ({ file, positionMm: 50 + 0.25 * i })),
    source,
    pattern: 'dot-pair',
    polarity: 'dark-on-light',
    focusOperator: 'gradient-energy',
    excludedFiles: new Set(),
    saturatedShareLimit: 0.01,
    concurrency: 2,
    onFrameDone: () => {},
  };
}

function inMemorySweep(sigmasPx: number[], spoil: (index: number) => GreyImage | null = () => null) {
  const files = sigmasPx.map((_, i) => `f${i + 1}.png`);
  const frames = new Map(files.map((file, i) => [file, spoil(i) ?? dotPairFrame(i, sigmasPx[i])]));
  return { files, frames };
}

// Blur grows away from focus near the middle frame, as through a sensor sweep.
const SINGLE_FOCUS_SIGMAS = [6, 5, 4, 3, 2, 1.5, 2, 3, 4, 5, 6];

describe('interpolateTargetCentre', () => {
  const located = [
    { positionMm: 10, centrePx: { x: 100, y: 50 } },
    { positionMm: 30, centrePx: { x: 140, y: 30 } },
    { positionMm: 20, centrePx: { x: 110, y: 40 } },
  ];
  it('follows the piece between the two located frames around a position, in any input order', () => {
    expect(interpolateTargetCentre(located, 15)).toEqual({ x: 105, y: 45 });
    expect(interpolateTargetCentre(located, 25)).toEqual({ x: 125, y: 35 });
  });
  it('passes through every located frame and extends the end pieces beyond them', () => {
    expect(interpolateTargetCentre(located, 20)).toEqual({ x: 110, y: 40 });
    expect(interpolateTargetCentre(located, 40)).toEqual({ x: 170, y: 20 });
    expect(interpolateTargetCentre(located, 0)).toEqual({ x: 90, y: 60 });
  });
  it('stays put with one located frame and refuses none', () => {
    expect(interpolateTargetCentre([located[0]], 99)).toEqual({ x: 100, y: 50 });
    expect(() => interpolateTargetCentre([], 1)).toThrow(/at least one frame/);
  });
});

describe('analyseSweepFrames locating the target', { timeout: 120_000 }, () => {
  it('reads reduced copies of three frames only on a clean single-focus sweep, and measures every frame as the sure path does', async () => {
    const { files, frames } = inMemorySweep(SINGLE_FOCUS_SIGMAS);
    const quick = new CountingFrameSource(frames, 4);
    const sure = new CountingFrameSource(frames, 4);
    const done: string[] = [];
    const result = await analyseSweepFrames({ ...sweepOptions(quick, files), onFrameDone: (file) => done.push(file) });
    const reference = await analyseSweepLocatingEveryFrame(sweepOptions(sure, files), () => {});
    expect(quick.reducedReads.sort()).toEqual(['f1.png', 'f11.png', 'f6.png']);
    expect(quick.regionReads).toHaveLength(files.length);
    expect(done.sort()).toEqual([...files].sort());
    expect(result.frames.map((f) => f.status)).toEqual(reference.frames.map((f) => f.status));
    expect(result.frames.every((f) => f.status === 'used')).toBe(true);
    // The quick path's region is one reduced pixel of extent (×1.3) wider, never narrower.
    for (const axis of ['width', 'height'] as const) {
      expect(result.regionSize[axis]).toBeGreaterThanOrEqual(reference.regionSize[axis]);
      expect(result.regionSize[axis]).toBeLessThanOrEqual(reference.regionSize[axis] + Math.ceil(1.3 * 4) + 1 + 2 * 4);
    }
    // The dots' windows are sized from the detected blob areas, which the two detections give a little
    // differently, so the centroids see slightly different noise: sizes agree to 5e-4, a quarter of the
    // engine's 0.2 % magnification target, on these small noisy dots.
    result.frames.forEach((frame, i) => expect(relative(frame.sizePx, reference.frames[i].sizePx)).toBeLessThan(5e-4));
  });

  it('gives a lost, an unreadable and a saturated frame the same reasons as the sure path', async () => {
    // f3 pure noise; f9 over-exposed, its background clipped at full scale.
    const { files, frames } = inMemorySweep(SINGLE_FOCUS_SIGMAS, (i) =>
      i === 2 ? addNoise(renderBlank(480, 360, 128, 255), 60, 7) : i === 8 ? overExposed(dotPairFrame(i, SINGLE_FOCUS_SIGMAS[i])) : null,
    );
    // The source reports f4 as a file that cannot be decoded, whichever way it is read.
    const unreadable = (source: CountingFrameSource): FrameSource => ({
      readReduced: (file) => (file === 'f4.png' ? Promise.reject(new FrameUnreadableError(file, 'premature end of data')) : source.readReduced(file)),
      readRegion: (file, rect) => (file === 'f4.png' ? Promise.reject(new FrameUnreadableError(file, 'premature end of data')) : source.readRegion(file, rect)),
    });
    const quick = await analyseSweepFrames(sweepOptions(unreadable(new CountingFrameSource(frames, 4)), files));
    const sure = await analyseSweepLocatingEveryFrame(sweepOptions(unreadable(new CountingFrameSource(frames, 4)), files), () => {});
    const reasons = (r: typeof quick) => Object.fromEntries(r.frames.filter((f) => f.status === 'rejected').map((f) => [f.file, f.reason]));
    expect(reasons(quick)).toEqual({ 'f3.png': 'target-lost', 'f4.png': 'undecodable', 'f9.png': 'saturated' });
    expect(reasons(quick)).toEqual(reasons(sure));
  });

  it("records the chosen focus operator's measure only, unless every operator is asked for", async () => {
    const { files, frames } = inMemorySweep(SINGLE_FOCUS_SIGMAS.slice(0, 5));
    const chosen = await analyseSweepFrames({ ...sweepOptions(new CountingFrameSource(frames, 4), files), focusOperator: 'brenner' });
    const every = await analyseSweepFrames({ ...sweepOptions(new CountingFrameSource(frames, 4), files), focusOperator: 'brenner', everyFocusOperator: true });
    chosen.frames.forEach((frame, i) => {
      expect(Object.keys(frame.focusValues ?? {})).toEqual(['brenner']);
      expect(Object.keys(every.frames[i].focusValues ?? {}).sort()).toEqual(['brenner', 'gradient-energy', 'laplacian-variance', 'normalised-variance']);
      expect(frame.focusValue).toBe(every.frames[i].focusValue);
    });
  });

  it('falls back to locating every frame when a frame between the located ones is more blurred than they are', async () => {
    // A second defocus hump at frame 3 (as between the two sharp positions of a lens-displacement sweep).
    const sigmas = [3, 6, 9, 6, 3, 1.5, 2, 3, 4, 4.5, 3];
    const { files, frames } = inMemorySweep(sigmas);
    await expect(analyseSweepFromLocatingSubset(sweepOptions(new CountingFrameSource(frames, 4), files), () => {})).rejects.toBeInstanceOf(
      RegionTooSmallForSweep,
    );
    const source = new CountingFrameSource(frames, 4);
    const done: string[] = [];
    const result = await analyseSweepFrames({ ...sweepOptions(source, files), onFrameDone: (file) => done.push(file) });
    const reference = await analyseSweepLocatingEveryFrame(sweepOptions(new CountingFrameSource(frames, 4), files), () => {});
    expect(result).toEqual(reference);
    expect(new Set(source.reducedReads)).toEqual(new Set(files));
    // Each frame is reported done once, though the quick path had measured some before it gave way.
    expect(done.sort()).toEqual([...files].sort());
  });

  it('agrees with the sure path on a generated bench sweep read with sharp', async () => {
    const fixture = await cachedBenchMeasurement('finite-conjugate');
    const frames = fixture.manifest.sweeps[0].frames as { file: string; positionMm: number }[];
    const base = { ...sweepOptions(new SharpFrameSource(fixture.folder), []), frames, polarity: fixture.manifest.target.polarity };
    let reducedReads = 0;
    const counting = new SharpFrameSource(fixture.folder);
    const readReduced = counting.readReduced.bind(counting);
    counting.readReduced = (file) => {
      reducedReads++;
      return readReduced(file);
    };
    const quick = await analyseSweepFrames({ ...base, source: counting });
    const sure = await analyseSweepLocatingEveryFrame({ ...base, source: new SharpFrameSource(fixture.folder) }, () => {});
    expect(reducedReads).toBe(3);
    expect(quick.frames.map((f) => f.status)).toEqual(sure.frames.map((f) => f.status));
    quick.frames.forEach((frame, i) => {
      expect(relative(frame.sizePx, sure.frames[i].sizePx)).toBeLessThan(1e-4);
      // Regions a few pixels apart in size and place hold nearly the same gradient energy.
      expect(relative(frame.focusValue, sure.frames[i].focusValue)).toBeLessThan(0.02);
    });
  });
});
