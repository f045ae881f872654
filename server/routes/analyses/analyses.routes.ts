import { validateBody, validateParams, validateQuery } from '../../middleware/validate';
import type { RouteDefinition } from '../route-definition';
import { getAnalysis, postAnalysis } from './analyses.handlers';
import { analysisRunParams, analysisRunQuery, startAnalysisBody, startAnalysisParams } from './analyses.schemas';

export const analysesRoutes: RouteDefinition[] = [
  {
    method: 'post',
    path: '/api/measurements/:measurementId/analyses',
    roles: ['technician'],
    summary: 'Queues a new analysis version with the present frames, readings, exclusions and equipment values; 202.',
    handlers: (deps) => [validateParams(startAnalysisParams), validateBody(startAnalysisBody), postAnalysis(deps)],
  },
  {
    method: 'get',
    path: '/api/measurements/:measurementId/analyses/:version',
    roles: ['technician', 'reviewer', 'admin'],
    summary: 'One analysis version with its result and manifest; ?fields=progress answers only status and progress.',
    handlers: (deps) => [validateParams(analysisRunParams), validateQuery(analysisRunQuery), getAnalysis(deps)],
  },
];
