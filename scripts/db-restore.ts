import { existsSync, mkdirSync, readdirSync, readFileSync, renameSync, rmSync } from 'node:fs';
import path from 'node:path';
import { loadConfig } from '../server/config';
import { changedTables } from './db-checksum';
import {
  appDatabase,
  BackupError,
  clientTool,
  connect,
  DUMP_FILE,
  figuresWith,
  MANIFEST_FILE,
  PHOTOS_FILE,
  printFigures,
  runTar,
  runTool,
  type Manifest,
} from './backup-tools';
import { ClusterError } from './pg-cluster';

// npm run db:restore -- <backup folder> [--force]
// Restores a db:backup folder into the app's database (DATABASE_URL, or the private cluster) and
// its photos folder (photos in a bucket were not copied: the manifest names the bucket), then
// checks the row counts and checksum against the backup's manifest.
// A database with tables, or a photos folder with files, is left alone unless --force is given.

function readManifest(dir: string): Manifest {
  const file = path.join(dir, MANIFEST_FILE);
  if (!existsSync(file))
    throw new BackupError(`${dir} is not a backup folder: no ${MANIFEST_FILE}.`);
  const manifest = JSON.parse(readFileSync(file, 'utf8')) as Manifest;
  // Photos in a bucket are not in the backup, so it has no photos.tar.
  const parts = manifest.photos.store === 's3' ? [DUMP_FILE] : [DUMP_FILE, PHOTOS_FILE];
  for (const part of parts) {
    if (!existsSync(path.join(dir, part)))
      throw new BackupError(`The backup is incomplete: ${part} is missing.`);
  }
  return manifest;
}

/** Unpacks the backup's photos; a folder that had files is kept beside, renamed. */
async function restorePhotos(dir: string, dataDir: string, photosDir: string, present: number) {
  if (existsSync(photosDir)) {
    if (present > 0) {
      const aside = `${photosDir}.before-restore-${new Date().toISOString().replace(/[:.]/g, '-')}`;
      renameSync(photosDir, aside);
      console.log(`The photos that were there are kept in ${aside}`);
    } else {
      rmSync(photosDir, { recursive: true });
    }
  }
  mkdirSync(dataDir, { recursive: true });
  await runTar(['-xf', path.join(dir, PHOTOS_FILE), '-C', dataDir]);
}

async function main(): Promise<void> {
  const args = process.argv.slice(2);
  const force = args.includes('--force');
  const given = args.find((a) => !a.startsWith('--'));
  if (!given) {
    console.error('Usage: npm run db:restore -- <backup folder> [--force]');
    process.exitCode = 2;
    return;
  }
  const dir = path.resolve(given);
  const manifest = readManifest(dir);
  const config = loadConfig();
  const photosDir = path.join(config.dataDir, 'photos');
  const database = await appDatabase(config);
  try {
    const client = await connect(database.url);
    try {
      const present = await figuresWith(client);
      const inBucket = manifest.photos.store === 's3';
      const photoFiles = !inBucket && existsSync(photosDir) ? readdirSync(photosDir).length : 0;
      if ((present.tables.length > 0 || photoFiles > 0) && !force) {
        const what = [
          ...(present.tables.length
            ? [`${database.label} has ${present.tables.length} tables (${present.rows} rows)`]
            : []),
          ...(photoFiles ? [`${photosDir} has ${photoFiles} files`] : []),
        ];
        throw new BackupError(
          `Nothing restored: ${what.join(', and ')}. Restoring replaces them; ` +
            'run again with --force to do that.',
        );
      }

      // One transaction: the database is replaced whole, or not at all.
      await runTool(
        clientTool('pg_restore'),
        [
          '--clean',
          '--if-exists',
          '--no-owner',
          '--no-privileges',
          '--single-transaction',
          '--exit-on-error',
          path.join(dir, DUMP_FILE),
        ],
        database.url,
      );

      if (manifest.photos.store === 's3') {
        console.log(
          `Photos were not in the backup: they stay in bucket ${manifest.photos.bucket}, ` +
            "restored (if need be) from the object store's own versions or replica.",
        );
      } else {
        await restorePhotos(dir, config.dataDir, photosDir, photoFiles);
      }

      const restored = await figuresWith(client);
      printFigures(`Restored into ${database.label}`, restored);
      if (restored.checksum !== manifest.figures.checksum) {
        throw new BackupError(
          `The restored data differ from the backup in: ${changedTables(manifest.figures, restored).join(', ')}.`,
        );
      }
      console.log(`Row counts and checksum match the backup of ${manifest.createdAt}.`);
    } finally {
      await client.end();
    }
  } finally {
    database.release();
  }
}

main().catch((err: unknown) => {
  console.error(err instanceof BackupError || err instanceof ClusterError ? err.message : err);
  process.exitCode = 1;
});
