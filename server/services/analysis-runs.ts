/**
 * Analysis runs: every request for an analysis adds a version; a run goes
 * queued → running → succeeded | failed, and is never overwritten. The web
 * process creates runs and reads them; the analysis worker moves them on.
 */
import { and, desc, eq, inArray, sql } from 'drizzle-orm';
import type { NodePgQueryResultHKT } from 'drizzle-orm/node-postgres';
import type { PgDatabase } from 'drizzle-orm/pg-core';
import type pg from 'pg';
import {
  analysisPhaseOf,
  type AnalysisRun,
  type AnalysisRunFieldSet,
  type AnalysisRunManifest,
  type AnalysisRunSummary,
} from '../../shared/schemas/analyses';
import type { MeasurementResult } from '../../shared/schemas/measurement-result';
import type { Database } from '../db/client';
import type * as schema from '../db/schema';
import { analysisRuns, auditEvents, measurements, people, type MeasurementStatus } from '../db/schema';
import { HttpError } from '../http-error';
import { HttpStatus } from '../http-status';
import { invariant } from '../invariant';
import { analysisQueueFor, type AnalysisQueue, type AnalysisQueueEnv } from './analysis-queue';
import { buildEngineManifest, type EngineFrameFile, type EngineManifest } from './engine-manifest';
import type { Logger } from './logger';

/** The database or a transaction on it. */
type Queryable = PgDatabase<NodePgQueryResultHKT, typeof schema>;

/** A frame file as the manifest names it, and where its bytes are kept. */
export type AnalysisFrameObject = EngineFrameFile;

/**
 * What `analysis_runs.manifest` holds: the engine manifest exactly as the
 * engine is given it, and the object key of every frame file it names (a
 * snapshot: the run must not change if frames are added or renamed later).
 */
export type StoredAnalysisInput = EngineManifest;

/** Statuses from which a (re-)analysis may be requested. */
const ANALYSABLE_STATUSES: readonly MeasurementStatus[] = ['draft', 'analysed', 'analysis-failed', 'returned'];

export const INTERNAL_FAILURE_MESSAGE =
  'The analysis stopped because of a problem in Paraxia, not in the frames or readings; it was tried several times. Ask an administrator to look at the analysis worker log, then request the analysis again.';

/* ---------------------------------- reading ---------------------------------- */

const summaryColumns = {
  id: analysisRuns.id,
  measurementId: analysisRuns.measurementId,
  version: analysisRuns.version,
  status: analysisRuns.status,
  framesDone: analysisRuns.framesDone,
  framesTotal: analysisRuns.framesTotal,
  createdAt: analysisRuns.createdAt,
  startedAt: analysisRuns.startedAt,
  finishedAt: analysisRuns.finishedAt,
  errorMessage: analysisRuns.errorMessage,
  requestedById: analysisRuns.requestedById,
  requestedByName: people.name,
  // Read out of the stored result in SQL, so a progress poll never ships the result document.
  focalLengthMm: sql<number | null>`(${analysisRuns.result}->>'focalLengthMm')::float8`,
  expandedUncertaintyMm: sql<number | null>`(${analysisRuns.result}->>'expandedUncertaintyMm')::float8`,
  coverageFactor: sql<number | null>`(${analysisRuns.result}->>'coverageFactor')::float8`,
};

type SummaryRow = {
  id: string;
  version: number;
  status: AnalysisRunSummary['status'];
  framesDone: number;
  framesTotal: number;
  createdAt: Date;
  startedAt: Date | null;
  finishedAt: Date | null;
  errorMessage: string | null;
  requestedById: string | null;
  requestedByName: string | null;
  focalLengthMm: number | null;
  expandedUncertaintyMm: number | null;
  coverageFactor: number | null;
};

function toSummary(row: SummaryRow): AnalysisRunSummary {
  return {
    id: row.id,
    version: row.version,
    status: row.status,
    phase: analysisPhaseOf(row),
    framesDone: row.framesDone,
    framesTotal: row.framesTotal,
    createdAt: row.createdAt.toISOString(),
    startedAt: row.startedAt?.toISOString() ?? null,
    finishedAt: row.finishedAt?.toISOString() ?? null,
    requestedBy: row.requestedById && row.requestedByName ? { id: row.requestedById, name: row.requestedByName } : null,
    focalLengthMm: row.focalLengthMm,
    expandedUncertaintyMm: row.expandedUncertaintyMm,
    coverageFactor: row.coverageFactor,
    errorMessage: row.errorMessage,
  };
}

