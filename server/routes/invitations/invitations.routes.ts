import { validateBody, validateParams, validateQuery } from '../../middleware/validate';
import type { RouteDefinition } from '../route-definition';
import {
  getInvitationLink,
  getInvitations,
  postInvitation,
  postInvitationLink,
  postInvitationResend,
  postInvitationRevoke,
} from './invitations.handlers';
import { acceptInvitationBody, createInvitationBody, invitationIdParams, listInvitationsQuery } from './invitations.schemas';

export const invitationRoutes: RouteDefinition[] = [
  {
    method: 'get',
    path: '/api/invitations',
    roles: ['admin'],
    summary: 'Invitations newest first; ?state=pending|used|expired|revoked.',
    handlers: (deps) => [validateQuery(listInvitationsQuery), getInvitations(deps)],
  },
  {
    method: 'post',
    path: '/api/invitations',
    roles: ['admin'],
    summary: 'Invites a person by e-mail with roles (and a client organisation); queues the one-time link.',
    handlers: (deps) => [validateBody(createInvitationBody), postInvitation(deps)],
  },
  {
    method: 'post',
    path: '/api/invitations/:invitationId/revoke',
    roles: ['admin'],
    summary: 'Withdraws an unused invitation; its link stops working.',
    handlers: (deps) => [validateParams(invitationIdParams), postInvitationRevoke(deps)],
  },
  {
    method: 'post',
    path: '/api/invitations/:invitationId/resend',
    roles: ['admin'],
    summary: 'Sends a fresh link with a new expiry; the old link stops working.',
    handlers: (deps) => [validateParams(invitationIdParams), postInvitationResend(deps)],
  },
  {
    method: 'get',
    path: '/api/invitation-links/:token',
    roles: 'public',
    summary: 'Who an invitation link is for (name, e-mail, lab); 410 when used, withdrawn or expired.',
    handlers: (deps) => [getInvitationLink(deps)],
  },
  {
    method: 'post',
    path: '/api/invitation-links/:token',
    roles: 'public',
    summary: 'Accepts an invitation: chooses the password, creates the account and signs it in.',
    handlers: (deps) => [validateBody(acceptInvitationBody), postInvitationLink(deps)],
  },
];
