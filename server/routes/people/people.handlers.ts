import type { RequestHandler } from 'express';
import type { AppDeps } from '../../deps';
import { HttpStatus } from '../../http-status';
import { actorOf } from '../../services/catalogue-queries';
import { changePersonRoles } from '../../services/people/change-person-roles';
import { listPeoplePage } from '../../services/people/list-people-page';
import { completePasswordReset, readPasswordResetLink, requestPasswordReset } from '../../services/people/password-resets';
import { setPersonActive } from '../../services/people/set-person-active';
import type { ChangeRolesBody, CompletePasswordResetBody, ListPeopleQuery, RequestPasswordResetBody } from './people.schemas';
import { signInPerson } from './sign-in-person';

function resetSettings(deps: AppDeps) {
  return { baseUrl: deps.env.PUBLIC_BASE_URL, expiryMinutes: deps.env.PASSWORD_RESET_EXPIRY_MINUTES };
}

async function personAnswer(deps: AppDeps, personId: string) {
  const page = await listPeoplePage(deps.db, { q: undefined, page: 1, pageSize: undefined }, { personId });
  return page.people[0] ?? null;
}

export function getPeople(deps: AppDeps): RequestHandler {
  return async (_req, res) => {
    res.status(HttpStatus.OK).json(await listPeoplePage(deps.db, res.locals.query as ListPeopleQuery));
  };
}

export function putPersonRoles(deps: AppDeps): RequestHandler {
  return async (req, res) => {
    const { personId } = res.locals.params as { personId: string };
    await changePersonRoles(deps.db, personId, (res.locals.body as ChangeRolesBody).roles, actorOf(req));
    res.status(HttpStatus.OK).json({ person: await personAnswer(deps, personId) });
  };
}

export function postPersonActive(deps: AppDeps, active: boolean): RequestHandler {
  return async (req, res) => {
    const { personId } = res.locals.params as { personId: string };
    await setPersonActive(deps.db, personId, active, actorOf(req));
    res.status(HttpStatus.OK).json({ person: await personAnswer(deps, personId) });
  };
}

export function postPersonPasswordReset(deps: AppDeps): RequestHandler {
  return async (req, res) => {
    const { personId } = res.locals.params as { personId: string };
    const actor = actorOf(req);
    await requestPasswordReset(deps.db, { personId }, { actorId: actor.actorId, ip: actor.ip ?? null }, resetSettings(deps));
    res.status(HttpStatus.ACCEPTED).json({ message: 'A link to choose a new password is on its way to this person.' });
  };
}

export const FORGOT_PASSWORD_ANSWER = 'If this address belongs to an active account, a link to choose a new password is on its way. It expires soon; check your inbox.';

export function postPasswordResetRequest(deps: AppDeps): RequestHandler {
  return async (req, res) => {
    const { email } = res.locals.body as RequestPasswordResetBody;
    await requestPasswordReset(deps.db, { email }, { actorId: null, ip: req.ip ?? null }, resetSettings(deps));
    res.status(HttpStatus.ACCEPTED).json({ message: FORGOT_PASSWORD_ANSWER });
  };
}

export function getPasswordResetLink(deps: AppDeps): RequestHandler {
  return async (req, res) => {
    const token = String(req.params.token);
    res.status(HttpStatus.OK).json({ passwordReset: await readPasswordResetLink(deps.db, token) });
  };
}

export function postPasswordResetLink(deps: AppDeps): RequestHandler {
  return async (req, res) => {
    const token = String(req.params.token);
    const { password } = res.locals.body as CompletePasswordResetBody;
    const personId = await completePasswordReset(deps.db, deps.passwords, token, password, req.ip ?? null);
    res.status(HttpStatus.OK).json({ user: await signInPerson(deps, req, personId, 'password-reset') });
  };
}
