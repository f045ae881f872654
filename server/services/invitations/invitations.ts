import { and, desc, eq, gt, isNotNull, isNull, lte, type SQL } from 'drizzle-orm';
import type { Database } from '../../db/client';
import { invitations, organisations, people, personRoles, type Role } from '../../db/schema';
import { HttpError } from '../../http-error';
import { HttpStatus } from '../../http-status';
import type { CreateInvitationBody, InvitationLinkView, InvitationState, InvitationSummary, PersonRole } from '../../../shared/schemas/admin';
import { recordAuditEvent } from '../audit-log';
import type { Actor } from '../catalogue-queries';
import type { Queryable } from '../numbering';
import { queueMail } from '../outbound-mail/queue-mail';
import type { PasswordHasher } from '../passwords';
import { rolesFitOrganisation } from '../people/change-person-roles';
import { findLabName } from '../people/find-lab-name';
import { createLinkToken, hashLinkToken } from '../people/link-token';
import { describeRolesInWords, invitationMail } from './invitation-mail';

export interface InvitationSettings {
  baseUrl: string;
  expiryHours: number;
}

export const INVITATION_NOT_FOUND_MESSAGE = 'This invitation link is not valid; copy the whole link from the e-mail, or ask the lab for a new invitation.';
export const INVITATION_USED_MESSAGE = 'This invitation has already been accepted; sign in with the password you chose.';
export const INVITATION_EXPIRED_MESSAGE = 'This invitation has expired; ask the lab to send you a new one.';
export const INVITATION_REVOKED_MESSAGE = 'This invitation was withdrawn by the lab; ask them if you still need an account.';

function stateOf(row: { usedAt: Date | null; revokedAt: Date | null; expiresAt: Date }, now: Date): InvitationState {
  if (row.usedAt) return 'used';
  if (row.revokedAt) return 'revoked';
  return row.expiresAt.getTime() <= now.getTime() ? 'expired' : 'pending';
}

async function organisationOf(tx: Queryable, organisationId: string | null | undefined) {
  if (organisationId) {
    const [row] = await tx
      .select({ id: organisations.id, name: organisations.name, kind: organisations.kind })
      .from(organisations)
      .where(eq(organisations.id, organisationId));
    if (!row) throw new HttpError(HttpStatus.BAD_REQUEST, 'Field "organisationId" names no organisation.', { organisationId: 'No organisation has this id.' });
    return row;
  }
  return null;
}

/** The lab's own organisation, for staff invited without one. */
async function labOrganisation(tx: Queryable) {
  const [row] = await tx
    .select({ id: organisations.id, name: organisations.name, kind: organisations.kind })
    .from(organisations)
    .where(eq(organisations.kind, 'lab'))
    .orderBy(organisations.createdAt)
    .limit(1);
  return row ?? null;
}

async function queueInvitationMail(
  tx: Queryable,
  invitation: { id: string; email: string; name: string; roles: string[]; organisationName: string | null; expiresAt: Date },
  token: string,
  invitedById: string,
  settings: InvitationSettings,
): Promise<void> {
  const [inviter] = await tx.select({ name: people.name }).from(people).where(eq(people.id, invitedById));
  const mail = invitationMail({
    name: invitation.name,
    labName: await findLabName(tx),
    invitedByName: inviter?.name ?? null,
    roleWords: describeRolesInWords(invitation.roles),
    organisationName: invitation.organisationName,
    link: `${settings.baseUrl}/invitation/${token}`,
    expiresAt: invitation.expiresAt,
  });
  await queueMail(tx, { kind: 'invitation', to: [invitation.email], ...mail, subjectType: 'invitation', subjectId: invitation.id });
}

