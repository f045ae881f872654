import { eq, inArray } from 'drizzle-orm';
import { simpleParser, type ParsedMail } from 'mailparser';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { organisationContacts, outboundMail } from '../../../server/db/schema';
import { createMailer } from '../../../server/services/mailer';
import { readMailIndex, readStoredMailSource } from '../../../server/services/mail-store';
import { notifyCertificateIssued } from '../../../server/services/notifications/notify-certificate-issued';
import { notifyMeasurementReturned } from '../../../server/services/notifications/notify-measurement-returned';
import { notifyWorkRequested } from '../../../server/services/notifications/notify-work-requested';
import { dispatchDueMail } from '../../../server/services/outbound-mail/dispatch-due-mail';
import { MAIL_RETRY_DELAYS_MS, MAX_MAIL_ATTEMPTS } from '../../../server/services/outbound-mail/mail-backoff';
import { queueMail } from '../../../server/services/outbound-mail/queue-mail';
import { retryMailNow } from '../../../server/services/outbound-mail/retry-mail-now';
import { startMailDispatcher } from '../../../server/services/outbound-mail/start-mail-dispatcher';
import { createLogger } from '../../../server/services/logger';
import { findFreePort } from '../../../scripts/services/ports';
import { createTestOrganisation, createTestPerson, uniqueSuffix } from '../../helpers/people';
import { createTestApp, type TestApp } from '../../helpers/test-app';
import { insertCertifiedLens } from '../verification/issued-certificate-fixture';

let testApp: TestApp;
const log = createLogger({ level: 'silent', name: 'mail-test' });

beforeAll(() => {
  testApp = createTestApp();
});

afterAll(async () => {
  await testApp?.close();
});

function dispatchDeps(mailer = testApp.deps.mailer) {
  return { db: testApp.deps.db, mailer, log };
}

async function mailRow(id: string) {
  const [row] = await testApp.deps.db.select().from(outboundMail).where(eq(outboundMail.id, id));
  return row;
}

async function mailIdsAbout(subjectId: string): Promise<string[]> {
  const rows = await testApp.deps.db.select({ id: outboundMail.id }).from(outboundMail).where(eq(outboundMail.subjectId, subjectId));
  return rows.map((row) => row.id);
}

/** The messages the fake SMTP server kept with this subject, parsed. */
async function receivedWithSubject(subject: string): Promise<{ envelopeTo: string[]; parsed: ParsedMail }[]> {
  const dir = testApp.deps.env.MAIL_STORE_DIR;
  const entries = (await readMailIndex(dir)).filter((entry) => entry.subject === subject);
  return Promise.all(entries.map(async (entry) => ({ envelopeTo: entry.envelopeTo, parsed: await simpleParser(await readStoredMailSource(dir, entry)) })));
}

describe('certificate issued', () => {
  it('reaches the contacts who receive certificates and the active client people, with text and HTML bodies and both links', async () => {
    const organisation = await createTestOrganisation(testApp.deps, { kind: 'client' });
    const suffix = uniqueSuffix();
    await testApp.deps.db.insert(organisationContacts).values([
      { organisationId: organisation.id, name: 'Quality desk', email: `quality-${suffix}@client.example`, receivesCertificates: true },
      { organisationId: organisation.id, name: 'Accounts', email: `accounts-${suffix}@client.example`, receivesCertificates: false },
    ]);
    const buyer = await createTestPerson(testApp.deps, { roles: ['client'], organisationId: organisation.id });
    const departed = await createTestPerson(testApp.deps, { roles: ['client'], organisationId: organisation.id, active: false });
    const certified = await insertCertifiedLens(testApp.deps, { organisationId: organisation.id, organisationName: organisation.name });
    const [revision] = certified.revisions;

    await testApp.deps.db.transaction((tx) => notifyCertificateIssued(tx, { certificateId: revision.id, baseUrl: testApp.deps.env.PUBLIC_BASE_URL }));
    const [mailId] = await mailIdsAbout(revision.id);
    const row = await mailRow(mailId);
    expect(row.kind).toBe('certificate-issued');
    expect([...row.toAddresses].sort()).toEqual([`quality-${suffix}@client.example`, buyer.email].sort());
    expect(row.toAddresses).not.toContain(departed.email);
    expect(row.subject).toBe(`Certificate ${revision.number} rev. 1 issued for lens ${certified.lensIdentifier}`);

    expect(await dispatchDueMail(dispatchDeps(), { mailIds: [mailId] })).toEqual({ sent: 1, retried: 0, failed: 0 });
    const sent = await mailRow(mailId);
    expect(sent.status).toBe('sent');
    expect(sent.attempts).toBe(1);
    expect(sent.sentAt).not.toBeNull();
    expect(sent.messageId).toBeTruthy();

    const [received] = await receivedWithSubject(row.subject);
    expect(received).toBeDefined();
    expect([...received.envelopeTo].sort()).toEqual([...row.toAddresses].sort());
    const verifyLink = `${testApp.deps.env.PUBLIC_BASE_URL}/verify/${revision.verificationCode}`;
    const portalLink = `${testApp.deps.env.PUBLIC_BASE_URL}/orders`;
    expect(received.parsed.text).toContain(verifyLink);
    expect(received.parsed.text).toContain(portalLink);
    expect(received.parsed.html).toBeTruthy();
    expect(received.parsed.html).toContain(`href="${verifyLink}"`);
    expect(received.parsed.html).toContain(`href="${portalLink}"`);
    // The body links to the certificate; the PDF itself is not sent.
    expect(received.parsed.attachments).toEqual([]);
  });
});

