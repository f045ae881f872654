/**
 * Security headers on API and HTML answers, and proof that the built client
 * really runs under the Content-Security-Policy the app serves: Chromium
 * loads the app from the real server and every CSP violation it reports
 * (console and `securitypolicyviolation` events) is counted across sign-in,
 * a list page and a measurement page with its plots.
 */
import { mkdir, mkdtemp, rm } from 'node:fs/promises';
import { tmpdir } from 'node:os';
import path from 'node:path';
import type { Page } from 'playwright-core';
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { startAnalysisWorker, type RunningAnalysisWorker } from '../../server/workers/analysis-worker';
import { cachedBenchMeasurement } from '../../scripts/synth/cached-bench-measurement';
import { createAnalysisBench, createMeasurementFromFixture, requestAnalysis, waitForAnalysisToFinish, type AnalysisBench } from '../api/analysis/analysis-bench';
import { smallFiniteConjugate } from '../api/analysis/small-bench';
import { buildClientOnce } from '../browser/build-client-once';
import { launchChromium, type RunningChromium } from '../browser/launch-chromium';
import { listenOnLoopback, type ListeningApp } from '../browser/listen-on-loopback';
import { uniqueSuffix } from '../helpers/people';
import { createTestApp, type TestApp } from '../helpers/test-app';
import { requireTestServices } from '../setup/test-services';

// This file's own queue, so workers of other test files never take its job.
process.env.PARAXIA_ANALYSIS_QUEUE_NAME = `csp-test-${uniqueSuffix()}`;
process.env.PARAXIA_ANALYSIS_POLLING_SECONDS = '0.5';

let runDir: string;
let screenshotDir: string;
let testApp: TestApp | undefined;
let worker: RunningAnalysisWorker | undefined;
let listening: ListeningApp | undefined;
let browser: RunningChromium | undefined;
let bench: AnalysisBench;
let measurementId: string;

beforeAll(async () => {
  requireTestServices();
  const scratchRoot = process.env.PARAXIA_TEST_SCRATCH_DIR ?? tmpdir();
  runDir = await mkdtemp(path.join(scratchRoot, 'csp-'));
  screenshotDir = process.env.PARAXIA_TEST_SCREENSHOT_DIR ?? path.join(runDir, 'screenshots');
  await mkdir(screenshotDir, { recursive: true });
  const [client, fixture] = await Promise.all([
    buildClientOnce({ scratchDir: process.env.PARAXIA_TEST_SCRATCH_DIR ?? runDir }),
    cachedBenchMeasurement('finite-conjugate', (scenario) => smallFiniteConjugate(scenario, { framesPerFocus: 11 })),
  ]);
  testApp = createTestApp({ env: { CLIENT_DIST_DIR: client.distDir } });
  bench = await createAnalysisBench(testApp);
  ({ measurementId } = await createMeasurementFromFixture(testApp, bench, fixture));
  const workerScratchDir = path.join(runDir, 'analysis-worker');
  await mkdir(workerScratchDir, { recursive: true });
  worker = await startAnalysisWorker({ env: testApp.deps.env, scratchDir: workerScratchDir });
  const queued = await requestAnalysis(bench, measurementId);
  const { final } = await waitForAnalysisToFinish(bench.technician, measurementId, queued.version, { timeoutMs: 180_000, pollMs: 500 });
  expect(final.status, final.errorMessage ?? '').toBe('succeeded');
  listening = await listenOnLoopback({ app: testApp.app });
  browser = await launchChromium({ scratchDir: runDir });
}, 300_000);

afterAll(async () => {
  const problems: unknown[] = [];
  for (const close of [() => browser?.close(), () => listening?.close(), () => worker?.stop(), () => testApp?.close()]) {
    try {
      await close();
    } catch (error) {
      problems.push(error);
    }
  }
  if (runDir) await rm(path.join(runDir, 'analysis-worker'), { recursive: true, force: true });
  if (problems.length > 0) throw problems[0];
}, 60_000);

/** The headers helmet sets (helmet 8 defaults, README of helmetjs/helmet) plus the app's own policy. */
function expectSecurityHeaders(headers: Record<string, string>) {
  const policy = headers['content-security-policy'] ?? '';
  expect(policy).toContain("default-src 'self'");
  expect(policy).toContain("script-src 'self'");
  expect(policy).toContain("object-src 'none'");
  expect(policy).toContain("frame-ancestors 'self'");
  expect(policy).not.toMatch(/unsafe-inline|unsafe-eval/);
  expect(headers['x-content-type-options']).toBe('nosniff');
  expect(headers['x-frame-options']).toBe('SAMEORIGIN');
  expect(headers['referrer-policy']).toBe('no-referrer');
  expect(headers['cross-origin-opener-policy']).toBe('same-origin');
  expect(headers['cross-origin-resource-policy']).toBe('same-origin');
  expect(headers['x-powered-by']).toBeUndefined();
  // Off on plain-HTTP test runs on purpose (server/middleware/security-headers.ts); production turns it on.
  expect(headers['strict-transport-security']).toBeUndefined();
}

