import { validateBody, validateParams, validateQuery } from '../../middleware/validate';
import type { RouteDefinition } from '../route-definition';
import { getWorkOrderById, getWorkOrders, patchWorkOrder, postLens, postWorkOrder } from './work-orders.handlers';
import { createLensBody, createWorkOrderBody, listWorkOrdersQuery, updateWorkOrderBody, workOrderIdParams } from './work-orders.schemas';

export const workOrderRoutes: RouteDefinition[] = [
  {
    method: 'get',
    path: '/api/work-orders',
    roles: ['technician', 'reviewer', 'admin', 'client'],
    summary: 'Work orders, searched, filtered, sorted and paged; a client sees only their organisation\'s.',
    handlers: (deps) => [validateQuery(listWorkOrdersQuery), getWorkOrders(deps)],
  },
  {
    method: 'post',
    path: '/api/work-orders',
    roles: ['technician', 'admin'],
    summary: 'Opens a work order for a client organisation; its number (WO-YYYY-NNNN) is allocated.',
    handlers: (deps) => [validateBody(createWorkOrderBody), postWorkOrder(deps)],
  },
  {
    method: 'get',
    path: '/api/work-orders/:workOrderId',
    roles: ['technician', 'reviewer', 'admin', 'client'],
    summary: 'One work order with its lenses; a client gets 404 for another organisation\'s.',
    handlers: (deps) => [validateParams(workOrderIdParams), getWorkOrderById(deps)],
  },
  {
    method: 'patch',
    path: '/api/work-orders/:workOrderId',
    roles: ['technician', 'admin'],
    summary: 'Changes title, client reference, due date, decision rule, notes or status.',
    handlers: (deps) => [validateParams(workOrderIdParams), validateBody(updateWorkOrderBody), patchWorkOrder(deps)],
  },
  {
    method: 'post',
    path: '/api/work-orders/:workOrderId/lenses',
    roles: ['technician', 'admin'],
    summary: 'Adds a lens (nominal focal length or power, and a tolerance) to a work order.',
    handlers: (deps) => [validateParams(workOrderIdParams), validateBody(createLensBody), postLens(deps)],
  },
];
