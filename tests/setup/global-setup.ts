import path from 'node:path';
import { loadConfig } from '../../server/config';
import { startFakeSmtp } from '../../server/mail/fake-smtp';
import { createSequelize } from '../../server/db';
import { migrateUp } from '../../server/migrate';
import { testCluster } from '../../scripts/local-db';
import { databaseUrl, dropDatabase, ensureDatabase, startCluster } from '../../scripts/pg-cluster';
import { TEMPLATE_DB } from '../support/db';

// One private cluster for the whole run, on its own port; a migrated template database that
// each test file copies, so files never share rows.
export default async function globalSetup(): Promise<void> {
  const config = loadConfig({ ...process.env, NODE_ENV: 'test' });
  const cluster = testCluster(config);
  await startCluster(cluster);
  await dropDatabase(cluster, TEMPLATE_DB);
  await ensureDatabase(cluster, TEMPLATE_DB);
  const sequelize = createSequelize(databaseUrl(cluster, TEMPLATE_DB));
  try {
    await migrateUp(sequelize);
  } finally {
    await sequelize.close();
  }
  process.env.NODE_ENV = 'test';

  // One mail catcher for the run; test files read what it captured from the mailbox folder.
  const mailboxDir = path.join(config.dataDir, 'mail-test');
  const smtp = await startFakeSmtp({ port: 0, mailboxDir });
  process.env.QB_FAKE_SMTP_PORT = String(smtp.port);
  process.env.QB_MAILBOX_DIR = mailboxDir;
  (globalThis as { qbTestSmtp?: typeof smtp }).qbTestSmtp = smtp;
}
