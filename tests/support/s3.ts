import { mkdtemp, rm } from 'node:fs/promises';
import { tmpdir } from 'node:os';
import path from 'node:path';
import S3rver from 's3rver';
import type { S3Config } from '../../server/config';

export type S3Fake = { config: S3Config; dir: string; close: () => Promise<void> };

/**
 * A local S3-compatible server (s3rver) on a free port, keeping objects in a temp folder, with
 * one empty bucket. Its fixed key pair is what s3rver checks signatures against.
 */
export async function startS3Fake(bucket = 'qb-photos'): Promise<S3Fake> {
  const dir = await mkdtemp(path.join(tmpdir(), 'qb-s3-'));
  const server = new S3rver({
    address: '127.0.0.1',
    port: 0,
    silent: true,
    directory: dir,
    configureBuckets: [{ name: bucket }],
  });
  const { port } = await server.run();
  return {
    dir,
    config: {
      bucket,
      endpoint: `http://127.0.0.1:${port}`,
      region: 'us-east-1',
      accessKeyId: 'S3RVER',
      secretAccessKey: 'S3RVER',
      forcePathStyle: true,
    },
    close: async () => {
      await server.close();
      await rm(dir, { recursive: true, force: true });
    },
  };
}
