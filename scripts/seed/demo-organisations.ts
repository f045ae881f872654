import { inArray } from 'drizzle-orm';
import type { Database } from '../../server/db/client';
import { organisations, type OrganisationKind } from '../../server/db/schema';

/** Invented organisations; any likeness to real ones is unintended. */
export const demoOrganisations = [
  {
    key: 'lab',
    name: 'Larkspur Optical Test Laboratory',
    kind: 'lab',
    postalAddress: 'Unit 3, Foundry Lane Works\n41 Larkspur Road\nWrenford WF2 8LQ, Examplia',
    email: 'certificates@larkspur-lab.example',
    phone: '+00 555 0199',
  },
  { key: 'quillmere', name: 'Quillmere Instruments', kind: 'client', postalAddress: 'Goods inwards, Building C\n7 Quillmere Park\nHatherby HB4 2QE, Examplia' },
  { key: 'tovel', name: 'Tovel Marine Optics', kind: 'client', postalAddress: 'Harbour Works\nTovel Quay\nSaltmarsh SM1 9TV, Examplia' },
] as const satisfies readonly { key: string; name: string; kind: OrganisationKind; postalAddress: string; email?: string; phone?: string }[];

export type DemoOrganisationKey = (typeof demoOrganisations)[number]['key'];

/** Inserts the missing demo organisations; returns every demo organisation's id by key. */
export async function seedDemoOrganisations(db: Database): Promise<Record<DemoOrganisationKey, string>> {
  await db
    .insert(organisations)
    .values(demoOrganisations.map(({ key: _key, ...organisation }) => organisation))
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
