import { readdir } from 'node:fs/promises';
import { createS3PhotoStore } from '../../server/photos/s3-store';
import type { PhotoStore } from '../../server/photos/store';
import { readWhole } from '../support/photos';
import { startS3Fake, type S3Fake } from '../support/s3';

let s3: S3Fake;
let store: PhotoStore;
beforeAll(async () => {
  s3 = await startS3Fake();
  store = createS3PhotoStore(s3.config);
});
afterAll(async () => {
  await store?.close?.();
  await s3?.close();
});

const key = '7c9e6679-7425-40de-944b-e07fc1f90ae7.jpg';
const thumbKey = '7c9e6679-7425-40de-944b-e07fc1f90ae7.thumb.jpg';

describe('createS3PhotoStore', () => {
  it('round-trips a photo and its thumbnail through the bucket, streaming with the size', async () => {
    await store.put(key, Buffer.from('photo bytes'));
    await store.put(thumbKey, Buffer.from('thumb'));
    const opened = await store.open(key);
    expect(opened?.size).toBe('photo bytes'.length);
    opened?.body.destroy();
    expect((await readWhole(store, key))?.toString()).toBe('photo bytes');
    expect((await readWhole(store, thumbKey))?.toString()).toBe('thumb');
  });

  it('keeps the objects under the photos/ prefix of the bucket', async () => {
    await store.put(key, Buffer.from('x'));
    // s3rver keeps a bucket as a folder of the same name, objects as files under their keys.
    expect(await readdir(`${s3.dir}/${s3.config.bucket}/photos`)).toEqual(
      expect.arrayContaining([expect.stringContaining(key.replace('.jpg', ''))]),
    );
  });

  it('answers undefined for a missing key, and removing it twice is fine', async () => {
    const gone = 'a8098c1a-f86e-41da-8e6d-9f2a7e3b5c11.jpg';
    expect(await store.open(gone)).toBeUndefined();
    await store.put(gone, Buffer.from('x'));
    await store.remove(gone);
    await store.remove(gone);
    expect(await store.open(gone)).toBeUndefined();
  });

  it.each(['../x.jpg', '../../etc/passwd', '/etc/passwd', `${key}\0`, 'a/b.jpg'])(
    'refuses the key %j without asking the bucket',
    async (bad) => {
      await expect(store.put(bad, Buffer.from('x'))).rejects.toThrow(/Not a photo key/);
      await expect(store.open(bad)).rejects.toThrow(/Not a photo key/);
      await expect(store.remove(bad)).rejects.toThrow(/Not a photo key/);
    },
  );

  it('fails loudly, not as a missing photo, when the bucket does not exist', async () => {
    const wrong = createS3PhotoStore({ ...s3.config, bucket: 'no-such-bucket' });
    try {
      await expect(wrong.open(key)).rejects.toThrow();
    } finally {
      await wrong.close?.();
    }
  });
});
