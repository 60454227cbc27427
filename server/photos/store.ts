import { randomUUID } from 'node:crypto';
import { mkdir, open, readFile, rename, rm } from 'node:fs/promises';
import path from 'node:path';

export type PhotoStore = {
  put(key: string, data: Buffer): Promise<void>;
  get(key: string): Promise<Buffer | undefined>;
  remove(key: string): Promise<void>;
};

/**
 * A UUID plus an optional `.thumb`, always `.jpg`. Keys become file names, so allowing nothing
 * else (no dots beyond these, no slashes) is what keeps a key from reaching outside the folder.
 */
export const PHOTO_KEY_PATTERN = /^[0-9a-f-]{36}(\.thumb)?\.jpg$/;

function checkedKey(key: string): string {
  // Keys are made by the server, so a bad one is a bug (or a route passing user input through):
  // fail loudly rather than touch the file system.
  if (!PHOTO_KEY_PATTERN.test(key)) throw new Error(`Not a photo key: ${JSON.stringify(key)}`);
  return key;
}

function isMissing(err: unknown): boolean {
  return (err as NodeJS.ErrnoException | undefined)?.code === 'ENOENT';
}

/** Photos as files in one folder, named by key. */
export function createDiskPhotoStore(rootDir: string): PhotoStore {
  const fileFor = (key: string) => path.join(rootDir, checkedKey(key));

  return {
    async put(key, data) {
      const target = fileFor(key);
      await mkdir(rootDir, { recursive: true });
      // Written beside the target and renamed into place, so a reader never sees half a photo and
      // a crash mid-write leaves only a temp file, never a damaged photo. The temp name cannot match
      // the key pattern, so it is never served.
      const temp = path.join(rootDir, `.${key}.${randomUUID()}.tmp`);
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

    async get(key) {
      try {
        return await readFile(fileFor(key));
      } catch (err) {
        if (isMissing(err)) return undefined;
        throw err;
      }
    },

    async remove(key) {
      // Removing what is already gone is fine: a retried delete must not fail.
      await rm(fileFor(key), { force: true });
    },
  };
}
