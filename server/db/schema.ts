import { sql } from 'drizzle-orm';
import {
  bigint,
  bigserial,
  boolean,
  check,
  doublePrecision,
  integer,
  index,
  jsonb,
  pgEnum,
  pgTable,
  primaryKey,
  text,
  timestamp,
  uniqueIndex,
  uuid,
  varchar,
  json,
} from 'drizzle-orm/pg-core';
import { focusOperators, measurementMethods } from '../../shared/schemas/measurement-manifest';

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
  /** Postal address, one line per line; empty when not recorded. The lab's is printed on every certificate. */
  postalAddress: text('postal_address').notNull().default(''),
  email: text('email'),
  phone: text('phone'),
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
    lastSignInAt: timestamp('last_sign_in_at', { withTimezone: true }),
    deactivatedAt: timestamp('deactivated_at', { withTimezone: true }),
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

/* ------------------------------------------------------------------ */
/* The bench workflow: work orders, lenses, equipment, measurements.  */
/* ------------------------------------------------------------------ */

export const workOrderStatusValues = ['requested', 'open', 'in-progress', 'completed', 'cancelled'] as const;
export type WorkOrderStatus = (typeof workOrderStatusValues)[number];
export const workOrderStatus = pgEnum('work_order_status', workOrderStatusValues);

export const decisionRuleValues = ['simple', 'guarded'] as const;
export type DecisionRule = (typeof decisionRuleValues)[number];
export const decisionRule = pgEnum('decision_rule', decisionRuleValues);

export const workOrders = pgTable(
  'work_orders',
  {
    id: uuid('id').primaryKey().defaultRandom(),
    /** Human-facing number, e.g. WO-2026-0012; unique. */
    number: text('number').notNull().unique(),
    organisationId: uuid('organisation_id')
      .notNull()
      .references(() => organisations.id, { onDelete: 'restrict' }),
    title: text('title').notNull(),
    clientReference: text('client_reference'),
    notes: text('notes'),
    status: workOrderStatus('status').notNull().default('open'),
    decisionRule: decisionRule('decision_rule').notNull().default('simple'),
    dueDate: text('due_date'), // ISO date (YYYY-MM-DD)
    createdById: uuid('created_by_id').references(() => people.id, { onDelete: 'set null' }),
    createdAt: timestamp('created_at', { withTimezone: true }).notNull().defaultNow(),
    updatedAt: timestamp('updated_at', { withTimezone: true }).notNull().defaultNow(),
  },
  (table) => [
    index('work_orders_organisation_idx').on(table.organisationId),
    index('work_orders_status_idx').on(table.status),
    index('work_orders_due_idx').on(table.dueDate),
    index('work_orders_created_idx').on(table.createdAt),
  ],
);

export const lenses = pgTable(
  'lenses',
  {
    id: uuid('id').primaryKey().defaultRandom(),
    workOrderId: uuid('work_order_id')
      .notNull()
      .references(() => workOrders.id, { onDelete: 'restrict' }),
    /** Identifier or serial marked on the item. */
    identifier: text('identifier').notNull(),
    description: text('description').notNull().default(''),
    partNumber: text('part_number'),
    /** Signed: negative for a diverging lens. */
    nominalFocalLengthMm: doublePrecision('nominal_focal_length_mm').notNull(),
    tolerancePercent: doublePrecision('tolerance_percent'),
    toleranceMm: doublePrecision('tolerance_mm'),
    createdAt: timestamp('created_at', { withTimezone: true }).notNull().defaultNow(),
  },
  (table) => [
    index('lenses_work_order_idx').on(table.workOrderId),
    index('lenses_part_number_idx').on(table.partNumber),
    check('lenses_tolerance_given', sql`${table.tolerancePercent} is not null or ${table.toleranceMm} is not null`),
    check('lenses_nominal_not_zero', sql`${table.nominalFocalLengthMm} <> 0`),
  ],
);

export const equipmentKindValues = ['camera', 'target', 'rail-scale', 'collimator', 'auxiliary-lens'] as const;
export type EquipmentKind = (typeof equipmentKindValues)[number];
export const equipmentKind = pgEnum('equipment_kind', equipmentKindValues);

