/**
 * An administrator's journey in a real browser (Debian's Chromium) through
 * the built client: invite a technician and follow the e-mailed link as the
 * invitee (the link is read from the outbox row), change a role, deactivate
 * someone, look after an organisation's contacts, filter the audit log and
 * export it, retry a failed message, and use "forgot your password?".
 * Every admin page is photographed (/tmp/shots/admin-journey) for people
 * to look at; the pictures are never asserted.
 */
import { eq } from 'drizzle-orm';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { outboundMail, people } from '../../server/db/schema';
import { queueMail } from '../../server/services/outbound-mail/queue-mail';
import { recordAuditEvent } from '../../server/services/audit-log';
import { latestOutboxMessage, tokenInLink } from '../api/admin/admin-fixtures';
import { createTestOrganisation, createTestPerson, uniqueSuffix, type TestPerson } from '../helpers/people';
import type { TestApp } from '../helpers/test-app';
import type { RunningChromium } from './launch-chromium';
import { shown, signInThroughPage, startBrowserStage, watchForPageErrors, type BrowserStage } from './browser-pages';

let stage: BrowserStage | undefined;
let testApp: TestApp | undefined;
let inviteeBrowser: RunningChromium | undefined;
let baseUrl: string;
let admin: TestPerson;
let leaver: TestPerson;
let clientName: string;
let failedMailSubject: string;

beforeAll(async () => {
  stage = await startBrowserStage({ name: 'admin-journey' });
  ({ testApp, baseUrl } = stage);

  const suffix = uniqueSuffix();
  const lab = await createTestOrganisation(testApp.deps, { kind: 'lab', name: `Larkspur Optical Test Laboratory ${suffix}` });
  clientName = `Quillmere Instruments ${suffix}`;
  await createTestOrganisation(testApp.deps, { kind: 'client', name: clientName });
  admin = await createTestPerson(testApp.deps, { roles: ['admin'], organisationId: lab.id, name: `Odile Farrant ${suffix}` });
  leaver = await createTestPerson(testApp.deps, { roles: ['technician'], organisationId: lab.id, name: `Pell Marrow ${suffix}` });
  failedMailSubject = `Certificate C-2026-0042 issued ${suffix}`;
  const failedId = await queueMail(testApp.deps.db, {
    kind: 'certificate-issued',
    to: [`buyer-${suffix}@quillmere.example`],
    subject: failedMailSubject,
    text: 'Certificate C-2026-0042 for lens PCX-100 has been issued.\n\nDownload it from Paraxia.',
    html: '<p>Certificate C-2026-0042 for lens PCX-100 has been issued.</p>',
  });
  await testApp.deps.db
    .update(outboundMail)
    .set({ status: 'failed', attempts: 5, lastError: 'ECONNREFUSED: connect ECONNREFUSED 10.0.0.25:25' })
    .where(eq(outboundMail.id, failedId!));
  await recordAuditEvent(testApp.deps.db, { actorId: null, action: 'auth.sign-in-failed', subjectType: 'person', subjectId: leaver.id, details: { email: leaver.email, reason: 'wrong-password' }, ip: '127.0.0.1' });

  inviteeBrowser = await stage.launchBrowser();
}, 240_000);

afterAll(async () => {
  console.info(`admin journey: screenshots in ${stage?.screenshotDir}`);
  await stage?.close();
}, 60_000);

