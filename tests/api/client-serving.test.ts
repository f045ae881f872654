import { mkdir, mkdtemp, rm, writeFile } from 'node:fs/promises';
import { tmpdir } from 'node:os';
import path from 'node:path';
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createTestApp, type TestApp } from '../helpers/test-app';

let distDir: string;
let testApp: TestApp;
const INDEX_HTML = '<!doctype html><html><body><div id="root"></div><script type="module" src="/assets/app-1a2b3c.js"></script></body></html>';

beforeAll(async () => {
  distDir = await mkdtemp(path.join(process.env.PARAXIA_TEST_SCRATCH_DIR ?? tmpdir(), 'dist-'));
  await mkdir(path.join(distDir, 'assets'));
  await writeFile(path.join(distDir, 'index.html'), INDEX_HTML);
  await writeFile(path.join(distDir, 'assets', 'app-1a2b3c.js'), 'console.log("paraxia");');
  testApp = createTestApp({ env: { CLIENT_DIST_DIR: distDir } });
});

afterAll(async () => {
  await testApp?.close();
  if (distDir) await rm(distDir, { recursive: true, force: true });
});

describe('serving the built client', () => {
  it('serves index.html for a client-side route that is not an API path', async () => {
    const response = await request(testApp.app).get('/work-orders/42/lenses');
    expect(response.status).toBe(200);
    expect(response.headers['content-type']).toMatch(/text\/html/);
    expect(response.text).toBe(INDEX_HTML);
    expect(response.headers['cache-control']).toBe('no-cache');
  });

  it('serves hashed assets with a long immutable cache lifetime', async () => {
    const response = await request(testApp.app).get('/assets/app-1a2b3c.js');
    expect(response.status).toBe(200);
    expect(response.text).toBe('console.log("paraxia");');
    expect(response.headers['cache-control']).toContain('immutable');
  });

  it('answers a missing file with 404 rather than index.html', async () => {
    const response = await request(testApp.app).get('/assets/missing-0000.js');
    expect(response.status).toBe(404);
    expect(response.text).not.toContain('<div id="root">');
  });

  it('never answers an /api path with index.html', async () => {
    const response = await request(testApp.app).get('/api/no-such-route');
    expect(response.status).toBe(404);
    expect(response.headers['content-type']).toMatch(/application\/json/);
  });
});
