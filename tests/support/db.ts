import { randomBytes } from 'node:crypto';
import type { Sequelize } from 'sequelize';
import { loadConfig, type Config } from '../../server/config';
import { createSequelize } from '../../server/db';
import { testCluster } from '../../scripts/local-db';
import { databaseUrl, dropDatabase, ensureDatabase } from '../../scripts/pg-cluster';

export const TEMPLATE_DB = 'qb_test_template';
export const TEST_DB_PREFIX = 'qb_test_';

export type TestDatabase = {
  url: string;
  sequelize: Sequelize;
  config: Config;
  drop: () => Promise<void>;
};

/** Cheap password hashing and a rate limit that ordinary tests never reach. */
function testConfig(config: Config): Config {
  return { ...config, auth: { ...config.auth, passwordCost: 'test', rateLimitMax: 100_000 } };
}

/** A migrated database of this test file's own, copied from the template made in global setup. */
export async function freshDatabase(): Promise<TestDatabase> {
  const config = loadConfig({ ...process.env, NODE_ENV: 'test' });
  const cluster = testCluster(config);
  const name = `${TEST_DB_PREFIX}${randomBytes(6).toString('hex')}`;
  await ensureDatabase(cluster, name, TEMPLATE_DB);
  const url = databaseUrl(cluster, name);
  const sequelize = createSequelize(url);
  return {
    url,
    sequelize,
    config: testConfig({ ...config, databaseUrl: url }),
    drop: async () => {
      await sequelize.close();
      await dropDatabase(cluster, name);
    },
  };
}
