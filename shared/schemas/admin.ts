/**
 * Administration as the API takes and returns it: people and roles,
 * invitations, password resets, organisations and contacts, the audit log
 * and the outbound mail. Shared by the server's validators and the client.
 */
import { z } from 'zod';
import { isIsoCalendarDate, optionalText, pageField, pageSizeField, trimmedText, uuidField } from './work-orders';

/* Kept equal to the database enums in server/db/schema.ts. */
export const personRoles = ['technician', 'reviewer', 'client', 'admin'] as const;
export type PersonRole = (typeof personRoles)[number];
export const labRoles = ['technician', 'reviewer', 'admin'] as const;

export const outboundMailStatuses = ['queued', 'sending', 'sent', 'retrying', 'failed'] as const;
export type OutboundMailStatus = (typeof outboundMailStatuses)[number];

export const invitationStates = ['pending', 'used', 'expired', 'revoked'] as const;
export type InvitationState = (typeof invitationStates)[number];

/** NIST SP 800-63B §5.1.1.2 asks at least 8 characters and allows long passphrases; Paraxia asks 12. */
export const PASSWORD_MIN_LENGTH = 12;
export const PASSWORD_MAX_LENGTH = 1024;

export const newPasswordField = z
  .string({ error: (issue) => (issue.input === undefined ? 'Field "password" is required.' : 'Field "password" must be text.') })
  .min(PASSWORD_MIN_LENGTH, { error: `Field "password" must be at least ${PASSWORD_MIN_LENGTH} characters long.` })
  .max(PASSWORD_MAX_LENGTH, { error: `Field "password" must be at most ${PASSWORD_MAX_LENGTH} characters long.` })
  .refine((value) => value.trim().length >= PASSWORD_MIN_LENGTH, {
    error: `Field "password" must have at least ${PASSWORD_MIN_LENGTH} characters that are not spaces.`,
  });

const emailField = z
  .string({ error: (issue) => (issue.input === undefined ? 'Field "email" is required.' : 'Field "email" must be text.') })
  .trim()
  .toLowerCase()
  .min(1, { error: 'Field "email" must not be empty.' })
  .max(320, { error: 'Field "email" must be at most 320 characters long.' })
  .pipe(z.email({ error: 'Field "email" must be an e-mail address like name@lab.example.' }));

const rolesField = z
  .array(z.enum(personRoles, { error: 'Field "roles" may only hold technician, reviewer, client or admin.' }), {
    error: 'Field "roles" must be a list of roles.',
  })
  .min(1, { error: 'Field "roles" must name at least one role.' })
  .transform((roles) => personRoles.filter((role) => roles.includes(role)));

const booleanQuery = (field: string) =>
  z
    .enum(['true', 'false'], { error: `Field "${field}" must be true or false.` })
    .transform((value) => value === 'true')
    .optional();

const optionalQueryText = (field: string, max: number) =>
  z
    .string({ error: `Field "${field}" must be text.` })
    .trim()
    .max(max, { error: `Field "${field}" must be at most ${max} characters long.` })
    .optional()
    .transform((value) => (value === undefined || value === '' ? undefined : value));

const isoDateQuery = (field: string) =>
  optionalQueryText(field, 10).refine((value) => value === undefined || isIsoCalendarDate(value), {
    error: `Field "${field}" must be a real date written YYYY-MM-DD (e.g. 2026-03-31).`,
  });

/* ------------------------------- people ------------------------------- */

export const PEOPLE_PAGE_SIZE_MAX = 200;

export const listPeopleQuery = z.object({
  q: optionalQueryText('q', 200),
  role: z.enum(personRoles, { error: 'Field "role" must be technician, reviewer, client or admin.' }).optional(),
  active: booleanQuery('active'),
  page: pageField(),
  /** Absent: everyone on one page (the system overview and older callers). */
  pageSize: z.coerce
    .number({ error: `Field "pageSize" must be a whole number from 1 to ${PEOPLE_PAGE_SIZE_MAX}.` })
    .int({ error: `Field "pageSize" must be a whole number from 1 to ${PEOPLE_PAGE_SIZE_MAX}.` })
    .min(1, { error: `Field "pageSize" must be a whole number from 1 to ${PEOPLE_PAGE_SIZE_MAX}.` })
    .max(PEOPLE_PAGE_SIZE_MAX, { error: `Field "pageSize" must be a whole number from 1 to ${PEOPLE_PAGE_SIZE_MAX}.` })
    .optional(),
});
export type ListPeopleQuery = z.output<typeof listPeopleQuery>;

