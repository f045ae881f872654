import { validateBody, validateParams, validateQuery } from '../../middleware/validate';
import type { RouteDefinition } from '../route-definition';
import { getMeasurementById, getMeasurements, patchMeasurement, postMeasurement, postSweep } from './measurements.handlers';
import { createMeasurementBody, createSweepBody, listMeasurementsQuery, measurementIdParams, updateMeasurementBody } from './measurements.schemas';

export const measurementRoutes: RouteDefinition[] = [
  {
    method: 'get',
    path: '/api/measurements',
    roles: ['technician', 'reviewer', 'admin'],
    summary: 'Measurements, newest change first; ?status=, ?mine=true (performed by the caller), ?lensId=, ?q=, paging and sort.',
    handlers: (deps) => [validateQuery(listMeasurementsQuery), getMeasurements(deps)],
  },
  {
    method: 'post',
    path: '/api/measurements',
    roles: ['technician'],
    summary: 'Sets up a measurement of a lens with its method, equipment (overrides for equipment past calibration) and sweeps.',
    handlers: (deps) => [validateBody(createMeasurementBody), postMeasurement(deps)],
  },
  {
    method: 'get',
    path: '/api/measurements/:measurementId',
    roles: ['technician', 'reviewer', 'admin'],
    summary: 'One measurement in full: lens, work order, equipment, overrides, sweeps with frames, analyses.',
    handlers: (deps) => [validateParams(measurementIdParams), getMeasurementById(deps)],
  },
  {
    method: 'patch',
    path: '/api/measurements/:measurementId',
    roles: ['technician'],
    summary: 'Changes environment, notes, focus operator or date, until the measurement is submitted.',
    handlers: (deps) => [validateParams(measurementIdParams), validateBody(updateMeasurementBody), patchMeasurement(deps)],
  },
  {
    method: 'post',
    path: '/api/measurements/:measurementId/sweeps',
    roles: ['technician'],
    summary: 'Adds a sweep to a measurement whose frames may still change.',
    handlers: (deps) => [validateParams(measurementIdParams), validateBody(createSweepBody), postSweep(deps)],
  },
];
