import { eq } from 'drizzle-orm';
import type { Database } from '../../server/db/client';
import { people, personRoles, type Role } from '../../server/db/schema';
import type { PasswordHasher } from '../../server/services/passwords';
import type { DemoOrganisationKey } from './demo-organisations';

export interface DemoPerson {
  email: string;
  /** Demo only: printed by npm start so people can try each role. */
  password: string;
  name: string;
  roles: Role[];
  organisation: DemoOrganisationKey;
}

/** Invented people of the invented lab and clients. */
export const demoPeople: readonly DemoPerson[] = [
  { email: 'tech@larkspur-lab.example', password: 'demo-tech-2026', name: 'Maren Ashdown', roles: ['technician'], organisation: 'lab' },
  { email: 'review@larkspur-lab.example', password: 'demo-review-2026', name: 'Teodor Brannock', roles: ['reviewer'], organisation: 'lab' },
  { email: 'admin@larkspur-lab.example', password: 'demo-admin-2026', name: 'Odile Farrant', roles: ['admin'], organisation: 'lab' },
  { email: 'buyer@quillmere.example', password: 'demo-client-2026', name: 'Casimir Wendt', roles: ['client'], organisation: 'quillmere' },
  { email: 'optics@tovel-marine.example', password: 'demo-client-2026', name: 'Halvard Ness', roles: ['client'], organisation: 'tovel' },
];

/** Adds the demo people who are missing; an existing account (perhaps with a
 * changed password) is left as it is. Returns ids by e-mail. */
export async function seedDemoPeople(
  db: Database,
  options: { organisationIds: Record<DemoOrganisationKey, string>; passwords: PasswordHasher },
): Promise<{ idByEmail: Record<string, string>; created: string[] }> {
  const idByEmail: Record<string, string> = {};
  const created: string[] = [];
  for (const person of demoPeople) {
    let [existing] = await db.select({ id: people.id }).from(people).where(eq(people.email, person.email));
    if (!existing) {
      [existing] = await db
        .insert(people)
        .values({
          email: person.email,
          name: person.name,
          passwordHash: await options.passwords.hash(person.password),
          organisationId: options.organisationIds[person.organisation],
        })
        .onConflictDoNothing({ target: people.email })
        .returning({ id: people.id });
      if (!existing) [existing] = await db.select({ id: people.id }).from(people).where(eq(people.email, person.email));
      else created.push(person.email);
      await db
        .insert(personRoles)
        .values(person.roles.map((role) => ({ personId: existing!.id, role })))
        .onConflictDoNothing();
    }
    idByEmail[person.email] = existing!.id;
  }
  return { idByEmail, created };
}
