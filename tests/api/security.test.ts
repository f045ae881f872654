import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { CSRF_COOKIE_NAME, CSRF_HEADER_NAME } from '../../server/middleware/csrf';
import { cookieFromResponse, startBrowserSession } from '../helpers/browser-session';
import { createTestApp, type TestApp } from '../helpers/test-app';

const CSRF_MESSAGE = 'This request is missing its CSRF token; reload the page and try again.';

let testApp: TestApp;

beforeAll(() => {
  testApp = createTestApp();
});

afterAll(async () => {
  await testApp?.close();
});

describe('CSRF double-submit cookie', () => {
  it('sets a readable, strict same-site paraxia_csrf cookie on the first visit', async () => {
    const response = await request(testApp.app).get('/api/health');
    const header = (response.headers['set-cookie'] as unknown as string[]).find((c) => c.startsWith(`${CSRF_COOKIE_NAME}=`));
    expect(header).toBeDefined();
    expect(header).not.toMatch(/HttpOnly/i);
    expect(header).toMatch(/SameSite=Strict/i);
    expect(header).toMatch(/Path=\//);
    expect(cookieFromResponse(response, CSRF_COOKIE_NAME)!.length).toBeGreaterThanOrEqual(40);
  });

  it('refuses a POST without the x-csrf-token header with 403', async () => {
    const browser = await startBrowserSession(testApp.app);
    const response = await browser.agent.post('/api/auth/sign-in').send({ email: 'a@test.example', password: 'x' });
    expect(response.status).toBe(403);
    expect(response.body).toEqual({ error: { message: CSRF_MESSAGE } });
  });

  it('refuses a POST whose header does not equal the cookie with 403', async () => {
    const browser = await startBrowserSession(testApp.app);
    const response = await browser.agent
      .post('/api/auth/sign-out')
      .set(CSRF_HEADER_NAME, `${browser.csrfToken.slice(0, -2)}xx`);
    expect(response.status).toBe(403);
    expect(response.body).toEqual({ error: { message: CSRF_MESSAGE } });
  });

  it('refuses a header token when the browser has no cookie (a cross-site form cannot set one)', async () => {
    const response = await request(testApp.app).post('/api/auth/sign-out').set(CSRF_HEADER_NAME, 'anything');
    expect(response.status).toBe(403);
  });

  it('lets a POST with the matching header through', async () => {
    const browser = await startBrowserSession(testApp.app);
    const response = await browser.agent.post('/api/auth/sign-out').set(CSRF_HEADER_NAME, browser.csrfToken);
    expect(response.status).toBe(204);
  });
});

describe('error shape', () => {
  it('answers an unknown /api path with a JSON 404 in the error shape', async () => {
    const response = await request(testApp.app).get('/api/nope');
    expect(response.status).toBe(404);
    expect(response.headers['content-type']).toMatch(/application\/json/);
    expect(response.body).toEqual({ error: { message: 'There is no API endpoint GET /api/nope.' } });
  });

  it('answers malformed JSON with 400 and a JSON error without parser internals', async () => {
    const browser = await startBrowserSession(testApp.app);
    const response = await browser.agent
      .post('/api/auth/sign-in')
      .set(CSRF_HEADER_NAME, browser.csrfToken)
      .set('Content-Type', 'application/json')
      .send('{"email": "a@test.example", "password": ');
    expect(response.status).toBe(400);
    expect(response.body).toEqual({ error: { message: 'The request body is not valid JSON.' } });
  });

  it('answers a body over the 1 MiB limit with 413 and a JSON error', async () => {
    const browser = await startBrowserSession(testApp.app);
    const response = await browser.agent
      .post('/api/auth/sign-in')
      .set(CSRF_HEADER_NAME, browser.csrfToken)
      .set('Content-Type', 'application/json')
      .send(JSON.stringify({ email: 'a@test.example', password: 'x'.repeat(1024 * 1024 + 10) }));
    expect(response.status).toBe(413);
    expect(response.body).toEqual({ error: { message: 'The request body is larger than the 1 MiB limit.' } });
  });
});

describe('security headers', () => {
  it('sends a Content-Security-Policy that allows only same-origin scripts and styles', async () => {
    const response = await request(testApp.app).get('/api/health');
    const policy = String(response.headers['content-security-policy']);
    expect(policy).toContain("script-src 'self'");
    expect(policy).toContain("style-src 'self'");
    expect(policy).toContain("img-src 'self' data: blob:");
    expect(policy).toContain("object-src 'none'");
    expect(policy).not.toContain('unsafe-inline');
    expect(policy).not.toContain('unsafe-eval');
    expect(response.headers['x-content-type-options']).toBe('nosniff');
    expect(response.headers['x-powered-by']).toBeUndefined();
  });
});
