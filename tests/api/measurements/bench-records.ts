/**
 * Rows a measurement test needs (an invented client, work order, lenses and
 * bench equipment), inserted straight into the shared test database with
 * unique names, so each test file owns what it asserts on.
 */
import type { AppDeps } from '../../../server/deps';
import { equipment, lenses, workOrders, type EquipmentKind } from '../../../server/db/schema';
import { todayIsoDate } from '../../../server/services/equipment';
import { createTestOrganisation, uniqueSuffix } from '../../helpers/people';

type Deps = Pick<AppDeps, 'db'>;

export function isoDateFromToday(days: number): string {
  const date = new Date(`${todayIsoDate()}T12:00:00Z`);
  date.setUTCDate(date.getUTCDate() + days);
  return date.toISOString().slice(0, 10);
}

export async function createTestWorkOrder(deps: Deps, options: { status?: 'open' | 'cancelled' } = {}) {
  const organisation = await createTestOrganisation(deps, { kind: 'client', name: `Bright Optics Test ${uniqueSuffix()}` });
  const [row] = await deps.db
    .insert(workOrders)
    .values({
      number: `WO-T-${uniqueSuffix()}`,
      organisationId: organisation.id,
      title: 'Focal length of condenser lenses',
      decisionRule: 'guarded',
      status: options.status ?? 'open',
    })
    .returning();
  return { workOrder: row, organisation };
}

export async function createTestLens(
  deps: Deps,
  workOrderId: string,
  options: { nominalFocalLengthMm?: number; tolerancePercent?: number | null; toleranceMm?: number | null } = {},
) {
  const [row] = await deps.db
    .insert(lenses)
    .values({
      workOrderId,
      identifier: `L-${uniqueSuffix()}`,
      description: 'Plano-convex singlet',
      partNumber: `PCX-${uniqueSuffix()}`,
      nominalFocalLengthMm: options.nominalFocalLengthMm ?? 100,
      tolerancePercent: options.tolerancePercent === undefined ? 2 : options.tolerancePercent,
      toleranceMm: options.toleranceMm ?? null,
    })
    .returning();
  return row;
}

const VALUES: Record<EquipmentKind, Record<string, string | number>> = {
  camera: { pixelPitchUm: 3.45, pixelPitchUncertaintyUm: 0.01 },
  target: { pattern: 'dot-pair', sizeMm: 6, sizeUncertaintyMm: 0.002, polarity: 'dark-on-light' },
  'rail-scale': { uncertaintyMm: 0.02 },
  collimator: { focalLengthMm: 400, focalLengthUncertaintyMm: 0.4 },
  'auxiliary-lens': { focalLengthMm: 75, focalLengthUncertaintyMm: 0.1 },
};

const PREFIXES: Record<EquipmentKind, string> = {
  camera: 'CAM',
  target: 'TGT',
  'rail-scale': 'RAIL',
  collimator: 'COL',
  'auxiliary-lens': 'AUX',
};

export async function createTestEquipment(
  deps: Deps,
  kind: EquipmentKind,
  options: { calibrationDueDate?: string; active?: boolean; values?: Record<string, string | number> } = {},
) {
  const [row] = await deps.db
    .insert(equipment)
    .values({
      kind,
      identifier: `${PREFIXES[kind]}-${uniqueSuffix()}`,
      description: `Test ${kind}`,
      values: options.values ?? VALUES[kind],
      calibrationReference: `CAL-${uniqueSuffix()}`,
      calibrationDueDate: options.calibrationDueDate ?? isoDateFromToday(365),
      active: options.active ?? true,
    })
    .returning();
  return row;
}

/** A full bench: one item of each kind, in calibration. */
export async function createTestBench(deps: Deps) {
  const [camera, target, railScale, collimator, auxiliaryLens] = await Promise.all([
    createTestEquipment(deps, 'camera'),
    createTestEquipment(deps, 'target'),
    createTestEquipment(deps, 'rail-scale'),
    createTestEquipment(deps, 'collimator'),
    createTestEquipment(deps, 'auxiliary-lens'),
  ]);
  return { camera, target, railScale, collimator, auxiliaryLens };
}

export type TestBench = Awaited<ReturnType<typeof createTestBench>>;

/** A finite-conjugate set-up body for `lensId` on `bench`. */
export function finiteConjugateBody(lensId: string, bench: TestBench) {
  return {
    lensId,
    method: 'finite-conjugate',
    cameraId: bench.camera.id,
    targetId: bench.target.id,
    railScaleId: bench.railScale.id,
    temperatureC: 21.5,
    relativeHumidityPercent: 45,
    measuredOn: todayIsoDate(),
    sweeps: [{ moving: 'sensor', objectPositionMm: 0, lensPositionMm: 300 }],
  };
}
