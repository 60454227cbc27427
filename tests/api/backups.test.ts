import { spawn } from 'node:child_process';
import { createHash } from 'node:crypto';
import { existsSync, mkdtempSync, readdirSync, readFileSync, rmSync } from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { childEnv, loadConfig, repoRoot } from '../../server/config';
import { createSequelize } from '../../server/db';
import { testCluster } from '../../scripts/local-db';
import {
  clusterFor,
  databaseUrl,
  dropDatabase,
  ensureDatabase,
  stopCluster,
} from '../../scripts/pg-cluster';
import { withTestApp } from '../support/app';
import { databaseChecksum, type DatabaseFigures } from '../support/db-checksum';
import { makeLabWorld } from '../support/hostile/world';
import { freePort } from '../../scripts/free-port';
import { recordFigures, soak } from '../support/soak';

// npm run db:backup / db:restore, run as a user would: a round trip from a configured database
// (DATABASE_URL) into a new private cluster and back into another empty database must give the
// same row counts, checksum and photo files. A restore into a database that has data is refused
// unless --force is given.

const LABS = soak ? 6 : 1;
const sourceDir = mkdtempSync(path.join(os.tmpdir(), 'qb-backup-source-'));
const t = withTestApp({ config: { dataDir: sourceDir } });
const scratch = mkdtempSync(path.join(os.tmpdir(), 'qb-backup-'));
const config = loadConfig({ ...process.env, NODE_ENV: 'test' });
const cluster = testCluster(config);
const emptyDb = `qb_test_restore_${process.pid}`;
const bucketDb = `qb_test_restore_s3_${process.pid}`;
let privateClusterRoot: string | undefined;

afterAll(async () => {
  await dropDatabase(cluster, emptyDb);
  await dropDatabase(cluster, bucketDb);
  // As root the cluster may live outside the data folder (where the postgres user can write).
  if (privateClusterRoot) rmSync(privateClusterRoot, { recursive: true, force: true });
  rmSync(scratch, { recursive: true, force: true });
  rmSync(sourceDir, { recursive: true, force: true });
}, 60_000);

type Run = { code: number; out: string; ms: number };

function script(name: string, args: string[], env: Record<string, string>): Promise<Run> {
  const started = performance.now();
  return new Promise((resolve) => {
    const child = spawn(process.execPath, ['--import', 'tsx', `scripts/${name}.ts`, ...args], {
      cwd: repoRoot,
      env: childEnv({ NODE_ENV: 'test', ...env }),
    });
    let out = '';
    child.stdout.on('data', (c: Buffer) => (out += c.toString()));
    child.stderr.on('data', (c: Buffer) => (out += c.toString()));
    child.on('exit', (code) => resolve({ code: code ?? -1, out, ms: performance.now() - started }));
  });
}

function photoHashes(dataDir: string): Record<string, string> {
  const dir = path.join(dataDir, 'photos');
  if (!existsSync(dir)) return {};
  return Object.fromEntries(
    readdirSync(dir).map((f) => [
      f,
      createHash('sha256')
        .update(readFileSync(path.join(dir, f)))
        .digest('hex'),
    ]),
  );
}

async function figuresOf(url: string): Promise<DatabaseFigures> {
  const sequelize = createSequelize(url);
  try {
    return await databaseChecksum(sequelize);
  } finally {
    await sequelize.close();
  }
}

