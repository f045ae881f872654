import type { RequestHandler } from 'express';
import type { AppDeps } from '../deps';
import { findPersonById, toSessionUser, type SessionUser } from '../services/people';
import { destroySession } from './session';

declare global {
  // eslint-disable-next-line @typescript-eslint/no-namespace
  namespace Express {
    interface Request {
      /** The signed-in person, loaded fresh on every API request. */
      user?: SessionUser;
    }
  }
}

/** Reloads the person on every request, so that deactivating an account or
 * changing its roles takes effect on sessions already open. */
export function loadSessionUser(deps: Pick<AppDeps, 'db'>): RequestHandler {
  return async (req, _res, next) => {
    const personId = req.session?.personId;
    if (!personId) return next();
    const person = await findPersonById(deps.db, personId);
    if (!person || !person.active) {
      await destroySession(req);
      return next();
    }
    req.user = toSessionUser(person);
    next();
  };
}
