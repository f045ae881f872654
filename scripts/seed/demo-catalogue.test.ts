import { eq, inArray } from 'drizzle-orm';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createDatabase, type DatabaseConnection } from '../../server/db/client';
import { equipment, lenses, workOrders } from '../../server/db/schema';
import { calibrationStateOf } from '../../server/services/equipment';
import { partNumberSpread } from '../../server/services/part-number-spread';
import { createPasswordHasher } from '../../server/services/passwords';
import { testEnv } from '../../tests/setup/test-services';
import { addDays, demoEquipment } from './demo-equipment';
import { demoLensesByKey, demoWorkOrders } from './demo-work-orders';
import { seedDemo } from './seed-demo';

let connection: DatabaseConnection;
const passwords = createPasswordHasher({ rounds: 4 });
const today = '2026-03-02';

beforeAll(() => {
  connection = createDatabase({ databaseUrl: testEnv().DATABASE_URL, maxConnections: 2 });
});

afterAll(async () => {
  await connection?.pool.end();
});

describe('demo equipment, work orders and lenses', () => {
  it('are seeded once: a second run finds the same rows and adds none', async () => {
    const first = await seedDemo({ db: connection.db, passwords, today });
    const second = await seedDemo({ db: connection.db, passwords, today });
    expect(second).toEqual(first);
    expect(Object.keys(first.lensIdsByKey).sort()).toEqual(Object.keys(demoLensesByKey).sort());

    const orderIds = Object.values(first.workOrderIdsByKey);
    expect(orderIds).toHaveLength(demoWorkOrders.length);
    const lensRows = await connection.db.select().from(lenses).where(inArray(lenses.workOrderId, orderIds));
    expect(lensRows).toHaveLength(Object.keys(demoLensesByKey).length);
  });

  it('hold the equipment the brief asks for, one camera past its calibration date', async () => {
    const { equipmentIdsByIdentifier } = await seedDemo({ db: connection.db, passwords, today });
    const rows = await connection.db.select().from(equipment).where(inArray(equipment.id, Object.values(equipmentIdsByIdentifier)));
    expect(rows).toHaveLength(demoEquipment.length);
    const byIdentifier = new Map(rows.map((row) => [row.identifier, row]));
    const cameras = rows.filter((row) => row.kind === 'camera');
    expect(cameras.map((row) => row.values.pixelPitchUm)).toEqual([3.45, 3.45]);
    // Whichever test file seeded first set the due dates; recover that day from CAM-A1's offset.
    const offsetA1 = demoEquipment.find((item) => item.item.identifier === 'CAM-A1')!.dueInDays;
    const seedingDay = addDays(byIdentifier.get('CAM-A1')!.calibrationDueDate, -offsetA1);
    expect(calibrationStateOf(byIdentifier.get('CAM-A1')!.calibrationDueDate, seedingDay)).toBe('current');
    expect(calibrationStateOf(byIdentifier.get('CAM-B2')!.calibrationDueDate, seedingDay)).toBe('overdue');
    expect(byIdentifier.get('TGT-DP6')?.values).toMatchObject({ pattern: 'dot-pair', sizeMm: 6 });
    expect(byIdentifier.get('TGT-SQ4')?.values).toMatchObject({ pattern: 'square', sizeMm: 4 });
    expect(byIdentifier.get('RAIL-1')?.values).toMatchObject({ uncertaintyMm: 0.02 });
    expect(byIdentifier.get('COL-400')?.values).toMatchObject({ focalLengthMm: 400 });
    expect(byIdentifier.get('AUX-75')?.values).toMatchObject({ focalLengthMm: 75 });
  });

  it('give the QI-PCX-100 batch six lenses of 100 mm ± 1 % and the demo orders several states', async () => {
    const spread = await partNumberSpread(connection.db, 'QI-PCX-100');
    expect(spread).toMatchObject({ lensCount: 6, nominalFocalLengthMm: 100, lowerLimitMm: 99, upperLimitMm: 101, specificationsDiffer: false });
    const { workOrderIdsByKey } = await seedDemo({ db: connection.db, passwords, today });
    const statuses = await connection.db
      .select({ status: workOrders.status, number: workOrders.number })
      .from(workOrders)
      .where(inArray(workOrders.id, Object.values(workOrderIdsByKey)));
    expect(new Set(statuses.map((s) => s.status))).toEqual(new Set(demoWorkOrders.map((o) => o.status)));
    expect(statuses.every((s) => /^WO-\d{4}-\d{4,}$/.test(s.number))).toBe(true);
    const [magnifier] = await connection.db.select().from(lenses).where(eq(lenses.identifier, 'TMO-MAG-4D-01'));
    expect(magnifier.nominalFocalLengthMm).toBe(250);
  });
});
