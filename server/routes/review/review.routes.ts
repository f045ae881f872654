import { measurementIdParams } from '../../../shared/schemas/measurements';
import { returnMeasurementBody, reviewCommentBody, transitionRemarkBody } from '../../../shared/schemas/review';
import { validateBody, validateParams } from '../../middleware/validate';
import type { RouteDefinition } from '../route-definition';
import { getQueue, getReviewEntries, postApproval, postReturn, postReviewEntry, postSubmission } from './review.handlers';

export const reviewRoutes: RouteDefinition[] = [
  {
    method: 'post',
    path: '/api/measurements/:measurementId/submission',
    roles: ['technician'],
    summary: 'Submits an analysed (or returned) measurement with a succeeded analysis for review; optional remark.',
    handlers: (deps) => [validateParams(measurementIdParams), validateBody(transitionRemarkBody), postSubmission(deps)],
  },
  {
    method: 'post',
    path: '/api/measurements/:measurementId/approval',
    roles: ['reviewer', 'admin'],
    summary: 'Approves a submitted measurement; never by the person who performed or submitted it (four-eyes rule).',
    handlers: (deps) => [validateParams(measurementIdParams), validateBody(transitionRemarkBody), postApproval(deps)],
  },
  {
    method: 'post',
    path: '/api/measurements/:measurementId/return',
    roles: ['reviewer', 'admin'],
    summary: 'Returns a submitted measurement to the technician with a required comment; the technician is e-mailed.',
    handlers: (deps) => [validateParams(measurementIdParams), validateBody(returnMeasurementBody), postReturn(deps)],
  },
  {
    method: 'get',
    path: '/api/measurements/:measurementId/review-entries',
    roles: ['technician', 'reviewer', 'admin'],
    summary: 'The review thread of a measurement, oldest first: comments, submissions, returns and approvals.',
    handlers: (deps) => [validateParams(measurementIdParams), getReviewEntries(deps)],
  },
  {
    method: 'post',
    path: '/api/measurements/:measurementId/review-entries',
    roles: ['technician', 'reviewer', 'admin'],
    summary: 'Adds a comment to the review thread of a measurement.',
    handlers: (deps) => [validateParams(measurementIdParams), validateBody(reviewCommentBody), postReviewEntry(deps)],
  },
  {
    method: 'get',
    path: '/api/review-queue',
    roles: ['reviewer', 'admin'],
    summary: 'Submitted measurements, oldest first, and approved ones awaiting a certificate, with f ± U and waiting time.',
    handlers: (deps) => [getQueue(deps)],
  },
];
