import type { RequestHandler } from 'express';
import type { AppDeps } from '../../deps';
import { HttpStatus } from '../../http-status';
import { actorOf, signedInUser } from '../../services/catalogue-queries';
import { createLens } from '../../services/lenses';
import { createWorkOrder, getWorkOrder, listWorkOrders, updateWorkOrder } from '../../services/work-orders';
import type { CreateLensInput, CreateWorkOrderInput, ListWorkOrdersQuery, UpdateWorkOrderInput, WorkOrderIdParams } from './work-orders.schemas';

export function getWorkOrders(deps: AppDeps): RequestHandler {
  return async (req, res) => {
    const query = res.locals.query as ListWorkOrdersQuery;
    res.status(HttpStatus.OK).json(await listWorkOrders(deps.db, query, signedInUser(req)));
  };
}

export function postWorkOrder(deps: AppDeps): RequestHandler {
  return async (req, res) => {
    const id = await createWorkOrder(deps.db, res.locals.body as CreateWorkOrderInput, actorOf(req));
    res.status(HttpStatus.CREATED).json({ workOrder: await getWorkOrder(deps.db, id, signedInUser(req)) });
  };
}

export function getWorkOrderById(deps: AppDeps): RequestHandler {
  return async (req, res) => {
    const { workOrderId } = res.locals.params as WorkOrderIdParams;
    res.status(HttpStatus.OK).json({ workOrder: await getWorkOrder(deps.db, workOrderId, signedInUser(req)) });
  };
}

export function patchWorkOrder(deps: AppDeps): RequestHandler {
  return async (req, res) => {
    const { workOrderId } = res.locals.params as WorkOrderIdParams;
    await updateWorkOrder(deps.db, workOrderId, res.locals.body as UpdateWorkOrderInput, actorOf(req));
    res.status(HttpStatus.OK).json({ workOrder: await getWorkOrder(deps.db, workOrderId, signedInUser(req)) });
  };
}

export function postLens(deps: AppDeps): RequestHandler {
  return async (req, res) => {
    const { workOrderId } = res.locals.params as WorkOrderIdParams;
    const lens = await createLens(deps.db, workOrderId, res.locals.body as CreateLensInput, actorOf(req));
    res.status(HttpStatus.CREATED).json({ lens });
  };
}
