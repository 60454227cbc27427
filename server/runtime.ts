import type { Sequelize } from 'sequelize';
import type { Config } from './config';
import { createSequelize } from './db';
import { createMailer, type Mailer } from './mail/sender';
import { OWASP_ARGON2ID, TEST_ARGON2ID } from './passwords/cost';
import { createPasswordHasher, type PasswordHasher } from './passwords/hasher';

export type Runtime = {
  sequelize: Sequelize;
  hasher: PasswordHasher;
  mailer: Mailer;
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
  return {
    sequelize,
    hasher,
    mailer,
    close: async () => {
      mailer.close();
      await hasher.close();
      await sequelize.close();
    },
  };
}
