import type { RouteDefinition } from '../route-definition';
import { getHealth } from './health.handlers';

export const healthRoutes: RouteDefinition[] = [
  {
    method: 'get',
    path: '/api/health',
    roles: 'public',
    summary: 'Reports whether the database, object storage and mail server answer.',
    handlers: (deps) => [getHealth(deps)],
  },
];
