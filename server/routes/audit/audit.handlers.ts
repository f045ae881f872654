import type { RequestHandler } from 'express';
import type { AppDeps } from '../../deps';
import { HttpStatus } from '../../http-status';
import type { AuditFilter, ListAuditEventsQuery } from '../../../shared/schemas/admin';
import { auditEventsToCsv } from '../../services/audit/audit-csv';
import { listAuditEvents, selectAuditEventsForExport } from '../../services/audit/list-audit-events';
import { recordAuditEvent } from '../../services/audit-log';
import { actorOf } from '../../services/catalogue-queries';

export function getAuditEvents(deps: AppDeps): RequestHandler {
  return async (_req, res) => {
    res.status(HttpStatus.OK).json(await listAuditEvents(deps.db, res.locals.query as ListAuditEventsQuery));
  };
}

export function getAuditExport(deps: AppDeps): RequestHandler {
  return async (req, res) => {
    const filter = res.locals.query as AuditFilter;
    const rows = await selectAuditEventsForExport(deps.db, filter);
    const actor = actorOf(req);
    // Recorded after the query, so an export never contains its own event.
    await recordAuditEvent(deps.db, {
      actorId: actor.actorId,
      action: 'audit.exported',
      details: { filter: Object.fromEntries(Object.entries(filter).filter(([, value]) => value !== undefined)), rows: rows.length },
      ip: actor.ip,
    });
    const stamp = new Date().toISOString().slice(0, 10);
    res
      .status(HttpStatus.OK)
      .type('text/csv; charset=utf-8')
      .attachment(`paraxia-audit-log-${stamp}.csv`)
      .send(auditEventsToCsv(rows));
  };
}
