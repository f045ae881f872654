import { validateBody, validateParams } from '../../middleware/validate';
import type { RouteDefinition } from '../route-definition';
import { getLensById, patchLens } from './lenses.handlers';
import { lensIdParams, updateLensBody } from './lenses.schemas';

export const lensRoutes: RouteDefinition[] = [
  {
    method: 'get',
    path: '/api/lenses/:lensId',
    roles: ['technician', 'reviewer', 'admin', 'client'],
    summary: 'One lens with its work order and measurement history; a client gets 404 for another organisation\'s.',
    handlers: (deps) => [validateParams(lensIdParams), getLensById(deps)],
  },
  {
    method: 'patch',
    path: '/api/lenses/:lensId',
    roles: ['technician', 'admin'],
    summary: 'Changes a lens; its nominal value and tolerance are fixed once a measurement of it is submitted.',
    handlers: (deps) => [validateParams(lensIdParams), validateBody(updateLensBody), patchLens(deps)],
  },
];
