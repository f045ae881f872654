import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { CSRF_HEADER_NAME } from '../../../server/middleware/csrf';
import { VERIFICATION_RATE_LIMIT } from '../../../server/routes/verification/verification.handlers';
import { startBrowserSession, type BrowserSession } from '../../helpers/browser-session';
import { createTestOrganisation } from '../../helpers/people';
import { createTestApp, type TestApp } from '../../helpers/test-app';
import { insertCertifiedLens, type CertifiedLens } from './issued-certificate-fixture';

let testApp: TestApp;
let anonymous: BrowserSession;
let reissued: CertifiedLens;
let organisationName: string;

beforeAll(async () => {
  testApp = createTestApp();
  const organisation = await createTestOrganisation(testApp.deps, { kind: 'client' });
  organisationName = organisation.name;
  reissued = await insertCertifiedLens(testApp.deps, { organisationId: organisation.id, organisationName: organisation.name, revisionCount: 2 });
  anonymous = await startBrowserSession(testApp.app);
}, 60_000);

afterAll(async () => {
  await testApp?.close();
});

const VERIFIED_KEYS = ['currentRevision', 'found', 'genuine', 'issueDate', 'item', 'labName', 'method', 'number', 'results', 'revision', 'status', 'supersededOn'];

describe('GET /api/verification/:code', () => {
  it('says a current revision is genuine and current, with exactly the public fields and the certificate\'s key results', async () => {
    const current = reissued.revisions[1];
    const response = await anonymous.agent.get(`/api/verification/${current.verificationCode}`);
    expect(response.status).toBe(200);
    expect(Object.keys(response.body).sort()).toEqual(VERIFIED_KEYS);
    expect(Object.keys(response.body.item).sort()).toEqual(['description', 'identifier']);
    expect(Object.keys(response.body.results).sort()).toEqual(['coverageFactor', 'decision', 'expandedUncertaintyMm', 'focalLengthMm']);
    expect(response.body).toMatchObject({
      found: true,
      genuine: true,
      number: current.number,
      revision: 2,
      status: 'current',
      currentRevision: 2,
      issueDate: current.data.certificate.issueDate,
      supersededOn: null,
      labName: current.data.lab.name,
      item: { identifier: reissued.lensIdentifier, description: current.data.item.description },
      method: 'finite-conjugate',
      results: {
        focalLengthMm: current.data.results.focalLengthMm,
        expandedUncertaintyMm: current.data.results.expandedUncertaintyMm,
        coverageFactor: current.data.results.coverageFactor,
        decision: current.data.conformity.decision,
      },
    });
    const text = JSON.stringify(response.body);
    expect(text).not.toContain(organisationName);
    expect(text).not.toContain('@');
    expect(text).not.toContain(reissued.measurementId);
  });

  it('says an earlier revision is genuine but superseded, and names the current revision', async () => {
    const first = reissued.revisions[0];
    const response = await anonymous.agent.get(`/api/verification/${first.verificationCode}`);
    expect(response.status).toBe(200);
    expect(response.body).toMatchObject({ found: true, genuine: true, revision: 1, status: 'superseded', currentRevision: 2 });
    expect(response.body.supersededOn).toMatch(/^\d{4}-\d{2}-\d{2}$/);
  });

  it('accepts the code typed in lower case, with spaces instead of hyphens', async () => {
    const code = reissued.revisions[1].verificationCode;
    const typed = code.toLowerCase().replace(/-/g, ' ');
    const response = await anonymous.agent.get(`/api/verification/${encodeURIComponent(typed)}`);
    expect(response.status).toBe(200);
    expect(response.body.revision).toBe(2);
  });

  it('answers 404 {found: false} with a sentence for an unknown code and for one with characters no code uses', async () => {
    for (const code of ['2345-6789-ABCD', 'O0O0-1I1L']) {
      const response = await anonymous.agent.get(`/api/verification/${code}`);
      expect(response.status, code).toBe(404);
      expect(Object.keys(response.body).sort()).toEqual(['error', 'found']);
      expect(response.body.found).toBe(false);
      expect(response.body.error.message).toContain(`No certificate has the verification code "${code}"`);
    }
  });
});

