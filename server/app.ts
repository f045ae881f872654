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

const guardedPools = new WeakSet<object>();

/**
 * A database restart breaks pooled connections. node-postgres reports it as
 * an 'error' event on the pool (idle connections) or on the client itself (a
 * connection checked out between two statements of a transaction); an
 * unheard 'error' event ends the process. Heard here, the request using the
 * connection fails with 503 and the pool opens a new one when asked.
 */
function guardPoolAgainstLostConnections(deps: AppDeps): void {
  if (guardedPools.has(deps.pool)) return;
  guardedPools.add(deps.pool);
  const warn = (error: Error) => deps.log.warn('A database connection was lost; the pool opens a new one when needed.', { error: String(error) });
  deps.pool.on('error', warn);
  deps.pool.on('connect', (client) => client.on('error', warn));
}

/** Builds the whole web app (API and built client); listening is index.ts's job. */
export function createApp(deps: AppDeps): Express {
  const { env } = deps;
  const production = env.NODE_ENV === 'production';
  const app = express();

  guardPoolAgainstLostConnections(deps);

  app.disable('x-powered-by');
  app.set('trust proxy', parseTrustProxy(env.TRUST_PROXY));
  // res.json writes <, > and & as \u003c, \u003e, \u0026: stored text can never read as markup if a JSON answer is sniffed or framed.
  app.set('json escape', true);

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
