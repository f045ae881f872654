import type { RequestHandler } from 'express';
import type { Role } from '../db/schema';
import type { AppDeps } from '../deps';

export type HttpMethod = 'get' | 'post' | 'put' | 'patch' | 'delete';

/** Who may call a route: anyone, any signed-in person, or holders of one of the roles. */
export type RouteAccess = 'public' | 'signed-in' | readonly Role[];

/** What the route table says about a route; enough to enumerate routes × roles. */
export interface RouteSpec {
  method: HttpMethod;
  /** Full Express path, e.g. `/api/people/:personId`. */
  path: string;
  roles: RouteAccess;
  summary: string;
}

export interface RouteDefinition extends RouteSpec {
  /** Validators and the handler, run after the access check that `roles` implies. */
  handlers: (deps: AppDeps) => RequestHandler[];
}
