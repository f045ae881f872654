import { validateQuery } from '../../middleware/validate';
import type { RouteDefinition } from '../route-definition';
import { getOrganisations } from './organisations.handlers';
import { listOrganisationsQuery } from './organisations.schemas';

export const organisationRoutes: RouteDefinition[] = [
  {
    method: 'get',
    path: '/api/organisations',
    roles: ['technician', 'reviewer', 'admin'],
    summary: 'Organisations by name; ?kind=client|lab filters.',
    handlers: (deps) => [validateQuery(listOrganisationsQuery), getOrganisations(deps)],
  },
];
