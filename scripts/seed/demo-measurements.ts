/**
 * Demo measurements: frames rendered by the synthetic bench generator for
 * the demo lenses, stored through the same path as an upload, readings set,
 * and an analysis queued, so the demo shows the real pipeline (the analysis
 * worker analyses them once `npm start` has started it). One measurement by
 * every method, a square-target one, and the six lenses of part number
 * QI-PCX-100 at focal lengths within and just outside their ±1 % band, so
 * the spread plot has points either side of the limits.
 */
import { createReadStream } from 'node:fs';
import path from 'node:path';
import { and, eq, inArray } from 'drizzle-orm';
import type pg from 'pg';
import type { MeasurementMethod } from '../../shared/measure/types';
import { createEquipmentBody, type CreateEquipmentInput } from '../../shared/schemas/equipment';
import type { Database } from '../../server/db/client';
import { analysisRuns, equipment, frames, measurements, sweeps } from '../../server/db/schema';
import { parseEnv } from '../../server/env';
import type { AnalysisQueueEnv } from '../../server/services/analysis-queue';
import { requestAnalysisRun } from '../../server/services/analysis-runs';
import type { Logger } from '../../server/services/logger';
import { createMeasurement } from '../../server/services/measurements';
import type { ObjectStorage } from '../../server/services/object-storage';
import { storeFrameFromStream } from '../../server/services/frame-storage';
import { setSweepReadings } from '../../server/services/readings';
import type { BenchCamera, BenchScenario } from '../synth/bench-scenario';
import { cachedBenchMeasurement } from '../synth/cached-bench-measurement';
import { benchPresets, type BenchPresetName } from '../synth/presets';
import { addDays } from './demo-equipment';

/* ------------------------------- equipment -------------------------------- */

type WithoutDueDate<T> = T extends unknown ? Omit<T, 'calibrationDueDate'> : never;

/**
 * Two items the demo measurements need beyond the catalogue's register: a
 * strong auxiliary lens (the −50 mm relay lenses need one shorter than
 * 50 mm, or the pair diverges too) and a small dot pair for the displacement
 * method (one of its two sharp images is magnified).
 */
export const demoMeasurementEquipment: readonly { item: WithoutDueDate<CreateEquipmentInput>; dueInDays: number }[] = [
  {
    item: {
      kind: 'auxiliary-lens',
      identifier: 'AUX-30',
      description: 'Auxiliary positive lens for strong diverging lenses, 30 mm',
      serialNumber: 'LK-A-0030',
      values: { focalLengthMm: 30, focalLengthUncertaintyMm: 0.03 },
      calibrationReference: 'LOTL-CAL-2026-045',
    },
    dueInDays: 150,
  },
  {
    item: {
      kind: 'target',
      identifier: 'TGT-DP1.6',
      description: 'Chrome-on-glass dot pair, 1.6 mm centre spacing, for magnified images',
      serialNumber: 'LK-T-0116',
      values: { pattern: 'dot-pair', sizeMm: 1.6, sizeUncertaintyMm: 0.001, polarity: 'dark-on-light' },
      calibrationReference: 'LOTL-CAL-2026-023',
    },
    dueInDays: 290,
  },
];

/* ---------------------------------- plans --------------------------------- */

/** A 1280 × 960 region of the bench camera, saved as JPEG: small enough for a quick first start. */
const demoCamera: BenchCamera = {
  ...benchPresets['finite-conjugate'].camera,
  pixelPitchUm: 3.45,
  widthPx: 1280,
  heightPx: 960,
  format: 'jpeg',
  jpegQuality: 90,
};

/** The generator's targets, matching the register's TGT-DP6, TGT-SQ4 and TGT-DP1.6. */
const dotPair6 = { pattern: 'dot-pair', sizeMm: 6, sizeUncertaintyMm: 0.0015, dotDiameterMm: 1.2, centreOffsetMm: { x: 0.3, y: -0.2 } } as const;
const square4 = { pattern: 'square', sizeMm: 4, sizeUncertaintyMm: 0.0012, rotationDeg: 4, centreOffsetMm: { x: 0.1, y: -0.05 } } as const;
const dotPair1p6 = { pattern: 'dot-pair', sizeMm: 1.6, sizeUncertaintyMm: 0.001, dotDiameterMm: 0.35, centreOffsetMm: { x: 0.05, y: -0.04 } } as const;