function storedManifestOf(stored: unknown): AnalysisRunManifest {
  const input = stored as Partial<StoredAnalysisInput> | null;
  invariant(input && typeof input === 'object' && input.manifest, 'analysis_runs.manifest holds { manifest, files }');
  return input.manifest;
}

/** Every run of a measurement, newest version first, without results or manifests. */
export async function listAnalysisRunSummaries(db: Queryable, measurementId: string): Promise<AnalysisRunSummary[]> {
  const rows = await db
    .select(summaryColumns)
    .from(analysisRuns)
    .leftJoin(people, eq(people.id, analysisRuns.requestedById))
    .where(eq(analysisRuns.measurementId, measurementId))
    .orderBy(desc(analysisRuns.version));
  return rows.map(toSummary);
}

async function findRun(db: Queryable, where: ReturnType<typeof eq>, fields: AnalysisRunFieldSet): Promise<AnalysisRun | AnalysisRunSummary | null> {
  if (fields === 'progress') {
    const [row] = await db.select(summaryColumns).from(analysisRuns).leftJoin(people, eq(people.id, analysisRuns.requestedById)).where(where);
    return row ? toSummary(row) : null;
  }
  const [row] = await db
    .select({ ...summaryColumns, result: analysisRuns.result, manifest: analysisRuns.manifest })
    .from(analysisRuns)
    .leftJoin(people, eq(people.id, analysisRuns.requestedById))
    .where(where);
  if (!row) return null;
  return { ...toSummary(row), result: (row.result as MeasurementResult | null) ?? null, manifest: storedManifestOf(row.manifest) };
}

/** One version of a measurement's analysis; `progress` leaves out result and manifest. */
export async function findAnalysisRun(
  db: Queryable,
  options: { measurementId: string; version: number; fields?: AnalysisRunFieldSet },
): Promise<AnalysisRun | AnalysisRunSummary | null> {
  return findRun(
    db,
    and(eq(analysisRuns.measurementId, options.measurementId), eq(analysisRuns.version, options.version)) as ReturnType<typeof eq>,
    options.fields ?? 'all',
  );
}

/** A run by id, in full (for a measurement's `currentAnalysis`). */
export async function findAnalysisRunById(db: Queryable, analysisRunId: string): Promise<AnalysisRun | null> {
  return (await findRun(db, eq(analysisRuns.id, analysisRunId), 'all')) as AnalysisRun | null;
}

/* --------------------------------- requesting -------------------------------- */

function refusalFor(status: MeasurementStatus, number: string): string | null {
  switch (status) {
    case 'analysing':
      return `Measurement ${number} is already being analysed; wait for that run to finish before asking for another.`;
    case 'submitted':
      return `Measurement ${number} has been submitted for review, so it can no longer be analysed again.`;
    case 'approved':
      return `Measurement ${number} has been approved, so it can no longer be analysed again.`;
    case 'certified':
      return `Measurement ${number} has been certified, so it can no longer be analysed again.`;
    default:
      return ANALYSABLE_STATUSES.includes(status) ? null : `Measurement ${number} cannot be analysed in its present state (${status}).`;
  }
}

export interface RequestAnalysisRunDeps {
  db: Database;
  pool: pg.Pool;
  log: Logger;
  /** The queue settings of the sender analysisQueueFor makes. */
  env: AnalysisQueueEnv;
  /** Defaults to this pool's shared sender (analysisQueueFor). */
  queue?: () => Promise<AnalysisQueue>;
}

/**
 * Queues a new analysis version of a measurement with its present frames,
 * readings, exclusions and equipment values. The run row and the
 * measurement's `analysing` status are written in one transaction; the job
 * is sent after the commit, and if sending fails the run is marked failed
 * with a sentence (so nothing is left queued that no worker will ever see).
 */
