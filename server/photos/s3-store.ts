import { Readable } from 'node:stream';
import {
  DeleteObjectCommand,
  GetObjectCommand,
  NoSuchKey,
  PutObjectCommand,
  S3Client,
} from '@aws-sdk/client-s3';
import type { S3Config } from '../config';
import { checkedKey, type PhotoStore } from './store';

/** Objects live under this prefix, so the bucket can hold other things beside the photos. */
const PREFIX = 'photos/';

// Only a missing key is a missing photo; a missing bucket (also a 404) is a broken setup.
function isMissing(err: unknown): boolean {
  return err instanceof NoSuchKey || (err as Error | undefined)?.name === 'NoSuchKey';
}

/** Photos as objects in an S3-compatible bucket that every server instance shares. */
export function createS3PhotoStore(config: S3Config): PhotoStore {
  const client = new S3Client({
    region: config.region,
    endpoint: config.endpoint,
    forcePathStyle: config.forcePathStyle,
    // Credentials come from our config only: the SDK must not go looking in the environment,
    // files or instance metadata on its own.
    credentials: { accessKeyId: config.accessKeyId, secretAccessKey: config.secretAccessKey },
    // Checksums only where S3 requires them: several S3-compatible stores refuse the newer
    // default checksum headers.
    requestChecksumCalculation: 'WHEN_REQUIRED',
    responseChecksumValidation: 'WHEN_REQUIRED',
  });
  const objectKey = (key: string) => `${PREFIX}${checkedKey(key)}`;

  return {
    async put(key, data) {
      // A PUT replaces the object whole, so a reader never sees half a photo.
      await client.send(
        new PutObjectCommand({
          Bucket: config.bucket,
          Key: objectKey(key),
          Body: data,
          ContentType: 'image/jpeg',
        }),
      );
    },

    async open(key) {
      try {
        const out = await client.send(
          new GetObjectCommand({ Bucket: config.bucket, Key: objectKey(key) }),
        );
        if (!(out.Body instanceof Readable)) throw new Error('S3 answered without a body stream');
        return { body: out.Body, size: out.ContentLength ?? 0 };
      } catch (err) {
        if (isMissing(err)) return undefined;
        throw err;
      }
    },

    async remove(key) {
      // S3 answers 204 for a key that is already gone, so a retried delete does not fail.
      await client.send(new DeleteObjectCommand({ Bucket: config.bucket, Key: objectKey(key) }));
    },

    close() {
      client.destroy();
    },
  };
}