describe('measurement returned', () => {
  it("reaches only the technician who performed it, quoting the reviewer's comment (escaped in the HTML)", async () => {
    const organisation = await createTestOrganisation(testApp.deps, { kind: 'client' });
    const technician = await createTestPerson(testApp.deps, { roles: ['technician'] });
    const reviewer = await createTestPerson(testApp.deps, { roles: ['reviewer'] });
    const measured = await insertCertifiedLens(testApp.deps, {
      organisationId: organisation.id,
      organisationName: organisation.name,
      revisionCount: 0,
      measurementStatus: 'returned',
      performedById: technician.id,
    });
    const comment = 'Frames 3–5 look clipped; re-run with <excluded> frames & check the rail reading.';
    await testApp.deps.db.transaction((tx) =>
      notifyMeasurementReturned(tx, { measurementId: measured.measurementId, comment, returnedById: reviewer.id, baseUrl: testApp.deps.env.PUBLIC_BASE_URL }),
    );
    const [mailId] = await mailIdsAbout(measured.measurementId);
    const row = await mailRow(mailId);
    expect(row.toAddresses).toEqual([technician.email]);
    expect(row.subject).toContain(measured.measurementNumber);
    expect(row.subject).toContain(reviewer.name);
    expect(row.htmlBody).toContain('re-run with &lt;excluded&gt; frames &amp; check');
    expect(row.htmlBody).not.toContain('<excluded>');

    await dispatchDueMail(dispatchDeps(), { mailIds: [mailId] });
    const [received] = await receivedWithSubject(row.subject);
    expect(received.envelopeTo).toEqual([technician.email]);
    expect(received.parsed.text).toContain(`> ${comment}`);
    expect(received.parsed.text).toContain(`${testApp.deps.env.PUBLIC_BASE_URL}/measurements/${measured.measurementId}`);
    expect(received.parsed.html).toContain('&lt;excluded&gt;');
  });
});

describe('work requested', () => {
  it("reaches the lab's active reviewers and admins, not its technicians or anyone outside the lab", async () => {
    const lab = await createTestOrganisation(testApp.deps, { kind: 'lab' });
    const client = await createTestOrganisation(testApp.deps, { kind: 'client' });
    const reviewer = await createTestPerson(testApp.deps, { roles: ['reviewer'], organisationId: lab.id });
    const admin = await createTestPerson(testApp.deps, { roles: ['admin'], organisationId: lab.id });
    const technician = await createTestPerson(testApp.deps, { roles: ['technician'], organisationId: lab.id });
    const retired = await createTestPerson(testApp.deps, { roles: ['reviewer'], organisationId: lab.id, active: false });
    const buyer = await createTestPerson(testApp.deps, { roles: ['client'], organisationId: client.id });
    const order = await insertCertifiedLens(testApp.deps, { organisationId: client.id, organisationName: client.name, revisionCount: 0, measurementStatus: 'draft' });

    await testApp.deps.db.transaction((tx) => notifyWorkRequested(tx, { workOrderId: order.workOrderId, requestedById: buyer.id, baseUrl: testApp.deps.env.PUBLIC_BASE_URL }));
    const [mailId] = await mailIdsAbout(order.workOrderId);
    const row = await mailRow(mailId);
    expect(row.toAddresses).toEqual(expect.arrayContaining([reviewer.email, admin.email]));
    for (const outsider of [technician.email, retired.email, buyer.email]) expect(row.toAddresses).not.toContain(outsider);

    await dispatchDueMail(dispatchDeps(), { mailIds: [mailId] });
    const [received] = await receivedWithSubject(row.subject);
    expect(received.parsed.text).toContain(order.workOrderNumber);
    expect(received.parsed.html).toContain(client.name.replace(/&/g, '&amp;'));
  });
});