export const personIdParams = z.object({ personId: uuidField('personId') });

export const changeRolesBody = z.object({ roles: rolesField }).strict();
export type ChangeRolesBody = z.output<typeof changeRolesBody>;

export interface AdminPersonSummary {
  id: string;
  email: string;
  name: string;
  roles: PersonRole[];
  organisation: { id: string; name: string; kind: 'lab' | 'client' } | null;
  active: boolean;
  createdAt: string;
  lastSignInAt: string | null;
  deactivatedAt: string | null;
}

export interface PeoplePage {
  people: AdminPersonSummary[];
  total: number;
  page: number;
  pageSize: number;
}

/* ---------------------------- invitations ---------------------------- */

export const createInvitationBody = z
  .object({
    email: emailField,
    name: trimmedText('name', 200),
    roles: rolesField,
    organisationId: uuidField('organisationId').nullable().optional(),
  })
  .strict();
export type CreateInvitationBody = z.output<typeof createInvitationBody>;

export const listInvitationsQuery = z.object({
  state: z.enum(invitationStates, { error: 'Field "state" must be pending, used, expired or revoked.' }).optional(),
});
export type ListInvitationsQuery = z.output<typeof listInvitationsQuery>;

export const invitationIdParams = z.object({ invitationId: uuidField('invitationId') });

export const acceptInvitationBody = z.object({ password: newPasswordField }).strict();
export type AcceptInvitationBody = z.output<typeof acceptInvitationBody>;

export interface InvitationSummary {
  id: string;
  email: string;
  name: string;
  roles: PersonRole[];
  organisation: { id: string; name: string } | null;
  state: InvitationState;
  expiresAt: string;
  createdAt: string;
  usedAt: string | null;
  revokedAt: string | null;
  invitedBy: { id: string; name: string } | null;
}

/** What the public invitation page shows before the password is chosen. */
export interface InvitationLinkView {
  name: string;
  email: string;
  labName: string;
  organisationName: string | null;
  roles: PersonRole[];
  expiresAt: string;
}

/* --------------------------- password resets -------------------------- */

export const requestPasswordResetBody = z.object({ email: emailField }).strict();
export type RequestPasswordResetBody = z.output<typeof requestPasswordResetBody>;

export const completePasswordResetBody = z.object({ password: newPasswordField }).strict();
export type CompletePasswordResetBody = z.output<typeof completePasswordResetBody>;

export interface PasswordResetLinkView {
  name: string;
  email: string;
  labName: string;
  expiresAt: string;
}

/* --------------------------- organisations --------------------------- */

export const organisationIdParams = z.object({ organisationId: uuidField('organisationId') });
export const contactIdParams = z.object({ organisationId: uuidField('organisationId'), contactId: uuidField('contactId') });

/** As many lines as a certificate prints for an address. */
export const POSTAL_ADDRESS_MAX_LINES = 5;
export const POSTAL_ADDRESS_MAX_LINE_LENGTH = 120;

/** A postal address as typed, one line per line: lines trimmed, blank ones dropped; stored joined with newlines ('' when none). */
const postalAddressField = z
  .string({ error: 'Field "postalAddress" must be text.' })
  .transform((value) =>
    value
      .split(/\r?\n/)
      .map((line) => line.trim())
      .filter(Boolean),
  )
  .refine((lines) => lines.length <= POSTAL_ADDRESS_MAX_LINES, {
    error: `Field "postalAddress" must have at most ${POSTAL_ADDRESS_MAX_LINES} lines.`,
  })
  .refine((lines) => lines.every((line) => line.length <= POSTAL_ADDRESS_MAX_LINE_LENGTH), {
    error: `Each line of field "postalAddress" must be at most ${POSTAL_ADDRESS_MAX_LINE_LENGTH} characters long.`,
  })
  .transform((lines) => lines.join('\n'));

