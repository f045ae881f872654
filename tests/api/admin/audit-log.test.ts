import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { recordAuditEvent } from '../../../server/services/audit-log';
import { auditEventsToCsv, csvCell } from '../../../server/services/audit/audit-csv';
import { auditEventBatchesForExport } from '../../../server/services/audit/list-audit-events';
import { auditFilterQuery } from '../../../shared/schemas/admin';
import { signInAs, signedInWithRoles, startBrowserSession, type SignedInSession } from '../../helpers/browser-session';
import { createTestPerson, uniqueSuffix } from '../../helpers/people';
import { createTestApp, type TestApp } from '../../helpers/test-app';
import { send } from './admin-fixtures';

let testApp: TestApp;
let admin: SignedInSession;

beforeAll(async () => {
  testApp = createTestApp();
  admin = await signedInWithRoles(testApp, ['admin']);
});

afterAll(async () => {
  await testApp?.close();
});

describe('csvCell', () => {
  // RFC 4180 §2 (quoting), OWASP "CSV Injection" (formula prefix).
  it('quotes a cell with a comma, quote or line break and doubles its quotes', () => {
    expect(csvCell('plain')).toBe('plain');
    expect(csvCell('a,b')).toBe('"a,b"');
    expect(csvCell('say "f"')).toBe('"say ""f"""');
    expect(csvCell('two\nlines')).toBe('"two\nlines"');
    expect(csvCell(null)).toBe('');
  });

  it('neutralises a cell a spreadsheet would run as a formula with a leading apostrophe', () => {
    expect(csvCell('=HYPERLINK("http://x.example")')).toBe(`"'=HYPERLINK(""http://x.example"")"`);
    expect(csvCell('+1+1')).toBe("'+1+1");
    expect(csvCell('-2')).toBe("'-2");
    expect(csvCell('@SUM(A1)')).toBe("'@SUM(A1)");
    expect(csvCell('\tcmd')).toBe("'\tcmd");
    expect(csvCell('a=b')).toBe('a=b');
  });

  it('writes a header and one CRLF-terminated line per event', () => {
    const csv = auditEventsToCsv([
      { id: 1, at: '2026-12-01T10:00:00.000Z', actor: null, action: 'auth.sign-in-failed', subjectType: null, subjectId: null, details: { email: 'a@b.example' }, ip: '127.0.0.1' },
    ]);
    expect(csv).toBe(
      'time_utc,actor_name,actor_email,action,subject_type,subject_id,details,ip\r\n2026-12-01T10:00:00.000Z,,,auth.sign-in-failed,,,"{""email"":""a@b.example""}",127.0.0.1\r\n',
    );
  });
});

describe('GET /api/audit-events', () => {
  it('filters by actor, action prefix, subject and date, newest first, one page at a time', async () => {
    const actor = await createTestPerson(testApp.deps, { roles: ['technician'], name: `Auditable ${uniqueSuffix()}` });
    const subjectId = `subject-${uniqueSuffix()}`;
    for (const action of ['lens.created', 'lens.changed', 'work-order.created']) {
      await recordAuditEvent(testApp.deps.db, { actorId: actor.id, action, subjectType: 'lens', subjectId });
    }
    const all = await admin.agent.get(`/api/audit-events?subjectType=lens&subjectId=${subjectId}`);
    expect(all.status).toBe(200);
    expect(all.body.items.map((e: { action: string }) => e.action)).toEqual(['work-order.created', 'lens.changed', 'lens.created']);
    expect(all.body.items[0].actor).toEqual({ id: actor.id, name: actor.name, email: actor.email });

    const byPrefix = await admin.agent.get(`/api/audit-events?subjectId=${subjectId}&action=lens.`);
    expect(byPrefix.body.total).toBe(2);

    const byActor = await admin.agent.get(`/api/audit-events?actor=${encodeURIComponent(actor.name)}`);
    expect(byActor.body.items.every((e: { actor: { id: string } }) => e.actor.id === actor.id)).toBe(true);
    expect(byActor.body.total).toBe(3);

    const paged = await admin.agent.get(`/api/audit-events?subjectId=${subjectId}&pageSize=2&page=2`);
    expect(paged.body).toMatchObject({ total: 3, page: 2, pageSize: 2 });
    expect(paged.body.items.map((e: { action: string }) => e.action)).toEqual(['lens.created']);

    const today = new Date().toISOString().slice(0, 10);
    const inRange = await admin.agent.get(`/api/audit-events?subjectId=${subjectId}&from=${today}&to=${today}`);
    expect(inRange.body.total).toBe(3);
    const before = await admin.agent.get(`/api/audit-events?subjectId=${subjectId}&to=2020-01-01`);
    expect(before.body.total).toBe(0);

    const bad = await admin.agent.get('/api/audit-events?from=2026-02-30');
    expect(bad.status).toBe(400);
    expect(bad.body.error.fields.from).toBe('Field "from" must be a real date written YYYY-MM-DD (e.g. 2026-03-31).');
  });

  it('records sign-in and failed sign-in', async () => {
    const person = await createTestPerson(testApp.deps, { roles: ['reviewer'] });
    const visitor = await startBrowserSession(testApp.app);
    await send(visitor, 'post', '/api/auth/sign-in', { email: person.email, password: 'wrong password here' });
    await signInAs(testApp.app, person);
    const events = await admin.agent.get(`/api/audit-events?subjectType=person&subjectId=${person.id}&action=auth.`);
    expect(events.body.items.map((e: { action: string }) => e.action)).toEqual(['auth.sign-in', 'auth.sign-in-failed']);
  });
});

