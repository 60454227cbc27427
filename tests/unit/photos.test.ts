import { mkdtemp, readdir, rm } from 'node:fs/promises';
import { tmpdir } from 'node:os';
import path from 'node:path';
import express from 'express';
import sharp from 'sharp';
import request from 'supertest';
import { AppError } from '../../server/errors';
import { errorHandler } from '../../server/middleware/error';
import { processPhoto } from '../../server/photos/process';
import { createDiskPhotoStore, fileInRoot } from '../../server/photos/store';
import { photoUpload } from '../../server/photos/upload';
import { readWhole } from '../support/photos';

function blank(width: number, height: number) {
  return sharp({ create: { width, height, channels: 3, background: '#b5482c' } });
}

/**
 * Whether IFD0 of an EXIF block points to a GPS IFD (tag 0x8825). sharp's metadata gives the raw
 * block only, so this reads the TIFF structure: "Exif\0\0", byte order, offset of IFD0, entries.
 */
function hasGpsIfd(exif: Buffer): boolean {
  const tiff = exif.subarray(6);
  const little = tiff.toString('latin1', 0, 2) === 'II';
  const u16 = (at: number) => (little ? tiff.readUInt16LE(at) : tiff.readUInt16BE(at));
  const u32 = (at: number) => (little ? tiff.readUInt32LE(at) : tiff.readUInt32BE(at));
  const ifd0 = u32(4);
  const count = u16(ifd0);
  for (let i = 0; i < count; i++) {
    if (u16(ifd0 + 2 + i * 12) === 0x8825) return true;
  }
  return false;
}

async function rejectionOf(promise: Promise<unknown>): Promise<AppError> {
  const err = await promise.then(
    () => undefined,
    (e: unknown) => e,
  );
  expect(err).toBeInstanceOf(AppError);
  return err as AppError;
}

const notAPhoto = { status: 415, code: 'invalid_request' };

