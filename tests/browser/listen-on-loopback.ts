import { createServer, type Server } from 'node:http';
import type { AddressInfo } from 'node:net';
import type { Express } from 'express';

export interface ListeningApp {
  /** e.g. http://127.0.0.1:41234 */
  baseUrl: string;
  server: Server;
  /** Stops listening and drops open keep-alive connections (a browser keeps some); safe to call twice. */
  close(): Promise<void>;
}

/** Serves `app` on a free 127.0.0.1 port, as `npm start` serves it on 8080. */
export async function listenOnLoopback(options: { app: Express }): Promise<ListeningApp> {
  const server = createServer(options.app);
  await new Promise<void>((resolve, reject) => {
    server.once('error', reject);
    server.listen(0, '127.0.0.1', () => {
      server.off('error', reject);
      resolve();
    });
  });
  const { port } = server.address() as AddressInfo;
  let closing: Promise<void> | null = null;
  return {
    baseUrl: `http://127.0.0.1:${port}`,
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
