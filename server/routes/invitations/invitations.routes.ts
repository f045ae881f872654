import type { RouteDefinition } from '../route-definition';

export const invitationRoutes: RouteDefinition[] = [];
