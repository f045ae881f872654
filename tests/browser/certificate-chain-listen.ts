/**
 * Serves an app on a loopback port chosen before the app is built, so the app
 * can be told its own address as PUBLIC_BASE_URL: the link and QR code
 * printed in a certificate, and the links in its e-mail, then lead to the
 * app a browser test is driving rather than to the default :8080.
 */
import { createServer } from 'node:http';
import type { Express } from 'express';
import { findFreePort } from '../../scripts/services/ports';
import type { ListeningApp } from './listen-on-loopback';

export interface PublicLoopbackAddress {
  port: number;
  /** e.g. http://127.0.0.1:41234, without a trailing slash. */
  baseUrl: string;
}

/** A loopback port that was free a moment ago and the base URL the app will be reached at. */
export async function choosePublicLoopbackAddress(): Promise<PublicLoopbackAddress> {
  const port = await findFreePort();
  return { port, baseUrl: `http://127.0.0.1:${port}` };
}

/** Serves `app` at the address chosen by choosePublicLoopbackAddress(). */
export async function listenAtPublicLoopbackAddress(options: { app: Express; address: PublicLoopbackAddress }): Promise<ListeningApp> {
  const server = createServer(options.app);
  await new Promise<void>((resolve, reject) => {
    server.once('error', (error: NodeJS.ErrnoException) =>
      reject(error.code === 'EADDRINUSE' ? new Error(`Port ${options.address.port} was taken between choosing and listening; run the test again.`) : error),
    );
    server.listen(options.address.port, '127.0.0.1', () => resolve());
  });
  let closing: Promise<void> | null = null;
  return {
    baseUrl: options.address.baseUrl,
    server,
    close() {
      closing ??= new Promise<void>((resolve, reject) => {
        server.close((error) => (error ? reject(error) : resolve()));
        server.closeAllConnections();
      });
      return closing;
    },
  };
}
