import { eq } from 'drizzle-orm';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { outboundMail } from '../../../server/db/schema';
import { queueMail } from '../../../server/services/outbound-mail/queue-mail';
import { signedInWithRoles, type SignedInSession } from '../../helpers/browser-session';
import { uniqueSuffix } from '../../helpers/people';
import { createTestApp, type TestApp } from '../../helpers/test-app';
import { auditEventsAbout, send } from './admin-fixtures';

let testApp: TestApp;
let admin: SignedInSession;

beforeAll(async () => {
  testApp = createTestApp();
  admin = await signedInWithRoles(testApp, ['admin']);
});

afterAll(async () => {
  await testApp?.close();
});

async function queued(subject: string): Promise<string> {
  const id = await queueMail(testApp.deps.db, { kind: 'work-requested', to: [`lab-${uniqueSuffix()}@test.example`], subject, text: `Body of ${subject}`, html: `<p>${subject}</p>` });
  return id!;
}

describe('the outbox for admins', () => {
  it('lists messages newest first with status counts, filters by status, and shows one message’s text', async () => {
    const failedId = await queued(`Failed ${uniqueSuffix()}`);
    await testApp.deps.db.update(outboundMail).set({ status: 'failed', attempts: 5, lastError: 'ECONNREFUSED: connect refused' }).where(eq(outboundMail.id, failedId));
    const queuedId = await queued(`Queued ${uniqueSuffix()}`);

    const all = await admin.agent.get('/api/outbound-mail?pageSize=200');
    expect(all.status).toBe(200);
    const ids = all.body.items.map((m: { id: string }) => m.id);
    expect(ids.indexOf(queuedId)).toBeLessThan(ids.indexOf(failedId));
    expect(all.body.countsByStatus.failed).toBeGreaterThanOrEqual(1);
    expect(all.body.total).toBe(Object.values(all.body.countsByStatus as Record<string, number>).reduce((a, b) => a + b, 0));

    const failed = await admin.agent.get('/api/outbound-mail?status=failed&pageSize=200');
    expect(failed.body.items.every((m: { status: string }) => m.status === 'failed')).toBe(true);
    expect(failed.body.items.find((m: { id: string }) => m.id === failedId)).toMatchObject({ attempts: 5, lastError: 'ECONNREFUSED: connect refused' });

    const one = await admin.agent.get(`/api/outbound-mail/${failedId}`);
    expect(one.body.message.textBody).toMatch(/^Body of Failed /);
    expect((await admin.agent.get('/api/outbound-mail/00000000-0000-4000-8000-000000000000')).status).toBe(404);
  });

  it('retries a failed message now (202, audited) and refuses one that is only queued (409)', async () => {
    const failedId = await queued(`Retry ${uniqueSuffix()}`);
    await testApp.deps.db.update(outboundMail).set({ status: 'failed', attempts: 5, nextAttemptAt: new Date(Date.now() + 3_600_000) }).where(eq(outboundMail.id, failedId));
    const retried = await send(admin, 'post', `/api/outbound-mail/${failedId}/retry`);
    expect(retried.status).toBe(202);
    expect(retried.body.message.status).toBe('retrying');
    expect(new Date(retried.body.message.nextAttemptAt).getTime()).toBeLessThanOrEqual(Date.now());
    const events = await auditEventsAbout(testApp.deps, 'outbound-mail', failedId);
    expect(events.map((event) => [event.action, event.actorId])).toEqual([['outbound-mail.retried', admin.person.id]]);

    const queuedId = await queued(`Waiting ${uniqueSuffix()}`);
    const refused = await send(admin, 'post', `/api/outbound-mail/${queuedId}/retry`);
    expect(refused.status).toBe(409);
    expect(refused.body.error.message).toBe('This message is queued; only a message waiting to be retried or one that failed can be sent again now.');
  });
});