/** Creates an invitation and queues its mail; one transaction with its audit event. */
export async function createInvitation(db: Database, input: CreateInvitationBody, actor: Actor, settings: InvitationSettings): Promise<string> {
  return db.transaction(async (tx) => {
    const [existing] = await tx.select({ id: people.id }).from(people).where(eq(people.email, input.email));
    if (existing) {
      throw new HttpError(HttpStatus.CONFLICT, `${input.email} already has a Paraxia account.`, { email: 'This address already has an account.' });
    }
    const [pending] = await tx
      .select({ id: invitations.id })
      .from(invitations)
      .where(and(eq(invitations.email, input.email), isNull(invitations.usedAt), isNull(invitations.revokedAt), gt(invitations.expiresAt, new Date())));
    if (pending) {
      throw new HttpError(HttpStatus.CONFLICT, `${input.email} already has a pending invitation; resend or withdraw it instead.`, {
        email: 'This address already has a pending invitation.',
      });
    }
    const organisation = (await organisationOf(tx, input.organisationId)) ?? (input.roles.includes('client') ? null : await labOrganisation(tx));
    const misfit = rolesFitOrganisation(input.roles, organisation?.kind ?? null);
    if (misfit) throw new HttpError(HttpStatus.BAD_REQUEST, misfit, { roles: misfit });

    const { token, tokenHash } = createLinkToken();
    const expiresAt = new Date(Date.now() + settings.expiryHours * 3_600_000);
    const [row] = await tx
      .insert(invitations)
      .values({
        email: input.email,
        name: input.name,
        roles: input.roles,
        organisationId: organisation?.id ?? null,
        tokenHash,
        expiresAt,
        invitedById: actor.actorId,
      })
      .returning({ id: invitations.id });
    await queueInvitationMail(
      tx,
      { id: row.id, email: input.email, name: input.name, roles: input.roles, organisationName: organisation?.name ?? null, expiresAt },
      token,
      actor.actorId,
      settings,
    );
    await recordAuditEvent(tx, {
      actorId: actor.actorId,
      action: 'invitation.sent',
      subjectType: 'invitation',
      subjectId: row.id,
      details: { email: input.email, roles: input.roles, organisationId: organisation?.id ?? null },
      ip: actor.ip,
    });
    return row.id;
  });
}

const summaryColumns = {
  id: invitations.id,
  email: invitations.email,
  name: invitations.name,
  roles: invitations.roles,
  organisationId: organisations.id,
  organisationName: organisations.name,
  expiresAt: invitations.expiresAt,
  createdAt: invitations.createdAt,
  usedAt: invitations.usedAt,
  revokedAt: invitations.revokedAt,
  invitedById: people.id,
  invitedByName: people.name,
};

export async function listInvitations(db: Database, filter: { state?: InvitationState; invitationId?: string }): Promise<InvitationSummary[]> {
  const now = new Date();
  const conditions: SQL[] = [];
  if (filter.invitationId) conditions.push(eq(invitations.id, filter.invitationId));
  if (filter.state === 'used') conditions.push(isNotNull(invitations.usedAt));
  if (filter.state === 'revoked') conditions.push(isNull(invitations.usedAt), isNotNull(invitations.revokedAt));
  if (filter.state === 'pending' || filter.state === 'expired') {
    conditions.push(isNull(invitations.usedAt), isNull(invitations.revokedAt));
    conditions.push(filter.state === 'pending' ? gt(invitations.expiresAt, now) : lte(invitations.expiresAt, now));
  }
  const rows = await db
    .select(summaryColumns)
    .from(invitations)
    .leftJoin(organisations, eq(organisations.id, invitations.organisationId))
    .leftJoin(people, eq(people.id, invitations.invitedById))
    .where(conditions.length > 0 ? and(...conditions) : undefined)
    .orderBy(desc(invitations.createdAt))
    .limit(500);
  return rows.map((row) => ({
    id: row.id,
    email: row.email,
    name: row.name,
    roles: row.roles as PersonRole[],
    organisation: row.organisationId && row.organisationName ? { id: row.organisationId, name: row.organisationName } : null,
    state: stateOf(row, now),
    expiresAt: row.expiresAt.toISOString(),
    createdAt: row.createdAt.toISOString(),
    usedAt: row.usedAt?.toISOString() ?? null,
    revokedAt: row.revokedAt?.toISOString() ?? null,
    invitedBy: row.invitedById && row.invitedByName ? { id: row.invitedById, name: row.invitedByName } : null,
  }));
}

async function lockInvitation(tx: Queryable, invitationId: string) {
  const [row] = await tx.select().from(invitations).where(eq(invitations.id, invitationId)).for('update');
  if (!row) throw new HttpError(HttpStatus.NOT_FOUND, 'There is no invitation with this id.');
  return row;
}

