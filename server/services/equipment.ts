import { and, asc, eq, ilike, or, sql, type SQL } from 'drizzle-orm';
import {
  CALIBRATION_DUE_SOON_DAYS,
  equipmentValuesByKind,
  type CalibrationState,
  type CreateEquipmentInput,
  type EquipmentItem,
  type EquipmentKindName,
  type ListEquipmentQuery,
  type UpdateEquipmentInput,
} from '../../shared/schemas/equipment';
import { isIsoCalendarDate } from '../../shared/schemas/work-orders';
import type { Database } from '../db/client';
import { equipment } from '../db/schema';
import { HttpError } from '../http-error';
import { HttpStatus } from '../http-status';
import { invariant } from '../invariant';
import { parseOrThrow } from '../middleware/validate';
import { containsPattern, recordAuditEventWithin, type Actor } from './catalogue-queries';

const MS_PER_DAY = 86_400_000;

function utcDayNumber(isoDate: string): number {
  invariant(isIsoCalendarDate(isoDate), `"${isoDate}" is not a calendar date written YYYY-MM-DD`);
  const [year, month, day] = isoDate.split('-').map(Number);
  return Date.UTC(year, month - 1, day) / MS_PER_DAY;
}

/** Whole calendar days from `fromDate` to `toDate` (both YYYY-MM-DD); negative when `toDate` is earlier. */
export function daysBetween(fromDate: string, toDate: string): number {
  return utcDayNumber(toDate) - utcDayNumber(fromDate);
}

/** Today's date on the server's calendar, YYYY-MM-DD. */
export function todayIsoDate(now: Date = new Date()): string {
  const pad = (value: number) => String(value).padStart(2, '0');
  return `${now.getFullYear()}-${pad(now.getMonth() + 1)}-${pad(now.getDate())}`;
}

/**
 * Where an item stands against its calibration due date (both YYYY-MM-DD):
 * usable through the due date itself, "overdue" from the day after, and
 * "due-soon" within CALIBRATION_DUE_SOON_DAYS before it.
 */
export function calibrationStateOf(dueDate: string, today: string): CalibrationState {
  const daysLeft = daysBetween(today, dueDate);
  if (daysLeft < 0) return 'overdue';
  if (daysLeft <= CALIBRATION_DUE_SOON_DAYS) return 'due-soon';
  return 'current';
}

type EquipmentRow = typeof equipment.$inferSelect;

export function toEquipmentItem(row: EquipmentRow, today: string): EquipmentItem {
  return {
    id: row.id,
    kind: row.kind,
    identifier: row.identifier,
    description: row.description,
    serialNumber: row.serialNumber,
    values: row.values,
    calibrationReference: row.calibrationReference,
    calibrationDueDate: row.calibrationDueDate,
    active: row.active,
    calibrationState: calibrationStateOf(row.calibrationDueDate, today),
    daysUntilCalibrationDue: daysBetween(today, row.calibrationDueDate),
  };
}

/** True for PostgreSQL's unique_violation (23505), also when Drizzle wraps it. */
export function isUniqueViolation(error: unknown, constraint?: string): boolean {
  for (let current = error as { code?: unknown; constraint?: unknown; cause?: unknown } | undefined, depth = 0; current && depth < 4; depth++) {
    if (current.code === '23505') return constraint === undefined || current.constraint === constraint;
    current = current.cause as typeof current;
  }
  return false;
}

function duplicateIdentifier(identifier: string): HttpError {
  const message = `Equipment with the identifier "${identifier}" is already in the register; give this item its own identifier.`;
  return new HttpError(HttpStatus.CONFLICT, message, { identifier: message });
}

async function assertIdentifierFree(db: Database, identifier: string, exceptId?: string): Promise<void> {
  const [clash] = await db
    .select({ id: equipment.id })
    .from(equipment)
    .where(and(sql`lower(${equipment.identifier}) = lower(${identifier})`, exceptId ? sql`${equipment.id} <> ${exceptId}` : undefined))
    .limit(1);
  if (clash) throw duplicateIdentifier(identifier);
}

export async function listEquipment(db: Database, query: ListEquipmentQuery, today: string): Promise<EquipmentItem[]> {
  const conditions: (SQL | undefined)[] = [];
  if (query.kind) conditions.push(eq(equipment.kind, query.kind));
  if (!query.includeInactive) conditions.push(eq(equipment.active, true));
  if (query.q) {
    const pattern = containsPattern(query.q);
    conditions.push(
      or(
        ilike(equipment.identifier, pattern),
        ilike(equipment.description, pattern),
        ilike(equipment.serialNumber, pattern),
        ilike(equipment.calibrationReference, pattern),
      ),
    );
  }
  const rows = await db
    .select()
    .from(equipment)
    .where(and(...conditions))
    .orderBy(asc(equipment.kind), asc(equipment.identifier));
  return rows.map((row) => toEquipmentItem(row, today));
}