describe('processPhoto', () => {
  it('strips EXIF with GPS, XMP and ICC, and the result still decodes', async () => {
    const input = await blank(40, 20)
      .withIccProfile('p3')
      .jpeg()
      .withExif({
        IFD0: { Make: 'Quenchbook test camera', Software: 'jest' },
        IFD3: {
          GPSLatitudeRef: 'N',
          GPSLatitude: '51/1 30/1 0/1',
          GPSLongitudeRef: 'W',
          GPSLongitude: '0/1 7/1 0/1',
        },
      })
      .withXmp('<x:xmpmeta xmlns:x="adobe:ns:meta/"><rdf:RDF/></x:xmpmeta>')
      .toBuffer();
    // The input must really carry what we expect to see removed, or the test proves nothing.
    const before = await sharp(input).metadata();
    expect(before.exif && hasGpsIfd(before.exif)).toBe(true);
    expect(before.xmp).toBeDefined();
    expect(before.icc).toBeDefined();

    const out = await processPhoto(input);

    for (const bytes of [out.image, out.thumbnail]) {
      const after = await sharp(bytes).metadata();
      expect(after.format).toBe('jpeg');
      expect(after.exif).toBeUndefined();
      expect(after.xmp).toBeUndefined();
      expect(after.icc).toBeUndefined();
      expect(after.iptc).toBeUndefined();
      expect(bytes.includes(Buffer.from('Quenchbook test camera'))).toBe(false);
      const { info } = await sharp(bytes).raw().toBuffer({ resolveWithObject: true });
      expect(info.width).toBeGreaterThan(0);
    }
    expect(out.contentType).toBe('image/jpeg');
  });

  it('applies the EXIF orientation to the pixels (40×20 tagged 6 comes out 20×40)', async () => {
    const input = await blank(40, 20).jpeg().withMetadata({ orientation: 6 }).toBuffer();
    expect((await sharp(input).metadata()).orientation).toBe(6);

    const out = await processPhoto(input);

    expect([out.width, out.height]).toEqual([20, 40]);
    const meta = await sharp(out.image).metadata();
    expect([meta.width, meta.height]).toEqual([20, 40]);
    expect(meta.orientation).toBeUndefined();
  });

  it('accepts a PNG and returns a JPEG', async () => {
    const input = await blank(64, 48).png().toBuffer();

    const out = await processPhoto(input);

    expect((await sharp(out.image).metadata()).format).toBe('jpeg');
    expect([out.width, out.height]).toEqual([64, 48]);
  });

  it('accepts a WebP', async () => {
    const out = await processPhoto(await blank(30, 30).webp().toBuffer());
    expect((await sharp(out.image).metadata()).format).toBe('jpeg');
  });

  it('downsizes a big image to 2560 px on the long side and makes a 320 px thumbnail', async () => {
    const input = await blank(3000, 1500).jpeg().toBuffer();

    const out = await processPhoto(input);

    expect([out.width, out.height]).toEqual([2560, 1280]);
    const thumb = await sharp(out.thumbnail).metadata();
    expect([thumb.width, thumb.height]).toEqual([320, 160]);
  });

  it('does not enlarge a small image', async () => {
    const out = await processPhoto(await blank(100, 50).jpeg().toBuffer());
    expect([out.width, out.height]).toEqual([100, 50]);
    const thumb = await sharp(out.thumbnail).metadata();
    expect([thumb.width, thumb.height]).toEqual([100, 50]);
  });

  it('answers 415 for text bytes', async () => {
    const err = await rejectionOf(processPhoto(Buffer.from('not a photo, just text\n')));
    expect(err).toMatchObject(notAPhoto);
    expect(err.message).toMatch(/JPEG, PNG or WebP/);
  });

  it('answers 415 for a truncated JPEG', async () => {
    const whole = await blank(200, 100).jpeg().toBuffer();
    const err = await rejectionOf(processPhoto(whole.subarray(0, 100)));
    expect(err).toMatchObject(notAPhoto);
  });

  it('answers 415 for a GIF', async () => {
    const gif = await blank(8, 8).gif().toBuffer();
    expect((await sharp(gif).metadata()).format).toBe('gif');
    expect(await rejectionOf(processPhoto(gif))).toMatchObject(notAPhoto);
  });

  it('answers 415 for an SVG', async () => {
    const svg = Buffer.from(
      '<svg xmlns="http://www.w3.org/2000/svg" width="10" height="10"><rect width="10" height="10"/></svg>',
    );
    expect((await sharp(svg).metadata()).format).toBe('svg');
    expect(await rejectionOf(processPhoto(svg))).toMatchObject(notAPhoto);
  });

  it('answers 415 for an image wider than 12000 px', async () => {
    const wide = await blank(12_001, 4).png().toBuffer();
    const err = await rejectionOf(processPhoto(wide));
    expect(err).toMatchObject(notAPhoto);
    expect(err.message).toMatch(/12000 pixels/);
  });
});

describe('createDiskPhotoStore', () => {
  let root: string;
  const key = '0f8fad5b-d9cb-469f-a165-70867728950e.jpg';

  beforeEach(async () => {
    root = path.join(await mkdtemp(path.join(tmpdir(), 'qb-photos-')), 'not-yet-there');
  });
  afterEach(async () => {
    await rm(path.dirname(root), { recursive: true, force: true });
  });

  it('round-trips a photo and its thumbnail, creating the folder, leaving no temp file', async () => {
    const store = createDiskPhotoStore(root);
    const thumbKey = key.replace('.jpg', '.thumb.jpg');

    await store.put(key, Buffer.from('photo bytes'));
    await store.put(thumbKey, Buffer.from('thumb bytes'));

    expect((await readWhole(store, key))?.toString()).toBe('photo bytes');
    expect((await readWhole(store, thumbKey))?.toString()).toBe('thumb bytes');
    expect((await readdir(root)).sort()).toEqual([key, thumbKey].sort());
  });

  it('replaces a photo written twice under one key', async () => {
    const store = createDiskPhotoStore(root);
    await store.put(key, Buffer.from('first'));
    await store.put(key, Buffer.from('second'));
    expect((await readWhole(store, key))?.toString()).toBe('second');
  });

  it('answers undefined for a missing key, and removing it twice is fine', async () => {
    const store = createDiskPhotoStore(root);
    expect(await readWhole(store, key)).toBeUndefined();
    await store.put(key, Buffer.from('x'));
    await store.remove(key);
    await store.remove(key);
    expect(await readWhole(store, key)).toBeUndefined();
  });

  it.each([
    '../x.jpg',
    'a/b.jpg',
    '../0f8fad5b-d9cb-469f-a165-70867728950e.jpg',
    '0f8fad5b-d9cb-469f-a165-70867728950e.png',
    '0F8FAD5B-D9CB-469F-A165-70867728950E.jpg',
    '0f8fad5b-d9cb-469f-a165-70867728950e.jpg/',
    'photo.jpg',
    '',
    '../../etc/passwd',
    '%2e%2e/%2e%2e/etc/passwd',
    '/etc/passwd',
    '/tmp/0f8fad5b-d9cb-469f-a165-70867728950e.jpg',
    '0f8fad5b-d9cb-469f-a165-70867728950e.jpg\0',
    '0f8fad5b-d9cb-469f-a165-70867728950e\0.jpg',
    '------------------------------------.jpg',
    '..\\0f8fad5b-d9cb-469f-a165-70867728950e.jpg',
  ])('refuses the key %j for put, open and remove', async (bad) => {
    const store = createDiskPhotoStore(root);
    await expect(store.put(bad, Buffer.from('x'))).rejects.toThrow(/Not a photo key/);
    await expect(store.open(bad)).rejects.toThrow(/Not a photo key/);
    await expect(store.remove(bad)).rejects.toThrow(/Not a photo key/);
    // Nothing was made, not even the root folder.
    await expect(readdir(root)).rejects.toThrow(/ENOENT/);
  });

  it('places a good key directly inside the resolved root, even from a relative root', () => {
    const file = fileInRoot('photos/../photos', key);
    expect(file).toBe(path.resolve('photos', key));
  });
});

