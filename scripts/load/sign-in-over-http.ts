/** A browser-like session over plain HTTP: the CSRF cookie from a first GET, then the real sign-in. */
import { CSRF_COOKIE_NAME, CSRF_HEADER_NAME } from '../../server/middleware/csrf';
import { SESSION_COOKIE_NAME } from '../../server/middleware/session';

export interface HttpSession {
  /** The Cookie header to send: CSRF and session cookies. */
  cookie: string;
  csrfToken: string;
}

function cookieValue(response: Response, name: string): string | undefined {
  for (const line of response.headers.getSetCookie()) {
    const [pair] = line.split(';');
    const separator = pair.indexOf('=');
    if (pair.slice(0, separator).trim() === name) return pair.slice(separator + 1);
  }
  return undefined;
}

export async function signInOverHttp(baseUrl: string, person: { email: string; password: string }): Promise<HttpSession> {
  const first = await fetch(`${baseUrl}/api/health`);
  await first.arrayBuffer();
  const csrfToken = cookieValue(first, CSRF_COOKIE_NAME);
  if (!csrfToken) throw new Error(`${baseUrl} set no ${CSRF_COOKIE_NAME} cookie on the first request.`);
  const signIn = await fetch(`${baseUrl}/api/auth/sign-in`, {
    method: 'POST',
    headers: { 'content-type': 'application/json', cookie: `${CSRF_COOKIE_NAME}=${csrfToken}`, [CSRF_HEADER_NAME]: decodeURIComponent(csrfToken) },
    body: JSON.stringify({ email: person.email, password: person.password }),
  });
  const body = await signIn.text();
  const session = cookieValue(signIn, SESSION_COOKIE_NAME);
  if (signIn.status !== 200 || !session) throw new Error(`Signing in ${person.email} failed with ${signIn.status}: ${body}`);
  return { cookie: `${CSRF_COOKIE_NAME}=${csrfToken}; ${SESSION_COOKIE_NAME}=${session}`, csrfToken: decodeURIComponent(csrfToken) };
}

/** POST with the session's cookies and CSRF header; returns status and parsed body. */
export async function postAsSession(baseUrl: string, session: HttpSession, path: string, body: unknown): Promise<{ status: number; body: any }> {
  const response = await fetch(`${baseUrl}${path}`, {
    method: 'POST',
    headers: { 'content-type': 'application/json', cookie: session.cookie, [CSRF_HEADER_NAME]: session.csrfToken },
    body: JSON.stringify(body),
  });
  const text = await response.text();
  return { status: response.status, body: text ? JSON.parse(text) : null };
}

export async function getAsSession(baseUrl: string, session: HttpSession, path: string): Promise<{ status: number; body: any }> {
  const response = await fetch(`${baseUrl}${path}`, { headers: { cookie: session.cookie } });
  const text = await response.text();
  return { status: response.status, body: text ? JSON.parse(text) : null };
}
