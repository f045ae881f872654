import type { Express } from 'express';
import request from 'supertest';
import { CSRF_COOKIE_NAME, CSRF_HEADER_NAME } from '../../server/middleware/csrf';
import { SESSION_COOKIE_NAME } from '../../server/middleware/session';
import type { SessionUser } from '../../server/services/people';
import { createTestPerson, type TestPerson } from './people';
import type { Role } from '../../server/db/schema';
import type { TestApp } from './test-app';

export type Agent = request.Agent;

export interface BrowserSession {
  /** Keeps cookies between requests, like a browser. */
  agent: Agent;
  /** The double-submit token; send it as x-csrf-token on POST/PUT/PATCH/DELETE. */
  csrfToken: string;
}

export interface SignedInSession extends BrowserSession {
  person: TestPerson;
  user: SessionUser;
  /** The session cookie's value as set at sign-in. */
  sessionCookie: string;
}

/** Value of cookie `name` in a response's Set-Cookie headers, if set. */
export function cookieFromResponse(response: request.Response, name: string): string | undefined {
  const header = response.headers['set-cookie'] as unknown as string[] | string | undefined;
  const lines = Array.isArray(header) ? header : header ? [header] : [];
  for (const line of lines) {
    const [pair] = line.split(';');
    const separator = pair.indexOf('=');
    if (pair.slice(0, separator).trim() === name) return decodeURIComponent(pair.slice(separator + 1));
  }
  return undefined;
}

/** An anonymous browser: one GET gives it the CSRF cookie, as loading the page would. */
export async function startBrowserSession(app: Express): Promise<BrowserSession> {
  const agent = request.agent(app);
  const response = await agent.get('/api/auth/me');
  const csrfToken = cookieFromResponse(response, CSRF_COOKIE_NAME);
  if (!csrfToken) throw new Error('The app did not set the CSRF cookie on the first request.');
  return { agent, csrfToken };
}

/** Signs `person` in through the real sign-in endpoint. */
export async function signInAs(app: Express, person: TestPerson, session?: BrowserSession): Promise<SignedInSession> {
  const browser = session ?? (await startBrowserSession(app));
  const response = await browser.agent
    .post('/api/auth/sign-in')
    .set(CSRF_HEADER_NAME, browser.csrfToken)
    .send({ email: person.email, password: person.password });
  if (response.status !== 200) {
    throw new Error(`Signing in ${person.email} failed with ${response.status}: ${JSON.stringify(response.body)}`);
  }
  const sessionCookie = cookieFromResponse(response, SESSION_COOKIE_NAME);
  if (!sessionCookie) throw new Error(`Signing in ${person.email} set no ${SESSION_COOKIE_NAME} cookie.`);
  return { ...browser, person, user: response.body.user as SessionUser, sessionCookie };
}

/** A new person with `roles` (unique e-mail), signed in; the usual start of a role test. */
export async function signedInWithRoles(
  testApp: TestApp,
  roles: Role[],
  options: { organisationId?: string | null } = {},
): Promise<SignedInSession> {
  const person = await createTestPerson(testApp.deps, { roles, organisationId: options.organisationId });
  return signInAs(testApp.app, person);
}
