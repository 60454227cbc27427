import { AppError } from '../errors';
import { BurnPairModel, PhotoModel } from '../models';
import { processPhoto } from '../photos/process';
import type { PhotoStore, StoredPhoto } from '../photos/store';

const key = (id: string, thumb: boolean) => `${id}${thumb ? '.thumb' : ''}.jpg`;

/**
 * Stores a specimen photo: checked by content, re-encoded without EXIF or location, with a
 * thumbnail. The client's id names the photo, so a retried upload is stored once.
 */
export async function addPhoto(
  store: PhotoStore,
  labId: string,
  pairId: string,
  userId: string,
  fields: { clientId: string; specimenId: string; stage: 'before' | 'after' },
  upload: Buffer,
): Promise<{
  photo: { id: string; stage: 'before' | 'after'; width: number; height: number };
  created: boolean;
}> {
  // Keys in the store are lower-case; a client may send its id in either case.
  const id = fields.clientId.toLowerCase();
  const pair = await BurnPairModel.findOne({ where: { id: pairId, labId } });
  if (!pair) throw AppError.notFound('No such burn test in this lab.');
  if (
    fields.specimenId !== pair.controlSpecimenId &&
    fields.specimenId !== pair.treatedSpecimenId
  ) {
    throw new AppError(400, 'invalid_request', 'Some fields are not valid.', [
      { path: 'specimenId', message: 'Not a specimen of this test' },
    ]);
  }
  const same = await PhotoModel.findByPk(id);
  if (same) {
    if (same.pairId !== pairId)
      throw new AppError(409, 'already_exists', 'A photo with this id belongs to another test.');
    return {
      photo: { id: same.id, stage: same.stage, width: same.width, height: same.height },
      created: false,
    };
  }
  if (pair.status === 'signed_off')
    throw new AppError(
      409,
      'locked',
      'This test is signed off: its photos are part of the record.',
    );
  const processed = await processPhoto(upload);
  await store.put(key(id, false), processed.image);
  await store.put(key(id, true), processed.thumbnail);
  const [row] = await PhotoModel.findOrCreate({
    where: { id },
    defaults: {
      id,
      labId,
      pairId,
      specimenId: fields.specimenId,
      stage: fields.stage,
      width: processed.width,
      height: processed.height,
      bytes: processed.image.length,
      uploadedBy: userId,
    },
  });
  return {
    photo: { id: row.id, stage: row.stage, width: row.width, height: row.height },
    created: true,
  };
}

export async function readPhoto(
  store: PhotoStore,
  labId: string,
  photoId: string,
  thumb: boolean,
): Promise<StoredPhoto> {
  const row = await PhotoModel.findOne({ where: { id: photoId, labId } });
  // The store is asked only for an id the database knows, never for what the caller typed.
  const data = row ? await store.open(key(row.id, thumb)) : undefined;
  if (!data) throw AppError.notFound('No such photo in this lab.');
  return data;
}
