import type { RequestHandler } from 'express';
import type { AppDeps } from '../../deps';
import { HttpStatus } from '../../http-status';
import { actorOf } from '../../services/catalogue-queries';
import {
  createClientOrganisation,
  createContact,
  deleteContact,
  getOrganisationDetail,
  listOrganisationsWithCounts,
  updateOrganisation,
  updateContact,
} from '../../services/organisations/organisations';
import { listOrganisations } from '../../services/work-orders';
import type { ListOrganisationsQuery, SaveContactBody, SaveOrganisationBody } from './organisations.schemas';

export function getOrganisations(deps: AppDeps): RequestHandler {
  return async (_req, res) => {
    const query = res.locals.query as ListOrganisationsQuery;
    const items =
      query.include === 'counts'
        ? await listOrganisationsWithCounts(deps.db, { kind: query.kind })
        : await listOrganisations(deps.db, { kind: query.kind });
    res.status(HttpStatus.OK).json({ items });
  };
}

export function getOrganisation(deps: AppDeps): RequestHandler {
  return async (_req, res) => {
    const { organisationId } = res.locals.params as { organisationId: string };
    res.status(HttpStatus.OK).json({ organisation: await getOrganisationDetail(deps.db, organisationId) });
  };
}

export function postOrganisation(deps: AppDeps): RequestHandler {
  return async (req, res) => {
    const id = await createClientOrganisation(deps.db, res.locals.body as SaveOrganisationBody, actorOf(req));
    res.status(HttpStatus.CREATED).json({ organisation: await getOrganisationDetail(deps.db, id) });
  };
}

export function patchOrganisation(deps: AppDeps): RequestHandler {
  return async (req, res) => {
    const { organisationId } = res.locals.params as { organisationId: string };
    await updateOrganisation(deps.db, organisationId, res.locals.body as SaveOrganisationBody, actorOf(req));
    res.status(HttpStatus.OK).json({ organisation: await getOrganisationDetail(deps.db, organisationId) });
  };
}

export function postContact(deps: AppDeps): RequestHandler {
  return async (req, res) => {
    const { organisationId } = res.locals.params as { organisationId: string };
    res.status(HttpStatus.CREATED).json({ contact: await createContact(deps.db, organisationId, res.locals.body as SaveContactBody, actorOf(req)) });
  };
}

export function putContact(deps: AppDeps): RequestHandler {
  return async (req, res) => {
    const { organisationId, contactId } = res.locals.params as { organisationId: string; contactId: string };
    res.status(HttpStatus.OK).json({ contact: await updateContact(deps.db, organisationId, contactId, res.locals.body as SaveContactBody, actorOf(req)) });
  };
}

export function deleteContactHandler(deps: AppDeps): RequestHandler {
  return async (req, res) => {
    const { organisationId, contactId } = res.locals.params as { organisationId: string; contactId: string };
    await deleteContact(deps.db, organisationId, contactId, actorOf(req));
    res.status(HttpStatus.NO_CONTENT).end();
  };
}
