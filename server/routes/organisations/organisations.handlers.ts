import type { RequestHandler } from 'express';
import type { AppDeps } from '../../deps';
import { HttpStatus } from '../../http-status';
import { listOrganisations } from '../../services/work-orders';
import type { ListOrganisationsQuery } from './organisations.schemas';

export function getOrganisations(deps: AppDeps): RequestHandler {
  return async (_req, res) => {
    const query = res.locals.query as ListOrganisationsQuery;
    res.status(HttpStatus.OK).json({ items: await listOrganisations(deps.db, { kind: query.kind }) });
  };
}
