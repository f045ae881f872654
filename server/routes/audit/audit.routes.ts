import { validateQuery } from '../../middleware/validate';
import { auditFilterQuery, listAuditEventsQuery } from '../../../shared/schemas/admin';
import type { RouteDefinition } from '../route-definition';
import { getAuditEvents, getAuditExport } from './audit.handlers';

export const auditRoutes: RouteDefinition[] = [
  {
    method: 'get',
    path: '/api/audit-events',
    roles: ['admin'],
    summary: 'Audit events newest first; ?actor= (name or e-mail) or ?actorId=, ?action= prefix, ?subjectType=, ?subjectId=, ?from=&to= (UTC dates), ?page=&pageSize=.',
    handlers: (deps) => [validateQuery(listAuditEventsQuery), getAuditEvents(deps)],
  },
  {
    method: 'get',
    path: '/api/audit-events/export',
    roles: ['admin'],
    summary: 'The filtered audit events as CSV (same filters; spreadsheet formulas neutralised).',
    handlers: (deps) => [validateQuery(auditFilterQuery), getAuditExport(deps)],
  },
];
