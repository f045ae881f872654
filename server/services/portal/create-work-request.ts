import { focalLengthMmFromPowerDioptres } from '../../../shared/schemas/lenses';
import type { WorkRequestInput, WorkRequestResponse } from '../../../shared/schemas/portal';
import type { Database } from '../../db/client';
import { lenses, workOrders } from '../../db/schema';
import { HttpError } from '../../http-error';
import { HttpStatus } from '../../http-status';
import { recordAuditEvent } from '../audit-log';
import type { Actor } from '../catalogue-queries';
import { allocateNumber } from '../numbering';
import { notifyWorkRequested } from '../notifications/notify-work-requested';

export interface WorkRequestContext {
  actor: Actor;
  organisationId: string;
  /** PUBLIC_BASE_URL, for the lab's e-mail. */
  baseUrl: string;
  /** Today as YYYY-MM-DD (UTC); a requested due date must not be earlier. */
  todayIsoDate: string;
}

/**
 * A client's request for new work: one transaction makes the work order (in
 * status "requested", numbered like any other), its lenses, the audit event
 * and the lab's e-mail in the outbox; any failure leaves none of them.
 */
export async function createWorkRequest(db: Database, input: WorkRequestInput, context: WorkRequestContext): Promise<WorkRequestResponse> {
  if (input.dueDate && input.dueDate < context.todayIsoDate) {
    const message = `Field "dueDate" must not be in the past (today is ${context.todayIsoDate}).`;
    throw new HttpError(HttpStatus.BAD_REQUEST, message, { dueDate: message });
  }
  const year = Number(context.todayIsoDate.slice(0, 4));
  return db.transaction(async (tx) => {
    const number = await allocateNumber(tx, 'work-order', year);
    const [order] = await tx
      .insert(workOrders)
      .values({
        number,
        organisationId: context.organisationId,
        title: input.title,
        clientReference: input.clientReference ?? null,
        dueDate: input.dueDate ?? null,
        decisionRule: input.decisionRule,
        notes: input.notes ?? null,
        status: 'requested',
        createdById: context.actor.actorId,
      })
      .returning();
    await tx.insert(lenses).values(
      input.lenses.map((lens) => ({
        workOrderId: order.id,
        identifier: lens.identifier,
        description: lens.description ?? '',
        partNumber: lens.partNumber ?? null,
        nominalFocalLengthMm: lens.nominalFocalLengthMm ?? focalLengthMmFromPowerDioptres(lens.nominalPowerDioptres as number),
        tolerancePercent: lens.tolerancePercent ?? null,
        toleranceMm: lens.toleranceMm ?? null,
      })),
    );
    await recordAuditEvent(tx, {
      actorId: context.actor.actorId,
      action: 'work-order.requested',
      subjectType: 'work-order',
      subjectId: order.id,
      details: {
        number,
        organisationId: context.organisationId,
        title: input.title,
        lensIdentifiers: input.lenses.map((lens) => lens.identifier),
      },
      ip: context.actor.ip,
    });
    await notifyWorkRequested(tx, { workOrderId: order.id, requestedById: context.actor.actorId, baseUrl: context.baseUrl });
    return {
      workOrder: { id: order.id, number, status: order.status, title: order.title, decisionRule: order.decisionRule, lensCount: input.lenses.length },
    };
  });
}
