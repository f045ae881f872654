import { validateParams, validateQuery } from '../../middleware/validate';
import { listOutboundMailQuery, mailIdParams } from '../../../shared/schemas/admin';
import type { RouteDefinition } from '../route-definition';
import { getOutboundMailById, getOutboundMailList, postOutboundMailRetry } from './outbound-mail.handlers';

export const outboundMailRoutes: RouteDefinition[] = [
  {
    method: 'get',
    path: '/api/outbound-mail',
    roles: ['admin'],
    summary: 'The outbox newest first with counts per status; ?status=queued|sending|sent|retrying|failed, ?page=&pageSize=.',
    handlers: (deps) => [validateQuery(listOutboundMailQuery), getOutboundMailList(deps)],
  },
  {
    method: 'get',
    path: '/api/outbound-mail/:mailId',
    roles: ['admin'],
    summary: 'One message with its text body.',
    handlers: (deps) => [validateParams(mailIdParams), getOutboundMailById(deps)],
  },
  {
    method: 'post',
    path: '/api/outbound-mail/:mailId/retry',
    roles: ['admin'],
    summary: 'Makes a failed or retrying message due at once for the dispatcher (202).',
    handlers: (deps) => [validateParams(mailIdParams), postOutboundMailRetry(deps)],
  },
];
