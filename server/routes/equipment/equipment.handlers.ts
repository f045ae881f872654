import type { RequestHandler } from 'express';
import type { AppDeps } from '../../deps';
import { HttpStatus } from '../../http-status';
import { actorOf } from '../../services/catalogue-queries';
import { createEquipment, listEquipment, todayIsoDate, updateEquipment } from '../../services/equipment';
import type { CreateEquipmentInput, EquipmentIdParams, ListEquipmentQuery, UpdateEquipmentInput } from './equipment.schemas';

export function getEquipment(deps: AppDeps): RequestHandler {
  return async (_req, res) => {
    const query = res.locals.query as ListEquipmentQuery;
    res.status(HttpStatus.OK).json({ items: await listEquipment(deps.db, query, todayIsoDate()) });
  };
}

export function postEquipment(deps: AppDeps): RequestHandler {
  return async (req, res) => {
    const item = await createEquipment(deps.db, res.locals.body as CreateEquipmentInput, actorOf(req), todayIsoDate());
    res.status(HttpStatus.CREATED).json({ equipment: item });
  };
}

export function patchEquipment(deps: AppDeps): RequestHandler {
  return async (req, res) => {
    const { equipmentId } = res.locals.params as EquipmentIdParams;
    const item = await updateEquipment(deps.db, equipmentId, res.locals.body as UpdateEquipmentInput, actorOf(req), todayIsoDate());
    res.status(HttpStatus.OK).json({ equipment: item });
  };
}
