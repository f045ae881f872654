import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { changePersonRoles } from '../../../server/services/people/change-person-roles';
import { setPersonActive } from '../../../server/services/people/set-person-active';
import { signInAs, type SignedInSession } from '../../helpers/browser-session';
import { createTestOrganisation, createTestPerson } from '../../helpers/people';
import { createTestApp, type TestApp } from '../../helpers/test-app';
import { testEnv } from '../../setup/test-services';
import { createIsolatedDatabase, send } from './admin-fixtures';

// Its own database: "the last active administrator" depends on every admin row,
// and the shared test database holds other files' admins.
let isolated: { url: string; drop: () => Promise<void> };
let testApp: TestApp;
let labId: string;

beforeAll(async () => {
  isolated = await createIsolatedDatabase(testEnv().DATABASE_URL);
  testApp = createTestApp({ env: { DATABASE_URL: isolated.url } });
  labId = (await createTestOrganisation(testApp.deps, { kind: 'lab' })).id;
});

afterAll(async () => {
  await testApp?.close();
  await isolated?.drop();
});

async function activeAdminIds(session: SignedInSession): Promise<string[]> {
  const page = await session.agent.get('/api/people?role=admin&active=true');
  return page.body.people.map((p: { id: string }) => p.id).sort();
}

describe('the last active administrator', () => {
  let first: SignedInSession;

  it('cannot remove their own admin role or deactivate themselves (409 with a sentence)', async () => {
    first = await signInAs(testApp.app, await createTestPerson(testApp.deps, { roles: ['admin', 'technician'], organisationId: labId }));
    const ownRole = await send(first, 'put', `/api/people/${first.person.id}/roles`, { roles: ['technician'] });
    expect(ownRole.status).toBe(409);
    expect(ownRole.body.error.message).toBe(
      'You are the last active administrator, so your account cannot lose the administrator role; make someone else an administrator first.',
    );
    const ownAccount = await send(first, 'post', `/api/people/${first.person.id}/deactivate`);
    expect(ownAccount.status).toBe(409);
    expect(ownAccount.body.error.message).toBe(
      'You are the last active administrator, so your account cannot be deactivated; make someone else an administrator first.',
    );
    expect(await activeAdminIds(first)).toEqual([first.person.id]);
  });

  it('does not count an inactive admin as a second one', async () => {
    await createTestPerson(testApp.deps, { roles: ['admin'], organisationId: labId, active: false });
    expect((await send(first, 'put', `/api/people/${first.person.id}/roles`, { roles: ['technician'] })).status).toBe(409);
  });

  it('refuses, with the "this person" sentence, a change made by someone else to the last admin', async () => {
    const technician = await createTestPerson(testApp.deps, { roles: ['technician'], organisationId: labId });
    const actor = { actorId: technician.id, ip: null };
    await expect(changePersonRoles(testApp.deps.db, first.person.id, ['technician'], actor)).rejects.toMatchObject({
      status: 409,
      message: 'This person is the last active administrator and cannot lose the administrator role; make someone else an administrator first.',
    });
    await expect(setPersonActive(testApp.deps.db, first.person.id, false, actor)).rejects.toMatchObject({
      status: 409,
      message: 'This person is the last active administrator and cannot be deactivated; make someone else an administrator first.',
    });
  });

  it('lets one of two active admins take the other admin’s role, after which the remaining one is protected', async () => {
    const second = await signInAs(testApp.app, await createTestPerson(testApp.deps, { roles: ['admin'], organisationId: labId }));
    expect((await send(second, 'put', `/api/people/${first.person.id}/roles`, { roles: ['technician'] })).status).toBe(200);
    expect(await activeAdminIds(second)).toEqual([second.person.id]);
    expect((await send(second, 'put', `/api/people/${second.person.id}/roles`, { roles: ['reviewer'] })).status).toBe(409);
    // Give it back, so the next test starts with two admins again.
    expect((await send(second, 'put', `/api/people/${first.person.id}/roles`, { roles: ['admin', 'technician'] })).status).toBe(200);
  });

  it('when two admins remove each other at the same moment, exactly one succeeds and an admin remains', async () => {
    const [a, b] = [
      await signInAs(testApp.app, await createTestPerson(testApp.deps, { roles: ['admin'], organisationId: labId })),
      await signInAs(testApp.app, await createTestPerson(testApp.deps, { roles: ['admin'], organisationId: labId })),
    ];
    // Make a and b the only active admins.
    for (const id of await activeAdminIds(a)) {
      if (id !== a.person.id && id !== b.person.id) expect((await send(a, 'put', `/api/people/${id}/roles`, { roles: ['technician'] })).status).toBe(200);
    }
    expect(await activeAdminIds(a)).toEqual([a.person.id, b.person.id].sort());
    const [aOnB, bOnA] = await Promise.all([
      send(a, 'post', `/api/people/${b.person.id}/deactivate`),
      send(b, 'post', `/api/people/${a.person.id}/deactivate`),
    ]);
    const statuses = [aOnB.status, bOnA.status].sort();
    // The loser is refused either by the lock (409) or, if it arrived after the winner committed, by its own ended session (401).
    expect(statuses[0]).toBe(200);
    expect([401, 409]).toContain(statuses[1]);
    const survivor = aOnB.status === 200 ? a : b;
    expect(await activeAdminIds(survivor)).toEqual([survivor.person.id]);
  });
});