describe('the administrator’s journey in a browser', () => {
  it('invites a technician who accepts from the e-mailed link, changes a role, deactivates someone, keeps contacts, filters and exports the audit log, and retries mail', async () => {
    if (!stage || !inviteeBrowser) throw new Error('beforeAll did not start the browsers.');
    const { screenshot } = stage;
    const errors: string[] = [];
    const page = await stage.browser.context.newPage();
    watchForPageErrors(page, errors);
    const suffix = uniqueSuffix();
    const inviteeName = `Ilse Varga ${suffix}`;
    const inviteeEmail = `ilse.varga-${suffix}@larkspur-lab.example`;
    const inviteePassword = 'focus through the bench';

    // Sign in; the admin's home is the system overview.
    await signInThroughPage(page, baseUrl, admin);
    await shown(page.getByRole('heading', { level: 1, name: 'System overview' }));
    await shown(page.getByText('failed sign-ins today (UTC)'));
    await screenshot(page, 'system-overview');

    // Invite a technician.
    await page.goto(`${baseUrl}/admin/people`);
    await shown(page.getByRole('heading', { level: 1, name: 'People' }));
    await page.getByRole('button', { name: 'Invite a person' }).click();
    const invite = await shown(page.getByRole('form', { name: 'Invite a person' }));
    await invite.getByLabel('Name').fill(inviteeName);
    await invite.getByLabel('E-mail address').fill(inviteeEmail);
    await screenshot(page, 'people-invite-form');
    await invite.getByRole('button', { name: 'Send invitation' }).click();
    await shown(page.getByText(`Invitation for ${inviteeName}`));
    await shown(page.getByRole('row').filter({ hasText: inviteeEmail }));
    await screenshot(page, 'people-with-pending-invitation');

    // The invitee follows the link from the outbox row in their own browser.
    const message = await latestOutboxMessage(testApp!.deps, 'invitation', inviteeEmail);
    expect(message?.subject).toMatch(/^Your invitation to Paraxia/);
    const token = tokenInLink(message!, 'invitation');
    const inviteePage = await inviteeBrowser.context.newPage();
    watchForPageErrors(inviteePage, errors);
    await inviteePage.goto(`${baseUrl}/invitation/${token}`);
    await shown(inviteePage.getByRole('heading', { level: 1, name: 'Accept your invitation' }));
    await shown(inviteePage.getByText(inviteeEmail));
    await screenshot(inviteePage, 'accept-invitation');
    await inviteePage.getByLabel('New password').fill('short');
    await inviteePage.getByLabel('The same password again').fill('short');
    await inviteePage.getByRole('button', { name: 'Create my account' }).click();
    await shown(inviteePage.getByText(/^Use at least 12 characters/));
    await screenshot(inviteePage, 'accept-invitation-weak-password');
    await inviteePage.getByLabel('New password').fill(inviteePassword);
    await inviteePage.getByLabel('The same password again').fill(inviteePassword);
    await inviteePage.getByRole('button', { name: 'Create my account' }).click();
    await shown(inviteePage.getByRole('heading', { level: 1, name: 'Open work' }));
    await screenshot(inviteePage, 'invitee-signed-in');

    // The same link a second time is refused.
    await inviteePage.goto(`${baseUrl}/invitation/${token}`);
    await shown(inviteePage.getByText('This invitation has already been accepted; sign in with the password you chose.'));
    await screenshot(inviteePage, 'invitation-used');

    // Change the new person's roles: add Reviewer.
    await page.reload();
    await page.getByLabel('Find').fill(inviteeEmail);
    const inviteeRow = await shown(page.getByRole('row').filter({ hasText: inviteeEmail }));
    await inviteeRow.getByRole('button', { name: '+ Reviewer' }).click();
    await shown(page.getByText(`Roles of ${inviteeName}: Technician, Reviewer.`));
    const [stored] = await testApp!.deps.db.select({ id: people.id }).from(people).where(eq(people.email, inviteeEmail));
    expect(stored).toBeDefined();

    // Deactivate another technician, with confirmation.
    await page.getByLabel('Find').fill(leaver.email);
    const leaverRow = await shown(page.getByRole('row').filter({ hasText: leaver.email }));
    await leaverRow.getByRole('button', { name: 'Deactivate…' }).click();
    await shown(leaverRow.getByText('Sign out and block?'));
    await screenshot(page, 'people-confirm-deactivate');
    await leaverRow.getByRole('button', { name: 'Deactivate', exact: true }).click();
    await shown(page.getByText(`${leaver.name} is deactivated; their sessions have ended.`));
    await page.getByLabel('Find').fill('');
    await shown(page.getByRole('row').filter({ hasText: inviteeEmail }));
    await screenshot(page, 'people');

    // Organisations: open the client and add a contact.
    await page.goto(`${baseUrl}/admin/organisations`);
    await shown(page.getByRole('heading', { level: 1, name: 'Organisations' }));
    await screenshot(page, 'organisations');
    await page.getByRole('button', { name: new RegExp(clientName) }).click();
    await shown(page.getByRole('heading', { level: 2, name: clientName }));
    await page.getByRole('button', { name: 'Add a contact' }).click();
    const contactForm = await shown(page.getByRole('form', { name: 'Add a contact' }));
    await contactForm.getByLabel('Name').fill('Casimir Wendt');
    await contactForm.getByLabel('E-mail address').fill(`casimir-${suffix}@quillmere.example`);
    await contactForm.getByLabel(/^Position/).fill('Quality manager');
    await contactForm.getByRole('button', { name: 'Add contact' }).click();
    await shown(page.getByRole('row').filter({ hasText: 'Casimir Wendt' }));
    await screenshot(page, 'organisation-detail');

    // The client's postal address, for its certificates: a seventh line is refused with a sentence, six blank-trimmed lines are kept as five.
    await page.getByRole('button', { name: 'Change details' }).click();
    const detailsForm = await shown(page.getByRole('form', { name: 'Change the organisation’s details' }));
    await detailsForm.getByLabel('Postal address').fill('Goods inwards\nBuilding C\n7 Quillmere Park\nHatherby\nHB4 2QE\nExamplia');
    await detailsForm.getByRole('button', { name: 'Save details' }).click();
    await shown(detailsForm.getByText('Field "postalAddress" must have at most 5 lines.'));
    await screenshot(page, 'organisation-address-refused');
    await detailsForm.getByLabel('Postal address').fill('Goods inwards, Building C\n\n  7 Quillmere Park  \nHatherby HB4 2QE, Examplia');
    await detailsForm.getByLabel('Phone').fill('+00 555 0117');
    await detailsForm.getByRole('button', { name: 'Save details' }).click();
    const address = await shown(page.locator('address'));
    expect(await address.innerText()).toBe('Goods inwards, Building C\n7 Quillmere Park\nHatherby HB4 2QE, Examplia');
    await shown(page.getByText('+00 555 0117'));
    await screenshot(page, 'organisation-address');

    // Audit log: people and roles only, then export with the same filter.
    await page.goto(`${baseUrl}/admin/audit`);
    await shown(page.getByRole('heading', { level: 1, name: 'Audit log' }));
    await shown(page.getByRole('row').filter({ hasText: 'invitation.accepted' }).first());
    await screenshot(page, 'audit-log');
    await page.getByLabel('Did').selectOption({ label: 'People and roles' });
    await page.getByRole('button', { name: 'Apply' }).click();
    await page.getByRole('row').filter({ hasText: 'invitation.accepted' }).first().waitFor({ state: 'detached' });
    await shown(page.getByRole('row').filter({ hasText: 'person.deactivated' }).first());
    await shown(page.getByRole('row').filter({ hasText: 'person.roles-changed' }).first());
    expect(await page.getByRole('row').filter({ hasText: 'invitation.accepted' }).count()).toBe(0);
    await screenshot(page, 'audit-log-filtered');
    const exportHref = await page.getByRole('link', { name: 'Export CSV' }).getAttribute('href');
    expect(exportHref).toBe('/api/audit-events/export?action=person.');
    const csv = await page.request.get(`${baseUrl}${exportHref}`);
    expect(csv.status()).toBe(200);
    const csvText = await csv.text();
    expect(csvText.split('\r\n')[0]).toBe('time_utc,actor_name,actor_email,action,subject_type,subject_id,details,ip');
    expect(csvText).toContain(',person.deactivated,person,');
    expect(csvText).not.toContain('invitation.accepted');

    // Outbound mail: open the failed message and retry it.
    await page.goto(`${baseUrl}/admin/mail`);
    await shown(page.getByRole('heading', { level: 1, name: 'Outbound mail' }));
    await screenshot(page, 'outbound-mail');
    await page.getByRole('button', { name: `Show “${failedMailSubject}”` }).click();
    const preview = await shown(page.getByRole('article', { name: 'Message' }));
    await shown(preview.getByText('ECONNREFUSED: connect ECONNREFUSED 10.0.0.25:25'));
    await screenshot(page, 'outbound-mail-message');
    await preview.getByRole('button', { name: 'Try again now' }).click();
    await shown(preview.getByText('Will retry'));

    // "Forgot your password?" from the sign-in page, as the new technician, in a fresh browser.
    const third = await stage.launchBrowser();
    try {
      const visitor = await third.context.newPage();
      watchForPageErrors(visitor, errors);
      await visitor.goto(`${baseUrl}/sign-in`);
      await visitor.getByRole('button', { name: 'Forgot your password?' }).click();
      await shown(visitor.getByRole('heading', { level: 1, name: 'Forgot your password?' }));
      await visitor.getByLabel('E-mail address').fill(inviteeEmail);
      await visitor.getByRole('button', { name: 'Send me a link' }).click();
      await shown(visitor.getByText(/^If this address belongs to an active account/));
      await screenshot(visitor, 'forgot-password-sent');
      const reset = await latestOutboxMessage(testApp!.deps, 'password-reset', inviteeEmail);
      await visitor.goto(`${baseUrl}/password-reset/${tokenInLink(reset!, 'password-reset')}`);
      await shown(visitor.getByRole('heading', { level: 1, name: 'Choose a new password' }));
      await screenshot(visitor, 'choose-password');
      await visitor.getByLabel('New password').fill('a different bench phrase');
      await visitor.getByLabel('The same password again').fill('a different bench phrase');
      await visitor.getByRole('button', { name: 'Save and sign in' }).click();
      await shown(visitor.getByRole('heading', { level: 1, name: /^Everything on your desk, Ilse/ }));
    } finally {
      await third.close();
    }
    // The reset ended the invitee's other session.
    await inviteePage.goto(`${baseUrl}/work-orders`);
    await shown(inviteePage.getByRole('heading', { level: 1, name: 'Sign in' }));

    expect(errors).toEqual([]);
  }, 300_000);
});
