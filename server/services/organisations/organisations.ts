import { and, asc, eq, sql, type SQL } from 'drizzle-orm';
import type { Database } from '../../db/client';
import { organisationContacts, organisations, people } from '../../db/schema';
import { HttpError } from '../../http-error';
import { HttpStatus } from '../../http-status';
import type {
  OrganisationContact,
  OrganisationDetail,
  OrganisationWithCounts,
  SaveContactBody,
  SaveOrganisationBody,
} from '../../../shared/schemas/admin';
import { recordAuditEvent } from '../audit-log';
import type { Actor } from '../catalogue-queries';
import type { Queryable } from '../numbering';

const countColumns = {
  id: organisations.id,
  name: organisations.name,
  kind: organisations.kind,
  postalAddress: organisations.postalAddress,
  email: organisations.email,
  phone: organisations.phone,
  createdAt: organisations.createdAt,
  contactCount: sql<number>`(select count(*)::int from organisation_contacts c where c.organisation_id = organisations.id)`,
  personCount: sql<number>`(select count(*)::int from people p where p.organisation_id = organisations.id)`,
  workOrderCount: sql<number>`(select count(*)::int from work_orders w where w.organisation_id = organisations.id)`,
};

function toOrganisation(row: Omit<OrganisationWithCounts, 'createdAt'> & { createdAt: Date }): OrganisationWithCounts {
  return { ...row, createdAt: row.createdAt.toISOString() };
}

export async function listOrganisationsWithCounts(db: Database, filter: { kind?: 'lab' | 'client' }): Promise<OrganisationWithCounts[]> {
  const rows = await db
    .select(countColumns)
    .from(organisations)
    .where(filter.kind ? eq(organisations.kind, filter.kind) : undefined)
    .orderBy(asc(organisations.name));
  return rows.map(toOrganisation);
}

function toContact(row: typeof organisationContacts.$inferSelect): OrganisationContact {
  return {
    id: row.id,
    organisationId: row.organisationId,
    name: row.name,
    email: row.email,
    position: row.position,
    phone: row.phone,
    receivesCertificates: row.receivesCertificates,
    createdAt: row.createdAt.toISOString(),
  };
}

export async function getOrganisationDetail(db: Database, organisationId: string): Promise<OrganisationDetail> {
  const [row] = await db.select(countColumns).from(organisations).where(eq(organisations.id, organisationId));
  if (!row) throw new HttpError(HttpStatus.NOT_FOUND, 'There is no organisation with this id.');
  const contacts = await db
    .select()
    .from(organisationContacts)
    .where(eq(organisationContacts.organisationId, organisationId))
    .orderBy(asc(organisationContacts.name));
  const members = await db
    .select({ id: people.id, name: people.name, email: people.email, active: people.active })
    .from(people)
    .where(eq(people.organisationId, organisationId))
    .orderBy(asc(people.name));
  return { ...toOrganisation(row), contacts: contacts.map(toContact), people: members };
}

async function assertNameFree(tx: Queryable, name: string, exceptId?: string): Promise<void> {
  const conditions: SQL[] = [sql`lower(${organisations.name}) = lower(${name})`];
  if (exceptId) conditions.push(sql`${organisations.id} <> ${exceptId}`);
  const [clash] = await tx.select({ id: organisations.id }).from(organisations).where(and(...conditions));
  if (clash) throw new HttpError(HttpStatus.CONFLICT, `An organisation called “${name}” already exists.`, { name: 'This name is already taken.' });
}

/** A new client organisation (the lab itself is made by the set-up, not here). */
export async function createClientOrganisation(db: Database, input: SaveOrganisationBody, actor: Actor): Promise<string> {
  return db.transaction(async (tx) => {
    await assertNameFree(tx, input.name);
    const [row] = await tx
      .insert(organisations)
      .values({ name: input.name, kind: 'client', postalAddress: input.postalAddress ?? '', email: input.email ?? null, phone: input.phone ?? null })
      .returning({ id: organisations.id });
    await recordAuditEvent(tx, { actorId: actor.actorId, action: 'organisation.created', subjectType: 'organisation', subjectId: row.id, details: { name: input.name }, ip: actor.ip });
    return row.id;
  });
}

/**
 * Renames an organisation and changes its postal address, e-mail and phone
 * (fields left out stay as they are). A rename is audited as
 * `organisation.renamed` with before and after; other changes as
 * `organisation.details-changed` naming the fields.
 */
