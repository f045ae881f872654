import type { RouteDefinition } from '../route-definition';

export const auditRoutes: RouteDefinition[] = [];
