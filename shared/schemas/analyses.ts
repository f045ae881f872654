/**
 * Analysis runs as the API takes and returns them (docs/api-bench.md,
 * "Analysis"). Shared by the server's validators and the client; no Node APIs here.
 */
import { z } from 'zod';
import type { MeasurementManifestInput } from './measurement-manifest';
import type { MeasurementResult } from './measurement-result';

/* Kept equal to the database enum analysis_run_status in server/db/schema.ts (a test checks it). */
export const analysisRunStatuses = ['queued', 'running', 'succeeded', 'failed'] as const;
export type AnalysisRunStatus = (typeof analysisRunStatuses)[number];

/**
 * What a run is doing, derived from its status and progress: waiting for a
 * worker, measuring frames, fitting (every frame measured, curves and
 * uncertainty being computed), or finished one way or the other.
 */
export const analysisPhases = ['waiting', 'measuring', 'fitting', 'succeeded', 'failed'] as const;
export type AnalysisPhase = (typeof analysisPhases)[number];

/** How often the page asks for progress while a run is queued or running. */
export const ANALYSIS_PROGRESS_POLL_MS = 1000;

/* --------------------------------- requests -------------------------------- */

const measurementIdField = z.uuid({ error: 'Field "measurementId" must be an id (a UUID).' });

/** `POST /api/measurements/:measurementId/analyses` takes an empty object. */
export const startAnalysisBody = z.strictObject({});
export type StartAnalysisBody = z.output<typeof startAnalysisBody>;

export const startAnalysisParams = z.object({ measurementId: measurementIdField });
export type StartAnalysisParams = z.output<typeof startAnalysisParams>;

export const analysisRunParams = z.object({
  measurementId: measurementIdField,
  version: z.coerce
    .number({ error: 'Field "version" must be a whole number of 1 or more.' })
    .int({ error: 'Field "version" must be a whole number of 1 or more.' })
    .min(1, { error: 'Field "version" must be a whole number of 1 or more.' })
    .max(2_147_483_647, { error: 'Field "version" must be a whole number of 1 or more.' }),
});
export type AnalysisRunParams = z.output<typeof analysisRunParams>;

/**
 * `?fields=progress` answers a summary without `result` and `manifest`: what
 * the page polls every second while a run is queued or running.
 */
export const analysisRunFieldSets = ['all', 'progress'] as const;
export type AnalysisRunFieldSet = (typeof analysisRunFieldSets)[number];

export const analysisRunQuery = z.strictObject({
  fields: z.enum(analysisRunFieldSets, { error: 'Field "fields" must be "all" or "progress".' }).default('all'),
});
export type AnalysisRunQuery = z.output<typeof analysisRunQuery>;

/* --------------------------------- responses ------------------------------- */

export interface PersonReference {
  id: string;
  name: string;
}

export interface AnalysisRunSummary {
  id: string;
  version: number;
  status: AnalysisRunStatus;
  phase: AnalysisPhase;
  framesDone: number;
  framesTotal: number;
  /** ISO 8601 instants. */
  createdAt: string;
  startedAt: string | null;
  finishedAt: string | null;
  requestedBy: PersonReference | null;
  /** Present once the run succeeded. */
  focalLengthMm: number | null;
  expandedUncertaintyMm: number | null;
  coverageFactor: number | null;
  /** A sentence for the technician when the run failed. */
  errorMessage: string | null;
}

/** The engine manifest the run was given: sweeps, frame files and their readings, equipment values. */
export type AnalysisRunManifest = MeasurementManifestInput;

export interface AnalysisRun extends AnalysisRunSummary {
  result: MeasurementResult | null;
  manifest: AnalysisRunManifest;
}

export interface StartAnalysisResponse {
  analysis: AnalysisRunSummary;
}

export interface AnalysisRunResponse {
  analysis: AnalysisRun;
}

export interface AnalysisRunProgressResponse {
  analysis: AnalysisRunSummary;
}

/** True while the page should keep polling. */
export function isAnalysisRunInProgress(status: AnalysisRunStatus): boolean {
  return status === 'queued' || status === 'running';
}

/** The phase shown for a run, from its stored status and progress. */
export function analysisPhaseOf(run: { status: AnalysisRunStatus; framesDone: number; framesTotal: number }): AnalysisPhase {
  switch (run.status) {
    case 'queued':
      return 'waiting';
    case 'running':
      return run.framesTotal > 0 && run.framesDone >= run.framesTotal ? 'fitting' : 'measuring';
    case 'succeeded':
      return 'succeeded';
    case 'failed':
      return 'failed';
  }
}
