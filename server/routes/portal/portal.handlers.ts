import type { Request, RequestHandler } from 'express';
import type { AppDeps } from '../../deps';
import { HttpError } from '../../http-error';
import { HttpStatus } from '../../http-status';
import { parseOrThrow } from '../../middleware/validate';
import { actorOf, signedInUser } from '../../services/catalogue-queries';
import { createWorkRequest } from '../../services/portal/create-work-request';
import { listClientOrders } from '../../services/portal/list-client-orders';
import type { PortalOrdersResponse } from '../../../shared/schemas/portal';
import { workRequestBody, type PortalOrdersQuery, type WorkRequestInput } from './portal.schemas';

/** A client account not (yet) attached to an organisation can see nothing and request nothing. */
function clientOrganisationOf(req: Request): string {
  const organisationId = signedInUser(req).organisation?.id;
  if (!organisationId) {
    throw new HttpError(HttpStatus.CONFLICT, 'Your account belongs to no client organisation; ask the laboratory to add you to one.');
  }
  return organisationId;
}

/** `lenses.2.nominalFocalLengthMm` → `lenses[2].nominalFocalLengthMm`, as the messages name it. */
function lensFieldKey(key: string): string {
  return key.replace(/^lenses\.(\d+)(?=\.|$)/, 'lenses[$1]');
}

/** validateBody for the request form, with each lens's fields named `lenses[i].field`. */
export const validateWorkRequest: RequestHandler = (req, res, next) => {
  try {
    res.locals.body = parseOrThrow(workRequestBody, req.body ?? {}, 'body');
  } catch (error) {
    if (!(error instanceof HttpError) || !error.fields) throw error;
    const fields = Object.fromEntries(Object.entries(error.fields).map(([key, message]) => [lensFieldKey(key), message]));
    const names = Object.keys(fields).filter((key) => key !== '_');
    throw new HttpError(error.status, names.length > 0 ? `Some fields need attention: ${names.join(', ')}.` : error.message, fields);
  }
  next();
};

export function getPortalOrders(deps: AppDeps): RequestHandler {
  return async (req, res) => {
    const query = res.locals.query as PortalOrdersQuery;
    const organisationId = signedInUser(req).organisation?.id;
    if (!organisationId) {
      const empty: PortalOrdersResponse = { organisation: null, items: [], total: 0, page: query.page, pageSize: query.pageSize };
      res.status(HttpStatus.OK).json(empty);
      return;
    }
    res.status(HttpStatus.OK).json(await listClientOrders(deps.db, organisationId, query));
  };
}

export function postWorkRequest(deps: AppDeps): RequestHandler {
  return async (req, res) => {
    const organisationId = clientOrganisationOf(req);
    const created = await createWorkRequest(deps.db, res.locals.body as WorkRequestInput, {
      actor: actorOf(req),
      organisationId,
      baseUrl: deps.env.PUBLIC_BASE_URL,
      todayIsoDate: new Date().toISOString().slice(0, 10),
    });
    res.status(HttpStatus.CREATED).json(created);
  };
}
