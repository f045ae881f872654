import type { RouteDefinition } from '../route-definition';

export const portalRoutes: RouteDefinition[] = [];
