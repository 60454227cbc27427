import type { Sequelize } from 'sequelize';
import type { Config } from './config';
import { createSequelize } from './db';
import { createMailer, type Mailer } from './mail/sender';
import { OWASP_ARGON2ID, TEST_ARGON2ID } from './passwords/cost';
import { createPasswordHasher, type PasswordHasher } from './passwords/hasher';
import { createPhotoStore } from './photos/configured-store';
import type { PhotoStore } from './photos/store';

export type Runtime = {
  sequelize: Sequelize;
  hasher: PasswordHasher;
  mailer: Mailer;
  photoStore: PhotoStore;
  close: () => Promise<void>;
};

/** The long-lived pieces a server process needs, built from config and closed together. */
export function createRuntime(config: Config, databaseUrl: string): Runtime {
  const sequelize = createSequelize(databaseUrl);
  // config.ts refuses the test cost in production.
  const hasher = createPasswordHasher({
    cost: config.auth.passwordCost === 'owasp' ? OWASP_ARGON2ID : TEST_ARGON2ID,
  });
  const mailer = createMailer({
    host: config.mail.host,
    port: config.mail.port,
    secure: config.mail.secure,
    user: config.mail.user,
    pass: config.mail.pass,
    from: config.mail.from,
  });
  const photoStore = createPhotoStore(config.photos);
  return {
    sequelize,
    hasher,
    mailer,
    photoStore,
    close: async () => {
      mailer.close();
      await photoStore.close?.();
      await hasher.close();
      await sequelize.close();
    },
  };
}
