import type { RequestHandler } from 'express';
import multer from 'multer';
import { AppError } from '../errors';

/** The multipart field that carries the photo. */
export const PHOTO_FIELD = 'photo';

function sizeLabel(bytes: number): string {
  const mb = bytes / (1024 * 1024);
  if (mb >= 1) return `${Number(mb.toFixed(1))} MB`;
  return `${Math.max(1, Math.floor(bytes / 1024))} KB`;
}

function missingPhoto(): AppError {
  return new AppError(400, 'invalid_request', 'Choose a photo to upload.', [
    { path: PHOTO_FIELD, message: 'Choose a photo' },
  ]);
}

function toAppError(err: unknown, maxBytes: number): AppError {
  if (err instanceof AppError) return err;
  if (err instanceof multer.MulterError) {
    if (err.code === 'LIMIT_FILE_SIZE') {
      return new AppError(
        413,
        'payload_too_large',
        `The photo is larger than ${sizeLabel(maxBytes)}.`,
      );
    }
    if (err.code === 'LIMIT_UNEXPECTED_FILE' || err.code === 'LIMIT_FILE_COUNT') {
      return new AppError(
        400,
        'invalid_request',
        `Send one photo, in the field named "${PHOTO_FIELD}".`,
        [{ path: err.field ?? PHOTO_FIELD, message: 'Send one photo only' }],
      );
    }
    return new AppError(400, 'invalid_request', `The upload is not valid: ${err.message}.`, [
      { path: err.field ?? '', message: err.message },
    ]);
  }
  // With memory storage and no file filter, multer's other errors come from reading the request
  // (a malformed multipart body, no boundary, the client going away): the request's fault, not ours.
  return new AppError(400, 'invalid_request', 'The upload could not be read. Please try again.', [
    { path: '', message: 'Could not be read' },
  ]);
}

/**
 * Accepts one file in the `photo` field, held in memory (`req.file.buffer`) because it is
 * re-encoded before anything is stored. The file's name and declared type are not trusted:
 * `processPhoto` decides from the bytes.
 */
export function photoUpload(maxBytes: number): RequestHandler {
  const upload = multer({
    storage: multer.memoryStorage(),
    limits: { fileSize: maxBytes, files: 1, fields: 10 },
  }).single(PHOTO_FIELD);

  return (req, res, next) => {
    upload(req, res, (err: unknown) => {
      if (err) return next(toAppError(err, maxBytes));
      // An empty part is what a browser form sends when no file was chosen.
      if (!req.file || req.file.size === 0) return next(missingPhoto());
      next();
    });
  };
}
