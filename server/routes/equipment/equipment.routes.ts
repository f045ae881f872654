import { validateBody, validateParams, validateQuery } from '../../middleware/validate';
import type { RouteDefinition } from '../route-definition';
import { getEquipment, patchEquipment, postEquipment } from './equipment.handlers';
import { createEquipmentBody, equipmentIdParams, listEquipmentQuery, updateEquipmentBody } from './equipment.schemas';

export const equipmentRoutes: RouteDefinition[] = [
  {
    method: 'get',
    path: '/api/equipment',
    roles: ['technician', 'reviewer', 'admin'],
    summary: 'The equipment register with each item\'s calibration state; ?kind=&q=&includeInactive=true.',
    handlers: (deps) => [validateQuery(listEquipmentQuery), getEquipment(deps)],
  },
  {
    method: 'post',
    path: '/api/equipment',
    roles: ['admin'],
    summary: 'Registers a camera, target, rail scale, collimator or auxiliary lens with its values and calibration.',
    handlers: (deps) => [validateBody(createEquipmentBody), postEquipment(deps)],
  },
  {
    method: 'patch',
    path: '/api/equipment/:equipmentId',
    roles: ['admin'],
    summary: 'Changes an item of equipment; active: false retires it.',
    handlers: (deps) => [validateParams(equipmentIdParams), validateBody(updateEquipmentBody), patchEquipment(deps)],
  },
];