describe('security headers', () => {
  it('are sent on an API answer, an API error and the HTML page', async () => {
    const api = await request(testApp!.app).get('/api/health');
    expectSecurityHeaders(api.headers as Record<string, string>);
    const refused = await request(testApp!.app).get('/api/people');
    expect(refused.status).toBe(401);
    expectSecurityHeaders(refused.headers as Record<string, string>);
    const html = await request(testApp!.app).get('/work-orders');
    expect(html.status).toBe(200);
    expect(html.headers['content-type']).toMatch(/text\/html/);
    expectSecurityHeaders(html.headers as Record<string, string>);
  });

  it('turns on HSTS and upgrade-insecure-requests in production', async () => {
    const production = createTestApp({ env: { NODE_ENV: 'production', SESSION_SECRET: 'x'.repeat(40) } });
    try {
      const response = await request(production.app).get('/api/health');
      expect(response.headers['strict-transport-security']).toMatch(/max-age=\d+/);
      expect(response.headers['content-security-policy']).toContain('upgrade-insecure-requests');
    } finally {
      await production.close();
    }
  });
});

/** Every CSP violation the page reports, from the console and from the DOM event. */
function recordViolations(page: Page): string[] {
  const violations: string[] = [];
  page.on('console', (message) => {
    if (/Content Security Policy/i.test(message.text())) violations.push(`console: ${message.text()}`);
  });
  page.on('pageerror', (error) => {
    if (/Content Security Policy/i.test(error.message)) violations.push(`error: ${error.message}`);
  });
  return violations;
}

async function violationEvents(page: Page): Promise<string[]> {
  return page.evaluate(() => (window as unknown as { cspViolations?: string[] }).cspViolations ?? []);
}

let shotNumber = 0;
async function screenshot(page: Page, name: string) {
  shotNumber += 1;
  await page.screenshot({ path: path.join(screenshotDir, `csp-${String(shotNumber).padStart(2, '0')}-${name}.png`), fullPage: true }).catch(() => undefined);
}

describe('the built client under the served Content-Security-Policy', () => {
  it('signs in, lists work orders and shows an analysed measurement with its plots with no CSP violation', async () => {
    const page = await browser!.context.newPage();
    await page.addInitScript(() => {
      const store: string[] = [];
      (window as unknown as { cspViolations: string[] }).cspViolations = store;
      document.addEventListener('securitypolicyviolation', (event) => store.push(`${event.violatedDirective} ${event.blockedURI}`));
    });
    const violations = recordViolations(page);
    const seenEvents: string[] = [];
    const base = listening!.baseUrl;

    await page.goto(`${base}/`);
    await page.getByRole('heading', { level: 1, name: 'Sign in' }).waitFor();
    await page.getByLabel('E-mail address').fill(bench.technician.person.email);
    await page.getByLabel('Password').fill(bench.technician.person.password);
    await page.getByRole('button', { name: 'Sign in' }).click();
    await page.getByRole('heading', { level: 1, name: 'Open work' }).waitFor();
    seenEvents.push(...(await violationEvents(page)));
    await screenshot(page, 'signed-in');

    await page.goto(`${base}/work-orders`);
    await page.getByRole('heading', { level: 1, name: 'Work orders' }).waitFor();
    await page.getByRole('table').first().waitFor();
    seenEvents.push(...(await violationEvents(page)));
    await screenshot(page, 'work-orders');

    await page.goto(`${base}/measurements/${measurementId}`);
    await page.getByRole('img', { name: /^Focus measure against rail position for sweep 1:/ }).waitFor({ timeout: 60_000 });
    await page.getByRole('table', { name: /^Uncertainty budget of f′/ }).waitFor();
    seenEvents.push(...(await violationEvents(page)));
    await screenshot(page, 'measurement');

    expect([...violations, ...seenEvents]).toEqual([]);

    // The control: an inline script is blocked and reported, so the zero above was measured, not assumed.
    await page.evaluate(() => {
      const script = document.createElement('script');
      script.textContent = 'window.inlineRan = true;';
      document.body.append(script);
    });
    await expect.poll(async () => (await violationEvents(page)).length, { timeout: 5_000 }).toBeGreaterThan(0);
    expect(await page.evaluate(() => (window as unknown as { inlineRan?: boolean }).inlineRan)).toBeUndefined();
    await page.close();
  }, 180_000);
});
