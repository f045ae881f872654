/**
 * PostgreSQL restarted while signed-in people keep the web busy. This file
 * starts a private cluster (the shared test cluster serves every other test
 * file in parallel), points one app at it, and stops and starts the server
 * under steady load: every answer during the outage is 503 with a sentence
 * and no stack, the process keeps running, and requests succeed again once
 * the database is back, on the same sessions.
 */
import { randomBytes } from 'node:crypto';
import { mkdir, rm } from 'node:fs/promises';
import path from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createServiceLog } from '../../scripts/services/console-log';
import { dataRoot } from '../../scripts/services/paths';
import { findFreePort } from '../../scripts/services/ports';
import { ensureDatabase, startPostgres, type RunningPostgres } from '../../scripts/services/postgres';
import { applyMigrations } from '../../server/db/migrate';
import { DATABASE_UNAVAILABLE_MESSAGE } from '../../server/middleware/error-handler';
import { CSRF_HEADER_NAME } from '../../server/middleware/csrf';
import { signedInWithRoles, type SignedInSession } from '../helpers/browser-session';
import { createTestOrganisation } from '../helpers/people';
import { createTestApp, type TestApp } from '../helpers/test-app';

const log = createServiceLog('database-restart test');
// Short, so the socket path stays under PostgreSQL's ~100-character limit; "test-" so that `npm test` removes it if a killed run left it behind.
const clusterRoot = path.join(dataRoot, `test-f-${randomBytes(3).toString('hex')}`);
let postgresPort: number;
let postgres: RunningPostgres | undefined;
let testApp: TestApp;
let sessions: SignedInSession[];
let organisationId: string;

function startCluster() {
  return startPostgres({
    dataDir: path.join(clusterRoot, 'pg'),
    runDir: path.join(clusterRoot, 'run'),
    port: postgresPort,
    unsafeFastWrites: true,
    log,
  });
}

beforeAll(async () => {
  await mkdir(clusterRoot, { recursive: true });
  postgresPort = await findFreePort();
  postgres = await startCluster();
  await ensureDatabase(postgres, 'paraxia_fault');
  const databaseUrl = postgres.urlFor('paraxia_fault');
  await applyMigrations({ databaseUrl });
  testApp = createTestApp({ env: { DATABASE_URL: databaseUrl } });
  organisationId = (await createTestOrganisation(testApp.deps, { kind: 'client' })).id;
  sessions = [];
  for (let i = 0; i < 8; i++) sessions.push(await signedInWithRoles(testApp, [i % 2 === 0 ? 'technician' : 'reviewer']));
}, 120_000);

afterAll(async () => {
  try {
    // A pool can wait on a connection the restart broke; the private cluster must go whatever happens here.
    await Promise.race([testApp?.close().catch(() => undefined), new Promise((resolve) => setTimeout(resolve, 10_000))]);
  } finally {
    await postgres?.stop({ mode: 'immediate' }).catch(() => undefined);
    await rm(clusterRoot, { recursive: true, force: true });
  }
}, 60_000);

interface Answer {
  phase: 'before' | 'outage' | 'after';
  status: number;
  text: string;
  retryAfter?: string;
}

describe('PostgreSQL restarted under load', () => {
  it('fails requests during the outage cleanly with 503 and a sentence, keeps the process up, and serves them again afterwards on the same sessions', async () => {
    let phase: Answer['phase'] = 'before';
    let running = true;
    const answers: Answer[] = [];

    // Eight browsers, each reading lists and details and one writing, back to back.
    const loops = sessions.map(async (session, index) => {
      while (running) {
        const response =
          index === 0
            ? await session.agent
                .post('/api/work-orders')
                .set(CSRF_HEADER_NAME, session.csrfToken)
                .send({ organisationId, title: `Restart load ${answers.length}`, decisionRule: 'simple' })
            : await session.agent.get(index % 2 === 0 ? '/api/work-orders?sort=number' : '/api/equipment');
        answers.push({ phase, status: response.status, text: response.text, retryAfter: response.headers['retry-after'] });
      }
    });

    const waitForAnswers = async (count: number) => {
      const target = answers.length + count;
      while (answers.length < target) await new Promise((resolve) => setTimeout(resolve, 20));
    };

    await waitForAnswers(40);
    phase = 'outage';
    await postgres!.stop({ mode: 'fast' });
    await waitForAnswers(40);
    postgres = await startCluster();
    phase = 'after';
    // The pool replaces its broken connections as requests come; give it a few rounds.
    await waitForAnswers(80);
    running = false;
    await Promise.all(loops);

    const byPhase = (wanted: Answer['phase']) => answers.filter((answer) => answer.phase === wanted);
    const statusesOf = (wanted: Answer['phase']) => [...new Set(byPhase(wanted).map((answer) => answer.status))].sort();

    expect(statusesOf('before')).toEqual(expect.arrayContaining([200]));
    expect(byPhase('before').every((answer) => answer.status === 200 || answer.status === 201)).toBe(true);

    // During the outage: only 503 (or, for a request that had finished just before the stop, success).
    const outage = byPhase('outage');
    expect(outage.some((answer) => answer.status === 503)).toBe(true);
    for (const answer of outage) {
      expect([200, 201, 503], answer.text).toContain(answer.status);
      if (answer.status === 503) {
        expect(JSON.parse(answer.text)).toEqual({ error: { message: DATABASE_UNAVAILABLE_MESSAGE } });
        expect(answer.retryAfter).toBe('30');
      }
      expect(answer.text).not.toMatch(/ECONNREFUSED|terminat|at .*\.(ts|js):\d+/);
    }

    // Afterwards: the last 40 answers are all successes, on the sessions signed in before the restart.
    const after = byPhase('after');
    expect(after.length).toBeGreaterThanOrEqual(80);
    const settled = after.slice(-40);
    expect(settled.filter((answer) => answer.status >= 300).map((answer) => `${answer.status} ${answer.text}`)).toEqual([]);
    expect(after.every((answer) => answer.status !== 500)).toBe(true);
  }, 120_000);
});