describe('npm run db:backup and db:restore', () => {
  it('round-trips the data and the photos through the private cluster and back, row for row', async () => {
    for (let i = 0; i < LABS; i++) await makeLabWorld(t, `Backup lab ${i}`);
    const source = await databaseChecksum(t.db.sequelize);
    expect(source.rows).toBeGreaterThan(50);
    const photos = photoHashes(sourceDir);
    expect(Object.keys(photos).length).toBeGreaterThan(0);

    // 1. From the configured database (DATABASE_URL).
    const first = path.join(scratch, 'first');
    const backup = await script('db-backup', ['--out', first], {
      DATABASE_URL: t.db.url,
      QB_DATA_DIR: sourceDir,
    });
    expect(backup.out).toContain('Backup written');
    expect(backup.code).toBe(0);
    const manifest = JSON.parse(readFileSync(path.join(first, 'manifest.json'), 'utf8'));
    expect(manifest.figures.checksum).toBe(source.checksum);
    expect(manifest.source).not.toContain(new URL(t.db.url).password);

    // 2. Into a private cluster of its own (no DATABASE_URL), created on first use.
    const privateDir = mkdtempSync(path.join(scratch, 'private-'));
    const privateEnv = { QB_DATA_DIR: privateDir, QB_PG_PORT: String(await freePort()) };
    const privateCluster = clusterFor(privateDir, 'dev', Number(privateEnv.QB_PG_PORT));
    privateClusterRoot = path.dirname(privateCluster.dir);
    const intoPrivate = await script('db-restore', [first], privateEnv);
    expect(intoPrivate.out).toContain('Row counts and checksum match');
    expect(intoPrivate.code).toBe(0);
    expect(photoHashes(privateDir)).toEqual(photos);

    // 3. Back out of the private cluster, and into another empty configured database.
    const second = path.join(scratch, 'second');
    const backupPrivate = await script('db-backup', ['--out', second], privateEnv);
    expect(backupPrivate.code).toBe(0);
    stopCluster(privateCluster);
    await ensureDatabase(cluster, emptyDb);
    const targetDir = mkdtempSync(path.join(scratch, 'target-'));
    const targetEnv = { DATABASE_URL: databaseUrl(cluster, emptyDb), QB_DATA_DIR: targetDir };
    const intoEmpty = await script('db-restore', [second], targetEnv);
    expect(intoEmpty.code).toBe(0);
    const restored = await figuresOf(databaseUrl(cluster, emptyDb));
    expect(restored.tables).toEqual(source.tables);
    expect(restored.checksum).toBe(source.checksum);
    expect(photoHashes(targetDir)).toEqual(photos);

    // 4. It now has data: a second restore is refused and changes nothing, unless --force.
    const refused = await script('db-restore', [second], targetEnv);
    expect(refused.code).toBe(1);
    expect(refused.out).toMatch(/Nothing restored: .* has \d+ tables .*--force/);
    expect((await figuresOf(databaseUrl(cluster, emptyDb))).checksum).toBe(source.checksum);
    const forced = await script('db-restore', [second, '--force'], targetEnv);
    expect(forced.code).toBe(0);
    expect((await figuresOf(databaseUrl(cluster, emptyDb))).checksum).toBe(source.checksum);

    recordFigures('backups', {
      labs: LABS,
      rows: source.rows,
      photoFiles: Object.keys(photos).length,
      dumpBytes: readFileSync(path.join(first, 'database.dump')).length,
      backupMs: Math.round(backup.ms),
      restoreIntoNewClusterMs: Math.round(intoPrivate.ms),
      restoreMs: Math.round(intoEmpty.ms),
    });
  }, 240_000);

  it('names the bucket in the manifest instead of packing photos kept in S3', async () => {
    const source = await databaseChecksum(t.db.sequelize);
    const out = path.join(scratch, 'bucket');
    const bucketEnv = {
      QB_S3_BUCKET: 'qb-photos',
      QB_S3_ENDPOINT: 'http://127.0.0.1:9/',
      QB_S3_ACCESS_KEY_ID: 'backup-test',
      QB_S3_SECRET_ACCESS_KEY: 'backup-test-secret',
    };
    const backup = await script('db-backup', ['--out', out], {
      DATABASE_URL: t.db.url,
      QB_DATA_DIR: sourceDir,
      ...bucketEnv,
    });
    expect(backup.code).toBe(0);
    expect(backup.out).toContain('they stay in bucket qb-photos');
    const manifest = JSON.parse(readFileSync(path.join(out, 'manifest.json'), 'utf8'));
    expect(manifest.photos).toEqual({
      store: 's3',
      bucket: 'qb-photos',
      endpoint: 'http://127.0.0.1:9',
    });
    expect(readdirSync(out).sort()).toEqual(['database.dump', 'manifest.json']);
    expect(JSON.stringify(manifest)).not.toContain('backup-test-secret');

    // The restore needs no photos.tar then, and leaves the photos folder alone.
    await ensureDatabase(cluster, bucketDb);
    const targetDir = mkdtempSync(path.join(scratch, 'bucket-target-'));
    const restore = await script('db-restore', [out], {
      DATABASE_URL: databaseUrl(cluster, bucketDb),
      QB_DATA_DIR: targetDir,
      ...bucketEnv,
    });
    expect(restore.out).toContain('they stay in bucket qb-photos');
    expect(restore.code).toBe(0);
    expect((await figuresOf(databaseUrl(cluster, bucketDb))).checksum).toBe(source.checksum);
    expect(existsSync(path.join(targetDir, 'photos'))).toBe(false);
  }, 120_000);
});
