import type { Server } from 'node:http';
import type { AddressInfo } from 'node:net';
import { createApp } from '../../server/app';
import type { TestDatabase } from './db';

/** The real server on a free loopback port, serving the built web app. */
export async function startTestServer(
  db: TestDatabase,
): Promise<{ url: string; close: () => Promise<void> }> {
  const app = createApp({ config: db.config, sequelize: db.sequelize });
  const server: Server = await new Promise((resolve) => {
    const s = app.listen(0, '127.0.0.1', () => resolve(s));
  });
  const { port } = server.address() as AddressInfo;
  return {
    url: `http://127.0.0.1:${port}`,
    close: () =>
      new Promise((resolve) => {
        server.closeAllConnections();
        server.close(() => resolve());
      }),
  };
}