export async function findEquipment(db: Database, equipmentId: string): Promise<EquipmentRow | null> {
  const [row] = await db.select().from(equipment).where(eq(equipment.id, equipmentId));
  return row ?? null;
}

export async function createEquipment(db: Database, input: CreateEquipmentInput, actor: Actor, today: string): Promise<EquipmentItem> {
  await assertIdentifierFree(db, input.identifier);
  try {
    return await db.transaction(async (tx) => {
      const [row] = await tx
        .insert(equipment)
        .values({
          kind: input.kind,
          identifier: input.identifier,
          description: input.description ?? '',
          serialNumber: input.serialNumber ?? null,
          values: input.values as EquipmentRow['values'],
          calibrationReference: input.calibrationReference,
          calibrationDueDate: input.calibrationDueDate,
        })
        .returning();
      await recordAuditEventWithin(tx, {
        actorId: actor.actorId,
        action: 'equipment.created',
        subjectType: 'equipment',
        subjectId: row.id,
        details: { kind: row.kind, identifier: row.identifier, calibrationDueDate: row.calibrationDueDate },
        ip: actor.ip,
      });
      return toEquipmentItem(row, today);
    });
  } catch (error) {
    if (isUniqueViolation(error, 'equipment_identifier_unique')) throw duplicateIdentifier(input.identifier);
    throw error;
  }
}

/** Checks `values` against the schema of `kind`, naming fields as `values.<name>`. */
export function parseEquipmentValues(kind: EquipmentKindName, values: unknown): EquipmentRow['values'] {
  const schema = equipmentValuesByKind[kind];
  const parsed = parseOrThrow(schema, values, 'body');
  return parsed as EquipmentRow['values'];
}

function prefixValueFields(error: unknown): never {
  if (error instanceof HttpError && error.fields) {
    const fields = Object.fromEntries(
      Object.entries(error.fields).map(([key, message]) => [key === '_' ? 'values' : `values.${key}`, message]),
    );
    throw new HttpError(error.status, `Some fields need attention: ${Object.keys(fields).join(', ')}.`, fields);
  }
  throw error;
}

export async function updateEquipment(
  db: Database,
  equipmentId: string,
  input: UpdateEquipmentInput,
  actor: Actor,
  today: string,
): Promise<EquipmentItem> {
  const existing = await findEquipment(db, equipmentId);
  if (!existing) throw new HttpError(HttpStatus.NOT_FOUND, `There is no equipment with id ${equipmentId}.`);
  if (input.kind !== undefined && input.kind !== existing.kind) {
    const message = `Field "kind" cannot change (this item is a ${existing.kind}); register the new item separately.`;
    throw new HttpError(HttpStatus.BAD_REQUEST, message, { kind: message });
  }
  let values: EquipmentRow['values'] | undefined;
  if (input.values !== undefined) {
    try {
      values = parseEquipmentValues(existing.kind, input.values);
    } catch (error) {
      prefixValueFields(error);
    }
  }
  if (input.identifier !== undefined && input.identifier !== existing.identifier) {
    await assertIdentifierFree(db, input.identifier, existing.id);
  }

  const changes: Partial<typeof equipment.$inferInsert> = {};
  if (input.identifier !== undefined) changes.identifier = input.identifier;
  if (input.description !== undefined) changes.description = input.description;
  if (input.serialNumber !== undefined) changes.serialNumber = input.serialNumber;
  if (values !== undefined) changes.values = values;
  if (input.calibrationReference !== undefined) changes.calibrationReference = input.calibrationReference;
  if (input.calibrationDueDate !== undefined) changes.calibrationDueDate = input.calibrationDueDate;
  if (input.active !== undefined) changes.active = input.active;

  const changedFields = Object.keys(changes).filter(
    (key) => JSON.stringify(changes[key as keyof typeof changes]) !== JSON.stringify(existing[key as keyof EquipmentRow]),
  );
  try {
    return await db.transaction(async (tx) => {
      const [row] = await tx
        .update(equipment)
        .set({ ...changes, updatedAt: new Date() })
        .where(eq(equipment.id, equipmentId))
        .returning();
      invariant(row, `equipment ${equipmentId} vanished during its update`);
      const retired = existing.active && row.active === false;
      await recordAuditEventWithin(tx, {
        actorId: actor.actorId,
        action: 'equipment.updated',
        subjectType: 'equipment',
        subjectId: row.id,
        details: {
          identifier: row.identifier,
          retired,
          changedFields,
          before: Object.fromEntries(changedFields.map((key) => [key, existing[key as keyof EquipmentRow]])),
          after: Object.fromEntries(changedFields.map((key) => [key, row[key as keyof EquipmentRow]])),
        },
        ip: actor.ip,
      });
      return toEquipmentItem(row, today);
    });
  } catch (error) {
    if (isUniqueViolation(error, 'equipment_identifier_unique')) throw duplicateIdentifier(input.identifier ?? existing.identifier);
    throw error;
  }
}
