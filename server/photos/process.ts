import sharp from 'sharp';
import { AppError } from '../errors';

/**
 * Formats we accept, as sharp's `metadata().format` names them, judged from the bytes alone: a
 * name or declared MIME type says nothing about what the file really is. `heif` covers AVIF, which
 * the prebuilt libvips decodes; HEIC (HEVC) also reports `heif` but only decodes where libvips was
 * built with an HEVC decoder, so elsewhere it fails at decoding and gets the same 415.
 * GIF, SVG, TIFF, PDF and the rest are refused: none is how a camera or phone saves a photo, and
 * SVG and PDF are documents to render, which widens what an upload can make the server do.
 */
export const ACCEPTED_PHOTO_FORMATS: readonly string[] = ['jpeg', 'png', 'webp', 'heif'];

/** Longest side we accept; larger is no lab photo, and decoding it costs too much memory. */
export const MAX_INPUT_SIDE = 12_000;

/**
 * Pixel ceiling handed to libvips, so a file whose header claims a huge canvas (a decompression
 * bomb) is refused before it is decoded. 12000 × 9000 still lets a 108 MP phone photo through.
 */
export const MAX_INPUT_PIXELS = 12_000 * 9_000;

/** Long side of the stored photo: enough to read a char length, a fraction of a camera original. */
export const MAX_STORED_SIDE = 2560;
export const THUMBNAIL_SIDE = 320;

// common practice, no source: JPEG quality 85 is the usual balance of size and visible detail.
const PHOTO_QUALITY = 85;
const THUMBNAIL_QUALITY = 80;

export type ProcessedPhoto = {
  image: Buffer;
  thumbnail: Buffer;
  width: number;
  height: number;
  contentType: 'image/jpeg';
};

function notAPhoto(): AppError {
  return new AppError(
    415,
    'invalid_request',
    'This file is not a photo Quenchbook can store (JPEG, PNG or WebP).',
  );
}

// failOn 'warning' (sharp's default, spelled out because it matters): a truncated or damaged file
// is refused rather than stored with a grey band where the data ran out.
const inputOptions: sharp.SharpOptions = {
  limitInputPixels: MAX_INPUT_PIXELS,
  failOn: 'warning',
};

/**
 * Turns an uploaded file into the JPEG we store and its thumbnail. Re-encoding is the point: the
 * stored bytes are ours, not the uploader's, and sharp writes no metadata unless asked, so EXIF
 * (GPS position, camera serial), XMP and ICC never reach storage.
 */
export async function processPhoto(input: Buffer): Promise<ProcessedPhoto> {
  let metadata: sharp.Metadata;
  try {
    metadata = await sharp(input, inputOptions).metadata();
  } catch {
    throw notAPhoto();
  }
  const { format, width, height } = metadata;
  if (!format || !ACCEPTED_PHOTO_FORMATS.includes(format) || !width || !height) throw notAPhoto();
  // The header alone tells us the size, so an absurd canvas is refused before any decoding.
  if (width > MAX_INPUT_SIDE || height > MAX_INPUT_SIDE || width * height > MAX_INPUT_PIXELS) {
    throw new AppError(
      415,
      'invalid_request',
      `This photo is too large to store (at most ${MAX_INPUT_SIDE} pixels a side).`,
    );
  }

  let image: Buffer;
  let info: sharp.OutputInfo;
  try {
    ({ data: image, info } = await sharp(input, inputOptions)
      // Apply EXIF orientation to the pixels, since the tag that described it is dropped.
      .rotate()
      .resize({
        width: MAX_STORED_SIDE,
        height: MAX_STORED_SIDE,
        fit: 'inside',
        withoutEnlargement: true,
      })
      // JPEG has no alpha; without this, transparent PNG areas turn black.
      .flatten({ background: '#ffffff' })
      .jpeg({ quality: PHOTO_QUALITY })
      .toBuffer({ resolveWithObject: true }));
  } catch {
    // The header was readable but the data is not (cut short, corrupt, or a HEIC this libvips
    // cannot decode): for the uploader that is the same thing as a file that is not a photo.
    throw notAPhoto();
  }

  // Made from our own re-encoded JPEG: it is already upright and carries no metadata.
  const thumbnail = await sharp(image)
    .resize({
      width: THUMBNAIL_SIDE,
      height: THUMBNAIL_SIDE,
      fit: 'inside',
      withoutEnlargement: true,
    })
    .jpeg({ quality: THUMBNAIL_QUALITY })
    .toBuffer();

  return { image, thumbnail, width: info.width, height: info.height, contentType: 'image/jpeg' };
}
