import type { RequestHandler } from 'express';
import { eq } from 'drizzle-orm';
import type { AnalysisRun, AnalysisRunProgressResponse, AnalysisRunResponse, StartAnalysisResponse } from '../../../shared/schemas/analyses';
import { measurements } from '../../db/schema';
import type { AppDeps } from '../../deps';
import { HttpError } from '../../http-error';
import { HttpStatus } from '../../http-status';
import { invariant } from '../../invariant';
import { findAnalysisRun, requestAnalysisRun } from '../../services/analysis-runs';
import type { AnalysisRunParams, AnalysisRunQuery, StartAnalysisParams } from './analyses.schemas';

/** 202 Accepted (RFC 9110 §15.3.3): the run is queued, not done; HttpStatus does not name it yet. */
const ACCEPTED = 202;

export function postAnalysis(deps: AppDeps): RequestHandler {
  return async (req, res) => {
    const { measurementId } = res.locals.params as StartAnalysisParams;
    invariant(req.user, 'the access check lets only signed-in people through');
    const analysis = await requestAnalysisRun(deps, { measurementId, requestedById: req.user.id, ip: req.ip ?? null });
    const body: StartAnalysisResponse = { analysis };
    res.status(ACCEPTED).json(body);
  };
}

export function getAnalysis(deps: AppDeps): RequestHandler {
  return async (_req, res) => {
    const { measurementId, version } = res.locals.params as AnalysisRunParams;
    const { fields } = res.locals.query as AnalysisRunQuery;
    const analysis = await findAnalysisRun(deps.db, { measurementId, version, fields });
    if (!analysis) {
      const [measurement] = await deps.db
        .select({ number: measurements.number })
        .from(measurements)
        .where(eq(measurements.id, measurementId));
      if (!measurement) throw new HttpError(HttpStatus.NOT_FOUND, 'No measurement has that id.');
      throw new HttpError(HttpStatus.NOT_FOUND, `Measurement ${measurement.number} has no analysis version ${version}.`);
    }
    const body: AnalysisRunResponse | AnalysisRunProgressResponse = { analysis: analysis as AnalysisRun };
    res.status(HttpStatus.OK).json(body);
  };
}
