import { and, eq, inArray } from 'drizzle-orm';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { certificates, measurements, reviewEntries } from '../../../server/db/schema';
import { DEMO_REVIEW_EMAILS, seedReviewAndCertificates } from '../../../scripts/seed/seed-review-and-certificates';
import { createTestPerson } from '../../helpers/people';
import { createTestApp, type TestApp } from '../../helpers/test-app';
import { createReviewBench, stageMeasurement } from './review-bench';

let testApp: TestApp;

beforeAll(() => {
  testApp = createTestApp();
});
afterAll(async () => {
  await testApp?.close();
});

describe('seedReviewAndCertificates', () => {
  it('submits six, returns one with a thread, approves three, certifies two and reissues one; a second run changes nothing', async () => {
    const bench = await createReviewBench(testApp);
    const [technician, reviewer, admin] = await Promise.all(
      (['technician', 'reviewer', 'admin'] as const).map((role) => createTestPerson(testApp.deps, { roles: [role] })),
    );
    const staged = [];
    for (let i = 0; i < 7; i += 1) staged.push(await stageMeasurement(testApp, bench, { performedById: technician.id, status: 'analysed' }));
    // The seed knows its people by the demo addresses; here those stand for this test's own people.
    const personIdsByEmail = { [DEMO_REVIEW_EMAILS.technician]: technician.id, [DEMO_REVIEW_EMAILS.reviewer]: reviewer.id, [DEMO_REVIEW_EMAILS.admin]: admin.id };
    const first = await seedReviewAndCertificates(testApp.deps, { personIdsByEmail });
    expect(first).toEqual({ submitted: 6, returned: 1, approved: 3, certified: 2, reissued: 1 });

    const ids = staged.map((s) => s.id);
    const statuses = (await testApp.deps.db.select({ status: measurements.status }).from(measurements).where(inArray(measurements.id, ids))).map((r) => r.status).sort();
    expect(statuses).toEqual(['analysed', 'approved', 'certified', 'certified', 'returned', 'submitted', 'submitted']);
    const rows = await testApp.deps.db.select().from(certificates).where(inArray(certificates.measurementId, ids));
    expect(rows.map((r) => `${r.revision}:${r.status}`).sort()).toEqual(['1:current', '1:superseded', '2:current']);
    const [returned] = await testApp.deps.db.select({ id: measurements.id }).from(measurements).where(and(eq(measurements.status, 'returned'), inArray(measurements.id, ids)));
    const thread = await testApp.deps.db.select({ kind: reviewEntries.kind }).from(reviewEntries).where(eq(reviewEntries.measurementId, returned.id));
    expect(thread.map((e) => e.kind).sort()).toEqual(['comment', 'comment', 'return', 'submission']);

    expect(await seedReviewAndCertificates(testApp.deps, { personIdsByEmail })).toEqual({ submitted: 0, returned: 0, approved: 0, certified: 0, reissued: 0 });
  }, 120_000);
});
