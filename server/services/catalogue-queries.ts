/** Pieces the catalogue services (work orders, lenses, equipment, spread) share. */
import type { Request } from 'express';
import type { Role } from '../db/schema';
import { HttpError } from '../http-error';
import { HttpStatus } from '../http-status';
import { invariant } from '../invariant';
import { recordAuditEvent, type AuditEventInput } from './audit-log';
import type { Queryable } from './numbering';
import type { SessionUser } from './people';

/** Who made a change, for the audit log. */
export interface Actor {
  actorId: string;
  ip?: string | null;
}

/** recordAuditEvent within a transaction, so the event commits or rolls back with the change it describes. */
export function recordAuditEventWithin(tx: Queryable, event: AuditEventInput): Promise<void> {
  return recordAuditEvent(tx, event);
}

/** An ILIKE pattern matching `text` anywhere, its own %, _ and \ taken literally. */
export function containsPattern(text: string): string {
  return `%${text.replace(/[\\%_]/g, (character) => `\\${character}`)}%`;
}

/** Who is looking: staff see every organisation's records, a client only their own. */
export interface Viewer {
  id: string;
  roles: readonly Role[];
  organisation: { id: string } | null;
}

const STAFF_ROLES: readonly Role[] = ['technician', 'reviewer', 'admin'];

/** null = every organisation; otherwise the only organisation the viewer may see ('' when none). */
export function visibleOrganisationOf(viewer: Viewer): string | null {
  if (viewer.roles.some((role) => STAFF_ROLES.includes(role))) return null;
  return viewer.organisation?.id ?? '';
}

export function workOrderNotFound(workOrderId: string): HttpError {
  return new HttpError(HttpStatus.NOT_FOUND, `There is no work order with id ${workOrderId}.`);
}

export function lensNotFound(lensId: string): HttpError {
  return new HttpError(HttpStatus.NOT_FOUND, `There is no lens with id ${lensId}.`);
}

/** The signed-in person behind a request that passed a role check. */
export function signedInUser(req: Request): SessionUser {
  invariant(req.user, 'a role-checked route ran without a signed-in person');
  return req.user;
}

export function actorOf(req: Request): Actor {
  return { actorId: signedInUser(req).id, ip: req.ip ?? null };
}