export async function updateOrganisation(db: Database, organisationId: string, input: SaveOrganisationBody, actor: Actor): Promise<void> {
  await db.transaction(async (tx) => {
    const [current] = await tx
      .select({ name: organisations.name, postalAddress: organisations.postalAddress, email: organisations.email, phone: organisations.phone })
      .from(organisations)
      .where(eq(organisations.id, organisationId))
      .for('update');
    if (!current) throw new HttpError(HttpStatus.NOT_FOUND, 'There is no organisation with this id.');
    const details = {
      ...(input.postalAddress !== undefined ? { postalAddress: input.postalAddress } : {}),
      ...(input.email !== undefined ? { email: input.email } : {}),
      ...(input.phone !== undefined ? { phone: input.phone } : {}),
    };
    const changedDetails = (Object.keys(details) as (keyof typeof details)[]).filter((key) => details[key] !== current[key]);
    const renamed = current.name !== input.name;
    if (!renamed && changedDetails.length === 0) return;
    if (renamed) await assertNameFree(tx, input.name, organisationId);
    await tx.update(organisations).set({ name: input.name, ...details }).where(eq(organisations.id, organisationId));
    if (renamed) {
      await recordAuditEvent(tx, {
        actorId: actor.actorId,
        action: 'organisation.renamed',
        subjectType: 'organisation',
        subjectId: organisationId,
        details: { before: current.name, after: input.name },
        ip: actor.ip,
      });
    }
    if (changedDetails.length > 0) {
      await recordAuditEvent(tx, {
        actorId: actor.actorId,
        action: 'organisation.details-changed',
        subjectType: 'organisation',
        subjectId: organisationId,
        details: { fields: changedDetails, before: Object.fromEntries(changedDetails.map((k) => [k, current[k]])), after: Object.fromEntries(changedDetails.map((k) => [k, details[k]])) },
        ip: actor.ip,
      });
    }
  });
}

async function assertOrganisationExists(tx: Queryable, organisationId: string): Promise<void> {
  const [row] = await tx.select({ id: organisations.id }).from(organisations).where(eq(organisations.id, organisationId));
  if (!row) throw new HttpError(HttpStatus.NOT_FOUND, 'There is no organisation with this id.');
}

export async function createContact(db: Database, organisationId: string, input: SaveContactBody, actor: Actor): Promise<OrganisationContact> {
  return db.transaction(async (tx) => {
    await assertOrganisationExists(tx, organisationId);
    const [row] = await tx.insert(organisationContacts).values({ organisationId, ...input }).returning();
    await recordAuditEvent(tx, {
      actorId: actor.actorId,
      action: 'organisation.contact-added',
      subjectType: 'organisation',
      subjectId: organisationId,
      details: { contactId: row.id, name: row.name, email: row.email },
      ip: actor.ip,
    });
    return toContact(row);
  });
}

async function lockContact(tx: Queryable, organisationId: string, contactId: string) {
  const [row] = await tx
    .select()
    .from(organisationContacts)
    .where(and(eq(organisationContacts.id, contactId), eq(organisationContacts.organisationId, organisationId)))
    .for('update');
  if (!row) throw new HttpError(HttpStatus.NOT_FOUND, 'This organisation has no contact with this id.');
  return row;
}

export async function updateContact(db: Database, organisationId: string, contactId: string, input: SaveContactBody, actor: Actor): Promise<OrganisationContact> {
  return db.transaction(async (tx) => {
    const before = await lockContact(tx, organisationId, contactId);
    const [row] = await tx.update(organisationContacts).set(input).where(eq(organisationContacts.id, contactId)).returning();
    const changed = (Object.keys(input) as (keyof SaveContactBody)[]).filter((key) => before[key] !== row[key]);
    await recordAuditEvent(tx, {
      actorId: actor.actorId,
      action: 'organisation.contact-changed',
      subjectType: 'organisation',
      subjectId: organisationId,
      details: { contactId, changed },
      ip: actor.ip,
    });
    return toContact(row);
  });
}

export async function deleteContact(db: Database, organisationId: string, contactId: string, actor: Actor): Promise<void> {
  await db.transaction(async (tx) => {
    const before = await lockContact(tx, organisationId, contactId);
    await tx.delete(organisationContacts).where(eq(organisationContacts.id, contactId));
    await recordAuditEvent(tx, {
      actorId: actor.actorId,
      action: 'organisation.contact-removed',
      subjectType: 'organisation',
      subjectId: organisationId,
      details: { contactId, name: before.name, email: before.email },
      ip: actor.ip,
    });
  });
}
