/**
 * Whether a measurement can be analysed now, and if not, the sentence that
 * says what is missing. The server refuses the same cases; the button says
 * why before anyone presses it.
 */
import type { AnalysisRunStatus } from '@shared/schemas/analyses';
import type { MeasurementStatus, SweepDetail } from '@shared/schemas/measurements';

/** The engine needs at least this many usable frames per sweep (manifest contract). */
export const MINIMUM_FRAMES_PER_SWEEP = 5;

const LOCKED_STATUSES: MeasurementStatus[] = ['submitted', 'approved', 'certified'];

export interface AnalysisReadinessOptions {
  status: MeasurementStatus;
  sweeps: readonly SweepDetail[];
  /** Status of the latest run, if any. */
  latestRunStatus: AnalysisRunStatus | null;
  /** Files still uploading on this page. */
  uploadsInFlight: number;
}

export type AnalysisReadiness = { ready: true; framesTotal: number } | { ready: false; reason: string };

function listNames(names: string[]): string {
  if (names.length <= 3) return names.join(', ');
  return `${names.slice(0, 3).join(', ')} and ${names.length - 3} more`;
}

export function analysisReadiness(options: AnalysisReadinessOptions): AnalysisReadiness {
  const { status, sweeps, latestRunStatus, uploadsInFlight } = options;
  if (LOCKED_STATUSES.includes(status)) {
    return { ready: false, reason: `This measurement is ${status}; its analysis can no longer change.` };
  }
  if (latestRunStatus === 'queued' || latestRunStatus === 'running') {
    return { ready: false, reason: 'An analysis is already under way; wait for it to finish.' };
  }
  if (uploadsInFlight > 0) {
    return { ready: false, reason: `${uploadsInFlight} ${uploadsInFlight === 1 ? 'file is' : 'files are'} still uploading.` };
  }
  if (sweeps.length === 0) throw new Error('Invariant failed: a measurement always has at least one sweep');
  let framesTotal = 0;
  for (const sweep of [...sweeps].sort((a, b) => a.position - b.position)) {
    const name = sweeps.length > 1 ? `Sweep ${sweep.position + 1}` : 'The sweep';
    const included = sweep.frames.filter((frame) => !frame.excluded);
    const withoutReading = included.filter((frame) => frame.positionMm === null).map((frame) => frame.fileName);
    if (withoutReading.length > 0) {
      return {
        ready: false,
        reason: `${name} has ${withoutReading.length} ${withoutReading.length === 1 ? 'frame' : 'frames'} without a rail reading (${listNames(withoutReading)}); enter the readings first.`,
      };
    }
    if (included.length < MINIMUM_FRAMES_PER_SWEEP) {
      return {
        ready: false,
        reason: `${name} has ${included.length} ${included.length === 1 ? 'frame' : 'frames'} with readings; it needs at least ${MINIMUM_FRAMES_PER_SWEEP}.`,
      };
    }
    framesTotal += included.length;
  }
  return { ready: true, framesTotal };
}
