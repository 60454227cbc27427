import { execFileSync, spawn } from 'node:child_process';
import { existsSync } from 'node:fs';
import path from 'node:path';
import pg from 'pg';
import type { Config } from '../server/config';
import { databaseFigures, type DatabaseFigures } from './db-checksum';
import { appCluster, APP_DATABASE } from './local-db';
import { databaseUrl, ensureDatabase, isRunning, startCluster, stopCluster } from './pg-cluster';

// What db-backup.ts and db-restore.ts share: which database, the client tools, the manifest.

export class BackupError extends Error {}

export const DUMP_FILE = 'database.dump';
export const PHOTOS_FILE = 'photos.tar';
export const MANIFEST_FILE = 'manifest.json';

export type Manifest = {
  createdAt: string;
  appVersion: string;
  source: string;
  pgDump: string;
  figures: DatabaseFigures;
  /**
   * A folder of photos is packed beside the dump; a bucket is not copied: its own versioning or
   * replication backs it up, and the manifest says which bucket the dump's photo rows point into.
   * (Manifests written before the bucket was an option have `{ files }` only: a folder.)
   */
  photos:
    { store?: 'disk'; files: number } | { store: 's3'; bucket: string; endpoint: string | null };
};

/**
 * pg_dump and pg_restore: next to the server binaries when PostgreSQL is installed here (the
 * version that matches the private cluster), else from PATH (client tools only, for a
 * configured external database). Clients run fine as root; only the server refuses it.
 */
export function clientTool(name: 'pg_dump' | 'pg_restore'): string {
  const dirs: string[] = [];
  try {
    dirs.push(execFileSync('pg_config', ['--bindir'], { encoding: 'utf8' }).trim());
  } catch {
    // No pg_config: try Debian's layout, then PATH.
  }
  dirs.push('/usr/lib/postgresql/15/bin');
  const found = dirs.map((d) => path.join(d, name)).find((p) => existsSync(p));
  return found ?? name;
}

export type Target = {
  url: string;
  /** Where it is, without the password: for messages and the manifest. */
  label: string;
  /** Stops the private cluster again when this script started it. */
  release: () => void;
};

/** The configured DATABASE_URL, or the private cluster's database (started for the occasion). */
export async function appDatabase(config: Config): Promise<Target> {
  if (config.databaseUrl) {
    return {
      url: config.databaseUrl,
      label: withoutPassword(config.databaseUrl),
      release: () => {},
    };
  }
  const cluster = appCluster(config);
  const wasRunning = isRunning(cluster);
  await startCluster(cluster);
  await ensureDatabase(cluster, APP_DATABASE);
  return {
    url: databaseUrl(cluster, APP_DATABASE),
    label: `private cluster "${cluster.name}" on 127.0.0.1:${cluster.port}, database ${APP_DATABASE}`,
    release: () => {
      if (!wasRunning) stopCluster(cluster);
    },
  };
}

export function withoutPassword(url: string): string {
  const u = new URL(url);
  u.password = '';
  return u.toString();
}

/** Runs a client tool with the password in PGPASSWORD (never on the command line, where ps shows it). */
export function runTool(tool: string, args: string[], url: string): Promise<void> {
  const password = decodeURIComponent(new URL(url).password);
  return new Promise((resolve, reject) => {
    const child = spawn(tool, [...args, `--dbname=${withoutPassword(url)}`], {
      stdio: ['ignore', 'inherit', 'pipe'],
      env: { ...process.env, PGPASSWORD: password, PGCONNECT_TIMEOUT: '10' },
    });
    let stderr = '';
    child.stderr!.on('data', (chunk: Buffer) => (stderr += chunk.toString()));
    child.on('error', (err) =>
      reject(new BackupError(`${path.basename(tool)} could not run: ${err.message}`)),
    );
    child.on('exit', (code) => {
      if (code === 0) resolve();
      else
        reject(new BackupError(`${path.basename(tool)} failed (exit ${code}):\n${stderr.trim()}`));
    });
  });
}

export function toolVersion(tool: string): string {
  return execFileSync(tool, ['--version'], { encoding: 'utf8' }).trim();
}

/** A client whose session prints times in UTC, so figures compare across clusters. */
export async function connect(url: string): Promise<pg.Client> {
  const client = new pg.Client({ connectionString: url, connectionTimeoutMillis: 10_000 });
  await client.connect();
  await client.query("SET TIME ZONE 'UTC'");
  return client;
}

export function figuresWith(client: pg.Client): Promise<DatabaseFigures> {
  return databaseFigures(async <T>(sql: string) => (await client.query(sql)).rows as T[]);
}

export function runTar(args: string[]): Promise<void> {
  return new Promise((resolve, reject) => {
    const child = spawn('tar', args, { stdio: ['ignore', 'inherit', 'pipe'] });
    let stderr = '';
    child.stderr!.on('data', (chunk: Buffer) => (stderr += chunk.toString()));
    child.on('error', (err) => reject(new BackupError(`tar could not run: ${err.message}`)));
    child.on('exit', (code) =>
      code === 0 ? resolve() : reject(new BackupError(`tar failed:\n${stderr.trim()}`)),
    );
  });
}

export function printFigures(title: string, figures: DatabaseFigures): void {
  console.log(title);
  for (const t of figures.tables)
    console.log(`  ${t.table.padEnd(24)} ${String(t.rows).padStart(8)}`);
  console.log(`  ${'rows in all'.padEnd(24)} ${String(figures.rows).padStart(8)}`);
  console.log(`  checksum ${figures.checksum}`);
}
