import type { Server } from 'node:http';
import { createApp } from './app';
import { closeDeps, createDeps } from './deps';
import { loadEnvOrExit } from './env';

const SHUTDOWN_GRACE_MS = 10_000;

const env = loadEnvOrExit();
const deps = createDeps(env);
const app = createApp(deps);

const server: Server = app.listen(env.PORT, env.HOST, () => {
  deps.log.info('Paraxia web server listening.', { url: env.PUBLIC_BASE_URL, host: env.HOST, port: env.PORT });
});
server.on('error', (error: NodeJS.ErrnoException) => {
  if (error.code === 'EADDRINUSE') {
    console.error(`Port ${env.PORT} on ${env.HOST} is already in use; set PORT to a free port.`);
  } else {
    console.error(`The web server could not start: ${error.message}`);
  }
  process.exit(1);
});

let shuttingDown = false;
async function shutDown(signal: string): Promise<void> {
  if (shuttingDown) return;
  shuttingDown = true;
  deps.log.info('Shutting down the web server.', { signal });
  const forceTimer = setTimeout(() => server.closeAllConnections(), SHUTDOWN_GRACE_MS);
  forceTimer.unref();
  server.closeIdleConnections();
  await new Promise<void>((resolve) => server.close(() => resolve()));
  await closeDeps(deps);
  process.exit(0);
}

process.on('SIGINT', () => void shutDown('SIGINT'));
process.on('SIGTERM', () => void shutDown('SIGTERM'));
