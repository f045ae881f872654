import { validateBody, validateParams, validateQuery } from '../../middleware/validate';
import type { RouteDefinition } from '../route-definition';
import {
  deleteContactHandler,
  getOrganisation,
  getOrganisations,
  patchOrganisation,
  postContact,
  postOrganisation,
  putContact,
} from './organisations.handlers';
import { contactIdParams, listOrganisationsQuery, organisationIdParams, saveContactBody, saveOrganisationBody } from './organisations.schemas';

export const organisationRoutes: RouteDefinition[] = [
  {
    method: 'get',
    path: '/api/organisations',
    roles: ['technician', 'reviewer', 'admin'],
    summary: 'Organisations by name; ?kind=client|lab filters; ?include=counts adds contact, people and work-order counts.',
    handlers: (deps) => [validateQuery(listOrganisationsQuery), getOrganisations(deps)],
  },
  {
    method: 'post',
    path: '/api/organisations',
    roles: ['admin'],
    summary: 'Creates a client organisation (name; postal address, e-mail and phone optional).',
    handlers: (deps) => [validateBody(saveOrganisationBody), postOrganisation(deps)],
  },
  {
    method: 'get',
    path: '/api/organisations/:organisationId',
    roles: ['admin'],
    summary: 'One organisation with counts, contacts and the people who belong to it.',
    handlers: (deps) => [validateParams(organisationIdParams), getOrganisation(deps)],
  },
  {
    method: 'patch',
    path: '/api/organisations/:organisationId',
    roles: ['admin'],
    summary: 'Renames an organisation and changes its postal address, e-mail and phone (fields left out stay as they are).',
    handlers: (deps) => [validateParams(organisationIdParams), validateBody(saveOrganisationBody), patchOrganisation(deps)],
  },
  {
    method: 'post',
    path: '/api/organisations/:organisationId/contacts',
    roles: ['admin'],
    summary: 'Adds a contact (name, e-mail, position, phone, receives certificates).',
    handlers: (deps) => [validateParams(organisationIdParams), validateBody(saveContactBody), postContact(deps)],
  },
  {
    method: 'put',
    path: '/api/organisations/:organisationId/contacts/:contactId',
    roles: ['admin'],
    summary: 'Replaces a contact’s details.',
    handlers: (deps) => [validateParams(contactIdParams), validateBody(saveContactBody), putContact(deps)],
  },
  {
    method: 'delete',
    path: '/api/organisations/:organisationId/contacts/:contactId',
    roles: ['admin'],
    summary: 'Removes a contact.',
    handlers: (deps) => [validateParams(contactIdParams), deleteContactHandler(deps)],
  },
];
