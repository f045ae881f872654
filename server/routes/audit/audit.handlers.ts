import type { RequestHandler, Response } from 'express';
import type { AppDeps } from '../../deps';
import { HttpStatus } from '../../http-status';
import type { AuditFilter, ListAuditEventsQuery } from '../../../shared/schemas/admin';
import { AUDIT_CSV_HEADER_LINE, auditRowsToCsvLines } from '../../services/audit/audit-csv';
import { auditEventBatchesForExport, listAuditEvents } from '../../services/audit/list-audit-events';
import { recordAuditEvent } from '../../services/audit-log';
import { actorOf } from '../../services/catalogue-queries';

export function getAuditEvents(deps: AppDeps): RequestHandler {
  return async (_req, res) => {
    res.status(HttpStatus.OK).json(await listAuditEvents(deps.db, res.locals.query as ListAuditEventsQuery));
  };
}

/** Waits until the response can take more, or has closed (a client that leaves stops the export). */
function drained(res: Response): Promise<void> {
  return new Promise((resolve) => {
    const done = () => {
      res.off('drain', done);
      res.off('close', done);
      resolve();
    };
    res.on('drain', done);
    res.on('close', done);
  });
}

/**
 * The filtered audit log as CSV, streamed batch by batch (no row limit, a
 * batch in memory at a time). The export is audited once it ends, with the
 * rows sent and, when the client left early, `completed: false`.
 */
export function getAuditExport(deps: AppDeps): RequestHandler {
  return async (req, res) => {
    const filter = res.locals.query as AuditFilter;
    const actor = actorOf(req);
    const batches = auditEventBatchesForExport(deps.db, filter);
    // The first batch is read before anything is sent, so a failing query still gets the one error shape.
    const first = await batches.next();
    const stamp = new Date().toISOString().slice(0, 10);
    res.status(HttpStatus.OK).type('text/csv; charset=utf-8').attachment(`paraxia-audit-log-${stamp}.csv`);
    res.write(AUDIT_CSV_HEADER_LINE);
    let rows = 0;
    let completed = false;
    try {
      for (let batch = first; !batch.done; batch = await batches.next()) {
        if (res.destroyed) break;
        rows += batch.value.length;
        if (!res.write(auditRowsToCsvLines(batch.value))) await drained(res);
      }
      completed = !res.destroyed;
    } finally {
      await batches.return(undefined);
      await recordAuditEvent(deps.db, {
        actorId: actor.actorId,
        action: 'audit.exported',
        details: {
          filter: Object.fromEntries(Object.entries(filter).filter(([, value]) => value !== undefined)),
          rows,
          ...(completed ? {} : { completed: false }),
        },
        ip: actor.ip,
      });
    }
    res.end();
  };
}
