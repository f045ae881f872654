/**
 * What every browser test needs around its own steps: the app serving the
 * built client on loopback with the real services of `npm test`, Debian's
 * Chromium, numbered screenshots, a record of page errors and failed API
 * answers, and signing in through the page as a person would.
 *
 * Screenshots go to `$PARAXIA_TEST_SCREENSHOT_DIR/<folder>` or
 * `/tmp/shots/<folder>` as `NN-<step>.png`; the previous run's numbered
 * pictures there are removed first (other files are left alone, other tests
 * may write beside them). They are for people reading a run, never asserted.
 */
import { mkdir, mkdtemp, readdir, rm } from 'node:fs/promises';
import { tmpdir } from 'node:os';
import path from 'node:path';
import type { Locator, Page } from 'playwright-core';
import type { TestPerson } from '../helpers/people';
import { createTestApp, type TestApp } from '../helpers/test-app';
import { requireTestServices } from '../setup/test-services';
import { buildClientOnce } from './build-client-once';
import { choosePublicLoopbackAddress, listenAtPublicLoopbackAddress } from './certificate-chain-listen';
import { launchChromium, type RunningChromium } from './launch-chromium';
import { listenOnLoopback, type ListeningApp } from './listen-on-loopback';

export interface BrowserStageOptions {
  /** Names this run's scratch folder, and its screenshot folder unless `screenshotFolder` is given. */
  name: string;
  screenshotFolder?: string;
  /** Environment overrides for the app (and for a worker given `testApp.deps.env`). */
  env?: Record<string, string>;
  /**
   * Serve on a loopback port chosen before the app is built and give the app
   * that address as PUBLIC_BASE_URL, so links in its mail and certificates
   * lead back to it.
   */
  tellAppItsAddress?: boolean;
  actionTimeoutMs?: number;
}

export interface BrowserStage {
  /** This run's own scratch folder, removed by close(). */
  runDir: string;
  testApp: TestApp;
  /** e.g. http://127.0.0.1:41234, without a trailing slash. */
  baseUrl: string;
  browser: RunningChromium;
  screenshotDir: string;
  /** A further browser with its own profile (another person at another desk); close() closes it too. */
  launchBrowser(): Promise<RunningChromium>;
  /** Saves `<NN>-<name>.png` of the whole page; a failed picture is reported, never fatal. */
  screenshot(page: Page, name: string): Promise<void>;
  /** Closes the browsers, the listener and the app, each even when an earlier one fails; safe to call twice. */
  close(): Promise<void>;
}

const SCREENSHOT_FILE_NAME = /^\d{2}-.+\.png$/;

/** Runs every stop in order, each even when an earlier one fails, then throws the first failure. */
export async function stopAll(stops: (() => Promise<unknown> | undefined)[]): Promise<void> {
  const problems: unknown[] = [];
  for (const stop of stops) {
    try {
      await stop();
    } catch (error) {
      problems.push(error);
    }
  }
  if (problems.length > 0) throw problems[0];
}

/** Builds the client (once per `npm test`), starts the app on loopback and launches Chromium. */
export async function startBrowserStage(options: BrowserStageOptions): Promise<BrowserStage> {
  requireTestServices();
  const actionTimeoutMs = options.actionTimeoutMs ?? 30_000;
  const sharedScratchDir = process.env.PARAXIA_TEST_SCRATCH_DIR;
  const runDir = await mkdtemp(path.join(sharedScratchDir ?? tmpdir(), `${options.name}-`));
  const screenshotDir = path.join(process.env.PARAXIA_TEST_SCREENSHOT_DIR ?? '/tmp/shots', options.screenshotFolder ?? options.name);
  const browsers: RunningChromium[] = [];
  let testApp: TestApp | undefined;
  let listening: ListeningApp | undefined;
  let closing: Promise<void> | null = null;
  const close = () => {
    closing ??= stopAll([
      ...browsers.map((browser) => () => browser.close()),
      () => listening?.close(),
      () => testApp?.close(),
      () => rm(runDir, { recursive: true, force: true }),
    ]);
    return closing;
  };
  const launchBrowser = async () => {
    const browser = await launchChromium({ scratchDir: runDir, actionTimeoutMs });
    browsers.push(browser);
    return browser;
  };

  try {
    await mkdir(screenshotDir, { recursive: true });
    const previousShots = (await readdir(screenshotDir)).filter((file) => SCREENSHOT_FILE_NAME.test(file));
    await Promise.all(previousShots.map((file) => rm(path.join(screenshotDir, file), { force: true })));
    // Outside `npm test` there is no per-run scratch folder to share the build through, so it goes in this run's own.
    const client = await buildClientOnce({ scratchDir: sharedScratchDir ?? runDir });
    const address = options.tellAppItsAddress ? await choosePublicLoopbackAddress() : undefined;
    testApp = createTestApp({
      env: { CLIENT_DIST_DIR: client.distDir, ...(address ? { PUBLIC_BASE_URL: address.baseUrl } : {}), ...options.env },
    });
    listening = address ? await listenAtPublicLoopbackAddress({ app: testApp.app, address }) : await listenOnLoopback({ app: testApp.app });
    const browser = await launchBrowser();

    let shotNumber = 0;
    return {
      runDir,
      testApp,
      baseUrl: listening.baseUrl,
      browser,
      screenshotDir,
      launchBrowser,
      async screenshot(page, name) {
        shotNumber += 1;
        const file = path.join(screenshotDir, `${String(shotNumber).padStart(2, '0')}-${name}.png`);
        await page.screenshot({ path: file, fullPage: true }).catch((error: Error) => console.warn(`Screenshot ${file} failed: ${error.message}`));
      },
      close,
    };
  } catch (error) {
    await close().catch(() => undefined);
    throw error;
  }
}

/** Waits until `locator` is visible and hands it back. */
export async function shown(locator: Locator, timeoutMs?: number): Promise<Locator> {
  await locator.waitFor({ state: 'visible', timeout: timeoutMs });
  return locator;
}

/**
 * Collects into `into` every uncaught error in the page and every API answer
 * of 500 or more, so a test can require none at its end.
 */
export function watchForPageErrors(page: Page, into: string[] = []): string[] {
  page.on('pageerror', (error) => into.push(`page error at ${page.url()}: ${error.message}`));
  page.on('response', (response) => {
    if (response.url().includes('/api/') && response.status() >= 500) {
      into.push(`${response.status()} ${response.request().method()} ${response.url()}`);
    }
  });
  return into;
}

/**
 * Signs `person` in through the sign-in form (signing out whoever is signed
 * in first) and waits for the signed-in shell, wherever the app lands them.
 */
export async function signInThroughPage(page: Page, baseUrl: string, person: Pick<TestPerson, 'email' | 'password'>): Promise<void> {
  await page.goto(`${baseUrl}/`);
  const signOut = page.getByRole('button', { name: 'Sign out' });
  const signInHeading = page.getByRole('heading', { level: 1, name: 'Sign in' });
  await signOut.or(signInHeading).first().waitFor();
  if (await signOut.isVisible()) await signOut.click();
  await signInHeading.waitFor();
  await page.getByLabel('E-mail address').fill(person.email);
  await page.getByLabel('Password').fill(person.password);
  await page.getByRole('button', { name: 'Sign in' }).click();
  await signOut.waitFor();
}