/** An e-mail address that may be left out: empty or null is stored as null. */
const optionalEmailField = z
  .string({ error: 'Field "email" must be text.' })
  .trim()
  .toLowerCase()
  .max(320, { error: 'Field "email" must be at most 320 characters long.' })
  .nullable()
  .refine((value) => !value || z.email().safeParse(value).success, { error: 'Field "email" must be an e-mail address like name@lab.example.' })
  .transform((value) => value || null);

/** Creating needs a name; on a change every field left out stays as it is. */
export const saveOrganisationBody = z
  .object({
    name: trimmedText('name', 200),
    postalAddress: postalAddressField.optional(),
    email: optionalEmailField.optional(),
    phone: optionalText('phone', 60).optional(),
  })
  .strict();
export type SaveOrganisationBody = z.output<typeof saveOrganisationBody>;

export const saveContactBody = z
  .object({
    name: trimmedText('name', 200),
    email: emailField,
    position: optionalText('position', 200).optional().transform((value) => value ?? null),
    phone: optionalText('phone', 60).optional().transform((value) => value ?? null),
    receivesCertificates: z.boolean({ error: 'Field "receivesCertificates" must be true or false.' }).default(true),
  })
  .strict();
export type SaveContactBody = z.output<typeof saveContactBody>;

export interface OrganisationWithCounts {
  id: string;
  name: string;
  kind: 'lab' | 'client';
  /** Lines joined with newlines; '' when not recorded. */
  postalAddress: string;
  email: string | null;
  phone: string | null;
  contactCount: number;
  personCount: number;
  workOrderCount: number;
  createdAt: string;
}

export interface OrganisationContact {
  id: string;
  organisationId: string;
  name: string;
  email: string;
  position: string | null;
  phone: string | null;
  receivesCertificates: boolean;
  createdAt: string;
}

export interface OrganisationDetail extends OrganisationWithCounts {
  contacts: OrganisationContact[];
  people: { id: string; name: string; email: string; active: boolean }[];
}

/* ------------------------------ audit log ----------------------------- */

export const AUDIT_PAGE_SIZE_DEFAULT = 50;
export const AUDIT_PAGE_SIZE_MAX = 200;

export const auditFilterQuery = z.object({
  actorId: uuidField('actorId').optional(),
  actor: optionalQueryText('actor', 200),
  action: optionalQueryText('action', 100),
  subjectType: optionalQueryText('subjectType', 100),
  subjectId: optionalQueryText('subjectId', 200),
  from: isoDateQuery('from'),
  to: isoDateQuery('to'),
});
export type AuditFilter = z.output<typeof auditFilterQuery>;

export const listAuditEventsQuery = auditFilterQuery.extend({
  page: pageField(),
  pageSize: pageSizeField(AUDIT_PAGE_SIZE_MAX, AUDIT_PAGE_SIZE_DEFAULT),
});
export type ListAuditEventsQuery = z.output<typeof listAuditEventsQuery>;

export interface AuditEventRow {
  id: number;
  at: string;
  actor: { id: string; name: string; email: string } | null;
  action: string;
  subjectType: string | null;
  subjectId: string | null;
  details: Record<string, unknown>;
  ip: string | null;
}

export interface AuditEventsPage {
  items: AuditEventRow[];
  total: number;
  page: number;
  pageSize: number;
}

/* ---------------------------- outbound mail --------------------------- */

export const MAIL_PAGE_SIZE_DEFAULT = 50;

export const listOutboundMailQuery = z.object({
  status: z.enum(outboundMailStatuses, { error: 'Field "status" must be queued, sending, sent, retrying or failed.' }).optional(),
  page: pageField(),
  pageSize: pageSizeField(200, MAIL_PAGE_SIZE_DEFAULT),
});
export type ListOutboundMailQuery = z.output<typeof listOutboundMailQuery>;

export const mailIdParams = z.object({ mailId: uuidField('mailId') });

export interface OutboundMailRow {
  id: string;
  kind: string;
  to: string[];
  subject: string;
  status: OutboundMailStatus;
  attempts: number;
  lastError: string | null;
  createdAt: string;
  sentAt: string | null;
  nextAttemptAt: string;
}

export interface OutboundMailPage {
  items: OutboundMailRow[];
  total: number;
  page: number;
  pageSize: number;
  countsByStatus: Record<OutboundMailStatus, number>;
}

export interface OutboundMailMessage extends OutboundMailRow {
  textBody: string;
}
