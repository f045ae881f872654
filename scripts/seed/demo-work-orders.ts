import { and, eq } from 'drizzle-orm';
import type { CreateLensInput } from '../../shared/schemas/lenses';
import type { CreateWorkOrderInput, WorkOrderStatus } from '../../shared/schemas/work-orders';
import type { Database } from '../../server/db/client';
import { lenses, workOrders } from '../../server/db/schema';
import { createLens } from '../../server/services/lenses';
import { createWorkOrder, updateWorkOrder } from '../../server/services/work-orders';
import { addDays } from './demo-equipment';
import type { DemoOrganisationKey } from './demo-organisations';

/** Invented orders, part numbers and lenses of the two invented clients. */
interface DemoWorkOrder {
  key: string;
  organisation: Exclude<DemoOrganisationKey, 'lab'>;
  /** Also how a re-run finds the order it made before. */
  clientReference: string;
  title: string;
  decisionRule: CreateWorkOrderInput['decisionRule'];
  status: WorkOrderStatus;
  dueInDays: number | null;
  notes?: string;
  lenses: { key: string; input: CreateLensInput }[];
}

function batch(keyPrefix: string, partNumber: string, count: number, spec: Omit<CreateLensInput, 'identifier' | 'partNumber'>) {
  return Array.from({ length: count }, (_, index) => {
    const serial = String(index + 1).padStart(2, '0');
    return { key: `${keyPrefix}-${serial}`, input: { ...spec, identifier: `${partNumber}-${serial}`, partNumber } };
  });
}

export const demoWorkOrders: readonly DemoWorkOrder[] = [
  {
    key: 'quillmere-pcx-batch',
    organisation: 'quillmere',
    clientReference: 'QI-PO-4471',
    title: 'Incoming inspection: plano-convex singlets, batch 7',
    decisionRule: 'guarded',
    status: 'in-progress',
    dueInDays: 12,
    notes: 'Six lenses from one moulding batch; the client wants the spread against ±1 %.',
    lenses: batch('pcx-100', 'QI-PCX-100', 6, {
      description: 'Plano-convex singlet, Ø 25 mm',
      nominalFocalLengthMm: 100,
      tolerancePercent: 1,
    }),
  },
  {
    key: 'quillmere-bcv-relay',
    organisation: 'quillmere',
    clientReference: 'QI-PO-4502',
    title: 'Bi-concave relay elements',
    decisionRule: 'simple',
    status: 'open',
    dueInDays: 30,
    lenses: batch('bcv-50', 'QI-BCV-50', 2, {
      description: 'Bi-concave singlet, Ø 12.5 mm',
      nominalFocalLengthMm: -50,
      toleranceMm: 0.5,
    }),
  },
  {
    key: 'tovel-achromats',
    organisation: 'tovel',
    clientReference: 'TMO-RQ-118',
    title: 'Achromat focal length check for sighting scopes',
    decisionRule: 'simple',
    status: 'in-progress',
    dueInDays: 5,
    lenses: batch('ach-200', 'TMO-ACH-200', 3, {
      description: 'Cemented achromatic doublet, Ø 40 mm',
      nominalFocalLengthMm: 200,
      tolerancePercent: 2,
    }),
  },
  {
    key: 'tovel-magnifier',
    organisation: 'tovel',
    clientReference: 'TMO-RQ-121',
    title: 'Reading magnifier element, specified in dioptres',
    decisionRule: 'guarded',
    status: 'requested',
    dueInDays: null,
    lenses: [
      {
        key: 'mag-4d-01',
        input: { identifier: 'TMO-MAG-4D-01', partNumber: 'TMO-MAG-4D', description: 'Biconvex magnifier lens', nominalPowerDioptres: 4, tolerancePercent: 3 },
      },
    ],
  },
  {
    key: 'tovel-long-focus',
    organisation: 'tovel',
    clientReference: 'TMO-RQ-097',
    title: 'Long-focus objective, final check',
    decisionRule: 'simple',
    status: 'completed',
    dueInDays: -14,
    lenses: [
      {
        key: 'lf-500-01',
        input: { identifier: 'TMO-LF-500-01', partNumber: 'TMO-LF-500', description: 'Air-spaced objective', nominalFocalLengthMm: 500, toleranceMm: 5 },
      },
    ],
  },
];

export interface DemoLens {
  key: string;
  workOrderKey: string;
  organisation: Exclude<DemoOrganisationKey, 'lab'>;
  input: CreateLensInput;
}

/**
 * Every demo lens by key (`pcx-100-01` … `pcx-100-06`, `bcv-50-01`, `ach-200-01`, `mag-4d-01`, `lf-500-01`…);
 * a later seed step finds the lens's id in `SeedContext.lensIdsByKey` under the same key.
 */
export const demoLensesByKey: Readonly<Record<string, DemoLens>> = Object.fromEntries(
  demoWorkOrders.flatMap((order) =>
    order.lenses.map((lens) => [lens.key, { key: lens.key, workOrderKey: order.key, organisation: order.organisation, input: lens.input }]),
  ),
);

/**
 * Creates the missing demo work orders and lenses through the same services
 * the API uses (numbers allocated, audit events recorded); an order is found
 * again by organisation and client reference, a lens by identifier.
 */
export async function seedDemoWorkOrders(
  db: Database,
  options: { organisationIds: Record<DemoOrganisationKey, string>; technicianId: string; today: string },
): Promise<{ workOrderIdsByKey: Record<string, string>; lensIdsByKey: Record<string, string>; created: number }> {
  const actor = { actorId: options.technicianId, ip: null };
  const workOrderIdsByKey: Record<string, string> = {};
  const lensIdsByKey: Record<string, string> = {};
  let created = 0;
  for (const demo of demoWorkOrders) {
    const organisationId = options.organisationIds[demo.organisation];
    let [order] = await db
      .select({ id: workOrders.id })
      .from(workOrders)
      .where(and(eq(workOrders.organisationId, organisationId), eq(workOrders.clientReference, demo.clientReference)));
    const isNew = !order;
    if (!order) {
      const id = await createWorkOrder(
        db,
        {
          organisationId,
          title: demo.title,
          clientReference: demo.clientReference,
          dueDate: demo.dueInDays === null ? null : addDays(options.today, demo.dueInDays),
          decisionRule: demo.decisionRule,
          notes: demo.notes ?? null,
        },
        actor,
      );
      order = { id };
      created += 1;
    }
    workOrderIdsByKey[demo.key] = order.id;
    for (const lens of demo.lenses) {
      const [existing] = await db
        .select({ id: lenses.id })
        .from(lenses)
        .where(and(eq(lenses.workOrderId, order.id), eq(lenses.identifier, lens.input.identifier)));
      lensIdsByKey[lens.key] = existing?.id ?? (await createLens(db, order.id, lens.input, actor)).id;
    }
    // Closing or marking progress comes last: a completed order takes no new lenses.
    if (isNew && demo.status !== 'open') await updateWorkOrder(db, order.id, { status: demo.status }, actor);
  }
  return { workOrderIdsByKey, lensIdsByKey, created };
}
