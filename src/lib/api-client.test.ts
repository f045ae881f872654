import { describe, expect, it } from 'vitest';
import {
  ApiError,
  createApiClient,
  CSRF_HEADER_NAME,
  parseRetryAfterSeconds,
  readCookie,
} from '@/lib/api-client';

interface RecordedCall {
  url: string;
  init: RequestInit;
}

function jsonResponse(status: number, body: unknown, headers: Record<string, string> = {}): Response {
  return new Response(body === undefined ? null : JSON.stringify(body), {
    status,
    headers: { 'content-type': 'application/json', ...headers },
  });
}

function fakeServer(answer: (call: RecordedCall) => Response | Promise<Response>) {
  const calls: RecordedCall[] = [];
  const fetch = (async (input: RequestInfo | URL, init: RequestInit = {}) => {
    const call = { url: String(input), init };
    calls.push(call);
    return answer(call);
  }) as typeof globalThis.fetch;
  return { calls, fetch };
}

function headerOf(call: RecordedCall, name: string): string | undefined {
  return (call.init.headers as Record<string, string> | undefined)?.[name];
}

describe('readCookie', () => {
  it('readCookie finds one cookie among several and decodes it', () => {
    expect(readCookie('a=1; paraxia_csrf=abc%3D%3D; b=2', 'paraxia_csrf')).toBe('abc==');
    expect(readCookie('a=1; xparaxia_csrf=zzz', 'paraxia_csrf')).toBeNull();
    expect(readCookie('', 'paraxia_csrf')).toBeNull();
  });
});

describe('parseRetryAfterSeconds', () => {
  it('parseRetryAfterSeconds reads both delta-seconds and an HTTP date (RFC 9110 §10.2.3)', () => {
    const now = Date.parse('2026-03-01T10:00:00Z');
    expect(parseRetryAfterSeconds('120', now)).toBe(120);
    expect(parseRetryAfterSeconds('Sun, 01 Mar 2026 10:01:30 GMT', now)).toBe(90);
    expect(parseRetryAfterSeconds(null, now)).toBeNull();
    expect(parseRetryAfterSeconds('soon', now)).toBeNull();
  });
});

describe('createApiClient', () => {
  it('the api client turns the server error shape into an ApiError with its message and fields', async () => {
    const server = fakeServer(() =>
      jsonResponse(400, { error: { message: 'Check the highlighted fields.', fields: { email: 'Enter a valid e-mail address.' } } }),
    );
    const api = createApiClient({ fetch: server.fetch, readCookies: () => 'paraxia_csrf=t1' });
    const error = await api.post('/api/auth/sign-in', { email: 'x', password: 'y' }).catch((e: unknown) => e);
    expect(error).toBeInstanceOf(ApiError);
    expect((error as ApiError).status).toBe(400);
    expect((error as ApiError).message).toBe('Check the highlighted fields.');
    expect((error as ApiError).fields).toEqual({ email: 'Enter a valid e-mail address.' });
  });

  it('the api client sends the CSRF cookie value as x-csrf-token on writes, not on reads', async () => {
    const server = fakeServer(() => jsonResponse(200, { ok: true }));
    const api = createApiClient({ fetch: server.fetch, readCookies: () => 'other=1; paraxia_csrf=tok-42' });
    await api.get('/api/auth/me');
    await api.post('/api/auth/sign-out');
    expect(headerOf(server.calls[0], CSRF_HEADER_NAME)).toBeUndefined();
    expect(headerOf(server.calls[1], CSRF_HEADER_NAME)).toBe('tok-42');
    expect(server.calls[1].init.credentials).toBe('same-origin');
  });

  it('the api client primes the CSRF cookie with GET /api/auth/me once when it is missing', async () => {
    let cookies = '';
    const server = fakeServer((call) => {
      if (call.url === '/api/auth/me') {
        cookies = 'paraxia_csrf=fresh';
        return jsonResponse(401, { error: { message: 'Not signed in.' } });
      }
      return jsonResponse(200, { user: { id: 'u1' } });
    });
    const api = createApiClient({ fetch: server.fetch, readCookies: () => cookies });
    await Promise.all([api.post('/api/a', {}), api.post('/api/b', {})]);
    expect(server.calls.filter((call) => call.url === '/api/auth/me')).toHaveLength(1);
    const writes = server.calls.filter((call) => call.url !== '/api/auth/me');
    expect(writes.map((call) => headerOf(call, CSRF_HEADER_NAME))).toEqual(['fresh', 'fresh']);
  });

  it('the api client reports a 429 with the wait from Retry-After when the server sent no message', async () => {
    const server = fakeServer(() => new Response('Too many requests', { status: 429, headers: { 'retry-after': '90' } }));
    const api = createApiClient({ fetch: server.fetch, readCookies: () => 'paraxia_csrf=t' });
    const error = (await api.post('/api/auth/sign-in', {}).catch((e: unknown) => e)) as ApiError;
    expect(error.status).toBe(429);
    expect(error.retryAfterSeconds).toBe(90);
    expect(error.message).toBe('Too many attempts in a short time. Wait 2 minutes and try again.');
  });

  it('the api client explains an HTML 502 from a proxy instead of failing to parse it', async () => {
    const server = fakeServer(() => new Response('<html>Bad gateway</html>', { status: 502, headers: { 'content-type': 'text/html' } }));
    const api = createApiClient({ fetch: server.fetch });
    const error = (await api.get('/api/health').catch((e: unknown) => e)) as ApiError;
    expect(error.status).toBe(502);
    expect(error.message).toMatch(/^The Paraxia server could not answer \(HTTP 502\)\./);
    expect(error.body).toBe('<html>Bad gateway</html>');
  });

  it('the api client reports an unreachable server as status 0 with a sentence', async () => {
    const api = createApiClient({
      fetch: (async () => {
        throw new TypeError('fetch failed');
      }) as typeof globalThis.fetch,
    });
    const error = (await api.get('/api/health').catch((e: unknown) => e)) as ApiError;
    expect(error.status).toBe(0);
    expect(error.message).toBe('Could not reach the Paraxia server. Check the network connection and try again.');
  });

  it('the api client returns undefined for 204 and sends JSON bodies with a content type', async () => {
    const server = fakeServer(() => new Response(null, { status: 204 }));
    const api = createApiClient({ fetch: server.fetch, readCookies: () => 'paraxia_csrf=t' });
    await expect(api.post('/api/auth/sign-in', { email: 'a@b.example' })).resolves.toBeUndefined();
    expect(server.calls[0].init.body).toBe('{"email":"a@b.example"}');
    expect(headerOf(server.calls[0], 'content-type')).toBe('application/json');
  });
});
