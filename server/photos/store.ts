import { randomUUID } from 'node:crypto';
import { mkdir, open, rename, rm } from 'node:fs/promises';
import path from 'node:path';
import type { Readable } from 'node:stream';

/** A stored photo, opened for reading: streamed to the client, never held whole in memory. */
export type StoredPhoto = { body: Readable; size: number };

/**
 * Where photo bytes live. Every instance of the server must see the same store, so a photo
 * uploaded through one is served by the others: the disk store for one machine, S3 for several.
 */
export type PhotoStore = {
  put(key: string, data: Buffer): Promise<void>;
  /** Undefined when there is no such photo. */
  open(key: string): Promise<StoredPhoto | undefined>;
  remove(key: string): Promise<void>;
  close?(): Promise<void> | void;
};

/**
 * A UUID plus an optional `.thumb`, always `.jpg`. Keys become file names (or object names), so
 * allowing nothing else (no dots beyond these, no slashes, no NUL) keeps a key inside the store.
 */
export const PHOTO_KEY_PATTERN =
  /^[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}(\.thumb)?\.jpg$/;

export function checkedKey(key: string): string {
  // Keys are made by the server, so a bad one is a bug (or a route passing user input through):
  // fail loudly rather than touch the storage.
  if (!PHOTO_KEY_PATTERN.test(key)) throw new Error(`Not a photo key: ${JSON.stringify(key)}`);
  return key;
}

/**
 * The file for a key, resolved and checked to lie directly in the root. The key pattern already
 * rules out every escape; this second check holds even if the pattern is ever loosened.
 */
export function fileInRoot(rootDir: string, key: string): string {
  const root = path.resolve(rootDir);
  const file = path.resolve(root, checkedKey(key));
  if (path.dirname(file) !== root) throw new Error(`Not a photo key: ${JSON.stringify(key)}`);
  return file;
}

function isMissing(err: unknown): boolean {
  return (err as NodeJS.ErrnoException | undefined)?.code === 'ENOENT';
}

/** Photos as files in one folder, named by key. */
export function createDiskPhotoStore(rootDir: string): PhotoStore {
  const root = path.resolve(rootDir);

  return {
    async put(key, data) {
      const target = fileInRoot(root, key);
      await mkdir(root, { recursive: true });
      // Written beside the target and renamed into place, so a reader never sees half a photo and
      // a crash mid-write leaves only a temp file, never a damaged photo. The temp name cannot match
      // the key pattern, so it is never served.
      const temp = path.join(root, `.${path.basename(target)}.${randomUUID()}.tmp`);
      try {
        const handle = await open(temp, 'wx');
        try {
          await handle.writeFile(data);
          // Flush before the rename, or a power cut could leave the new name on empty content.
          await handle.sync();
        } finally {
          await handle.close();
        }
        await rename(temp, target);
      } catch (err) {
        await rm(temp, { force: true });
        throw err;
      }
    },

    async open(key) {
      const file = fileInRoot(root, key);
      try {
        // Opened before answering, so a missing file is a 404 and not a broken stream.
        const handle = await open(file, 'r');
        const { size } = await handle.stat();
        return { body: handle.createReadStream(), size };
      } catch (err) {
        if (isMissing(err)) return undefined;
        throw err;
      }
    },

    async remove(key) {
      // Removing what is already gone is fine: a retried delete must not fail.
      await rm(fileInRoot(root, key), { force: true });
    },
  };
}
