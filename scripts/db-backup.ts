import { existsSync, mkdirSync, readdirSync, writeFileSync } from 'node:fs';
import path from 'node:path';
import { loadConfig, type S3Config } from '../server/config';
import { PHOTO_KEY_PATTERN } from '../server/photos/store';
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
  toolVersion,
  type Manifest,
} from './backup-tools';
import { ClusterError } from './pg-cluster';

// npm run db:backup [-- --out <folder>]
// The app's database (DATABASE_URL, or the private cluster) as a pg_dump archive, the photos
// folder as a tar beside it (or, for photos in S3, the bucket named in the manifest), and a
// manifest with every table's row count and checksum.

function outFolder(dataDir: string): string {
  const i = process.argv.indexOf('--out');
  if (i > 0) {
    const given = process.argv[i + 1];
    if (!given) throw new BackupError('--out needs a folder.');
    return path.resolve(given);
  }
  const stamp = new Date().toISOString().replace(/[:.]/g, '-');
  return path.join(dataDir, 'backups', stamp);
}

/**
 * Packs the photos folder. After the dump: a photo's file is written before its row, so every
 * photo row in the dump has its file by now. Half-written temp files (dot names) stay out.
 */
async function packPhotos(dataDir: string, dir: string): Promise<Manifest['photos']> {
  const photosDir = path.join(dataDir, 'photos');
  const photos = existsSync(photosDir)
    ? readdirSync(photosDir).filter((f) => PHOTO_KEY_PATTERN.test(f))
    : [];
  const tarFile = path.join(dir, PHOTOS_FILE);
  await runTar(
    existsSync(photosDir)
      ? ['-cf', tarFile, '-C', dataDir, '--exclude=photos/.*', 'photos']
      : ['-cf', tarFile, '--files-from=/dev/null'],
  );
  return { store: 'disk', files: photos.length };
}

/** Photos in a bucket are not copied: the object store's versioning or replication keeps them. */
function bucketNote(s3: S3Config): Manifest['photos'] {
  const endpoint = s3.endpoint ? new URL(s3.endpoint).origin : null;
  return { store: 's3', bucket: s3.bucket, endpoint };
}

async function main(): Promise<void> {
  const config = loadConfig();
  const dir = outFolder(config.dataDir);
  if (existsSync(dir) && readdirSync(dir).length > 0) {
    throw new BackupError(`${dir} is not empty: choose another folder for the backup.`);
  }
  mkdirSync(dir, { recursive: true });
  const database = await appDatabase(config);
  try {
    const dumpTool = clientTool('pg_dump');
    const client = await connect(database.url);
    let figures;
    try {
      // One snapshot for the dump and the figures, so the manifest describes exactly the dump
      // even while the app keeps writing.
      await client.query('BEGIN ISOLATION LEVEL REPEATABLE READ READ ONLY');
      const snapshot = (await client.query<{ id: string }>('SELECT pg_export_snapshot() AS id'))
        .rows[0]!.id;
      figures = await figuresWith(client);
      await runTool(
        dumpTool,
        ['--format=custom', `--snapshot=${snapshot}`, `--file=${path.join(dir, DUMP_FILE)}`],
        database.url,
      );
      await client.query('COMMIT');
    } finally {
      await client.end();
    }

    const photos =
      config.photos.kind === 's3'
        ? bucketNote(config.photos)
        : await packPhotos(config.dataDir, dir);
    const manifest: Manifest = {
      createdAt: new Date().toISOString(),
      appVersion: config.version,
      source: database.label,
      pgDump: toolVersion(dumpTool),
      figures,
      photos,
    };
    writeFileSync(path.join(dir, MANIFEST_FILE), `${JSON.stringify(manifest, null, 2)}\n`);
    printFigures(`Backed up ${database.label}`, figures);
    console.log(
      photos.store === 's3'
        ? `  photos: not copied, they stay in bucket ${photos.bucket} (backed up by its own versioning or replication)`
        : `  photo files ${photos.files}`,
    );
    console.log(`Backup written to ${dir}`);
  } finally {
    database.release();
  }
}

main().catch((err: unknown) => {
  console.error(err instanceof BackupError || err instanceof ClusterError ? err.message : err);
  process.exitCode = 1;
});