/**
 * Values per kind (all uncertainties are standard, k = 1):
 * camera { pixelPitchUm, pixelPitchUncertaintyUm, widthPx?, heightPx? };
 * target { pattern: 'dot-pair'|'square', sizeMm, sizeUncertaintyMm, polarity? };
 * rail-scale { uncertaintyMm, lengthMm? };
 * collimator / auxiliary-lens { focalLengthMm, focalLengthUncertaintyMm }.
 */
export type EquipmentValues = Record<string, string | number | null>;

export const equipment = pgTable(
  'equipment',
  {
    id: uuid('id').primaryKey().defaultRandom(),
    kind: equipmentKind('kind').notNull(),
    identifier: text('identifier').notNull().unique(),
    description: text('description').notNull().default(''),
    serialNumber: text('serial_number'),
    values: jsonb('values').$type<EquipmentValues>().notNull(),
    calibrationReference: text('calibration_reference').notNull(),
    calibrationDueDate: text('calibration_due_date').notNull(), // ISO date
    active: boolean('active').notNull().default(true),
    createdAt: timestamp('created_at', { withTimezone: true }).notNull().defaultNow(),
    updatedAt: timestamp('updated_at', { withTimezone: true }).notNull().defaultNow(),
  },
  (table) => [index('equipment_kind_idx').on(table.kind)],
);

export const measurementMethodValues = measurementMethods;
export const measurementMethod = pgEnum('measurement_method', measurementMethodValues);

export const measurementStatusValues = [
  'draft',
  'analysing',
  'analysed',
  'analysis-failed',
  'submitted',
  'approved',
  'returned',
  'certified',
] as const;
export type MeasurementStatus = (typeof measurementStatusValues)[number];
export const measurementStatus = pgEnum('measurement_status', measurementStatusValues);

export const focusOperatorValues = focusOperators;
export const focusOperator = pgEnum('focus_operator', focusOperatorValues);

export const measurements = pgTable(
  'measurements',
  {
    id: uuid('id').primaryKey().defaultRandom(),
    /** Human-facing number, e.g. M-2026-0031; unique. */
    number: text('number').notNull().unique(),
    lensId: uuid('lens_id')
      .notNull()
      .references(() => lenses.id, { onDelete: 'restrict' }),
    method: measurementMethod('method').notNull(),
    status: measurementStatus('status').notNull().default('draft'),
    cameraId: uuid('camera_id').references(() => equipment.id, { onDelete: 'restrict' }),
    targetId: uuid('target_id').references(() => equipment.id, { onDelete: 'restrict' }),
    railScaleId: uuid('rail_scale_id').references(() => equipment.id, { onDelete: 'restrict' }),
    collimatorId: uuid('collimator_id').references(() => equipment.id, { onDelete: 'restrict' }),
    auxiliaryLensId: uuid('auxiliary_lens_id').references(() => equipment.id, { onDelete: 'restrict' }),
    /** Equipment used past its calibration due date: [{ equipmentId, reason, recordedById, recordedAt }]. */
    equipmentOverrides: jsonb('equipment_overrides')
      .$type<{ equipmentId: string; reason: string; recordedById: string; recordedAt: string }[]>()
      .notNull()
      .default([]),
    temperatureC: doublePrecision('temperature_c'),
    relativeHumidityPercent: doublePrecision('relative_humidity_percent'),
    focusOperator: focusOperator('focus_operator').notNull().default('gradient-energy'),
    notes: text('notes'),
    performedById: uuid('performed_by_id').references(() => people.id, { onDelete: 'set null' }),
    measuredOn: text('measured_on'), // ISO date
    /** The analysis run shown (and, once submitted, the one under review). */
    currentAnalysisId: uuid('current_analysis_id'),
    submittedAt: timestamp('submitted_at', { withTimezone: true }),
    submittedById: uuid('submitted_by_id').references(() => people.id, { onDelete: 'set null' }),
    /** Who approved (authorised) the measurement; never the person who performed it. */
    approvedById: uuid('approved_by_id').references(() => people.id, { onDelete: 'set null' }),
    approvedAt: timestamp('approved_at', { withTimezone: true }),
    createdAt: timestamp('created_at', { withTimezone: true }).notNull().defaultNow(),
    updatedAt: timestamp('updated_at', { withTimezone: true }).notNull().defaultNow(),
  },
  (table) => [
    index('measurements_lens_idx').on(table.lensId),
    index('measurements_status_idx').on(table.status),
    index('measurements_performed_by_idx').on(table.performedById),
  ],
);

