import { validateParams, validateQuery } from '../../middleware/validate';
import type { RouteDefinition } from '../route-definition';
import { getPartNumberSpread } from './part-numbers.handlers';
import { partNumberParams, partNumberSpreadQuery } from './part-numbers.schemas';

export const partNumberRoutes: RouteDefinition[] = [
  {
    method: 'get',
    path: '/api/part-numbers/:partNumber/spread',
    roles: ['technician', 'reviewer', 'admin'],
    summary: 'Measured focal lengths of every lens of a part number against its tolerance band, with Cp and Cpk.',
    handlers: (deps) => [validateParams(partNumberParams), validateQuery(partNumberSpreadQuery), getPartNumberSpread(deps)],
  },
];
