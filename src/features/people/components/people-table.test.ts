import { describe, expect, it } from 'vitest';
import type { AdminPersonSummary } from '@shared/schemas/admin';
import { countPeopleByRole } from '@/features/people/components/people-table';

function person(roles: AdminPersonSummary['roles'], active: boolean, lastSignInAt: string | null): AdminPersonSummary {
  return { id: Math.random().toString(), email: 'x@y.example', name: 'X', roles, organisation: null, active, createdAt: '', lastSignInAt, deactivatedAt: null };
}

describe('countPeopleByRole', () => {
  it('counts only active holders of each role, and those of them who never signed in', () => {
    const counts = countPeopleByRole([
      person(['technician', 'reviewer'], true, null),
      person(['technician'], true, '2026-12-01T10:00:00Z'),
      person(['technician'], false, null),
      person(['admin'], true, '2026-12-01T10:00:00Z'),
    ]);
    expect(counts).toEqual([
      { role: 'technician', active: 2, neverSignedIn: 1 },
      { role: 'reviewer', active: 1, neverSignedIn: 1 },
      { role: 'client', active: 0, neverSignedIn: 0 },
      { role: 'admin', active: 1, neverSignedIn: 0 },
    ]);
  });
});
