import { validateBody } from '../../middleware/validate';
import type { RouteDefinition } from '../route-definition';
import { getCurrentUser, signIn, signInRateLimit, signOut } from './auth.handlers';
import { signInBody } from './auth.schemas';

export const authRoutes: RouteDefinition[] = [
  {
    method: 'post',
    path: '/api/auth/sign-in',
    roles: 'public',
    summary: 'Signs in with e-mail and password; starts a new session.',
    handlers: (deps) => [signInRateLimit(deps), validateBody(signInBody), signIn(deps)],
  },
  {
    method: 'post',
    path: '/api/auth/sign-out',
    roles: 'public',
    summary: 'Ends the session, if any.',
    handlers: (deps) => [signOut(deps)],
  },
  {
    method: 'get',
    path: '/api/auth/me',
    roles: 'signed-in',
    summary: 'The signed-in person with roles and organisation.',
    handlers: () => [getCurrentUser],
  },
];
