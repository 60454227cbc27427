import type { Server } from 'node:http';
import { createApp } from './app';
import type { Config } from './config';
import type { Runtime } from './runtime';

/** Listens on the configured host and port; resolves once the port is bound. */
export function listen(config: Config, runtime: Runtime): Promise<Server> {
  const app = createApp({ config, ...runtime });
  return new Promise((resolve, reject) => {
    const server = app.listen(config.port, config.host, (err?: Error) => {
      if (err) reject(err);
      else resolve(server);
    });
  });
}
