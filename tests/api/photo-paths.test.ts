import { randomUUID } from 'node:crypto';
import { mkdir, mkdtemp, readdir, rm, writeFile } from 'node:fs/promises';
import { tmpdir } from 'node:os';
import path from 'node:path';
import sharp from 'sharp';
import request from 'supertest';
import { createDiskPhotoStore, type PhotoStore } from '../../server/photos/store';
import { bearer, memberWithRole, signUpPerson } from '../support/accounts';
import { buildApp, type TestApp } from '../support/app';
import { sessionWithPair } from '../support/burn';
import { freshDatabase, type TestDatabase } from '../support/db';

const unstorable = (path: string) => ({
  path,
  message: 'Contains a character that cannot be saved (a NUL or a broken symbol)',
});

// The photo root sits in a temp folder beside a decoy "outside" photo that no request may reach.
let db: TestDatabase;
let built: TestApp;
let tmp: string;
let root: string;
const decoyId = randomUUID();
const asked: string[] = [];

function recording(store: PhotoStore): PhotoStore {
  return {
    put: (key, data) => (asked.push(key), store.put(key, data)),
    open: (key) => (asked.push(key), store.open(key)),
    remove: (key) => (asked.push(key), store.remove(key)),
  };
}

beforeAll(async () => {
  tmp = await mkdtemp(path.join(tmpdir(), 'qb-photo-paths-'));
  root = path.join(tmp, 'photos');
  await mkdir(path.join(tmp, 'outside'));
  await writeFile(path.join(tmp, 'outside', `${decoyId}.jpg`), 'SECRET-OUTSIDE');
  db = await freshDatabase();
  built = buildApp(db, { photoStore: recording(createDiskPhotoStore(root)) });
});
afterAll(async () => {
  await built?.close();
  await db?.drop();
  await rm(tmp, { recursive: true, force: true });
});
beforeEach(() => {
  asked.length = 0;
});

async function labWithPair() {
  const lead = await signUpPerson(built);
  const tech = await memberWithRole(built, lead.labId, 'technician');
  const { pair, treatedId } = await sessionWithPair(lead.labId, tech.email);
  return { lead, tech, pair, treatedId };
}

const jpeg = () =>
  sharp({ create: { width: 32, height: 24, channels: 3, background: '#446688' } })
    .jpeg()
    .toBuffer();

describe('GET /api/labs/:labId/photos/:photoId', () => {
  const tricks = [
    ['a parent-folder path', '..%2F..%2Fetc%2Fpasswd'],
    ['an encoded parent folder', '%2e%2e'],
    ['an encoded walk to a photo outside the root', `%2e%2e%2Foutside%2F${decoyId}`],
    ['an absolute path', '%2Fetc%2Fpasswd'],
    ['a NUL byte after a valid id', `${decoyId}%00`],
    ['a NUL byte and an extension', `${decoyId}%00.jpg`],
    ['a backslash walk', `..%5C..%5Coutside%5C${decoyId}`],
  ];

  it.each(tricks)(
    'answers 400 naming photoId for %s, and never asks the store',
    async (_name, id) => {
      const { lead } = await labWithPair();
      for (const suffix of ['', '/thumbnail']) {
        const res = await request(built.app)
          .get(`/api/labs/${lead.labId}/photos/${id}${suffix}`)
          .set(bearer(lead.token));
        expect(res.status).toBe(400);
        // A NUL is also named as text that cannot be stored; nothing else may be said.
        const unknown = { path: 'photoId', message: 'Unknown photo' };
        const expected = id.includes('%00') ? [unknown, unstorable('photoId')] : [unknown];
        expect(res.body.error.fields).toEqual(expected);
        expect(res.text).not.toContain('SECRET-OUTSIDE');
      }
      expect(asked).toEqual([]);
    },
  );

  it('answers 404 for a well-formed id that is not a photo of the lab, without reading files', async () => {
    const { lead } = await labWithPair();
    const res = await request(built.app)
      .get(`/api/labs/${lead.labId}/photos/${decoyId}`)
      .set(bearer(lead.token));
    expect(res.status).toBe(404);
    expect(asked).toEqual([]);
  });
});

describe('POST /api/labs/:labId/pairs/:pairId/photos', () => {
  it.each([
    ['a parent-folder path', '../../etc/passwd'],
    ['an absolute path', '/tmp/evil'],
    ['a NUL byte', `${randomUUID()}\0`],
  ])('answers 400 naming clientId for %s, storing nothing', async (_name, clientId) => {
    const { tech, lead, pair, treatedId } = await labWithPair();
    const res = await request(built.app)
      .post(`/api/labs/${lead.labId}/pairs/${pair.id}/photos`)
      .set(bearer(tech.token))
      .field('clientId', clientId)
      .field('specimenId', treatedId)
      .field('stage', 'after')
      .attach('photo', await jpeg(), { filename: 'after.jpg', contentType: 'image/jpeg' });
    expect(res.status).toBe(400);
    const fields = res.body.error.fields as { path: string; message: string }[];
    expect(fields.map((f) => f.path)).toEqual(
      clientId.includes('\0') ? ['clientId', 'clientId'] : ['clientId'],
    );
    if (clientId.includes('\0')) expect(fields[1]).toEqual(unstorable('clientId'));
    expect(asked).toEqual([]);
  });

  it('ignores a path in the uploaded file name: the photo is stored by its id inside the root', async () => {
    const { tech, lead, pair, treatedId } = await labWithPair();
    const id = randomUUID();
    const res = await request(built.app)
      .post(`/api/labs/${lead.labId}/pairs/${pair.id}/photos`)
      .set(bearer(tech.token))
      .field('clientId', id)
      .field('specimenId', treatedId)
      .field('stage', 'before')
      .attach('photo', await jpeg(), {
        filename: '../../outside/evil.jpg',
        contentType: 'image/jpeg',
      });
    expect(res.status).toBe(201);
    expect(asked).toEqual([`${id}.jpg`, `${id}.thumb.jpg`]);
    expect(await readdir(path.join(tmp, 'outside'))).toEqual([`${decoyId}.jpg`]);
    expect(await readdir(root)).toEqual(expect.arrayContaining([`${id}.jpg`, `${id}.thumb.jpg`]));
  });
});
