import net from 'node:net';

/** A port that was free a moment ago on 127.0.0.1 (the OS picks it). */
export function findFreePort(): Promise<number> {
  return new Promise((resolve, reject) => {
    const server = net.createServer();
    server.unref();
    server.on('error', reject);
    server.listen(0, '127.0.0.1', () => {
      const address = server.address();
      const port = typeof address === 'object' && address ? address.port : 0;
      server.close(() => resolve(port));
    });
  });
}

export function isPortFree(port: number, host = '127.0.0.1'): Promise<boolean> {
  return new Promise((resolve) => {
    const server = net.createServer();
    server.unref();
    server.once('error', () => resolve(false));
    server.listen(port, host, () => server.close(() => resolve(true)));
  });
}

export async function assertPortFree(port: number, what: string, variable: string): Promise<void> {
  if (!(await isPortFree(port))) {
    throw new Error(`Port ${port} for ${what} is already in use; stop whatever uses it or set ${variable} to a free port.`);
  }
}
