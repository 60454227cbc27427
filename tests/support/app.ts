import http from 'node:http';
import type { AddressInfo } from 'node:net';
import type { Express } from 'express';
import { createApp } from '../../server/app';
import type { Config } from '../../server/config';
import { createMailer, type Mailer } from '../../server/mail/sender';
import type { ErrorContext } from '../../server/middleware/error';
import { TEST_ARGON2ID } from '../../server/passwords/cost';
import { createPasswordHasher, type PasswordHasher } from '../../server/passwords/hasher';
import type { PhotoStore } from '../../server/photos/store';
import type { ServiceDeps } from '../../server/services/deps';
import { freshDatabase, type TestDatabase } from './db';

export type TestApp = {
  app: Express;
  deps: ServiceDeps;
  config: Config;
  close: () => Promise<void>;
};

function mailerFor(config: Config): Mailer {
  return createMailer({
    host: config.mail.host,
    port: config.mail.port,
    secure: false,
    from: config.mail.from,
  });
}

/** createApp with the real services: cheap hashing, mail to the run's mail catcher. */
export function buildApp(
  db: TestDatabase,
  options: {
    config?: Partial<Config>;
    logError?: (err: unknown, context: ErrorContext) => void;
    hasher?: PasswordHasher;
    photoStore?: PhotoStore;
  } = {},
): TestApp {
  const config: Config = { ...db.config, ...options.config };
  const hasher = options.hasher ?? createPasswordHasher({ cost: TEST_ARGON2ID });
  const mailer = mailerFor(config);
  const app = createApp({
    config,
    sequelize: db.sequelize,
    hasher,
    mailer,
    photoStore: options.photoStore,
    logError: options.logError,
  });
  return {
    app,
    config,
    deps: { config, hasher, mailer },
    close: async () => {
      mailer.close();
      if (!options.hasher) await hasher.close();
    },
  };
}

/**
 * The real server on a free loopback port, serving the built web app. Links in its e-mails
 * point at that port.
 */
export async function startTestServer(
  db: TestDatabase,
  options: { config?: Partial<Config> } = {},
): Promise<{ url: string; deps: ServiceDeps; close: () => Promise<void> }> {
  const server = http.createServer();
  await new Promise<void>((resolve) => server.listen(0, '127.0.0.1', resolve));
  const { port } = server.address() as AddressInfo;
  const url = `http://127.0.0.1:${port}`;
  const built = buildApp(db, { config: { ...options.config, publicUrl: url } });
  server.on('request', built.app);
  return {
    url,
    deps: built.deps,
    close: async () => {
      server.closeAllConnections();
      await new Promise<void>((resolve) => server.close(() => resolve()));
      await built.close();
    },
  };
}

/**
 * A test file's own database and app, made before its tests and dropped after them. The
 * returned object reads through to them, so tests use it like a TestApp.
 */
export function withTestApp(
  options: Parameters<typeof buildApp>[1] = {},
): TestApp & { readonly db: TestDatabase } {
  let db: TestDatabase | undefined;
  let built: TestApp | undefined;
  beforeAll(async () => {
    db = await freshDatabase();
    built = buildApp(db, options);
  });
  afterAll(async () => {
    await built?.close();
    await db?.drop();
  });
  const need = <T>(value: T | undefined): T => {
    if (value === undefined) throw new Error('withTestApp: used outside beforeAll/it');
    return value;
  };
  return {
    get app() {
      return need(built).app;
    },
    get config() {
      return need(built).config;
    },
    get deps() {
      return need(built).deps;
    },
    get db() {
      return need(db);
    },
    close: async () => {},
  };
}
