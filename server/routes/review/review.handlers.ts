import type { RequestHandler } from 'express';
import type { ReturnMeasurementInput, ReviewCommentInput, TransitionRemarkInput } from '../../../shared/schemas/review';
import type { AppDeps } from '../../deps';
import { HttpStatus } from '../../http-status';
import { actorOf } from '../../services/catalogue-queries';
import { todayIsoDate } from '../../services/equipment';
import { getMeasurementDetail } from '../../services/measurements';
import { approveMeasurement } from '../../services/review/approve-measurement';
import { returnMeasurement } from '../../services/review/return-measurement';
import { addReviewComment, listReviewEntries } from '../../services/review/review-entries';
import { getReviewQueue } from '../../services/review/review-queue';
import { submitMeasurement } from '../../services/review/submit-measurement';

interface MeasurementIdParams {
  measurementId: string;
}

async function answerWithMeasurement(deps: AppDeps, res: Parameters<RequestHandler>[1], measurementId: string): Promise<void> {
  res.status(HttpStatus.OK).json({ measurement: await getMeasurementDetail(deps.db, measurementId, todayIsoDate()) });
}

export function postSubmission(deps: AppDeps): RequestHandler {
  return async (req, res) => {
    const { measurementId } = res.locals.params as MeasurementIdParams;
    await submitMeasurement(deps.db, measurementId, actorOf(req), (res.locals.body as TransitionRemarkInput).remark);
    await answerWithMeasurement(deps, res, measurementId);
  };
}

export function postApproval(deps: AppDeps): RequestHandler {
  return async (req, res) => {
    const { measurementId } = res.locals.params as MeasurementIdParams;
    await approveMeasurement(deps.db, measurementId, actorOf(req), (res.locals.body as TransitionRemarkInput).remark);
    await answerWithMeasurement(deps, res, measurementId);
  };
}

export function postReturn(deps: AppDeps): RequestHandler {
  return async (req, res) => {
    const { measurementId } = res.locals.params as MeasurementIdParams;
    await returnMeasurement(deps.db, measurementId, actorOf(req), (res.locals.body as ReturnMeasurementInput).comment, deps.env.PUBLIC_BASE_URL);
    await answerWithMeasurement(deps, res, measurementId);
  };
}

export function getReviewEntries(deps: AppDeps): RequestHandler {
  return async (_req, res) => {
    const { measurementId } = res.locals.params as MeasurementIdParams;
    res.status(HttpStatus.OK).json({ entries: await listReviewEntries(deps.db, measurementId) });
  };
}

export function postReviewEntry(deps: AppDeps): RequestHandler {
  return async (req, res) => {
    const { measurementId } = res.locals.params as MeasurementIdParams;
    const id = await addReviewComment(deps.db, measurementId, actorOf(req), (res.locals.body as ReviewCommentInput).body);
    const entries = await listReviewEntries(deps.db, measurementId);
    res.status(HttpStatus.CREATED).json({ entry: entries.find((entry) => entry.id === id) });
  };
}

export function getQueue(deps: AppDeps): RequestHandler {
  return async (_req, res) => {
    res.status(HttpStatus.OK).json(await getReviewQueue(deps.db, new Date()));
  };
}
