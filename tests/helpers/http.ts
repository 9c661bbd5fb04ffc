import type { Server } from 'node:http';
import type { Express } from 'express';

export interface RunningServer {
  baseUrl: string;
  close(): Promise<void>;
}

/** Listens on a free loopback port so tests speak real HTTP to the app. */
export async function listen(app: Express, port = 0): Promise<RunningServer> {
  const server: Server = await new Promise((resolve) => {
    const s = app.listen(port, '127.0.0.1', () => resolve(s));
  });
  const address = server.address();
  const actualPort = typeof address === 'object' && address ? address.port : 0;
  return {
    baseUrl: `http://127.0.0.1:${actualPort}`,
    close: () =>
      new Promise((resolve) => {
        server.closeAllConnections();
        server.close(() => resolve());
      }),
  };
}
