import type { RequestHandler } from 'express';
import type { SweepSetup } from '../../../shared/schemas/measurements';
import type { AppDeps } from '../../deps';
import { HttpStatus } from '../../http-status';
import { actorOf, signedInUser } from '../../services/catalogue-queries';
import { todayIsoDate } from '../../services/equipment';
import { createMeasurement, createSweep, getMeasurementDetail, listMeasurements, updateMeasurement } from '../../services/measurements';
import type { CreateMeasurementInput, ListMeasurementsQuery, MeasurementIdParams, UpdateMeasurementInput } from './measurements.schemas';

export function getMeasurements(deps: AppDeps): RequestHandler {
  return async (req, res) => {
    const query = res.locals.query as ListMeasurementsQuery;
    res.status(HttpStatus.OK).json(await listMeasurements(deps.db, query, signedInUser(req)));
  };
}

export function postMeasurement(deps: AppDeps): RequestHandler {
  return async (req, res) => {
    const today = todayIsoDate();
    const measurementId = await createMeasurement(deps.db, res.locals.body as CreateMeasurementInput, actorOf(req), today);
    res.status(HttpStatus.CREATED).json({ measurement: await getMeasurementDetail(deps.db, measurementId, today) });
  };
}

export function getMeasurementById(deps: AppDeps): RequestHandler {
  return async (_req, res) => {
    const { measurementId } = res.locals.params as MeasurementIdParams;
    res.status(HttpStatus.OK).json({ measurement: await getMeasurementDetail(deps.db, measurementId, todayIsoDate()) });
  };
}

export function patchMeasurement(deps: AppDeps): RequestHandler {
  return async (req, res) => {
    const { measurementId } = res.locals.params as MeasurementIdParams;
    await updateMeasurement(deps.db, measurementId, res.locals.body as UpdateMeasurementInput, actorOf(req));
    res.status(HttpStatus.OK).json({ measurement: await getMeasurementDetail(deps.db, measurementId, todayIsoDate()) });
  };
}

export function postSweep(deps: AppDeps): RequestHandler {
  return async (req, res) => {
    const { measurementId } = res.locals.params as MeasurementIdParams;
    const sweep = await createSweep(deps.db, measurementId, res.locals.body as SweepSetup, actorOf(req));
    res.status(HttpStatus.CREATED).json({ sweep });
  };
}
