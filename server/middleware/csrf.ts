import { randomBytes, timingSafeEqual } from 'node:crypto';
import type { RequestHandler } from 'express';
import { HttpError } from '../http-error';
import { HttpStatus } from '../http-status';
import { readCookie } from './cookies';

export const CSRF_COOKIE_NAME = 'paraxia_csrf';
export const CSRF_HEADER_NAME = 'x-csrf-token';
export const CSRF_MISSING_MESSAGE = 'This request is missing its CSRF token; reload the page and try again.';

const STATE_CHANGING_METHODS = new Set(['POST', 'PUT', 'PATCH', 'DELETE']);

/** Gives every browser a random token cookie that page scripts can read
 * (double-submit pattern; OWASP CSRF Prevention Cheat Sheet). */
export function issueCsrfCookie(options: { secure: boolean }): RequestHandler {
  return (req, res, next) => {
    if (!readCookie(req, CSRF_COOKIE_NAME)) {
      const token = randomBytes(32).toString('base64url');
      res.cookie(CSRF_COOKIE_NAME, token, { httpOnly: false, sameSite: 'strict', secure: options.secure, path: '/' });
    }
    next();
  };
}

function sameToken(a: string, b: string): boolean {
  const left = Buffer.from(a);
  const right = Buffer.from(b);
  return left.length === right.length && timingSafeEqual(left, right);
}

/** A state-changing request must echo the cookie in the x-csrf-token header:
 * another site can make the browser send the cookie but cannot read it. */
export const requireCsrfToken: RequestHandler = (req, _res, next) => {
  if (!STATE_CHANGING_METHODS.has(req.method)) return next();
  const cookieToken = readCookie(req, CSRF_COOKIE_NAME);
  const headerToken = req.get(CSRF_HEADER_NAME);
  if (!cookieToken || !headerToken || !sameToken(cookieToken, headerToken)) {
    return next(new HttpError(HttpStatus.FORBIDDEN, CSRF_MISSING_MESSAGE));
  }
  next();
};
