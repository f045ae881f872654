import { validateBody, validateParams } from '../../middleware/validate';
import type { RouteDefinition } from '../route-definition';
import { patchSweep, putReadings, removeSweep, uploadFrameHandlers } from './sweeps.handlers';
import { readingsBody, sweepIdParams, updateSweepBody } from './sweeps.schemas';

export const sweepRoutes: RouteDefinition[] = [
  {
    method: 'patch',
    path: '/api/sweeps/:sweepId',
    roles: ['technician'],
    summary: 'Changes a sweep\'s object, lens or sensor position while its frames may still change.',
    handlers: (deps) => [validateParams(sweepIdParams), validateBody(updateSweepBody), patchSweep(deps)],
  },
  {
    method: 'delete',
    path: '/api/sweeps/:sweepId',
    roles: ['technician'],
    summary: 'Deletes a sweep with its frames and their images; only before any analysis of the measurement.',
    handlers: (deps) => [validateParams(sweepIdParams), removeSweep(deps)],
  },
  {
    method: 'post',
    path: '/api/sweeps/:sweepId/frames',
    roles: ['technician'],
    summary: 'Uploads one frame (multipart field "frame"; PNG, JPEG or TIFF, 8/16-bit, ≤ 80 MiB, ≤ 60 MP), streamed to object storage.',
    handlers: (deps) => [validateParams(sweepIdParams), ...uploadFrameHandlers(deps)],
  },
  {
    method: 'put',
    path: '/api/sweeps/:sweepId/readings',
    roles: ['technician'],
    summary: 'Sets every frame\'s rail reading: start and step, a table, or pasted text; all or nothing.',
    handlers: (deps) => [validateParams(sweepIdParams), validateBody(readingsBody), putReadings(deps)],
  },
];