export async function requestAnalysisRun(
  deps: RequestAnalysisRunDeps,
  options: { measurementId: string; requestedById: string | null; ip?: string | null },
): Promise<AnalysisRunSummary> {
  const { db } = deps;
  const run = await db.transaction(async (tx) => {
    // The row lock serialises concurrent requests for one measurement, so versions never collide.
    const [measurement] = await tx
      .select({ id: measurements.id, number: measurements.number, status: measurements.status })
      .from(measurements)
      .where(eq(measurements.id, options.measurementId))
      .for('update');
    if (!measurement) throw new HttpError(HttpStatus.NOT_FOUND, 'No measurement has that id.');
    const refusal = refusalFor(measurement.status, measurement.number);
    if (refusal) throw new HttpError(HttpStatus.CONFLICT, refusal);

    // Throws a 400 naming the sweep when frames lack readings or a sweep has fewer than 5 in use.
    const stored: StoredAnalysisInput = await buildEngineManifest(tx, measurement.id);
    const framesTotal = stored.manifest.sweeps.reduce((n, sweep) => n + sweep.frames.length, 0);

    const [{ lastVersion }] = await tx
      .select({ lastVersion: sql<number>`coalesce(max(${analysisRuns.version}), 0)::int` })
      .from(analysisRuns)
      .where(eq(analysisRuns.measurementId, measurement.id));
    const [inserted] = await tx
      .insert(analysisRuns)
      .values({
        measurementId: measurement.id,
        version: lastVersion + 1,
        status: 'queued',
        manifest: stored as unknown as Record<string, unknown>,
        framesTotal,
        requestedById: options.requestedById,
      })
      .returning({ id: analysisRuns.id, version: analysisRuns.version });
    await tx.update(measurements).set({ status: 'analysing', updatedAt: new Date() }).where(eq(measurements.id, measurement.id));
    await tx.insert(auditEvents).values({
      actorId: options.requestedById,
      action: 'analysis.requested',
      subjectType: 'measurement',
      subjectId: measurement.id,
      details: { number: measurement.number, version: inserted.version, analysisRunId: inserted.id, framesTotal },
      ip: options.ip ?? null,
    });
    return { ...inserted, measurementNumber: measurement.number };
  });

  try {
    const queue = await (deps.queue ?? (() => analysisQueueFor(deps)))();
    const jobId = await queue.enqueue(run.id);
    await db.update(analysisRuns).set({ jobId }).where(eq(analysisRuns.id, run.id));
  } catch (error) {
    deps.log.error('An analysis run could not be queued.', { analysisRunId: run.id, error });
    await recordAnalysisFailure(db, {
      analysisRunId: run.id,
      errorMessage: 'The analysis could not be queued because the job queue did not answer; request the analysis again in a minute.',
    });
    throw new HttpError(
      HttpStatus.SERVICE_UNAVAILABLE,
      `The analysis of measurement ${run.measurementNumber} could not be queued (version ${run.version} is recorded as failed); try again in a minute.`,
    );
  }

  const summary = (await findAnalysisRun(db, { measurementId: options.measurementId, version: run.version, fields: 'progress' })) as AnalysisRunSummary;
  invariant(summary, 'a run just inserted can be read back');
  return summary;
}

/* ------------------------------ the worker's moves ------------------------------ */

export interface ClaimedAnalysisRun {
  id: string;
  measurementId: string;
  version: number;
  /** This attempt's number; later writes only land while it is still the run's latest. */
  attempt: number;
  input: StoredAnalysisInput;
}

/**
 * Marks a queued run (or one left `running` by a worker that died) as
 * running for a new attempt, with its progress reset. Null when the run is
 * gone or already finished: the job then has nothing left to do.
 */
export async function claimAnalysisRun(db: Queryable, options: { analysisRunId: string; jobId: string }): Promise<ClaimedAnalysisRun | null> {
  const [row] = await db
    .update(analysisRuns)
    .set({
      status: 'running',
      attempts: sql`${analysisRuns.attempts} + 1`,
      startedAt: new Date(),
      finishedAt: null,
      framesDone: 0,
      errorMessage: null,
      jobId: options.jobId,
    })
    .where(and(eq(analysisRuns.id, options.analysisRunId), inArray(analysisRuns.status, ['queued', 'running'])))
    .returning({
      id: analysisRuns.id,
      measurementId: analysisRuns.measurementId,
      version: analysisRuns.version,
      attempt: analysisRuns.attempts,
      manifest: analysisRuns.manifest,
    });
  if (!row) return null;
  const input = row.manifest as unknown as StoredAnalysisInput;
  invariant(input && input.manifest && Array.isArray(input.files), `analysis run ${row.id} holds { manifest, files }`);
  return { id: row.id, measurementId: row.measurementId, version: row.version, attempt: row.attempt, input };
}

