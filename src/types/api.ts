/**
 * Shapes of the server's JSON as the client reads them. When the server's
 * zod contracts land in shared/schemas, these should be inferred from them.
 */

export const ROLES = ['technician', 'reviewer', 'client', 'admin'] as const;
export type Role = (typeof ROLES)[number];

export interface Organisation {
  id: string;
  name: string;
  kind: 'lab' | 'client';
}

export interface User {
  id: string;
  email: string;
  name: string;
  roles: Role[];
  organisation: Organisation | null;
}

export interface Person extends User {
  active: boolean;
}

/** The server's error body: `{ error: { message, fields? } }`. */
export interface ServerErrorBody {
  error: {
    message: string;
    fields?: Record<string, string>;
  };
}

export interface ServiceCheck {
  ok: boolean;
  latencyMs: number;
  message?: string;
}

export type ServiceName = 'database' | 'objectStorage' | 'mail';

export interface HealthReport {
  status: 'ok' | 'degraded';
  checks: Record<ServiceName, ServiceCheck>;
}