export interface DemoMeasurementPlan {
  /** Also the name of the generated folder's cache entry. */
  key: string;
  /** A key of `demoLensesByKey` (scripts/seed/demo-work-orders.ts). */
  lensKey: string;
  method: MeasurementMethod;
  /** Register identifiers. */
  equipment: { camera: string; target: string; railScale: string; collimator?: string; auxiliaryLens?: string };
  measuredDaysAgo: number;
  temperatureC: number;
  relativeHumidityPercent: number;
  notes: string;
  /** The generator's preset the scenario starts from (names the cache folder). */
  preset: BenchPresetName;
  scenario: BenchScenario;
}

const RAIL = 'RAIL-1';
const CAMERA = 'CAM-A1';

/** Focal lengths of the six QI-PCX-100 lenses (nominal 100 mm ± 1 %, guarded): three well inside, one inside but within its uncertainty of the limit, two just outside. */
const pcxFocalLengthsMm = [99.62, 100.31, 100.985, 99.18, 101.27, 98.71];

function finiteConjugatePlan(serial: number, focalLengthMm: number): DemoMeasurementPlan {
  const lensKey = `pcx-100-${String(serial).padStart(2, '0')}`;
  return {
    key: `demo-${lensKey}-finite-conjugate`,
    lensKey,
    method: 'finite-conjugate',
    equipment: { camera: CAMERA, target: 'TGT-DP6', railScale: RAIL },
    measuredDaysAgo: 9 - serial,
    temperatureC: 20.4 + serial * 0.1,
    relativeHumidityPercent: 44 + serial,
    notes: 'Batch 7 incoming inspection; object at the rail zero, lens carrier at 380 mm.',
    preset: 'finite-conjugate',
    scenario: {
      ...benchPresets['finite-conjugate'],
      seed: 700 + serial,
      lens: { focalLengthMm, frontOffsetMm: 0, rearOffsetMm: 0, fNumber: 8 },
      camera: demoCamera,
      target: dotPair6,
      sweeps: [{ objectPositionMm: 0, lensPositionMm: 380, framesPerFocus: 15, stepMm: 0.3 }],
    },
  };
}

