import type { RouteDefinition } from '../route-definition';

export const outboundMailRoutes: RouteDefinition[] = [];
