import { validateQuery } from '../../middleware/validate';
import type { RouteDefinition } from '../route-definition';
import { getPeople } from './people.handlers';
import { listPeopleQuery } from './people.schemas';

export const peopleRoutes: RouteDefinition[] = [
  {
    method: 'get',
    path: '/api/people',
    roles: ['admin'],
    summary: 'Everyone with an account, with roles and organisation; ?active=true|false filters.',
    handlers: (deps) => [validateQuery(listPeopleQuery), getPeople(deps)],
  },
];