export const demoMeasurementPlans: readonly DemoMeasurementPlan[] = [
  ...pcxFocalLengthsMm.map((focalLengthMm, index) => finiteConjugatePlan(index + 1, focalLengthMm)),
  {
    key: 'demo-ach-200-01-multi-conjugate',
    lensKey: 'ach-200-01',
    method: 'multi-conjugate',
    equipment: { camera: CAMERA, target: 'TGT-DP6', railScale: RAIL },
    measuredDaysAgo: 4,
    temperatureC: 20.8,
    relativeHumidityPercent: 47,
    notes: 'Three object distances to find the principal planes of the cemented doublet.',
    preset: 'multi-conjugate',
    scenario: {
      ...benchPresets['multi-conjugate'],
      seed: 711,
      lens: { focalLengthMm: 201.6, frontOffsetMm: 3.1, rearOffsetMm: -2.4, fNumber: 8, exitPupilOffsetMm: 1.0 },
      camera: demoCamera,
      target: dotPair6,
      sweeps: [
        { objectPositionMm: 0, lensPositionMm: 700, framesPerFocus: 13, stepMm: 0.35 },
        { objectPositionMm: 50, lensPositionMm: 700, framesPerFocus: 13, stepMm: 0.35 },
        { objectPositionMm: 100, lensPositionMm: 700, framesPerFocus: 13, stepMm: 0.35 },
      ],
    },
  },
  {
    key: 'demo-ach-200-02-collimator',
    lensKey: 'ach-200-02',
    method: 'collimator',
    equipment: { camera: CAMERA, target: 'TGT-DP6', railScale: RAIL, collimator: 'COL-400' },
    measuredDaysAgo: 3,
    temperatureC: 20.6,
    relativeHumidityPercent: 46,
    notes: 'Object at infinity through the 400 mm collimator.',
    preset: 'collimator',
    scenario: {
      ...benchPresets.collimator,
      seed: 712,
      lens: { focalLengthMm: 198.9, frontOffsetMm: 3.1, rearOffsetMm: -2.4, fNumber: 8 },
      camera: demoCamera,
      target: dotPair6,
      collimator: { focalLengthMm: 400, focalLengthUncertaintyMm: 0.4 },
      sweeps: [{ lensPositionMm: 600, framesPerFocus: 15, stepMm: 0.3 }],
    },
  },
  {
    key: 'demo-ach-200-03-displacement',
    lensKey: 'ach-200-03',
    method: 'displacement',
    equipment: { camera: CAMERA, target: 'TGT-DP1.6', railScale: RAIL },
    measuredDaysAgo: 2,
    temperatureC: 20.5,
    relativeHumidityPercent: 45,
    notes: 'Bessel set-up: object at 0 mm, camera at 900 mm, lens carrier moved through both sharp positions.',
    preset: 'displacement',
    scenario: {
      ...benchPresets.displacement,
      seed: 713,
      lens: { focalLengthMm: 199.4, frontOffsetMm: 0, rearOffsetMm: 0, fNumber: 8 },
      camera: demoCamera,
      target: dotPair1p6,
      sweeps: [{ objectPositionMm: 0, sensorPositionMm: 900, framesPerFocus: 13, stepMm: [0.15, 0.3] }],
    },
  },
  {
    key: 'demo-bcv-50-01-auxiliary-lens',
    lensKey: 'bcv-50-01',
    method: 'auxiliary-lens',
    equipment: { camera: CAMERA, target: 'TGT-DP6', railScale: RAIL, auxiliaryLens: 'AUX-30' },
    measuredDaysAgo: 1,
    temperatureC: 21.0,
    relativeHumidityPercent: 43,
    notes: 'Diverging lens in contact with the 30 mm auxiliary lens.',
    preset: 'auxiliary-lens',
    scenario: {
      ...benchPresets['auxiliary-lens'],
      seed: 714,
      lens: { focalLengthMm: -50.3, frontOffsetMm: 0, rearOffsetMm: 0, fNumber: 8 },
      camera: demoCamera,
      target: dotPair6,
      auxiliaryLens: { focalLengthMm: 30, focalLengthUncertaintyMm: 0.03 },
      sweeps: [{ objectPositionMm: 0, lensPositionMm: 400, framesPerFocus: 15, stepMm: 0.2 }],
    },
  },
  {
    key: 'demo-mag-4d-01-square-collimator',
    lensKey: 'mag-4d-01',
    method: 'collimator',
    equipment: { camera: CAMERA, target: 'TGT-SQ4', railScale: RAIL, collimator: 'COL-400' },
    measuredDaysAgo: 1,
    temperatureC: 20.9,
    relativeHumidityPercent: 44,
    notes: 'Square target through the collimator; the magnifier is specified as 4 D.',
    preset: 'square-target',
    scenario: {
      ...benchPresets.collimator,
      seed: 715,
      lens: { focalLengthMm: 252.1, frontOffsetMm: 0, rearOffsetMm: 0, fNumber: 8 },
      camera: demoCamera,
      target: square4,
      collimator: { focalLengthMm: 400, focalLengthUncertaintyMm: 0.4 },
      sweeps: [{ lensPositionMm: 550, framesPerFocus: 15, stepMm: 0.25 }],
    },
  },
];

/* --------------------------------- seeding -------------------------------- */

export interface DemoMeasurementDeps {
  db: Database;
  pool: pg.Pool;
  storage: ObjectStorage;
  log: Logger;
  /** The analysis queue settings; default: this process's environment. */
  env?: AnalysisQueueEnv;
}

