/**
 * The records a load run reads, written straight to the database in a few
 * batched inserts: an invented lab with its client organisations, 50 people
 * who can sign in, a bench's equipment, 300 work orders with two lenses
 * each, and a measurement of one lens in each (through the measurement
 * service, so numbers and sweeps are real).
 */
import { randomBytes } from 'node:crypto';
import bcrypt from 'bcryptjs';
import type { Database } from '../../server/db/client';
import { equipment, lenses, organisations, people, personRoles, workOrders, type Role } from '../../server/db/schema';
import { createMeasurement } from '../../server/services/measurements';

export interface LoadPerson {
  email: string;
  password: string;
  roles: Role[];
}

export interface LoadData {
  people: LoadPerson[];
  technicianId: string;
  workOrderIds: string[];
  measurementIds: string[];
  searchTerms: string[];
  equipmentIds: { camera: string; target: string; railScale: string };
}

const WORK_ORDER_STATUSES = ['requested', 'open', 'in-progress', 'completed'] as const;
const CLIENT_NAMES = ['Fenwick Lens Works', 'Orrin Microscopy', 'Saltmarsh Survey Optics', 'Tarn Valley Photonics', 'Wexcombe Instruments'];
const TITLES = ['Incoming inspection of condenser lenses', 'Focal length check, relay doublets', 'Batch release, plano-convex singlets', 'Requalification of field lenses'];

function isoDate(daysFromToday: number): string {
  const date = new Date();
  date.setUTCDate(date.getUTCDate() + daysFromToday);
  return date.toISOString().slice(0, 10);
}

/** 50 people: 30 technicians, 15 reviewers and 5 administrators, one password each (bcrypt cost 4: sign-in speed is not what is measured). */
function plannedPeople(runId: string): LoadPerson[] {
  const roleFor = (index: number): Role => (index < 30 ? 'technician' : index < 45 ? 'reviewer' : 'admin');
  return Array.from({ length: 50 }, (_, index) => ({
    email: `load-${index + 1}-${runId}@wexcombe-lab.example`,
    password: `load-password-${runId}`,
    roles: [roleFor(index)],
  }));
}

export async function seedLoadData(db: Database, options: { workOrders: number; today: string }): Promise<LoadData> {
  const runId = randomBytes(3).toString('hex');
  const [lab] = await db.insert(organisations).values({ name: `Wexcombe Optical Test Bench ${runId}`, kind: 'lab', postalAddress: '2 Load Lane\nWexcombe WX3 3LD, Examplia' }).returning();
  const clients = await db
    .insert(organisations)
    .values(CLIENT_NAMES.map((name) => ({ name: `${name} ${runId}`, kind: 'client' as const })))
    .returning();

  const planned = plannedPeople(runId);
  const passwordHash = await bcrypt.hash(planned[0].password, 4);
  const personRows = await db
    .insert(people)
    .values(planned.map((person, index) => ({ email: person.email, name: `Load Person ${index + 1}`, passwordHash, organisationId: lab.id })))
    .returning({ id: people.id, email: people.email });
  const idByEmail = new Map(personRows.map((row) => [row.email, row.id]));
  await db.insert(personRoles).values(planned.map((person) => ({ personId: idByEmail.get(person.email)!, role: person.roles[0] })));
  const technicianId = idByEmail.get(planned[0].email)!;

  const bench = await db
    .insert(equipment)
    .values([
      { kind: 'camera', identifier: `CAM-L-${runId}`, description: 'Bench camera', values: { pixelPitchUm: 3.45, pixelPitchUncertaintyUm: 0.01 }, calibrationReference: `WX-CAL-${runId}-1`, calibrationDueDate: isoDate(300) },
      { kind: 'target', identifier: `TGT-L-${runId}`, description: 'Dot pair 6 mm', values: { pattern: 'dot-pair', sizeMm: 6, sizeUncertaintyMm: 0.0015, polarity: 'dark-on-light' }, calibrationReference: `WX-CAL-${runId}-2`, calibrationDueDate: isoDate(300) },
      { kind: 'rail-scale', identifier: `RAIL-L-${runId}`, description: 'Rail scale', values: { uncertaintyMm: 0.02 }, calibrationReference: `WX-CAL-${runId}-3`, calibrationDueDate: isoDate(300) },
    ])
    .returning({ id: equipment.id, kind: equipment.kind });
  const equipmentIds = {
    camera: bench.find((row) => row.kind === 'camera')!.id,
    target: bench.find((row) => row.kind === 'target')!.id,
    railScale: bench.find((row) => row.kind === 'rail-scale')!.id,
  };

  const orderRows = await db
    .insert(workOrders)
    .values(
      Array.from({ length: options.workOrders }, (_, index) => ({
        number: `WO-LOAD-${runId}-${String(index + 1).padStart(4, '0')}`,
        organisationId: clients[index % clients.length].id,
        title: `${TITLES[index % TITLES.length]} ${index + 1}`,
        clientReference: `PO-${runId}-${index + 1}`,
        status: WORK_ORDER_STATUSES[index % WORK_ORDER_STATUSES.length],
        decisionRule: index % 2 === 0 ? ('simple' as const) : ('guarded' as const),
        dueDate: isoDate((index % 60) - 10),
        createdById: technicianId,
      })),
    )
    .returning({ id: workOrders.id });
  const lensRows = await db
    .insert(lenses)
    .values(
      orderRows.flatMap((order, index) =>
        [1, 2].map((serial) => ({
          workOrderId: order.id,
          identifier: `PCX-${runId}-${index + 1}-${serial}`,
          description: 'Plano-convex singlet',
          partNumber: `WX-PCX-${(index % 12) * 25 + 50}`,
          nominalFocalLengthMm: (index % 12) * 25 + 50,
          tolerancePercent: 1,
        })),
      ),
    )
    .returning({ id: lenses.id, workOrderId: lenses.workOrderId });

  const measurementIds: string[] = [];
  const firstLensOfOrder = new Map<string, string>();
  for (const lens of lensRows) if (!firstLensOfOrder.has(lens.workOrderId)) firstLensOfOrder.set(lens.workOrderId, lens.id);
  for (const lensId of firstLensOfOrder.values()) {
    measurementIds.push(
      await createMeasurement(
        db,
        {
          lensId,
          method: 'finite-conjugate',
          cameraId: equipmentIds.camera,
          targetId: equipmentIds.target,
          railScaleId: equipmentIds.railScale,
          collimatorId: null,
          auxiliaryLensId: null,
          overrides: [],
          temperatureC: 20.5,
          relativeHumidityPercent: 45,
          measuredOn: options.today,
          focusOperator: 'gradient-energy',
          notes: 'Load-run measurement.',
          sweeps: [{ moving: 'sensor', objectPositionMm: 0, lensPositionMm: 300, sensorPositionMm: null }],
        },
        { actorId: technicianId, ip: null },
        options.today,
      ),
    );
  }

  return {
    people: planned,
    technicianId,
    workOrderIds: orderRows.map((row) => row.id),
    measurementIds,
    searchTerms: ['condenser', 'relay', `PO-${runId}-1`, 'Orrin', `PCX-${runId}-7`, 'WO-LOAD'],
    equipmentIds,
  };
}
