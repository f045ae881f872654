import type { RequestHandler } from 'express';
import type { AppDeps } from '../../deps';
import { HttpStatus } from '../../http-status';
import { partNumberSpread } from '../../services/part-number-spread';
import type { PartNumberParams, PartNumberSpreadQuery } from './part-numbers.schemas';

export function getPartNumberSpread(deps: AppDeps): RequestHandler {
  return async (_req, res) => {
    const { partNumber } = res.locals.params as PartNumberParams;
    const query = res.locals.query as PartNumberSpreadQuery;
    res.status(HttpStatus.OK).json(await partNumberSpread(deps.db, partNumber, { organisationId: query.organisationId }));
  };
}
