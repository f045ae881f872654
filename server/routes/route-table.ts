import type { Express, RequestHandler } from 'express';
import type { AppDeps } from '../deps';
import { invariant } from '../invariant';
import { requireRole, requireSignedIn } from '../middleware/require-role';
import { authRoutes } from './auth/auth.routes';
import { healthRoutes } from './health/health.routes';
import { peopleRoutes } from './people/people.routes';
import { equipmentRoutes } from './equipment/equipment.routes';
import { lensRoutes } from './lenses/lenses.routes';
import { organisationRoutes } from './organisations/organisations.routes';
import { partNumberRoutes } from './part-numbers/part-numbers.routes';
import { workOrderRoutes } from './work-orders/work-orders.routes';
import { measurementRoutes } from './measurements/measurements.routes';
import { sweepRoutes } from './sweeps/sweeps.routes';
import { frameRoutes } from './frames/frames.routes';
import { analysesRoutes } from './analyses/analyses.routes';
import { reviewRoutes } from './review/review.routes';
import { certificateRoutes } from './certificates/certificates.routes';
import { verificationRoutes } from './verification/verification.routes';
import { portalRoutes } from './portal/portal.routes';
import { invitationRoutes } from './invitations/invitations.routes';
import { auditRoutes } from './audit/audit.routes';
import { outboundMailRoutes } from './outbound-mail/outbound-mail.routes';
import { storageRoutes } from './storage/storage.routes';
import type { RouteAccess, RouteDefinition, RouteSpec } from './route-definition';

/** Every API route, and nothing registers a route any other way. */
export const routeDefinitions: readonly RouteDefinition[] = [
  ...healthRoutes,
  ...authRoutes,
  ...peopleRoutes,
  ...organisationRoutes,
  ...workOrderRoutes,
  ...lensRoutes,
  ...partNumberRoutes,
  ...equipmentRoutes,
  ...measurementRoutes,
  ...sweepRoutes,
  ...frameRoutes,
  ...analysesRoutes,
  ...reviewRoutes,
  ...certificateRoutes,
  ...verificationRoutes,
  ...portalRoutes,
  ...invitationRoutes,
  ...auditRoutes,
  ...outboundMailRoutes,
  ...storageRoutes,
];

/** Who may call what: one row per route (method, path, roles). */
export const routeTable: readonly RouteSpec[] = routeDefinitions.map(({ method, path, roles, summary }) => ({
  method,
  path,
  roles,
  summary,
}));

function accessCheck(roles: RouteAccess): RequestHandler[] {
  if (roles === 'public') return [];
  if (roles === 'signed-in') return [requireSignedIn];
  invariant(roles.length > 0, 'a role-restricted route must name at least one role');
  return [requireRole(...roles)];
}

export function registerRoutes(app: Express, deps: AppDeps): void {
  const seen = new Set<string>();
  for (const route of routeDefinitions) {
    const key = `${route.method.toUpperCase()} ${route.path}`;
    invariant(!seen.has(key), `route ${key} is defined twice`);
    invariant(route.path.startsWith('/api/'), `route ${key} must live under /api/`);
    seen.add(key);
    app[route.method](route.path, ...accessCheck(route.roles), ...route.handlers(deps));
  }
}
