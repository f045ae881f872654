import type { RequestHandler } from 'express';
import type { Role } from '../db/schema';
import { HttpError } from '../http-error';
import { HttpStatus } from '../http-status';

export const SIGN_IN_REQUIRED_MESSAGE = 'You need to sign in to do this.';

export const requireSignedIn: RequestHandler = (req, _res, next) => {
  if (!req.user) return next(new HttpError(HttpStatus.UNAUTHORIZED, SIGN_IN_REQUIRED_MESSAGE));
  next();
};

/** Lets through a signed-in person holding at least one of `roles`. */
export function requireRole(...roles: Role[]): RequestHandler {
  const allowed = new Set(roles);
  return (req, _res, next) => {
    if (!req.user) return next(new HttpError(HttpStatus.UNAUTHORIZED, SIGN_IN_REQUIRED_MESSAGE));
    if (!req.user.roles.some((role) => allowed.has(role))) {
      return next(
        new HttpError(HttpStatus.FORBIDDEN, `Your account does not have a role allowed to do this (needs: ${roles.join(' or ')}).`),
      );
    }
    next();
  };
}
