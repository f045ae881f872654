import type { Request } from 'express';
import { regenerateSession, saveSession } from '../../middleware/session';
import { recordSignIn } from '../../services/people/record-sign-in';
import { findPersonById, toSessionUser, type SessionUser } from '../../services/people';
import type { AppDeps } from '../../deps';
import { recordAuditEvent } from '../../services/audit-log';
import { invariant } from '../../invariant';

/** Starts a fresh session for a person who just proved who they are by a one-time link. */
export async function signInPerson(deps: AppDeps, req: Request, personId: string, how: 'invitation' | 'password-reset'): Promise<SessionUser> {
  const person = await findPersonById(deps.db, personId);
  invariant(person, 'the person a link was just used for must exist');
  await regenerateSession(req);
  req.session.personId = person.id;
  await saveSession(req);
  await recordSignIn(deps.db, person.id);
  await recordAuditEvent(deps.db, { actorId: person.id, action: 'auth.sign-in', subjectType: 'person', subjectId: person.id, details: { via: how }, ip: req.ip });
  return toSessionUser(person);
}
