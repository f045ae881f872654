import express, { type Express } from 'express';
import type { AppDeps } from './deps';
import { issueCsrfCookie, requireCsrfToken } from './middleware/csrf';
import { apiNotFound, errorHandler } from './middleware/error-handler';
import { loadSessionUser } from './middleware/load-session-user';
import { securityHeaders } from './middleware/security-headers';
import { serveClient } from './middleware/serve-client';
import { sessionMiddleware } from './middleware/session';
import { registerRoutes } from './routes/route-table';

export const JSON_BODY_LIMIT_BYTES = 1024 * 1024;

/** TRUST_PROXY: "true"/"false", a hop count, or addresses/subnet names as Express takes them. */
export function parseTrustProxy(value: string): boolean | number | string {
  if (value === 'true') return true;
  if (value === 'false') return false;
  if (/^\d+$/.test(value)) return Number(value);
  return value;
}

/** Builds the whole web app (API and built client); listening is index.ts's job. */
export function createApp(deps: AppDeps): Express {
  const { env } = deps;
  const production = env.NODE_ENV === 'production';
  const app = express();

  app.disable('x-powered-by');
  app.set('trust proxy', parseTrustProxy(env.TRUST_PROXY));

  app.use(securityHeaders({ production }));
  app.use(issueCsrfCookie({ secure: production }));

  // The CSRF check comes before body parsing, so forged requests cost nothing.
  app.use('/api', requireCsrfToken);
  app.use('/api', express.json({ limit: JSON_BODY_LIMIT_BYTES }));
  app.use('/api', sessionMiddleware(deps), loadSessionUser(deps));
  app.use('/api', (_req, res, next) => {
    res.setHeader('Cache-Control', 'no-store');
    next();
  });

  registerRoutes(app, deps);
  app.use('/api', apiNotFound);

  serveClient(app, env.CLIENT_DIST_DIR);
  app.use(errorHandler(deps.log));
  return app;
}
