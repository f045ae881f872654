import { inArray } from 'drizzle-orm';
import { createEquipmentBody, type CreateEquipmentInput } from '../../shared/schemas/equipment';
import type { Database } from '../../server/db/client';
import { equipment } from '../../server/db/schema';

/** Invented equipment of the invented lab; identifiers, serials and calibration references are made up. */
type WithoutDueDate<T> = T extends unknown ? Omit<T, 'calibrationDueDate'> : never;

export interface DemoEquipment {
  item: WithoutDueDate<CreateEquipmentInput>;
  /** Calibration due this many days from the day the demo is seeded (negative: already overdue). */
  dueInDays: number;
}

function demoItem(item: WithoutDueDate<CreateEquipmentInput>, dueInDays: number): DemoEquipment {
  return { item, dueInDays };
}

export const demoEquipment: readonly DemoEquipment[] = [
  demoItem(
    {
      kind: 'camera',
      identifier: 'CAM-A1',
      description: 'Monochrome bench camera, bare sensor, 12-bit',
      serialNumber: 'LK-C-20931',
      values: { pixelPitchUm: 3.45, pixelPitchUncertaintyUm: 0.005, widthPx: 4096, heightPx: 3000 },
      calibrationReference: 'LOTL-CAL-2026-014',
    },
    240,
  ),
  demoItem(
    {
      kind: 'camera',
      identifier: 'CAM-B2',
      description: 'Spare monochrome bench camera (calibration lapsed)',
      serialNumber: 'LK-C-18077',
      values: { pixelPitchUm: 3.45, pixelPitchUncertaintyUm: 0.005, widthPx: 2448, heightPx: 2048 },
      calibrationReference: 'LOTL-CAL-2025-102',
    },
    -21,
  ),
  demoItem(
    {
      kind: 'target',
      identifier: 'TGT-DP6',
      description: 'Chrome-on-glass dot pair, 6 mm centre spacing',
      serialNumber: 'LK-T-0612',
      values: { pattern: 'dot-pair', sizeMm: 6.0, sizeUncertaintyMm: 0.0015, polarity: 'dark-on-light' },
      calibrationReference: 'LOTL-CAL-2026-021',
    },
    310,
  ),
  demoItem(
    {
      kind: 'target',
      identifier: 'TGT-SQ4',
      description: 'Chrome-on-glass square, 4 mm side',
      serialNumber: 'LK-T-0407',
      values: { pattern: 'square', sizeMm: 4.0, sizeUncertaintyMm: 0.0012, polarity: 'dark-on-light' },
      calibrationReference: 'LOTL-CAL-2026-022',
    },
    18,
  ),
  demoItem(
    {
      kind: 'rail-scale',
      identifier: 'RAIL-1',
      description: 'Optical rail with vernier carriage, 1 m',
      serialNumber: 'LK-R-0001',
      values: { uncertaintyMm: 0.02, lengthMm: 1000 },
      calibrationReference: 'LOTL-CAL-2026-030',
    },
    400,
  ),
  demoItem(
    {
      kind: 'collimator',
      identifier: 'COL-400',
      description: 'Reference collimator, 400 mm',
      serialNumber: 'LK-K-0400',
      values: { focalLengthMm: 400, focalLengthUncertaintyMm: 0.4 },
      calibrationReference: 'LOTL-CAL-2026-041',
    },
    180,
  ),
  demoItem(
    {
      kind: 'auxiliary-lens',
      identifier: 'AUX-75',
      description: 'Auxiliary positive lens for diverging lenses, 75 mm',
      serialNumber: 'LK-A-0075',
      values: { focalLengthMm: 75, focalLengthUncertaintyMm: 0.08 },
      calibrationReference: 'LOTL-CAL-2026-044',
    },
    150,
  ),
];

export function addDays(isoDate: string, days: number): string {
  const date = new Date(`${isoDate}T00:00:00Z`);
  date.setUTCDate(date.getUTCDate() + days);
  return date.toISOString().slice(0, 10);
}

/** Registers the missing demo equipment (an existing item is left as it is); returns ids by identifier. */
export async function seedDemoEquipment(db: Database, options: { today: string }): Promise<{ idByIdentifier: Record<string, string>; created: number }> {
  const rows = demoEquipment.map((demo) => {
    const item = createEquipmentBody.parse({ ...demo.item, calibrationDueDate: addDays(options.today, demo.dueInDays) });
    return {
      kind: item.kind,
      identifier: item.identifier,
      description: item.description ?? '',
      serialNumber: item.serialNumber ?? null,
      values: item.values as Record<string, string | number | null>,
      calibrationReference: item.calibrationReference,
      calibrationDueDate: item.calibrationDueDate,
    };
  });
  const inserted = await db.insert(equipment).values(rows).onConflictDoNothing({ target: equipment.identifier }).returning({ id: equipment.id });
  const stored = await db
    .select({ id: equipment.id, identifier: equipment.identifier })
    .from(equipment)
    .where(inArray(equipment.identifier, rows.map((row) => row.identifier)));
  const idByIdentifier = Object.fromEntries(stored.map((row) => [row.identifier, row.id]));
  for (const row of rows) {
    if (!idByIdentifier[row.identifier]) throw new Error(`Demo equipment "${row.identifier}" is missing after seeding.`);
  }
  return { idByIdentifier, created: inserted.length };
}
