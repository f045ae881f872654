import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { parseEnv } from '../../server/env';
import { createMailer } from '../../server/services/mailer';
import { readMailIndex, readStoredMailSource } from '../../server/services/mail-store';
import { findFreePort } from '../../scripts/services/ports';
import { uniqueSuffix } from '../helpers/people';
import { createTestApp, type TestApp } from '../helpers/test-app';

let testApp: TestApp;

beforeAll(() => {
  testApp = createTestApp();
});

afterAll(async () => {
  await testApp?.close();
});

describe('GET /api/health', () => {
  it('answers 200 with database, object storage and mail all ok, to an anonymous visitor', async () => {
    const response = await request(testApp.app).get('/api/health');
    expect(response.status).toBe(200);
    expect(response.body.status).toBe('ok');
    for (const name of ['database', 'objectStorage', 'mail'] as const) {
      expect(response.body.checks[name].ok, name).toBe(true);
      expect(response.body.checks[name].latencyMs, name).toBeGreaterThanOrEqual(0);
    }
    expect(response.headers['cache-control']).toBe('no-store');
  });

  it('answers 503 "degraded" naming the mail check when nothing listens on the SMTP port', async () => {
    const closedPort = await findFreePort();
    const broken = createTestApp({ env: { SMTP_PORT: String(closedPort) } });
    try {
      const response = await request(broken.app).get('/api/health');
      expect(response.status).toBe(503);
      expect(response.body.status).toBe('degraded');
      expect(response.body.checks.database.ok).toBe(true);
      expect(response.body.checks.objectStorage.ok).toBe(true);
      expect(response.body.checks.mail).toMatchObject({ ok: false, message: 'The SMTP server could not be reached.' });
    } finally {
      await broken.close();
    }
  });

  it('answers 503 naming object storage when the bucket does not exist', async () => {
    const broken = createTestApp({ env: { S3_BUCKET: `missing-${uniqueSuffix()}` } });
    try {
      const response = await request(broken.app).get('/api/health');
      expect(response.status).toBe(503);
      expect(response.body.checks.objectStorage).toMatchObject({ ok: false, message: 'The object storage bucket could not be reached.' });
      expect(response.body.checks.mail.ok).toBe(true);
    } finally {
      await broken.close();
    }
  });
});

describe('mailer and the fake SMTP server', () => {
  it('delivers a message that the fake server keeps as .eml with an index entry', async () => {
    const env = parseEnv(process.env);
    const mailer = createMailer(env);
    const subject = `Certificate ready ${uniqueSuffix()}`;
    try {
      const sent = await mailer.send({
        to: 'buyer@quillmere.example',
        subject,
        text: 'Your focal length certificate PX-0001 is ready to download.',
      });
      expect(sent.accepted).toEqual(['buyer@quillmere.example']);
    } finally {
      mailer.close();
    }

    const entries = await readMailIndex(env.MAIL_STORE_DIR);
    const entry = entries.find((e) => e.subject === subject);
    expect(entry).toBeDefined();
    expect(entry!.envelopeTo).toEqual(['buyer@quillmere.example']);
    expect(entry!.from).toContain('no-reply@paraxia.example');
    expect(entry!.textPreview).toContain('certificate PX-0001');
    const source = (await readStoredMailSource(env.MAIL_STORE_DIR, entry!)).toString('utf8');
    expect(source).toContain(`Subject: ${subject}`);
    expect(entry!.sizeBytes).toBe(Buffer.byteLength(source));
  });
});
