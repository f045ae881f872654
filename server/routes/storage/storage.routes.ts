import type { RouteDefinition } from '../route-definition';

export const storageRoutes: RouteDefinition[] = [];
