/**
 * The engine's manifest (shared/schemas/measurement-manifest.ts) for a
 * measurement as it stands: equipment values, sweeps, frames with their rail
 * readings, exclusions, the lens's nominal value and tolerance with the work
 * order's decision rule, and the focus operator. The analysis run stores it,
 * so a run never changes when the measurement does afterwards.
 */
import { asc, eq, inArray } from 'drizzle-orm';
import { equipmentValuesByKind, type EquipmentKindName } from '../../shared/schemas/equipment';
import { compareFrameFileNames } from '../../shared/schemas/frames';
import { checkMeasurementManifest, type MeasurementManifestInput } from '../../shared/schemas/measurement-manifest';
import { equipmentKindNames } from '../../shared/schemas/measurements';
import { equipment, frames, lenses, measurements, sweeps, workOrders } from '../db/schema';
import { HttpError } from '../http-error';
import { HttpStatus } from '../http-status';
import { invariant } from '../invariant';
import type { Queryable } from './numbering';

/** The manifest contract needs at least 5 frames to fit a focus curve. */
export const MIN_READ_FRAMES_PER_SWEEP = 5;

export interface EngineFrameFile {
  /** The file as the manifest names it, e.g. "s1/0001.png". */
  file: string;
  objectKey: string;
}

export interface EngineManifest {
  manifest: MeasurementManifestInput;
  files: EngineFrameFile[];
}

type EquipmentRow = typeof equipment.$inferSelect;

function valuesOf<K extends EquipmentKindName>(row: EquipmentRow | undefined, kind: K, role: string) {
  if (!row) throw new HttpError(HttpStatus.BAD_REQUEST, `The measurement names no ${role}; it cannot be analysed.`);
  invariant(row.kind === kind, `equipment ${row.id} used as ${kind} is a ${row.kind}`);
  const parsed = equipmentValuesByKind[kind].safeParse(row.values);
  if (!parsed.success) {
    throw new HttpError(
      HttpStatus.BAD_REQUEST,
      `The register values of ${equipmentKindNames[kind]} ${row.identifier} are incomplete (${parsed.error.issues[0]?.message ?? 'invalid'}); an administrator must correct them before analysis.`,
    );
  }
  return parsed.data as ReturnType<(typeof equipmentValuesByKind)[K]['parse']>;
}

/** The folder a sweep's files sit in within the manifest: s1, s2, … */
export function sweepFolder(position: number): string {
  return `s${position + 1}`;
}

/**
 * Builds the engine manifest of a measurement and the object key of every
 * frame file it names. Excluded frames are listed and named in
 * `analysis.excludedFiles` (the engine reports them as excluded); an
 * excluded frame without a reading is left out. Throws an HttpError 400
 * naming the sweep when a frame in use lacks a reading or a sweep has fewer
 * than 5 frames in use with readings.
 */
/** The manifest takes one tolerance; a lens given both in % and in mm must meet both, so the tighter one is the band. */
export function engineToleranceOf(lens: { nominalFocalLengthMm: number; tolerancePercent: number | null; toleranceMm: number | null }): { tolerancePercent: number } | { toleranceMm: number } {
  if (lens.tolerancePercent === null) return { toleranceMm: lens.toleranceMm! };
  if (lens.toleranceMm === null) return { tolerancePercent: lens.tolerancePercent };
  const percentAsMm = (Math.abs(lens.nominalFocalLengthMm) * lens.tolerancePercent) / 100;
  return lens.toleranceMm < percentAsMm ? { toleranceMm: lens.toleranceMm } : { tolerancePercent: lens.tolerancePercent };
}

