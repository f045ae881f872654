/**
 * Turning a row of the route table into a request the handlers can run:
 * every `:param` gets a fresh, well-formed value that matches no record, so
 * an allowed caller reaches the handler (and gets 404 or 400), while the
 * access check alone decides 401 and 403.
 */
import { randomBytes, randomUUID } from 'node:crypto';
import type request from 'supertest';
import type { Role } from '../../server/db/schema';
import { CSRF_HEADER_NAME } from '../../server/middleware/csrf';
import type { RouteSpec } from '../../server/routes/route-definition';

export const STATE_CHANGING_METHODS: readonly RouteSpec['method'][] = ['post', 'put', 'patch', 'delete'];

export function routeName(route: Pick<RouteSpec, 'method' | 'path'>): string {
  return `${route.method.toUpperCase()} ${route.path}`;
}

/** A value for one path parameter that looks real to its validator. */
export function sampleParamValue(name: string): string {
  if (/id$/i.test(name)) return randomUUID();
  if (/version|number|revision|index|position/i.test(name)) return '1';
  if (/partNumber/i.test(name)) return `PCX-${randomBytes(4).toString('hex')}`;
  // Verification codes, invitation and reset tokens: long random text that matches nothing.
  return randomBytes(16).toString('hex');
}

export function concretePath(route: Pick<RouteSpec, 'path'>): string {
  return route.path.replace(/:([A-Za-z_]+)/g, (_match, name: string) => encodeURIComponent(sampleParamValue(name)));
}

/** True when `role` may call the route according to the table. */
export function roleIsAllowed(route: RouteSpec, role: Role): boolean {
  if (route.roles === 'public' || route.roles === 'signed-in') return true;
  return route.roles.includes(role);
}

export interface CallOptions {
  /** The CSRF header to send: the session's token (default), a wrong one, or none. */
  csrf?: 'right' | 'wrong' | 'none';
}

/** The same length as `token`, differing in its last character. */
export function wrongToken(token: string): string {
  return `${token.slice(0, -1)}${token.endsWith('A') ? 'B' : 'A'}`;
}

/** Sends the route's method to a concrete path, with an empty JSON body for state-changing methods. */
export function callRoute(session: { agent: request.Agent; csrfToken: string }, route: RouteSpec, options: CallOptions = {}) {
  const call = session.agent[route.method](concretePath(route));
  if (!STATE_CHANGING_METHODS.includes(route.method)) return call;
  const csrf = options.csrf ?? 'right';
  if (csrf === 'right') call.set(CSRF_HEADER_NAME, session.csrfToken);
  if (csrf === 'wrong') call.set(CSRF_HEADER_NAME, wrongToken(session.csrfToken));
  return call.send({});
}