function sameAttempt(analysisRunId: string, attempt: number) {
  return and(eq(analysisRuns.id, analysisRunId), eq(analysisRuns.attempts, attempt), eq(analysisRuns.status, 'running'));
}

/** Progress of the running attempt; a stale attempt (its job expired and was retried elsewhere) writes nothing. */
export async function recordAnalysisProgress(
  db: Queryable,
  options: { analysisRunId: string; attempt: number; framesDone: number; framesTotal: number },
): Promise<void> {
  await db
    .update(analysisRuns)
    .set({ framesDone: options.framesDone, framesTotal: options.framesTotal })
    .where(sameAttempt(options.analysisRunId, options.attempt));
}

/**
 * Stores the result and makes the run the measurement's current analysis,
 * in one transaction. False when this attempt is no longer the run's
 * latest (nothing is written then).
 */
export async function recordAnalysisSuccess(
  db: Database,
  options: { analysisRunId: string; attempt: number; result: MeasurementResult; framesTotal: number },
): Promise<boolean> {
  return db.transaction(async (tx) => {
    const [run] = await tx
      .update(analysisRuns)
      .set({
        status: 'succeeded',
        result: options.result as unknown as Record<string, unknown>,
        finishedAt: new Date(),
        framesDone: options.framesTotal,
        framesTotal: options.framesTotal,
        errorMessage: null,
      })
      .where(sameAttempt(options.analysisRunId, options.attempt))
      .returning({ id: analysisRuns.id, measurementId: analysisRuns.measurementId, version: analysisRuns.version });
    if (!run) return false;
    await tx
      .update(measurements)
      .set({ status: 'analysed', currentAnalysisId: run.id, updatedAt: new Date() })
      .where(and(eq(measurements.id, run.measurementId), eq(measurements.status, 'analysing')));
    await tx.insert(auditEvents).values({
      actorId: null,
      action: 'analysis.succeeded',
      subjectType: 'measurement',
      subjectId: run.measurementId,
      details: { analysisRunId: run.id, version: run.version, focalLengthMm: options.result.focalLengthMm },
    });
    return true;
  });
}

/**
 * Marks a run failed with a sentence for the technician and the measurement
 * `analysis-failed`, in one transaction. With `attempt`, only that attempt
 * may do it; without, any run not yet finished. False when nothing changed.
 */
export async function recordAnalysisFailure(
  db: Database,
  options: { analysisRunId: string; errorMessage: string; attempt?: number },
): Promise<boolean> {
  return db.transaction(async (tx) => {
    const where =
      options.attempt === undefined
        ? and(eq(analysisRuns.id, options.analysisRunId), inArray(analysisRuns.status, ['queued', 'running']))
        : sameAttempt(options.analysisRunId, options.attempt);
    const [run] = await tx
      .update(analysisRuns)
      .set({ status: 'failed', errorMessage: options.errorMessage, finishedAt: new Date() })
      .where(where)
      .returning({ id: analysisRuns.id, measurementId: analysisRuns.measurementId, version: analysisRuns.version });
    if (!run) return false;
    await tx
      .update(measurements)
      .set({ status: 'analysis-failed', updatedAt: new Date() })
      .where(and(eq(measurements.id, run.measurementId), eq(measurements.status, 'analysing')));
    await tx.insert(auditEvents).values({
      actorId: null,
      action: 'analysis.failed',
      subjectType: 'measurement',
      subjectId: run.measurementId,
      details: { analysisRunId: run.id, version: run.version, message: options.errorMessage },
    });
    return true;
  });
}

/** After a failure that will be retried: the run shows as waiting again, its progress cleared. */
export async function returnAnalysisRunToQueue(db: Queryable, options: { analysisRunId: string; attempt: number }): Promise<void> {
  await db
    .update(analysisRuns)
    .set({ status: 'queued', framesDone: 0, startedAt: null })
    .where(sameAttempt(options.analysisRunId, options.attempt));
}
