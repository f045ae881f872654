/**
 * What a technician finds already in place before the journey starts: a
 * sign-in, a client organisation to open a work order for, and calibrated
 * equipment in the register matching a generated bench measurement. Made
 * through the services (the register is an administrator's job, not this
 * journey's). Names are invented and unique per run, as the shared test
 * database needs.
 */
import type { CreateEquipmentInput, EquipmentItem } from '../../shared/schemas/equipment';
import { createEquipment, todayIsoDate } from '../../server/services/equipment';
import type { CachedBenchMeasurement } from '../../scripts/synth/cached-bench-measurement';
import { createTestOrganisation, createTestPerson, uniqueSuffix, type TestPerson } from '../helpers/people';
import type { TestApp } from '../helpers/test-app';

export interface JourneyBench {
  technician: TestPerson;
  labName: string;
  clientName: string;
  camera: EquipmentItem;
  target: EquipmentItem;
  railScale: EquipmentItem;
}

function isoDateInDays(days: number): string {
  const date = new Date();
  date.setUTCDate(date.getUTCDate() + days);
  return date.toISOString().slice(0, 10);
}

/** Equipment values as the generated manifest states them, so the analysis uses the generator's own numbers. */
export async function createJourneyBench(options: { testApp: TestApp; fixture: CachedBenchMeasurement }): Promise<JourneyBench> {
  const { testApp, fixture } = options;
  const { manifest } = fixture;
  const suffix = uniqueSuffix();
  const lab = await createTestOrganisation(testApp.deps, { kind: 'lab', name: `Harrowmere Optical Bench ${suffix}` });
  const client = await createTestOrganisation(testApp.deps, { kind: 'client', name: `Quenby Lens Works ${suffix}` });
  const technician = await createTestPerson(testApp.deps, {
    roles: ['technician'],
    organisationId: lab.id,
    name: `Bench Technician ${suffix}`,
    emailPrefix: 'journey-technician',
  });
  const admin = await createTestPerson(testApp.deps, { roles: ['admin'], organisationId: lab.id, emailPrefix: 'journey-admin' });

  const actor = { actorId: admin.id, ip: null };
  const calibration = (kind: string) => ({ calibrationReference: `HOB-CAL-${suffix}-${kind}`, calibrationDueDate: isoDateInDays(365) });
  const register = (input: CreateEquipmentInput) => createEquipment(testApp.deps.db, input, actor, todayIsoDate());
  const camera = await register({
    kind: 'camera',
    identifier: `CAM-${suffix}`,
    description: 'Monochrome bench camera',
    values: { pixelPitchUm: manifest.camera.pixelPitchUm, pixelPitchUncertaintyUm: manifest.camera.pixelPitchUncertaintyUm ?? 0 },
    ...calibration('camera'),
  });
  const target = await register({
    kind: 'target',
    identifier: `TGT-${suffix}`,
    description: 'Chrome-on-glass dot pair',
    values: {
      pattern: manifest.target.pattern,
      sizeMm: manifest.target.sizeMm,
      sizeUncertaintyMm: manifest.target.sizeUncertaintyMm ?? 0,
      ...(manifest.target.polarity ? { polarity: manifest.target.polarity } : {}),
    },
    ...calibration('target'),
  });
  const railScale = await register({
    kind: 'rail-scale',
    identifier: `RAIL-${suffix}`,
    description: 'Bench rail scale',
    values: { uncertaintyMm: manifest.scale?.uncertaintyMm ?? 0 },
    ...calibration('rail-scale'),
  });
  return { technician, labName: lab.name, clientName: client.name, camera, target, railScale };
}
