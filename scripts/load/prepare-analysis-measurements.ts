/**
 * Measurements ready to analyse during a load run: generated bench sweeps
 * (the demo's finite-conjugate plans, cached in .cache/ like `npm start`'s)
 * stored through the same path as an upload, with their readings set. The
 * analyses themselves are requested through the API by the load run.
 */
import { createReadStream } from 'node:fs';
import path from 'node:path';
import { inArray } from 'drizzle-orm';
import type { Database } from '../../server/db/client';
import { lenses, sweeps } from '../../server/db/schema';
import { storeFrameFromStream } from '../../server/services/frame-storage';
import type { Logger } from '../../server/services/logger';
import { createMeasurement } from '../../server/services/measurements';
import type { ObjectStorage } from '../../server/services/object-storage';
import { setSweepReadings } from '../../server/services/readings';
import { demoMeasurementPlans } from '../seed/demo-measurements';
import { cachedBenchMeasurement } from '../synth/cached-bench-measurement';
import type { LoadData } from './seed-load-data';

export async function prepareAnalysisMeasurements(
  deps: { db: Database; storage: ObjectStorage; log: Logger },
  options: { data: LoadData; count: number; today: string; report(message: string): void },
): Promise<string[]> {
  const plans = demoMeasurementPlans.filter((plan) => plan.method === 'finite-conjugate').slice(0, options.count);
  if (plans.length < options.count) throw new Error(`Only ${plans.length} finite-conjugate demo plans exist; the load run needs ${options.count}.`);
  const [lensRows] = await Promise.all([
    deps.db.select({ id: lenses.id }).from(lenses).where(inArray(lenses.workOrderId, options.data.workOrderIds.slice(0, options.count))),
  ]);
  const ids: string[] = [];
  for (const [index, plan] of plans.entries()) {
    options.report(`analysis sweep ${index + 1}/${plans.length}: generating or reading the cached frames`);
    const generated = await cachedBenchMeasurement(plan.preset, () => plan.scenario);
    const manifestSweep = generated.manifest.sweeps[0] as { objectPositionMm: number; lensPositionMm: number; frames: { file: string; positionMm: number }[] };
    const measurementId = await createMeasurement(
      deps.db,
      {
        lensId: lensRows[index].id,
        method: 'finite-conjugate',
        cameraId: options.data.equipmentIds.camera,
        targetId: options.data.equipmentIds.target,
        railScaleId: options.data.equipmentIds.railScale,
        collimatorId: null,
        auxiliaryLensId: null,
        overrides: [],
        temperatureC: plan.temperatureC,
        relativeHumidityPercent: plan.relativeHumidityPercent,
        measuredOn: options.today,
        focusOperator: 'gradient-energy',
        notes: 'Load-run analysis.',
        sweeps: [{ moving: 'sensor', objectPositionMm: manifestSweep.objectPositionMm, lensPositionMm: manifestSweep.lensPositionMm, sensorPositionMm: null }],
      },
      { actorId: options.data.technicianId, ip: null },
      options.today,
    );
    const [sweep] = await deps.db.select({ id: sweeps.id }).from(sweeps).where(inArray(sweeps.measurementId, [measurementId]));
    for (const frame of manifestSweep.frames) {
      await storeFrameFromStream(deps, {
        sweepId: sweep.id,
        fileName: path.basename(frame.file),
        stream: createReadStream(path.join(generated.folder, frame.file)),
        actorId: options.data.technicianId,
      });
    }
    await setSweepReadings(
      deps.db,
      sweep.id,
      { mode: 'table', rows: manifestSweep.frames.map((frame) => ({ fileName: path.basename(frame.file), positionMm: frame.positionMm })) },
      { actorId: options.data.technicianId, ip: null },
    );
    ids.push(measurementId);
  }
  return ids;
}
