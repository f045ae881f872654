import session from 'express-session';
import type { RequestHandler } from 'express';
import type { AppDeps } from '../deps';

export const SESSION_COOKIE_NAME = 'paraxia_session';
export const SESSION_MAX_AGE_MS = 12 * 60 * 60 * 1000;

declare module 'express-session' {
  interface SessionData {
    personId: string;
  }
}

export function sessionCookieOptions(deps: Pick<AppDeps, 'env'>) {
  return {
    httpOnly: true,
    sameSite: 'lax' as const,
    // Behind a TLS-terminating proxy this relies on `trust proxy` (TRUST_PROXY).
    secure: deps.env.NODE_ENV === 'production',
    path: '/',
  };
}

export function sessionMiddleware(deps: Pick<AppDeps, 'env' | 'sessionStore'>): RequestHandler {
  return session({
    name: SESSION_COOKIE_NAME,
    secret: deps.env.SESSION_SECRET,
    store: deps.sessionStore,
    resave: false,
    saveUninitialized: false,
    cookie: { ...sessionCookieOptions(deps), maxAge: SESSION_MAX_AGE_MS },
  });
}

export function regenerateSession(req: Express.Request): Promise<void> {
  return new Promise((resolve, reject) => req.session.regenerate((error) => (error ? reject(error) : resolve())));
}

export function saveSession(req: Express.Request): Promise<void> {
  return new Promise((resolve, reject) => req.session.save((error) => (error ? reject(error) : resolve())));
}

export function destroySession(req: Express.Request): Promise<void> {
  return new Promise((resolve, reject) => req.session.destroy((error) => (error ? reject(error) : resolve())));
}
