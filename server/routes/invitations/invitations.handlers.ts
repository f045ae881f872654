import type { RequestHandler } from 'express';
import type { AppDeps } from '../../deps';
import { HttpStatus } from '../../http-status';
import { actorOf } from '../../services/catalogue-queries';
import {
  acceptInvitation,
  createInvitation,
  listInvitations,
  readInvitationLink,
  resendInvitation,
  revokeInvitation,
} from '../../services/invitations/invitations';
import { signInPerson } from '../people/sign-in-person';
import type { AcceptInvitationBody, CreateInvitationBody, ListInvitationsQuery } from './invitations.schemas';

function invitationSettings(deps: AppDeps) {
  return { baseUrl: deps.env.PUBLIC_BASE_URL, expiryHours: deps.env.INVITATION_EXPIRY_HOURS };
}

async function oneInvitation(deps: AppDeps, invitationId: string) {
  const [invitation] = await listInvitations(deps.db, { invitationId });
  return invitation;
}

export function getInvitations(deps: AppDeps): RequestHandler {
  return async (_req, res) => {
    const query = res.locals.query as ListInvitationsQuery;
    res.status(HttpStatus.OK).json({ items: await listInvitations(deps.db, { state: query.state }) });
  };
}

export function postInvitation(deps: AppDeps): RequestHandler {
  return async (req, res) => {
    const id = await createInvitation(deps.db, res.locals.body as CreateInvitationBody, actorOf(req), invitationSettings(deps));
    res.status(HttpStatus.CREATED).json({ invitation: await oneInvitation(deps, id) });
  };
}

export function postInvitationRevoke(deps: AppDeps): RequestHandler {
  return async (req, res) => {
    const { invitationId } = res.locals.params as { invitationId: string };
    await revokeInvitation(deps.db, invitationId, actorOf(req));
    res.status(HttpStatus.OK).json({ invitation: await oneInvitation(deps, invitationId) });
  };
}

export function postInvitationResend(deps: AppDeps): RequestHandler {
  return async (req, res) => {
    const { invitationId } = res.locals.params as { invitationId: string };
    await resendInvitation(deps.db, invitationId, actorOf(req), invitationSettings(deps));
    res.status(HttpStatus.OK).json({ invitation: await oneInvitation(deps, invitationId) });
  };
}

export function getInvitationLink(deps: AppDeps): RequestHandler {
  return async (req, res) => {
    res.status(HttpStatus.OK).json({ invitation: await readInvitationLink(deps.db, String(req.params.token)) });
  };
}

export function postInvitationLink(deps: AppDeps): RequestHandler {
  return async (req, res) => {
    const { password } = res.locals.body as AcceptInvitationBody;
    const personId = await acceptInvitation(deps.db, deps.passwords, String(req.params.token), password, req.ip ?? null);
    res.status(HttpStatus.CREATED).json({ user: await signInPerson(deps, req, personId, 'invitation') });
  };
}
