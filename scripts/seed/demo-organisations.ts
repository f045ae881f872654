import { inArray } from 'drizzle-orm';
import type { Database } from '../../server/db/client';
import { organisations, type OrganisationKind } from '../../server/db/schema';

/** Invented organisations; any likeness to real ones is unintended. */
export const demoOrganisations = [
  { key: 'lab', name: 'Larkspur Optical Test Laboratory', kind: 'lab' },
  { key: 'quillmere', name: 'Quillmere Instruments', kind: 'client' },
  { key: 'tovel', name: 'Tovel Marine Optics', kind: 'client' },
] as const satisfies readonly { key: string; name: string; kind: OrganisationKind }[];

export type DemoOrganisationKey = (typeof demoOrganisations)[number]['key'];

/** Inserts the missing demo organisations; returns every demo organisation's id by key. */
export async function seedDemoOrganisations(db: Database): Promise<Record<DemoOrganisationKey, string>> {
  await db
    .insert(organisations)
    .values(demoOrganisations.map(({ name, kind }) => ({ name, kind })))
    .onConflictDoNothing({ target: organisations.name });
  const rows = await db
    .select({ id: organisations.id, name: organisations.name })
    .from(organisations)
    .where(inArray(organisations.name, demoOrganisations.map((o) => o.name)));
  const idByName = new Map(rows.map((row) => [row.name, row.id]));
  return Object.fromEntries(
    demoOrganisations.map((o) => {
      const id = idByName.get(o.name);
      if (!id) throw new Error(`Demo organisation "${o.name}" is missing after seeding.`);
      return [o.key, id];
    }),
  ) as Record<DemoOrganisationKey, string>;
}