describe('GET /api/audit-events/export', () => {
  it('exports the filtered events as CSV with formula cells neutralised, and audits the export', async () => {
    const subjectId = `export-${uniqueSuffix()}`;
    await recordAuditEvent(testApp.deps.db, { actorId: admin.person.id, action: 'lens.changed', subjectType: 'lens', subjectId, details: { note: '=1+2, "quoted"' } });
    await recordAuditEvent(testApp.deps.db, { actorId: null, action: '=cmd|calc', subjectType: 'lens', subjectId });
    const response = await admin.agent.get(`/api/audit-events/export?subjectId=${subjectId}`);
    expect(response.status).toBe(200);
    expect(response.headers['content-type']).toBe('text/csv; charset=utf-8');
    expect(response.headers['content-disposition']).toMatch(/^attachment; filename="?paraxia-audit-log-\d{4}-\d{2}-\d{2}\.csv"?$/);
    const lines = response.text.trimEnd().split('\r\n');
    expect(lines).toHaveLength(3);
    expect(lines[1]).toContain(`,'=cmd|calc,lens,${subjectId},{},`);
    expect(lines[2]).toContain(`,lens.changed,lens,${subjectId},"{""note"":""=1+2, \\""quoted\\""""}",`);

    const exported = await admin.agent.get(`/api/audit-events?action=audit.exported&actorId=${admin.person.id}`);
    expect(exported.body.items[0].details).toMatchObject({ filter: { subjectId }, rows: 2 });
  });
});

describe('auditEventBatchesForExport', () => {
  it('pages newest first by time then id, ties within one transaction’s microsecond included, every event once, none recorded after it began', async () => {
    const subjectId = `batches-${uniqueSuffix()}`;
    // Three events in one transaction share now(), so paging must break the tie by id.
    await testApp.deps.db.transaction(async (tx) => {
      for (let i = 0; i < 3; i++) await recordAuditEvent(tx, { actorId: null, action: `tie.${i}`, subjectType: 'lens', subjectId });
    });
    for (let i = 0; i < 4; i++) await recordAuditEvent(testApp.deps.db, { actorId: null, action: `single.${i}`, subjectType: 'lens', subjectId });
    const batches = auditEventBatchesForExport(testApp.deps.db, auditFilterQuery.parse({ subjectId }), 3);
    const first = await batches.next();
    const firstBatch = first.done ? [] : first.value;
    // Recorded after the export began: not exported.
    await recordAuditEvent(testApp.deps.db, { actorId: null, action: 'late', subjectType: 'lens', subjectId });
    const sizes = [firstBatch.length];
    const actions = firstBatch.map((row) => row.action);
    for await (const batch of batches) {
      sizes.push(batch.length);
      actions.push(...batch.map((row) => row.action));
    }
    expect(sizes).toEqual([3, 3, 1]);
    expect(actions).toEqual(['single.3', 'single.2', 'single.1', 'single.0', 'tie.2', 'tie.1', 'tie.0']);
  });
});

