import type { RouteDefinition } from '../route-definition';

export const reviewRoutes: RouteDefinition[] = [];
