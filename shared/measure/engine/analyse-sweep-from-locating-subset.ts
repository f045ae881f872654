import type { GreyImage, PixelRect } from '../types';
import type { FrameAnalysis, FrameRejectionReason } from '../../schemas/measurement-result';
import type { TargetDetection } from '../target/detect-target';
import type { ReducedFrame } from './frame-source';
import { mapWithReadAhead } from './map-with-read-ahead';
import { mapAsReadsFinish } from './map-as-reads-finish';
import { isUnreadable, readOrReject } from './read-or-reject';
import { chooseRegionSize, type RegionSize } from './choose-region-size';
import { regionAround } from './region-around';
import { majorityPolarity } from './majority-polarity';
import { measureSweepFrame } from './measure-sweep-frame';
import { rejectedFrameRecord } from './rejected-frame-record';
import { interpolateTargetCentre } from './interpolate-target-centre';
import { locateTargetInRegion } from './locate-target-in-region';
import { locateOnReducedFrame, noTargetError, type LocatedFrame } from './analyse-sweep-locating-every-frame';
import type { AnalyseSweepFramesOptions, SweepFramesResult } from './analyse-sweep-frames';

/** Thrown when a frame's blurred target does not fit the region size the locating subset gave. */
export class RegionTooSmallForSweep extends Error {
  constructor(file: string) {
    super(`the blurred target on ${file} does not fit the region chosen from the locating frames`);
    this.name = 'RegionTooSmallForSweep';
  }
}

type FollowUp =
  | { kind: 'relocate' }
  | { kind: 'recentre'; detection: TargetDetection };

/**
 * Frame indices, by rail position, that pass 1 locates the target on: the
 * first, the last and the middle frame. A frame that cannot be used gives
 * way to the nearest untried one.
 */
function slotOrders(candidates: number[]): number[][] {
  const n = candidates.length;
  const slots = [...new Set([0, n - 1, (n - 1) >> 1])];
  return slots.map((slot) =>
    candidates
      .map((frameIndex, k) => ({ frameIndex, distance: Math.abs(k - slot) }))
      .sort((a, b) => a.distance - b.distance)
      .map((c) => c.frameIndex),
  );
}

/**
 * The sweep analysed with the target located on the reduced copies of three
 * frames only (first, middle and last by position: a defocused target is
 * widest at an end of a single-focus sweep). They give the region size, one
 * reduced pixel of extent wider than they need, and the target's path
 * through the sweep, along which every frame's region is then decoded and
 * measured. Each region must show the target again (detection on the region
 * reduced by the same factor); a frame where it does not is located on its
 * own reduced copy, as in the sure path, so a lost or spoilt frame gets the
 * same verdict. A target found more than one reduced pixel off its predicted
 * place is measured in a region re-read around it.
 *
 * Throws RegionTooSmallForSweep when some frame's blur needs a larger
 * region than the locating frames gave: the sweep then needs every frame
 * located first (analyseSweepLocatingEveryFrame).
 */