export async function buildEngineManifest(db: Queryable, measurementId: string): Promise<EngineManifest> {
  const [row] = await db
    .select({ measurement: measurements, lens: lenses, decisionRule: workOrders.decisionRule })
    .from(measurements)
    .innerJoin(lenses, eq(lenses.id, measurements.lensId))
    .innerJoin(workOrders, eq(workOrders.id, lenses.workOrderId))
    .where(eq(measurements.id, measurementId));
  if (!row) throw new HttpError(HttpStatus.NOT_FOUND, `There is no measurement with id ${measurementId}.`);
  const m = row.measurement;

  const ids = [m.cameraId, m.targetId, m.railScaleId, m.collimatorId, m.auxiliaryLensId].filter((id): id is string => Boolean(id));
  const equipmentRows = new Map((await db.select().from(equipment).where(inArray(equipment.id, ids))).map((e) => [e.id, e]));
  const byId = (id: string | null) => (id ? equipmentRows.get(id) : undefined);

  const camera = valuesOf(byId(m.cameraId), 'camera', 'camera');
  const target = valuesOf(byId(m.targetId), 'target', 'target');
  const rail = valuesOf(byId(m.railScaleId), 'rail-scale', 'rail scale');

  const sweepRows = await db.select().from(sweeps).where(eq(sweeps.measurementId, m.id)).orderBy(asc(sweeps.position));
  const frameRows = sweepRows.length
    ? await db.select().from(frames).where(inArray(frames.sweepId, sweepRows.map((s) => s.id)))
    : [];

  const problems: Record<string, string> = {};
  const files: EngineFrameFile[] = [];
  const excludedFiles: string[] = [];
  const manifestSweeps = sweepRows.map((sweep, index) => {
    const folder = sweepFolder(index);
    const field = `sweeps[${index}]`;
    const ofSweep = frameRows.filter((f) => f.sweepId === sweep.id).sort((a, b) => compareFrameFileNames(a.fileName, b.fileName));
    const unread = ofSweep.filter((f) => !f.excluded && f.positionMm === null);
    const purged = ofSweep.filter((f) => !f.excluded && f.purgedAt !== null);
    const inUse = ofSweep.filter((f) => !f.excluded && f.positionMm !== null);
    if (unread.length > 0) {
      const names = unread.slice(0, 5).map((f) => f.fileName).join(', ');
      problems[field] = `Sweep ${index + 1}: ${unread.length === 1 ? `frame ${names} has` : `${unread.length} frames (${names}${unread.length > 5 ? ', …' : ''}) have`} no rail reading; give readings or exclude ${unread.length === 1 ? 'it' : 'them'}.`;
    } else if (purged.length > 0) {
      problems[field] = `Sweep ${index + 1}: the original of frame ${purged[0].fileName} was removed by retention, so this sweep cannot be analysed again.`;
    } else if (inUse.length < MIN_READ_FRAMES_PER_SWEEP) {
      problems[field] = `Sweep ${index + 1} has ${inUse.length} frame${inUse.length === 1 ? '' : 's'} in use with a reading; it needs at least ${MIN_READ_FRAMES_PER_SWEEP}.`;
    }
    const listed = ofSweep.filter((f) => f.positionMm !== null && f.purgedAt === null);
    for (const f of listed) {
      const file = `${folder}/${f.fileName}`;
      files.push({ file, objectKey: f.objectKey });
      if (f.excluded) excludedFiles.push(file);
    }
    return {
      moving: sweep.moving,
      objectPositionMm: sweep.objectPositionMm ?? undefined,
      lensPositionMm: sweep.lensPositionMm ?? undefined,
      sensorPositionMm: sweep.sensorPositionMm ?? undefined,
      frames: listed.map((f) => ({ file: `${folder}/${f.fileName}`, positionMm: f.positionMm as number })),
    };
  });
  if (sweepRows.length === 0) problems.sweeps = `Measurement ${m.number} has no sweeps.`;
  if (Object.keys(problems).length > 0) {
    const sentences = Object.values(problems);
    throw new HttpError(HttpStatus.BAD_REQUEST, sentences.join(' '), problems);
  }

  const manifest: MeasurementManifestInput = {
    method: m.method,
    camera: { pixelPitchUm: camera.pixelPitchUm, pixelPitchUncertaintyUm: camera.pixelPitchUncertaintyUm },
    target: {
      pattern: target.pattern,
      sizeMm: target.sizeMm,
      sizeUncertaintyMm: target.sizeUncertaintyMm,
      ...(target.polarity ? { polarity: target.polarity } : {}),
    },
    scale: { uncertaintyMm: rail.uncertaintyMm },
    sweeps: manifestSweeps,
    lens: {
      nominalFocalLengthMm: row.lens.nominalFocalLengthMm,
      ...engineToleranceOf(row.lens),
      decisionRule: row.decisionRule,
    },
    analysis: { focusOperator: m.focusOperator, excludedFiles },
  };
  if (m.method === 'collimator') {
    const collimator = valuesOf(byId(m.collimatorId), 'collimator', 'collimator');
    manifest.collimator = { focalLengthMm: collimator.focalLengthMm, focalLengthUncertaintyMm: collimator.focalLengthUncertaintyMm };
  }
  if (m.method === 'auxiliary-lens') {
    const auxiliary = valuesOf(byId(m.auxiliaryLensId), 'auxiliary-lens', 'auxiliary lens');
    manifest.auxiliaryLens = { focalLengthMm: auxiliary.focalLengthMm, focalLengthUncertaintyMm: auxiliary.focalLengthUncertaintyMm };
  }

  const check = checkMeasurementManifest(manifest);
  if (!check.ok) throw new HttpError(HttpStatus.BAD_REQUEST, `Measurement ${m.number} cannot be analysed: ${check.message}.`, check.fields);
  return { manifest, files };
}