export const sweepMovingValues = ['sensor', 'lens'] as const;
export const sweepMoving = pgEnum('sweep_moving', sweepMovingValues);

export const sweeps = pgTable(
  'sweeps',
  {
    id: uuid('id').primaryKey().defaultRandom(),
    measurementId: uuid('measurement_id')
      .notNull()
      .references(() => measurements.id, { onDelete: 'cascade' }),
    /** 0-based order within the measurement. */
    position: integer('position').notNull(),
    moving: sweepMoving('moving').notNull(),
    objectPositionMm: doublePrecision('object_position_mm'),
    lensPositionMm: doublePrecision('lens_position_mm'),
    sensorPositionMm: doublePrecision('sensor_position_mm'),
    createdAt: timestamp('created_at', { withTimezone: true }).notNull().defaultNow(),
  },
  (table) => [uniqueIndex('sweeps_measurement_position_idx').on(table.measurementId, table.position)],
);

export const frames = pgTable(
  'frames',
  {
    id: uuid('id').primaryKey().defaultRandom(),
    sweepId: uuid('sweep_id')
      .notNull()
      .references(() => sweeps.id, { onDelete: 'cascade' }),
    /** The file name as uploaded (sanitised); unique within a sweep. */
    fileName: text('file_name').notNull(),
    /** Rail reading of this frame, mm; null until readings are given. */
    positionMm: doublePrecision('position_mm'),
    objectKey: text('object_key').notNull(),
    thumbnailKey: text('thumbnail_key'),
    previewKey: text('preview_key'),
    contentType: text('content_type').notNull(),
    byteSize: bigint('byte_size', { mode: 'number' }).notNull(),
    widthPx: integer('width_px').notNull(),
    heightPx: integer('height_px').notNull(),
    bitDepth: integer('bit_depth').notNull(),
    sha256: text('sha256').notNull(),
    /** Excluded by a person from the next analysis run. */
    excluded: boolean('excluded').notNull().default(false),
    /** Set when raw pixels were purged by retention; thumbnails and preview remain. */
    purgedAt: timestamp('purged_at', { withTimezone: true }),
    createdAt: timestamp('created_at', { withTimezone: true }).notNull().defaultNow(),
  },
  (table) => [uniqueIndex('frames_sweep_file_idx').on(table.sweepId, table.fileName), index('frames_sweep_idx').on(table.sweepId)],
);

export const analysisRunStatusValues = ['queued', 'running', 'succeeded', 'failed'] as const;
export type AnalysisRunStatus = (typeof analysisRunStatusValues)[number];
export const analysisRunStatus = pgEnum('analysis_run_status', analysisRunStatusValues);

/** Every analysis run is kept; a re-run adds a version and never overwrites one. */
export const analysisRuns = pgTable(
  'analysis_runs',
  {
    id: uuid('id').primaryKey().defaultRandom(),
    measurementId: uuid('measurement_id')
      .notNull()
      .references(() => measurements.id, { onDelete: 'cascade' }),
    version: integer('version').notNull(),
    status: analysisRunStatus('status').notNull().default('queued'),
    /** The manifest the engine was given (frames as object keys' file names, readings, equipment values). */
    manifest: jsonb('manifest').$type<Record<string, unknown>>().notNull(),
    result: jsonb('result').$type<Record<string, unknown>>(),
    errorMessage: text('error_message'),
    framesDone: integer('frames_done').notNull().default(0),
    framesTotal: integer('frames_total').notNull().default(0),
    attempts: integer('attempts').notNull().default(0),
    jobId: text('job_id'),
    requestedById: uuid('requested_by_id').references(() => people.id, { onDelete: 'set null' }),
    createdAt: timestamp('created_at', { withTimezone: true }).notNull().defaultNow(),
    startedAt: timestamp('started_at', { withTimezone: true }),
    finishedAt: timestamp('finished_at', { withTimezone: true }),
  },
  (table) => [uniqueIndex('analysis_runs_measurement_version_idx').on(table.measurementId, table.version)],
);

/**
 * The last human-facing number handed out per kind and year (WO-2026-0001,
 * M-2026-0001, …). The row is bumped inside the transaction that uses the
 * number, so concurrent requests queue on its lock and a rolled-back insert
 * leaves no gap (a Postgres sequence would).
 */