export interface SeedDemoMeasurementsOptions {
  lensIdsByKey: Record<string, string>;
  equipmentIdsByIdentifier: Record<string, string>;
  technicianId: string;
  today: string;
  report(message: string): void;
  plans?: readonly DemoMeasurementPlan[];
}

async function seedMeasurementEquipment(db: Database, today: string): Promise<Record<string, string>> {
  const rows = demoMeasurementEquipment.map(({ item, dueInDays }) => {
    const parsed = createEquipmentBody.parse({ ...item, calibrationDueDate: addDays(today, dueInDays) });
    return {
      kind: parsed.kind,
      identifier: parsed.identifier,
      description: parsed.description ?? '',
      serialNumber: parsed.serialNumber ?? null,
      values: parsed.values as Record<string, string | number | null>,
      calibrationReference: parsed.calibrationReference,
      calibrationDueDate: parsed.calibrationDueDate,
    };
  });
  await db.insert(equipment).values(rows).onConflictDoNothing({ target: equipment.identifier });
  const stored = await db
    .select({ id: equipment.id, identifier: equipment.identifier })
    .from(equipment)
    .where(inArray(equipment.identifier, rows.map((row) => row.identifier)));
  return Object.fromEntries(stored.map((row) => [row.identifier, row.id]));
}

function idOf(ids: Record<string, string>, identifier: string | undefined, what: string): string | undefined {
  if (identifier === undefined) return undefined;
  const id = ids[identifier];
  if (!id) throw new Error(`The demo ${what} ${identifier} must be seeded before the demo measurements.`);
  return id;
}

/** The plan's measurement if an earlier seeding made it (same lens, method and target), else a new one. */
async function findOrCreateMeasurement(
  deps: DemoMeasurementDeps,
  plan: DemoMeasurementPlan,
  manifest: Record<string, any>,
  options: SeedDemoMeasurementsOptions & { equipmentIds: Record<string, string> },
): Promise<{ id: string; created: boolean }> {
  const lensId = options.lensIdsByKey[plan.lensKey];
  if (!lensId) throw new Error(`The demo lens ${plan.lensKey} must be seeded before the demo measurements.`);
  const targetId = idOf(options.equipmentIds, plan.equipment.target, 'target')!;
  const [existing] = await deps.db
    .select({ id: measurements.id })
    .from(measurements)
    .where(and(eq(measurements.lensId, lensId), eq(measurements.method, plan.method), eq(measurements.targetId, targetId)));
  if (existing) return { id: existing.id, created: false };
  const id = await createMeasurement(
    deps.db,
    {
      lensId,
      method: plan.method,
      cameraId: idOf(options.equipmentIds, plan.equipment.camera, 'camera')!,
      targetId,
      railScaleId: idOf(options.equipmentIds, plan.equipment.railScale, 'rail scale')!,
      collimatorId: idOf(options.equipmentIds, plan.equipment.collimator, 'collimator') ?? null,
      auxiliaryLensId: idOf(options.equipmentIds, plan.equipment.auxiliaryLens, 'auxiliary lens') ?? null,
      overrides: [],
      temperatureC: plan.temperatureC,
      relativeHumidityPercent: plan.relativeHumidityPercent,
      measuredOn: addDays(options.today, -plan.measuredDaysAgo),
      focusOperator: 'gradient-energy',
      notes: plan.notes,
      sweeps: (manifest.sweeps as Record<string, number | string | undefined>[]).map((sweep) => ({
        moving: sweep.moving as 'sensor' | 'lens',
        objectPositionMm: (sweep.objectPositionMm as number | undefined) ?? null,
        lensPositionMm: (sweep.lensPositionMm as number | undefined) ?? null,
        sensorPositionMm: (sweep.sensorPositionMm as number | undefined) ?? null,
      })),
    },
    { actorId: options.technicianId, ip: null },
    options.today,
  );
  return { id, created: true };
}

