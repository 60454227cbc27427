import type { PhotoStorageConfig } from '../config';
import { createS3PhotoStore } from './s3-store';
import { createDiskPhotoStore, type PhotoStore } from './store';

/** The photo store the configuration names: a local folder by default, S3 when configured. */
export function createPhotoStore(photos: PhotoStorageConfig): PhotoStore {
  return photos.kind === 's3' ? createS3PhotoStore(photos) : createDiskPhotoStore(photos.dir);
}