export const numberCounters = pgTable(
  'number_counters',
  {
    kind: text('kind').notNull(),
    year: integer('year').notNull(),
    lastValue: integer('last_value').notNull(),
  },
  (table) => [primaryKey({ columns: [table.kind, table.year] })],
);

/* ------------------------------------------------------------------ */
/* Review, certificates, outbound mail.                               */
/* ------------------------------------------------------------------ */

export const reviewEntryKindValues = ['comment', 'submission', 'return', 'approval'] as const;
export type ReviewEntryKind = (typeof reviewEntryKindValues)[number];
export const reviewEntryKind = pgEnum('review_entry_kind', reviewEntryKindValues);

/** One thread per measurement: comments and the transitions that carried a remark. */
export const reviewEntries = pgTable(
  'review_entries',
  {
    id: uuid('id').primaryKey().defaultRandom(),
    measurementId: uuid('measurement_id')
      .notNull()
      .references(() => measurements.id, { onDelete: 'cascade' }),
    authorId: uuid('author_id').references(() => people.id, { onDelete: 'set null' }),
    kind: reviewEntryKind('kind').notNull().default('comment'),
    body: text('body').notNull(),
    /** The analysis run the remark was made about. */
    analysisRunId: uuid('analysis_run_id').references(() => analysisRuns.id, { onDelete: 'set null' }),
    createdAt: timestamp('created_at', { withTimezone: true }).notNull().defaultNow(),
  },
  (table) => [index('review_entries_measurement_idx').on(table.measurementId, table.createdAt)],
);

export const certificateStatusValues = ['current', 'superseded'] as const;
export type CertificateStatus = (typeof certificateStatusValues)[number];
export const certificateStatus = pgEnum('certificate_status', certificateStatusValues);

/** Every revision of every certificate is kept; a reissue supersedes, nothing is deleted. */
export const certificates = pgTable(
  'certificates',
  {
    id: uuid('id').primaryKey().defaultRandom(),
    /** Human-facing number shared by all revisions, e.g. C-2026-0007. */
    number: text('number').notNull(),
    /** 1 for the first issue, then 2, 3, … (as printed on the certificate). */
    revision: integer('revision').notNull(),
    measurementId: uuid('measurement_id')
      .notNull()
      .references(() => measurements.id, { onDelete: 'restrict' }),
    organisationId: uuid('organisation_id')
      .notNull()
      .references(() => organisations.id, { onDelete: 'restrict' }),
    status: certificateStatus('status').notNull().default('current'),
    /** Printed on the PDF and in its QR code; unique across all revisions. */
    verificationCode: text('verification_code').notNull().unique(),
    objectKey: text('object_key').notNull(),
    sha256: text('sha256').notNull(),
    byteSize: integer('byte_size').notNull(),
    pageCount: integer('page_count').notNull(),
    /** The data the PDF was rendered from (CertificateData), kept for verification and reissue. */
    data: jsonb('data').$type<Record<string, unknown>>().notNull(),
    reissueReason: text('reissue_reason'),
    issuedById: uuid('issued_by_id').references(() => people.id, { onDelete: 'set null' }),
    issuedAt: timestamp('issued_at', { withTimezone: true }).notNull().defaultNow(),
    supersededAt: timestamp('superseded_at', { withTimezone: true }),
    supersededByCertificateId: uuid('superseded_by_certificate_id'),
  },
  (table) => [
    uniqueIndex('certificates_number_revision_idx').on(table.number, table.revision),
    index('certificates_measurement_idx').on(table.measurementId),
    index('certificates_organisation_idx').on(table.organisationId),
    index('certificates_sha256_idx').on(table.sha256),
  ],
);

export const outboundMailKindValues = [
  'certificate-issued',
  'measurement-returned',
  'work-requested',
  'invitation',
  'password-reset',
] as const;
export type OutboundMailKind = (typeof outboundMailKindValues)[number];
export const outboundMailKind = pgEnum('outbound_mail_kind', outboundMailKindValues);

export const outboundMailStatusValues = ['queued', 'sending', 'sent', 'retrying', 'failed'] as const;
export type OutboundMailStatus = (typeof outboundMailStatusValues)[number];
export const outboundMailStatus = pgEnum('outbound_mail_status', outboundMailStatusValues);

