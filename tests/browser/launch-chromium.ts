/**
 * Debian's Chromium driven by playwright-core, with a fresh profile folder
 * per launch. Playwright's own browser download is never used (it fails on
 * this kind of machine); `npm test` installs the Debian package when missing.
 */
import { existsSync } from 'node:fs';
import { mkdtemp, rm } from 'node:fs/promises';
import path from 'node:path';
import { chromium, type BrowserContext } from 'playwright-core';

export const CHROMIUM_EXECUTABLE_PATH = '/usr/lib/chromium/chromium';

const CHROMIUM_ARGS = [
  '--headless',
  '--no-sandbox',
  '--disable-gpu',
  '--disable-quic',
  '--no-first-run',
  '--disable-background-networking',
  '--disable-component-update',
  '--disable-sync',
];

export interface LaunchChromiumOptions {
  /** A fresh profile folder is made inside it and removed by close(). */
  scratchDir: string;
  viewport?: { width: number; height: number };
  /** Default timeout of every action and wait on the context's pages. */
  actionTimeoutMs?: number;
}

export interface RunningChromium {
  context: BrowserContext;
  userDataDir: string;
  /** Closes the browser and removes its profile; safe to call twice. */
  close(): Promise<void>;
}

function checkLaunchChromiumOptions(options: LaunchChromiumOptions): Required<LaunchChromiumOptions> {
  if (typeof options.scratchDir !== 'string' || !path.isAbsolute(options.scratchDir)) {
    throw new TypeError(`launchChromium: option "scratchDir" must be an absolute path; got ${JSON.stringify(options.scratchDir)}.`);
  }
  const actionTimeoutMs = options.actionTimeoutMs ?? 30_000;
  if (!(Number.isFinite(actionTimeoutMs) && actionTimeoutMs > 0)) {
    throw new RangeError(`launchChromium: option "actionTimeoutMs" must be a positive number of milliseconds; got ${actionTimeoutMs}.`);
  }
  return { scratchDir: options.scratchDir, viewport: options.viewport ?? { width: 1366, height: 900 }, actionTimeoutMs };
}

export async function launchChromium(options: LaunchChromiumOptions): Promise<RunningChromium> {
  const { scratchDir, viewport, actionTimeoutMs } = checkLaunchChromiumOptions(options);
  if (!existsSync(CHROMIUM_EXECUTABLE_PATH)) {
    throw new Error(
      `Chromium is missing at ${CHROMIUM_EXECUTABLE_PATH}: run the tests through \`npm test\`, which installs Debian's chromium package, or run \`apt-get install -y chromium\`.`,
    );
  }
  const userDataDir = await mkdtemp(path.join(scratchDir, 'chromium-profile-'));
  let context: BrowserContext;
  try {
    // A persistent context is how Playwright takes a profile folder (it refuses --user-data-dir in args).
    context = await chromium.launchPersistentContext(userDataDir, {
      executablePath: CHROMIUM_EXECUTABLE_PATH,
      headless: true,
      args: CHROMIUM_ARGS,
      viewport,
      locale: 'en-GB',
      timezoneId: 'UTC',
    });
  } catch (error) {
    await rm(userDataDir, { recursive: true, force: true });
    throw error;
  }
  context.setDefaultTimeout(actionTimeoutMs);
  let closing: Promise<void> | null = null;
  return {
    context,
    userDataDir,
    close() {
      closing ??= (async () => {
        try {
          await context.close();
        } finally {
          await rm(userDataDir, { recursive: true, force: true });
        }
      })();
      return closing;
    },
  };
}
