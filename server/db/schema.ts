import { sql } from 'drizzle-orm';
import {
  bigserial,
  boolean,
  check,
  index,
  jsonb,
  pgEnum,
  pgTable,
  primaryKey,
  text,
  timestamp,
  uuid,
  varchar,
  json,
} from 'drizzle-orm/pg-core';

export const organisationKindValues = ['lab', 'client'] as const;
export type OrganisationKind = (typeof organisationKindValues)[number];
export const organisationKind = pgEnum('organisation_kind', organisationKindValues);

export const roleValues = ['technician', 'reviewer', 'client', 'admin'] as const;
export type Role = (typeof roleValues)[number];
export const personRole = pgEnum('person_role', roleValues);

export const organisations = pgTable('organisations', {
  id: uuid('id').primaryKey().defaultRandom(),
  name: text('name').notNull().unique(),
  kind: organisationKind('kind').notNull(),
  createdAt: timestamp('created_at', { withTimezone: true }).notNull().defaultNow(),
});

export const people = pgTable(
  'people',
  {
    id: uuid('id').primaryKey().defaultRandom(),
    email: text('email').notNull().unique(),
    name: text('name').notNull(),
    passwordHash: text('password_hash').notNull(),
    organisationId: uuid('organisation_id').references(() => organisations.id, { onDelete: 'restrict' }),
    active: boolean('active').notNull().default(true),
    createdAt: timestamp('created_at', { withTimezone: true }).notNull().defaultNow(),
  },
  (table) => [
    // Addresses are compared lower-cased; storing them that way keeps the unique index honest.
    check('people_email_lower_case', sql`${table.email} = lower(${table.email})`),
    index('people_organisation_idx').on(table.organisationId),
  ],
);

export const personRoles = pgTable(
  'person_roles',
  {
    personId: uuid('person_id')
      .notNull()
      .references(() => people.id, { onDelete: 'cascade' }),
    role: personRole('role').notNull(),
  },
  (table) => [primaryKey({ columns: [table.personId, table.role] })],
);

export const auditEvents = pgTable(
  'audit_events',
  {
    id: bigserial('id', { mode: 'number' }).primaryKey(),
    at: timestamp('at', { withTimezone: true }).notNull().defaultNow(),
    actorId: uuid('actor_id').references(() => people.id, { onDelete: 'set null' }),
    action: text('action').notNull(),
    subjectType: text('subject_type'),
    subjectId: text('subject_id'),
    details: jsonb('details').$type<Record<string, unknown>>().notNull().default({}),
    ip: text('ip'),
  },
  (table) => [
    index('audit_events_at_idx').on(table.at),
    index('audit_events_subject_idx').on(table.subjectType, table.subjectId),
    index('audit_events_actor_idx').on(table.actorId),
  ],
);

/** The express-session store table read and written by connect-pg-simple
 * (its expected columns: sid, sess, expire). Declared here so that the
 * migrations own it instead of the store's createTableIfMissing. */
export const httpSessions = pgTable(
  'http_sessions',
  {
    sid: varchar('sid').primaryKey(),
    sess: json('sess').notNull(),
    expire: timestamp('expire', { precision: 6 }).notNull(),
  },
  (table) => [index('http_sessions_expire_idx').on(table.expire)],
);