export async function analyseSweepFromLocatingSubset(
  options: AnalyseSweepFramesOptions,
  onFrameDone: (file: string) => void,
): Promise<SweepFramesResult> {
  const { frames, source, pattern } = options;
  const located: (LocatedFrame | undefined)[] = frames.map((frame) =>
    options.excludedFiles.has(frame.file) ? locateOnReducedFrame(null, options) : undefined,
  );
  const candidates = frames
    .map((frame, index) => ({ index, positionMm: frame.positionMm }))
    .filter(({ index }) => located[index] === undefined)
    .sort((a, b) => a.positionMm - b.positionMm)
    .map(({ index }) => index);
  if (candidates.length === 0) throw noTargetError(located as LocatedFrame[], pattern);

  const locate = async (index: number) => {
    const reduced = await readOrReject<ReducedFrame>(frames[index].file, () => source.readReduced(frames[index].file));
    located[index] = locateOnReducedFrame(reduced, options);
  };
  const orders = slotOrders(candidates);
  // All first picks at once: reduced copies are small.
  await mapWithReadAhead(orders, Math.max(options.concurrency, orders.length), (order) => locate(order[0]), () => undefined);
  for (const order of orders) {
    for (const index of order) {
      if (located[index]?.detection) break;
      if (located[index] === undefined) await locate(index);
    }
  }

  const anyFound = located.filter((l): l is LocatedFrame => l?.detection != null);
  if (anyFound.length === 0) throw noTargetError(located.filter((l): l is LocatedFrame => l !== undefined), pattern);
  const polarity = options.polarity ?? majorityPolarity(anyFound.map((l) => l.detection!.polarity));
  for (const [index, loc] of located.entries()) {
    if (loc?.detection && loc.detection.polarity !== polarity) located[index] = { ...loc, detection: null, reason: 'target-lost' };
  }
  const found = located.filter((l): l is LocatedFrame & { detection: TargetDetection } => l?.detection != null);
  const path = frames.flatMap((frame, index) => {
    const detection = located[index]?.detection;
    return detection ? [{ positionMm: frame.positionMm, centrePx: detection.centrePx }] : [];
  });
  const { factor, fullWidth, fullHeight } = found[0];
  // One reduced pixel of extent more than the locating frames need: the extent's own step (see the check at the end).
  const regionSize: RegionSize = chooseRegionSize(found.map((l) => l.detection), factor);
  const measureOptions = { ...options, polarity, everyFocusOperator: options.everyFocusOperator ?? false };

  // Extents along each axis (the region is sized per axis).
  const extentOf = (detection: TargetDetection): RegionSize => ({ width: detection.blurExtentBox.width, height: detection.blurExtentBox.height });
  const widestOf = (extents: RegionSize[]): RegionSize => ({
    width: Math.max(...extents.map((e) => e.width)),
    height: Math.max(...extents.map((e) => e.height)),
  });
  const wider = (extent: RegionSize, than: RegionSize) => !(extent.width <= than.width + factor && extent.height <= than.height + factor);
  const locatingExtent = widestOf(found.map((l) => extentOf(l.detection)));
  // Extents found in regions are compared among themselves: detection in a region sized to the target
  // splits background from target at other levels than on a whole frame, and gives somewhat wider extents.
  const regionExtents: { index: number; extent: RegionSize }[] = [];
  const checkOnFrame = (file: string, detection: TargetDetection) => {
    if (wider(extentOf(detection), locatingExtent)) throw new RegionTooSmallForSweep(file);
  };
  const predictedRect = (index: number): PixelRect | null => {
    const loc = located[index];
    if (loc && !loc.detection) return null;
    const centre = loc?.detection?.centrePx ?? interpolateTargetCentre(path, frames[index].positionMm);
    return regionAround(centre, regionSize, fullWidth, fullHeight);
  };
  const finish = (file: string, result: FrameAnalysis) => {
    onFrameDone(file);
    return result;
  };
  const measured = (region: GreyImage, rect: PixelRect, detection: TargetDetection, frame: (typeof frames)[number]) => {
    const result = measureSweepFrame(region, rect, detection, measureOptions, rejectedFrameRecord(frame));
    source.recycle?.(region);
    return result;
  };

  // One read more running than lanes, and up to `concurrency` regions waiting: while this thread measures a
  // frame, decodes keep running; frames are measured in the order their regions arrive.
  const firstResults: (FrameAnalysis | FollowUp)[] = await mapAsReadsFinish(
    frames,
    { reads: options.concurrency + 1, held: options.concurrency },
    async (frame, index) => {
      const rect = predictedRect(index);
      return rect ? { rect, region: await readOrReject<GreyImage>(frame.file, () => source.readRegion(frame.file, rect)) } : null;
    },
    (read, frame, index): FrameAnalysis | FollowUp => {
      if (read === null) return finish(frame.file, rejectedFrameRecord(frame, located[index]!.reason ?? 'target-lost'));
      const { rect, region } = read;
      if (isUnreadable(region)) {
        // A locating frame's file was decoded whole in pass 1; another's may be smaller than the rest, so it is located on its own.
        return located[index] ? finish(frame.file, rejectedFrameRecord(frame, 'undecodable')) : { kind: 'relocate' };
      }
      const inRegion = locateTargetInRegion(region, rect, { pattern, polarity, factor, frameWidth: fullWidth, frameHeight: fullHeight });
      if (!inRegion) {
        source.recycle?.(region);
        return { kind: 'relocate' };
      }
      if (inRegion.touchesRegionEdge) throw new RegionTooSmallForSweep(frame.file);
      regionExtents.push({ index, extent: extentOf(inRegion.detection) });
      const centred = regionAround(inRegion.detection.centrePx, regionSize, fullWidth, fullHeight);
      if (Math.hypot(centred.x - rect.x, centred.y - rect.y) > 2 * factor) {
        source.recycle?.(region);
        return { kind: 'recentre', detection: inRegion.detection };
      }
      return finish(frame.file, measured(region, rect, inRegion.detection, frame));
    },
    (read) => {
      if (read && !isUnreadable(read.region)) source.recycle?.(read.region);
    },
  );

  // Follow-ups one frame at a time: they are the exceptions (a lost, spoilt or strayed target).
  const results: FrameAnalysis[] = [];
  for (const [index, first] of firstResults.entries()) {
    const frame = frames[index];
    if (!('kind' in first)) {
      results.push(first);
      continue;
    }
    let detection: TargetDetection;
    let width = fullWidth;
    let height = fullHeight;
    if (first.kind === 'relocate') {
      const reduced = await readOrReject<ReducedFrame>(frame.file, () => source.readReduced(frame.file));
      const loc = locateOnReducedFrame(reduced, options);
      const reason: FrameRejectionReason | undefined = !loc.detection ? loc.reason : loc.detection.polarity !== polarity ? 'target-lost' : undefined;
      if (reason || !loc.detection) {
        results.push(finish(frame.file, rejectedFrameRecord(frame, reason ?? 'target-lost')));
        continue;
      }
      checkOnFrame(frame.file, loc.detection);
      detection = loc.detection;
      width = loc.fullWidth;
      height = loc.fullHeight;
    } else {
      detection = first.detection;
    }
    const rect = regionAround(detection.centrePx, regionSize, width, height);
    const region = await readOrReject<GreyImage>(frame.file, () => source.readRegion(frame.file, rect));
    results.push(
      finish(frame.file, isUnreadable(region) ? rejectedFrameRecord(frame, 'undecodable') : measured(region, rect, detection, frame)),
    );
  }
  // No frame's blur may be wider than the widest locating frame's (by more than one reduced pixel, the
  // extent's own step); otherwise the region size is not vouched for and the sweep is done the sure way.
  const locatingInRegions = regionExtents.filter(({ index }) => located[index]?.detection);
  // With no locating frame measured in its region nothing vouches for the size (the widest is then −∞ on both axes).
  const widestLocating = widestOf(locatingInRegions.map((e) => e.extent));
  const tooWide = regionExtents.find((e) => wider(e.extent, widestLocating));
  if (tooWide) throw new RegionTooSmallForSweep(frames[tooWide.index].file);
  return { frames: results, polarity, regionSize };
}
