import type { RequestHandler } from 'express';
import { rateLimit, ipKeyGenerator } from 'express-rate-limit';
import type { AppDeps } from '../../deps';
import { HttpError, type ApiErrorBody } from '../../http-error';
import { HttpStatus } from '../../http-status';
import { destroySession, regenerateSession, saveSession, SESSION_COOKIE_NAME, sessionCookieOptions } from '../../middleware/session';
import { recordAuditEvent } from '../../services/audit-log';
import { findPersonByEmail, normaliseEmail, toSessionUser } from '../../services/people';
import { recordSignIn } from '../../services/people/record-sign-in';
import type { SignInBody } from './auth.schemas';

export const SIGN_IN_FAILED_MESSAGE = 'That e-mail and password do not match an active account.';

/** Counts failed sign-ins per client address and e-mail address; a
 * successful sign-in does not use up an attempt. */
export function signInRateLimit(deps: Pick<AppDeps, 'env'>): RequestHandler {
  const windowMinutes = Math.ceil(deps.env.SIGN_IN_RATE_LIMIT_WINDOW_MS / 60_000);
  return rateLimit({
    windowMs: deps.env.SIGN_IN_RATE_LIMIT_WINDOW_MS,
    limit: deps.env.SIGN_IN_RATE_LIMIT_MAX,
    skipSuccessfulRequests: true,
    standardHeaders: 'draft-8',
    legacyHeaders: false,
    keyGenerator: (req) => {
      const email = typeof req.body?.email === 'string' ? normaliseEmail(req.body.email) : '';
      return `${ipKeyGenerator(req.ip ?? 'unknown')}|${email}`;
    },
    handler: (_req, res) => {
      const body: ApiErrorBody = {
        error: { message: `Too many failed sign-in attempts for this address; wait ${windowMinutes} minute(s) and try again.` },
      };
      res.status(HttpStatus.TOO_MANY_REQUESTS).json(body);
    },
  });
}

export function signIn(deps: AppDeps): RequestHandler {
  return async (req, res) => {
    const { email, password } = res.locals.body as SignInBody;
    const person = await findPersonByEmail(deps.db, email);
    const passwordMatches = await deps.passwords.verify(password, person?.passwordHash ?? null);

    if (!person || !passwordMatches || !person.active) {
      const reason = !person ? 'unknown-email' : !passwordMatches ? 'wrong-password' : 'inactive-account';
      await recordAuditEvent(deps.db, {
        actorId: null,
        action: 'auth.sign-in-failed',
        subjectType: person ? 'person' : undefined,
        subjectId: person?.id,
        details: { email: normaliseEmail(email), reason },
        ip: req.ip,
      });
      throw new HttpError(HttpStatus.UNAUTHORIZED, SIGN_IN_FAILED_MESSAGE);
    }

    // A fresh session id at sign-in, so an id planted before sign-in is worthless.
    await regenerateSession(req);
    req.session.personId = person.id;
    await saveSession(req);
    await recordSignIn(deps.db, person.id);
    await recordAuditEvent(deps.db, {
      actorId: person.id,
      action: 'auth.sign-in',
      subjectType: 'person',
      subjectId: person.id,
      ip: req.ip,
    });
    res.status(HttpStatus.OK).json({ user: toSessionUser(person) });
  };
}

export function signOut(deps: AppDeps): RequestHandler {
  return async (req, res) => {
    const personId = req.session?.personId;
    if (req.session) await destroySession(req);
    res.clearCookie(SESSION_COOKIE_NAME, sessionCookieOptions(deps));
    if (personId) {
      await recordAuditEvent(deps.db, { actorId: personId, action: 'auth.sign-out', subjectType: 'person', subjectId: personId, ip: req.ip });
    }
    res.status(HttpStatus.NO_CONTENT).end();
  };
}

export const getCurrentUser: RequestHandler = (req, res) => {
  res.status(HttpStatus.OK).json({ user: req.user });
};
