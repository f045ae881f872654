import { validateQuery } from '../../middleware/validate';
import type { RouteDefinition } from '../route-definition';
import { getPortalOrders, postWorkRequest, validateWorkRequest } from './portal.handlers';
import { portalOrdersQuery } from './portal.schemas';

export const portalRoutes: RouteDefinition[] = [
  {
    method: 'get',
    path: '/api/portal/orders',
    roles: ['client'],
    summary: "The client organisation's own work orders: lenses, each measurement's stage, results and every revision of its certificates.",
    handlers: (deps) => [validateQuery(portalOrdersQuery), getPortalOrders(deps)],
  },
  {
    method: 'post',
    path: '/api/portal/work-requests',
    roles: ['client'],
    summary: 'Requests new work: a work order in status "requested" with 1–50 lenses; the lab is told by e-mail.',
    handlers: (deps) => [validateWorkRequest, postWorkRequest(deps)],
  },
];
