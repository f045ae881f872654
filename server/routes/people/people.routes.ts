import { validateBody, validateParams, validateQuery } from '../../middleware/validate';
import type { RouteDefinition } from '../route-definition';
import {
  getPasswordResetLink,
  getPeople,
  postPasswordResetLink,
  postPasswordResetRequest,
  postPersonActive,
  postPersonPasswordReset,
  putPersonRoles,
} from './people.handlers';
import { passwordResetRateLimit } from './password-reset-rate-limit';
import {
  changeRolesBody,
  completePasswordResetBody,
  listPeopleQuery,
  personIdParams,
  requestPasswordResetBody,
} from './people.schemas';

export const peopleRoutes: RouteDefinition[] = [
  {
    method: 'get',
    path: '/api/people',
    roles: ['admin'],
    summary: 'People with roles, organisation and last sign-in; ?q= name or e-mail, ?role=, ?active=true|false, ?page=&pageSize=.',
    handlers: (deps) => [validateQuery(listPeopleQuery), getPeople(deps)],
  },
  {
    method: 'put',
    path: '/api/people/:personId/roles',
    roles: ['admin'],
    summary: 'Replaces a person’s roles (the last active admin keeps the admin role).',
    handlers: (deps) => [validateParams(personIdParams), validateBody(changeRolesBody), putPersonRoles(deps)],
  },
  {
    method: 'post',
    path: '/api/people/:personId/deactivate',
    roles: ['admin'],
    summary: 'Deactivates a person and ends their sessions at once (never the last active admin).',
    handlers: (deps) => [validateParams(personIdParams), postPersonActive(deps, false)],
  },
  {
    method: 'post',
    path: '/api/people/:personId/reactivate',
    roles: ['admin'],
    summary: 'Lets a deactivated person sign in again.',
    handlers: (deps) => [validateParams(personIdParams), postPersonActive(deps, true)],
  },
  {
    method: 'post',
    path: '/api/people/:personId/password-reset',
    roles: ['admin'],
    summary: 'E-mails the person a one-time link to choose a new password (202).',
    handlers: (deps) => [validateParams(personIdParams), postPersonPasswordReset(deps)],
  },
  {
    method: 'post',
    path: '/api/password-reset-requests',
    roles: 'public',
    summary: '"Forgot your password?": always 202 whatever the address; rate-limited per address and IP.',
    handlers: (deps) => [passwordResetRateLimit(deps), validateBody(requestPasswordResetBody), postPasswordResetRequest(deps)],
  },
  {
    method: 'get',
    path: '/api/password-reset-links/:token',
    roles: 'public',
    summary: 'Whose password a reset link is for; 410 when used or expired.',
    handlers: (deps) => [getPasswordResetLink(deps)],
  },
  {
    method: 'post',
    path: '/api/password-reset-links/:token',
    roles: 'public',
    summary: 'Sets the new password, ends the person’s other sessions and signs this browser in.',
    handlers: (deps) => [validateBody(completePasswordResetBody), postPasswordResetLink(deps)],
  },
];