describe('dispatching', () => {
  async function queueTestMail(label: string): Promise<{ id: string; subject: string }> {
    const subject = `${label} ${uniqueSuffix()}`;
    const id = await queueMail(testApp.deps.db, { kind: 'work-requested', to: ['lab-intake@lab.example'], subject, text: `${subject} (text)`, html: `<p>${subject} (html)</p>` });
    return { id: id as string, subject };
  }

  it('marks a message retrying with the error and a later attempt when SMTP is down, failed after five attempts, and an admin retry then delivers it', async () => {
    const closedPort = await findFreePort();
    const downMailer = createMailer({ ...testApp.deps.env, SMTP_PORT: closedPort });
    const { id, subject } = await queueTestMail('Relay down');
    try {
      const firstTry = new Date();
      expect(await dispatchDueMail(dispatchDeps(downMailer), { mailIds: [id], now: firstTry })).toEqual({ sent: 0, retried: 1, failed: 0 });
      let row = await mailRow(id);
      expect(row.status).toBe('retrying');
      expect(row.attempts).toBe(1);
      expect(row.lastError).toMatch(/ECONNREFUSED/);
      expect(row.nextAttemptAt.getTime()).toBe(firstTry.getTime() + MAIL_RETRY_DELAYS_MS[0]);

      // Not due yet: a dispatcher at the same moment leaves it alone.
      expect(await dispatchDueMail(dispatchDeps(downMailer), { mailIds: [id], now: firstTry })).toEqual({ sent: 0, retried: 0, failed: 0 });

      for (let attempt = 2; attempt <= MAX_MAIL_ATTEMPTS; attempt += 1) {
        await dispatchDueMail(dispatchDeps(downMailer), { mailIds: [id], now: row.nextAttemptAt });
        row = await mailRow(id);
        expect(row.attempts).toBe(attempt);
      }
      expect(row.status).toBe('failed');
      expect(row.lastError).toMatch(/ECONNREFUSED/);
      expect(row.sentAt).toBeNull();
    } finally {
      downMailer.close();
    }

    expect(await retryMailNow(testApp.deps.db, id)).toBe(true);
    expect(await dispatchDueMail(dispatchDeps(), { mailIds: [id] })).toEqual({ sent: 1, retried: 0, failed: 0 });
    const delivered = await mailRow(id);
    expect(delivered.status).toBe('sent');
    expect(await receivedWithSubject(subject)).toHaveLength(1);
    // Sent mail is not sent again.
    expect(await retryMailNow(testApp.deps.db, id)).toBe(false);
  }, 60_000);

  it('never sends a message twice when two dispatchers run at the same time', async () => {
    const queued = await Promise.all(Array.from({ length: 12 }, (_, i) => queueTestMail(`Parallel ${i}`)));
    const ids = queued.map((mail) => mail.id);
    const [first, second] = await Promise.all([
      dispatchDueMail(dispatchDeps(), { mailIds: ids, limit: 12 }),
      dispatchDueMail(dispatchDeps(), { mailIds: ids, limit: 12 }),
    ]);
    expect(first.sent + second.sent).toBe(12);
    for (const mail of queued) expect(await receivedWithSubject(mail.subject), mail.subject).toHaveLength(1);
    const rows = await testApp.deps.db.select().from(outboundMail).where(inArray(outboundMail.id, ids));
    expect(rows.every((row) => row.status === 'sent' && row.attempts === 1)).toBe(true);
  }, 60_000);

  it("takes back a message left 'sending' by a dispatcher whose claim has run out, but not one still being sent", async () => {
    const stuck = await queueTestMail('Stuck');
    const busy = await queueTestMail('Busy');
    const now = new Date();
    await testApp.deps.db.update(outboundMail).set({ status: 'sending', attempts: 1, nextAttemptAt: new Date(now.getTime() - 1_000) }).where(eq(outboundMail.id, stuck.id));
    await testApp.deps.db.update(outboundMail).set({ status: 'sending', attempts: 1, nextAttemptAt: new Date(now.getTime() + 60_000) }).where(eq(outboundMail.id, busy.id));
    expect(await dispatchDueMail(dispatchDeps(), { mailIds: [stuck.id, busy.id], now })).toEqual({ sent: 1, retried: 0, failed: 0 });
    expect((await mailRow(stuck.id)).status).toBe('sent');
    expect((await mailRow(busy.id)).status).toBe('sending');
    expect(await receivedWithSubject(busy.subject)).toHaveLength(0);
  });

  it('startMailDispatcher sends queued mail in the background and stops cleanly', async () => {
    const { id, subject } = await queueTestMail('Background');
    const dispatcher = startMailDispatcher(dispatchDeps(), { intervalMs: 100 });
    try {
      for (let i = 0; i < 100 && (await mailRow(id)).status !== 'sent'; i += 1) await new Promise((resolve) => setTimeout(resolve, 100));
    } finally {
      await dispatcher.stop();
    }
    expect((await mailRow(id)).status).toBe('sent');
    expect(await receivedWithSubject(subject)).toHaveLength(1);
  }, 30_000);
});
