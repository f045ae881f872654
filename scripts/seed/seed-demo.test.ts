import { inArray } from 'drizzle-orm';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createDatabase, type DatabaseConnection } from '../../server/db/client';
import { organisations, people } from '../../server/db/schema';
import { createPasswordHasher } from '../../server/services/passwords';
import { findPersonByEmail } from '../../server/services/people';
import { testEnv } from '../../tests/setup/test-services';
import { demoOrganisations } from './demo-organisations';
import { demoPeople } from './demo-people';
import { seedDemo } from './seed-demo';

let connection: DatabaseConnection;
const passwords = createPasswordHasher({ rounds: 4 });

beforeAll(() => {
  connection = createDatabase({ databaseUrl: testEnv().DATABASE_URL, maxConnections: 2 });
});

afterAll(async () => {
  await connection?.pool.end();
});

describe('seedDemo', () => {
  it('creates the demo lab, two clients and one person per role, and a second run changes nothing', async () => {
    const first = await seedDemo({ db: connection.db, passwords });
    const second = await seedDemo({ db: connection.db, passwords });
    expect(second).toEqual(first);

    const orgRows = await connection.db
      .select()
      .from(organisations)
      .where(inArray(organisations.name, demoOrganisations.map((o) => o.name)));
    expect(orgRows.map((o) => [o.name, o.kind]).sort()).toEqual([
      ['Larkspur Optical Test Laboratory', 'lab'],
      ['Quillmere Instruments', 'client'],
      ['Tovel Marine Optics', 'client'],
    ]);
    const peopleRows = await connection.db.select().from(people).where(inArray(people.email, demoPeople.map((p) => p.email)));
    expect(peopleRows).toHaveLength(5);

    const buyer = await findPersonByEmail(connection.db, 'buyer@quillmere.example');
    expect(buyer).toMatchObject({ roles: ['client'], organisation: { name: 'Quillmere Instruments', kind: 'client' }, active: true });
    for (const role of ['technician', 'reviewer', 'admin'] as const) {
      const person = demoPeople.find((p) => p.roles.includes(role))!;
      const stored = await findPersonByEmail(connection.db, person.email);
      expect(stored?.roles).toEqual([role]);
      expect(stored?.organisation?.name).toBe('Larkspur Optical Test Laboratory');
      expect(await passwords.verify(person.password, stored!.passwordHash)).toBe(true);
    }
  });
});