describe('photoUpload', () => {
  const maxBytes = 8 * 1024;

  function appWith(received: Buffer[]) {
    const app = express();
    app.post('/photos', photoUpload(maxBytes), (req, res) => {
      received.push(req.file!.buffer);
      res.json({ bytes: req.file!.buffer.length });
    });
    app.post('/processed', photoUpload(maxBytes), async (req, res) => {
      const out = await processPhoto(req.file!.buffer);
      res.json({ width: out.width });
    });
    app.use(errorHandler(() => undefined));
    return app;
  }

  it('hands a good file to the handler as req.file.buffer', async () => {
    const jpeg = await blank(16, 16).jpeg().toBuffer();
    const received: Buffer[] = [];

    const res = await request(appWith(received))
      .post('/photos')
      .attach('photo', jpeg, { filename: 'burn-1.jpg', contentType: 'image/jpeg' });

    expect(res.status).toBe(200);
    expect(received).toHaveLength(1);
    expect(received[0]!.equals(jpeg)).toBe(true);
  });

  it('answers 413 payload_too_large for a file over the limit', async () => {
    const res = await request(appWith([]))
      .post('/photos')
      .attach('photo', Buffer.alloc(maxBytes + 1, 1), 'big.jpg');

    expect(res.status).toBe(413);
    expect(res.body.error.code).toBe('payload_too_large');
    expect(res.body.error.message).toBe('The photo is larger than 8 KB.');
  });

  it('answers 400 naming photo when no file is sent', async () => {
    const res = await request(appWith([])).post('/photos').field('note', 'forgot the photo');

    expect(res.status).toBe(400);
    expect(res.body.error.code).toBe('invalid_request');
    expect(res.body.error.fields).toEqual([{ path: 'photo', message: 'Choose a photo' }]);
  });

  it('answers 400 naming photo for a request that is not multipart', async () => {
    const res = await request(appWith([])).post('/photos').send({ photo: 'x' });
    expect(res.status).toBe(400);
    expect(res.body.error.fields[0].path).toBe('photo');
  });

  it('answers 400 for a file in another field', async () => {
    const res = await request(appWith([]))
      .post('/photos')
      .attach('picture', Buffer.from('x'), 'a.jpg');
    expect(res.status).toBe(400);
    expect(res.body.error.code).toBe('invalid_request');
  });

  it('judges by content: text named photo.jpg and sent as image/jpeg gets 415', async () => {
    const res = await request(appWith([]))
      .post('/processed')
      .attach('photo', Buffer.from('plain text, not a JPEG'), {
        filename: 'photo.jpg',
        contentType: 'image/jpeg',
      });

    expect(res.status).toBe(415);
    expect(res.body.error.code).toBe('invalid_request');
  });
});