describe('POST /api/verification/:code/document', () => {
  function upload(code: string, file: Buffer, fileName = 'certificate.pdf') {
    return anonymous.agent
      .post(`/api/verification/${code}/document`)
      .set(CSRF_HEADER_NAME, anonymous.csrfToken)
      .attach('file', file, { filename: fileName, contentType: 'application/pdf' });
  }

  it('reports a match for the very PDF that was issued under that code', async () => {
    const current = reissued.revisions[1];
    const response = await upload(current.verificationCode, current.pdf);
    expect(response.status).toBe(200);
    expect(Object.keys(response.body).sort()).toEqual(['currentRevision', 'found', 'matches', 'number', 'revision', 'status', 'uploadedSha256']);
    expect(response.body).toMatchObject({ found: true, matches: true, number: current.number, revision: 2, status: 'current', uploadedSha256: current.sha256 });
  });

  it('reports no match when one byte of the PDF was changed', async () => {
    const current = reissued.revisions[1];
    const tampered = Buffer.from(current.pdf);
    const index = Math.floor(tampered.length / 2);
    tampered[index] = tampered[index] ^ 0x01;
    const response = await upload(current.verificationCode, tampered);
    expect(response.status).toBe(200);
    expect(response.body.matches).toBe(false);
    expect(response.body.uploadedSha256).not.toBe(current.sha256);
  });

  it('reports no match for another revision\'s PDF checked against this code', async () => {
    const response = await upload(reissued.revisions[1].verificationCode, reissued.revisions[0].pdf);
    expect(response.status).toBe(200);
    expect(response.body.matches).toBe(false);
  });

  it('refuses a file that is not a PDF with 400 naming the file', async () => {
    const response = await upload(reissued.revisions[1].verificationCode, Buffer.from('GIF89a not a certificate'), 'scan.gif');
    expect(response.status).toBe(400);
    expect(response.body.error.message).toBe('The file "scan.gif" is not a PDF; upload the certificate as you received it.');
    expect(response.body.error.fields).toHaveProperty('file');
  });

  it('refuses a request without a file with 400 naming the field', async () => {
    const response = await anonymous.agent.post(`/api/verification/${reissued.revisions[1].verificationCode}/document`).set(CSRF_HEADER_NAME, anonymous.csrfToken).field('note', 'x');
    expect(response.status).toBe(400);
    expect(response.body.error.fields).toHaveProperty('file');
  });

  it('refuses a file over 10 MB with 413', async () => {
    const big = Buffer.concat([Buffer.from('%PDF-1.7\n'), Buffer.alloc(10 * 1024 * 1024 + 1, 0x20)]);
    const response = await upload(reissued.revisions[1].verificationCode, big);
    expect(response.status).toBe(413);
    expect(response.body.error.message).toContain('larger than 10 MB');
  });

  it('answers 404 {found: false} for an unknown code', async () => {
    const response = await upload('2345-6789-ABCD', reissued.revisions[1].pdf);
    expect(response.status).toBe(404);
    expect(response.body.found).toBe(false);
  });
});

describe('rate limit', () => {
  it(`answers 429 with a sentence after ${VERIFICATION_RATE_LIMIT.limit} checks from one address`, async () => {
    // Its own app, so the other tests' requests do not count towards this budget.
    const limited = createTestApp();
    try {
      const code = reissued.revisions[1].verificationCode;
      for (let i = 0; i < VERIFICATION_RATE_LIMIT.limit; i += 1) {
        const response = await request(limited.app).get(`/api/verification/${code}`);
        expect(response.status, `request ${i + 1}`).toBe(200);
      }
      const refused = await request(limited.app).get(`/api/verification/${code}`);
      expect(refused.status).toBe(429);
      expect(refused.body.error.message).toMatch(/^Too many certificate checks from this address; wait up to \d+ minutes and try again\.$/);
    } finally {
      await limited.close();
    }
  }, 60_000);
});
