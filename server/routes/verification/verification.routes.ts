import type { RouteDefinition } from '../route-definition';

export const verificationRoutes: RouteDefinition[] = [];
