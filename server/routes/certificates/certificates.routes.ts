import type { RouteDefinition } from '../route-definition';

export const certificateRoutes: RouteDefinition[] = [];