export async function revokeInvitation(db: Database, invitationId: string, actor: Actor): Promise<void> {
  await db.transaction(async (tx) => {
    const row = await lockInvitation(tx, invitationId);
    if (row.usedAt) throw new HttpError(HttpStatus.CONFLICT, 'This invitation was already accepted; deactivate the person instead.');
    if (row.revokedAt) return;
    await tx.update(invitations).set({ revokedAt: new Date() }).where(eq(invitations.id, invitationId));
    await recordAuditEvent(tx, {
      actorId: actor.actorId,
      action: 'invitation.revoked',
      subjectType: 'invitation',
      subjectId: invitationId,
      details: { email: row.email },
      ip: actor.ip,
    });
  });
}

/** A fresh link and expiry for an unused invitation; the old link stops working. */
export async function resendInvitation(db: Database, invitationId: string, actor: Actor, settings: InvitationSettings): Promise<void> {
  await db.transaction(async (tx) => {
    const row = await lockInvitation(tx, invitationId);
    if (row.usedAt) throw new HttpError(HttpStatus.CONFLICT, 'This invitation was already accepted; there is nothing to resend.');
    const [holder] = await tx.select({ id: people.id }).from(people).where(eq(people.email, row.email));
    if (holder) throw new HttpError(HttpStatus.CONFLICT, `${row.email} already has a Paraxia account.`);
    const { token, tokenHash } = createLinkToken();
    const expiresAt = new Date(Date.now() + settings.expiryHours * 3_600_000);
    await tx.update(invitations).set({ tokenHash, expiresAt, revokedAt: null }).where(eq(invitations.id, invitationId));
    const organisation = await organisationOf(tx, row.organisationId);
    await queueInvitationMail(
      tx,
      { id: row.id, email: row.email, name: row.name, roles: row.roles, organisationName: organisation?.name ?? null, expiresAt },
      token,
      actor.actorId,
      settings,
    );
    await recordAuditEvent(tx, {
      actorId: actor.actorId,
      action: 'invitation.resent',
      subjectType: 'invitation',
      subjectId: invitationId,
      details: { email: row.email },
      ip: actor.ip,
    });
  });
}

async function findUsableInvitation(tx: Queryable, token: string, options: { lock: boolean }) {
  const query = tx.select().from(invitations).where(eq(invitations.tokenHash, hashLinkToken(token)));
  const [row] = options.lock ? await query.for('update') : await query;
  if (!row) throw new HttpError(HttpStatus.NOT_FOUND, INVITATION_NOT_FOUND_MESSAGE);
  if (row.usedAt) throw new HttpError(HttpStatus.GONE, INVITATION_USED_MESSAGE);
  if (row.revokedAt) throw new HttpError(HttpStatus.GONE, INVITATION_REVOKED_MESSAGE);
  if (row.expiresAt.getTime() <= Date.now()) throw new HttpError(HttpStatus.GONE, INVITATION_EXPIRED_MESSAGE);
  return row;
}

export async function readInvitationLink(db: Database, token: string): Promise<InvitationLinkView> {
  const row = await findUsableInvitation(db, token, { lock: false });
  const organisation = await organisationOf(db, row.organisationId);
  return {
    name: row.name,
    email: row.email,
    labName: await findLabName(db),
    organisationName: organisation?.kind === 'client' ? organisation.name : null,
    roles: row.roles as PersonRole[],
    expiresAt: row.expiresAt.toISOString(),
  };
}

/** Creates the person the invitation describes and uses the invitation up; returns the new person's id. */
export async function acceptInvitation(db: Database, passwords: PasswordHasher, token: string, password: string, ip: string | null): Promise<string> {
  const passwordHash = await passwords.hash(password);
  return db.transaction(async (tx) => {
    const row = await findUsableInvitation(tx, token, { lock: true });
    const [holder] = await tx.select({ id: people.id }).from(people).where(eq(people.email, row.email));
    if (holder) throw new HttpError(HttpStatus.CONFLICT, `${row.email} already has a Paraxia account; sign in instead.`);
    const [person] = await tx
      .insert(people)
      .values({ email: row.email, name: row.name, passwordHash, organisationId: row.organisationId })
      .returning({ id: people.id });
    await tx.insert(personRoles).values((row.roles as Role[]).map((role) => ({ personId: person.id, role })));
    await tx.update(invitations).set({ usedAt: new Date(), personId: person.id }).where(eq(invitations.id, row.id));
    await recordAuditEvent(tx, {
      actorId: person.id,
      action: 'invitation.accepted',
      subjectType: 'invitation',
      subjectId: row.id,
      details: { email: row.email, personId: person.id, roles: row.roles },
      ip,
    });
    return person.id;
  });
}
