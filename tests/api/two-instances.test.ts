import { randomBytes, randomUUID } from 'node:crypto';
import { mkdtemp, readdir, rm } from 'node:fs/promises';
import { tmpdir } from 'node:os';
import path from 'node:path';
import sharp from 'sharp';
import request from 'supertest';
import { PASSWORD, uniqueEmail } from '../support/accounts';
import { sessionWithPair } from '../support/burn';
import { freshDatabase, type TestDatabase } from '../support/db';
import { startS3Fake, type S3Fake } from '../support/s3';
import { startServerProcess, type ServerProcess } from '../support/server-process';

// Two server processes, as two instances behind a load balancer: one database, one bucket, one
// secret, and each its own (unshared) data folder.
jest.setTimeout(120_000);

let db: TestDatabase;
let s3: S3Fake;
let dataDirs: string[] = [];
let a: ServerProcess;
let b: ServerProcess;

beforeAll(async () => {
  db = await freshDatabase();
  s3 = await startS3Fake();
  dataDirs = [
    await mkdtemp(path.join(tmpdir(), 'qb-instance-a-')),
    await mkdtemp(path.join(tmpdir(), 'qb-instance-b-')),
  ];
  const shared = {
    NODE_ENV: 'test',
    DATABASE_URL: db.url,
    QB_PASSWORD_COST: 'test',
    QB_JWT_SECRET: randomBytes(32).toString('base64url'),
    QB_RATE_LIMIT_MAX: '3',
    QB_S3_BUCKET: s3.config.bucket,
    QB_S3_ENDPOINT: s3.config.endpoint!,
    QB_S3_ACCESS_KEY_ID: s3.config.accessKeyId,
    QB_S3_SECRET_ACCESS_KEY: s3.config.secretAccessKey,
  };
  const start = (dataDir: string) => startServerProcess({ ...shared, QB_DATA_DIR: dataDir });
  [a, b] = await Promise.all([start(dataDirs[0]!), start(dataDirs[1]!)]);
});

afterAll(async () => {
  await a?.stop();
  await b?.stop();
  await s3?.close();
  await db?.drop();
  for (const dir of dataDirs) await rm(dir, { recursive: true, force: true });
});

function cookieHeader(res: request.Response): string {
  const raw = res.headers['set-cookie'] as unknown as string[];
  return raw.map((c) => c.split(';')[0]).join('; ');
}

async function signUpThrough(server: ServerProcess) {
  const email = uniqueEmail('instances');
  const res = await request(server.url)
    .post('/api/auth/sign-up')
    .send({ email, password: PASSWORD, displayName: 'Ivo', labName: 'Two-instance lab' });
  expect(res.status).toBe(201);
  return {
    email,
    cookie: cookieHeader(res),
    csrf: res.body.me.csrfToken as string,
    labId: res.body.me.labs[0].id as string,
  };
}

describe('two server instances on one database and one bucket', () => {
  it('serve a web session made through A from B, CSRF token included', async () => {
    const person = await signUpThrough(a);
    const me = await request(b.url).get('/api/me').set('Cookie', person.cookie);
    expect(me.status).toBe(200);
    expect(me.body.user.email).toBe(person.email);
    const write = await request(b.url)
      .patch('/api/me')
      .set('Cookie', person.cookie)
      .set('X-CSRF-Token', person.csrf)
      .send({ units: 'us' });
    expect(write.status).toBe(200);
  });

  it('accept on A the tokens issued by B, and refuse on A a refresh token B has rotated', async () => {
    const person = await signUpThrough(a);
    const signIn = await request(b.url)
      .post('/api/auth/sign-in')
      .send({ email: person.email, password: PASSWORD, tokenDelivery: 'body' });
    expect(signIn.status).toBe(200);
    const onA = await request(a.url)
      .get('/api/me')
      .set('Authorization', `Bearer ${signIn.body.accessToken}`);
    expect(onA.status).toBe(200);
    const rotated = await request(b.url)
      .post('/api/auth/refresh')
      .send({ refreshToken: signIn.body.refreshToken, tokenDelivery: 'body' });
    expect(rotated.status).toBe(200);
    const replayed = await request(a.url)
      .post('/api/auth/refresh')
      .send({ refreshToken: signIn.body.refreshToken, tokenDelivery: 'body' });
    expect(replayed.status).toBe(401);
  });

  it('serve from B a photo uploaded through A, kept in the bucket and on neither machine', async () => {
    const person = await signUpThrough(a);
    const { pair, treatedId } = await sessionWithPair(person.labId, person.email);
    const photoId = randomUUID();
    const upload = await request(a.url)
      .post(`/api/labs/${person.labId}/pairs/${pair.id}/photos`)
      .set('Cookie', person.cookie)
      .set('X-CSRF-Token', person.csrf)
      .field('clientId', photoId)
      .field('specimenId', treatedId)
      .field('stage', 'after')
      .attach(
        'photo',
        await sharp({ create: { width: 90, height: 60, channels: 3, background: '#aa5522' } })
          .jpeg()
          .toBuffer(),
        { filename: 'after.jpg', contentType: 'image/jpeg' },
      );
    expect(upload.status).toBe(201);
    for (const suffix of ['', '/thumbnail']) {
      const served = await request(b.url)
        .get(`/api/labs/${person.labId}/photos/${photoId}${suffix}`)
        .set('Cookie', person.cookie)
        .buffer(true);
      expect(served.status).toBe(200);
      expect(served.headers['content-type']).toBe('image/jpeg');
      expect((await sharp(served.body as Buffer).metadata()).format).toBe('jpeg');
    }
    const objects = await readdir(path.join(s3.dir, s3.config.bucket, 'photos'));
    expect(objects.some((name) => name.startsWith(photoId))).toBe(true);
    for (const dir of dataDirs) expect(await readdir(dir)).not.toContain('photos');
  });

  it('count sign-in tries made on A against the limit on B', async () => {
    const tryOn = (server: ServerProcess) =>
      request(server.url)
        .post('/api/auth/sign-in')
        // Both processes trust X-Forwarded-For from loopback: one address for all four tries.
        .set('X-Forwarded-For', '203.0.113.77')
        .send({ email: uniqueEmail(), password: 'wrong password' });
    for (let i = 0; i < 3; i++) expect((await tryOn(a)).status).toBe(401);
    const fourth = await tryOn(b);
    expect(fourth.status).toBe(429);
    expect(fourth.body.error.code).toBe('rate_limited');
  });
});