/** Stores the frames a sweep still lacks (a seeding cut short resumes here) and sets its readings if any are missing. */
async function fillSweep(
  deps: DemoMeasurementDeps,
  options: { sweepId: string; folder: string; frames: { file: string; positionMm: number }[]; technicianId: string; uploadConcurrency: number },
): Promise<number> {
  const stored = await deps.db.select({ fileName: frames.fileName, positionMm: frames.positionMm }).from(frames).where(eq(frames.sweepId, options.sweepId));
  const have = new Set(stored.map((row) => row.fileName));
  const missing = options.frames.filter((frame) => !have.has(path.basename(frame.file)));
  const queue = [...missing];
  await Promise.all(
    Array.from({ length: options.uploadConcurrency }, async () => {
      for (let frame = queue.shift(); frame; frame = queue.shift()) {
        await storeFrameFromStream(deps, {
          sweepId: options.sweepId,
          fileName: path.basename(frame.file),
          stream: createReadStream(path.join(options.folder, frame.file)),
          actorId: options.technicianId,
        });
      }
    }),
  );
  if (missing.length > 0 || stored.some((row) => row.positionMm === null)) {
    await setSweepReadings(
      deps.db,
      options.sweepId,
      { mode: 'table', rows: options.frames.map((frame) => ({ fileName: path.basename(frame.file), positionMm: frame.positionMm })) },
      { actorId: options.technicianId, ip: null },
    );
  }
  return missing.length;
}

/**
 * Creates the demo measurements that are missing and queues their analysis.
 * Idempotent: a measurement already made (found by lens, method and target)
 * only gets what an interrupted earlier seeding left out, and an analysis is
 * requested only for one that has none yet.
 */
export async function seedDemoMeasurements(
  deps: DemoMeasurementDeps,
  options: SeedDemoMeasurementsOptions,
): Promise<{ created: number; framesStored: number; analysesQueued: number }> {
  const plans = options.plans ?? demoMeasurementPlans;
  const equipmentIds = { ...options.equipmentIdsByIdentifier, ...(await seedMeasurementEquipment(deps.db, options.today)) };
  let created = 0;
  let framesStored = 0;
  let analysesQueued = 0;
  for (const [index, plan] of plans.entries()) {
    const label = `demo measurement ${index + 1}/${plans.length} (${plan.lensKey}, ${plan.method})`;
    const lensId = options.lensIdsByKey[plan.lensKey];
    const targetId = equipmentIds[plan.equipment.target];
    if (lensId && targetId) {
      const [done] = await deps.db
        .select({ status: measurements.status })
        .from(measurements)
        .where(and(eq(measurements.lensId, lensId), eq(measurements.method, plan.method), eq(measurements.targetId, targetId)));
      if (done && done.status !== 'draft') continue;
    }
    let lastReport = 0;
    const generated = await cachedBenchMeasurement(
      plan.preset,
      () => plan.scenario,
      (message) => {
        if (Date.now() - lastReport < 2000) return;
        lastReport = Date.now();
        options.report(`${label}: rendering ${message.split(' ')[1] ?? ''}`);
      },
    );
    const measurement = await findOrCreateMeasurement(deps, plan, generated.manifest, { ...options, equipmentIds });
    if (measurement.created) created += 1;
    const sweepRows = await deps.db
      .select({ id: sweeps.id, position: sweeps.position })
      .from(sweeps)
      .where(eq(sweeps.measurementId, measurement.id))
      .orderBy(sweeps.position);
    for (const sweep of sweepRows) {
      const manifestSweep = generated.manifest.sweeps[sweep.position] as { frames: { file: string; positionMm: number }[] };
      framesStored += await fillSweep(deps, {
        sweepId: sweep.id,
        folder: generated.folder,
        frames: manifestSweep.frames,
        technicianId: options.technicianId,
        uploadConcurrency: 3,
      });
    }
    const runCount = await deps.db.$count(analysisRuns, eq(analysisRuns.measurementId, measurement.id));
    if (runCount === 0) {
      await requestAnalysisRun({ ...deps, env: deps.env ?? parseEnv() }, { measurementId: measurement.id, requestedById: options.technicianId });
      analysesQueued += 1;
    }
    options.report(`${label}: frames stored, analysis queued`);
  }
  return { created, framesStored, analysesQueued };
}
