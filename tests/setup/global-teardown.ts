import pg from 'pg';
import { loadConfig } from '../../server/config';
import { testCluster } from '../../scripts/local-db';
import { databaseUrl, dropDatabase, stopCluster } from '../../scripts/pg-cluster';
import { TEST_DB_PREFIX } from '../support/db';

export default async function globalTeardown(): Promise<void> {
  await (globalThis as { qbTestSmtp?: { close: () => Promise<void> } }).qbTestSmtp?.close();
  const config = loadConfig({ ...process.env, NODE_ENV: 'test' });
  const cluster = testCluster(config);
  // Databases a crashed test file left behind.
  const client = new pg.Client({ connectionString: databaseUrl(cluster, 'postgres') });
  await client.connect();
  const { rows } = await client.query<{ datname: string }>(
    'SELECT datname FROM pg_database WHERE datname LIKE $1',
    [`${TEST_DB_PREFIX}%`],
  );
  await client.end();
  for (const row of rows) await dropDatabase(cluster, row.datname);
  // The test cluster belongs to the tests alone: stop it even when an earlier run left it up.
  stopCluster(cluster);
}
