import { mkdir } from 'node:fs/promises';
import S3rver from 's3rver';

export interface RunningFakeS3 {
  port: number;
  endpoint: string;
  stop(): Promise<void>;
}

/** s3rver on 127.0.0.1, objects kept as files under `directory`. Port 0 picks a free port. */
export async function startFakeS3(options: { directory: string; port: number }): Promise<RunningFakeS3> {
  await mkdir(options.directory, { recursive: true });
  const server = new S3rver({ address: '127.0.0.1', port: options.port, directory: options.directory, silent: true });
  const address = await server.run();
  let stopped = false;
  return {
    port: address.port,
    endpoint: `http://127.0.0.1:${address.port}`,
    async stop() {
      if (stopped) return;
      stopped = true;
      // Clients keep connections alive; without this close() waits for them.
      server.httpServer?.closeAllConnections();
      await server.close();
    },
  };
}