/** Mail is written here inside the transaction of the action that caused it and sent
 * afterwards by a dispatcher, so that sending never blocks or undoes the action. */
export const outboundMail = pgTable(
  'outbound_mail',
  {
    id: uuid('id').primaryKey().defaultRandom(),
    kind: outboundMailKind('kind').notNull(),
    toAddresses: text('to_addresses').array().notNull(),
    subject: text('subject').notNull(),
    textBody: text('text_body').notNull(),
    htmlBody: text('html_body').notNull(),
    status: outboundMailStatus('status').notNull().default('queued'),
    attempts: integer('attempts').notNull().default(0),
    lastError: text('last_error'),
    nextAttemptAt: timestamp('next_attempt_at', { withTimezone: true }).notNull().defaultNow(),
    sentAt: timestamp('sent_at', { withTimezone: true }),
    messageId: text('message_id'),
    /** What the mail is about, e.g. ('certificate', id). */
    subjectType: text('subject_type'),
    subjectId: text('subject_id'),
    createdAt: timestamp('created_at', { withTimezone: true }).notNull().defaultNow(),
  },
  (table) => [
    index('outbound_mail_due_idx').on(table.status, table.nextAttemptAt),
    index('outbound_mail_created_idx').on(table.createdAt),
  ],
);

/* ------------------------------------------------------------------ */
/* Administration: contacts, invitations, password resets.            */
/* ------------------------------------------------------------------ */

export const organisationContacts = pgTable(
  'organisation_contacts',
  {
    id: uuid('id').primaryKey().defaultRandom(),
    organisationId: uuid('organisation_id')
      .notNull()
      .references(() => organisations.id, { onDelete: 'cascade' }),
    name: text('name').notNull(),
    email: text('email').notNull(),
    /** Their job at the client, e.g. "Quality manager". */
    position: text('position'),
    phone: text('phone'),
    /** Receives the "certificate issued" e-mail. */
    receivesCertificates: boolean('receives_certificates').notNull().default(true),
    createdAt: timestamp('created_at', { withTimezone: true }).notNull().defaultNow(),
  },
  (table) => [
    index('organisation_contacts_organisation_idx').on(table.organisationId),
    check('organisation_contacts_email_lower_case', sql`${table.email} = lower(${table.email})`),
  ],
);

/** A one-time link to set a password: an invitation to a new person. Only the token's SHA-256 is stored. */
export const invitations = pgTable(
  'invitations',
  {
    id: uuid('id').primaryKey().defaultRandom(),
    email: text('email').notNull(),
    name: text('name').notNull(),
    roles: text('roles').array().notNull(),
    organisationId: uuid('organisation_id').references(() => organisations.id, { onDelete: 'cascade' }),
    tokenHash: text('token_hash').notNull().unique(),
    expiresAt: timestamp('expires_at', { withTimezone: true }).notNull(),
    usedAt: timestamp('used_at', { withTimezone: true }),
    revokedAt: timestamp('revoked_at', { withTimezone: true }),
    invitedById: uuid('invited_by_id').references(() => people.id, { onDelete: 'set null' }),
    /** The person created when the invitation was accepted. */
    personId: uuid('person_id').references(() => people.id, { onDelete: 'set null' }),
    createdAt: timestamp('created_at', { withTimezone: true }).notNull().defaultNow(),
  },
  (table) => [
    index('invitations_email_idx').on(table.email),
    check('invitations_email_lower_case', sql`${table.email} = lower(${table.email})`),
  ],
);

/** A one-time link to choose a new password. Only the token's SHA-256 is stored. */
export const passwordResets = pgTable(
  'password_resets',
  {
    id: uuid('id').primaryKey().defaultRandom(),
    personId: uuid('person_id')
      .notNull()
      .references(() => people.id, { onDelete: 'cascade' }),
    tokenHash: text('token_hash').notNull().unique(),
    expiresAt: timestamp('expires_at', { withTimezone: true }).notNull(),
    usedAt: timestamp('used_at', { withTimezone: true }),
    requestedById: uuid('requested_by_id').references(() => people.id, { onDelete: 'set null' }),
    createdAt: timestamp('created_at', { withTimezone: true }).notNull().defaultNow(),
  },
  (table) => [index('password_resets_person_idx').on(table.personId)],
);
