import type { Server } from 'node:http';
import type { Sequelize } from 'sequelize';
import { createApp } from './app';
import type { Config } from './config';

/** Listens on the configured host and port; resolves once the port is bound. */
export function listen(config: Config, sequelize: Sequelize): Promise<Server> {
  const app = createApp({ config, sequelize });
  return new Promise((resolve, reject) => {
    const server = app.listen(config.port, config.host, (err?: Error) => {
      if (err) reject(err);
      else resolve(server);
    });
  });
}
