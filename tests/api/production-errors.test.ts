import { randomUUID } from 'node:crypto';
import sharp from 'sharp';
import request from 'supertest';
import { errorBodySchema } from '../../shared/schemas/error';
import type { ErrorContext } from '../../server/middleware/error';
import type { PhotoStore } from '../../server/photos/store';
import { bearer, memberWithRole, signUpPerson } from '../support/accounts';
import { buildApp, type TestApp } from '../support/app';
import { sessionWithPair } from '../support/burn';
import { freshDatabase, type TestDatabase } from '../support/db';

// createApp as production runs it; a photo store whose disk "fails" with a message full of
// internals, as a real EACCES would.
const brokenStore: PhotoStore = {
  put: async () => {
    throw new Error("EACCES: permission denied, open '/srv/quenchbook/photos/x.jpg'");
  },
  open: async () => undefined,
  remove: async () => undefined,
};

let db: TestDatabase;
let built: TestApp;
const logged: { err: unknown; context: ErrorContext }[] = [];
beforeAll(async () => {
  db = await freshDatabase();
  built = buildApp(db, {
    config: { env: 'production', auth: { ...db.config.auth, cookieSecure: true } },
    photoStore: brokenStore,
    logError: (err, context) => logged.push({ err, context }),
  });
});
afterAll(async () => {
  await built?.close();
  await db?.drop();
});
beforeEach(() => {
  logged.length = 0;
});

const uuid = /^[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}$/;
// Anything that would tell an outsider about our insides.
const internals = [
  /at .+\(/, // a stack frame
  /\.(ts|js):\d+/,
  /node_modules/,
  /\/srv\//,
  /EACCES/,
  /SELECT|INSERT|relation|column|sequelize|postgres/i,
];

/** The production body: the stable code, our own sentence and the request id, nothing else. */
function expectBareInternalError(res: request.Response) {
  expect(res.status).toBe(500);
  const body = errorBodySchema.parse(res.body);
  expect(Object.keys(body.error).sort()).toEqual(['code', 'message', 'requestId']);
  expect(body.error.code).toBe('internal');
  expect(body.error.message).toBe('Something went wrong on our side. Please try again.');
  expect(body.error.requestId).toMatch(uuid);
  expect(res.headers['x-request-id']).toBe(body.error.requestId);
  for (const pattern of internals) expect(res.text).not.toMatch(pattern);
  return body.error.requestId!;
}

describe('unexpected errors in production', () => {
  it('answers 500 with code internal and a request id only when the photo store fails, and logs the details under that id', async () => {
    const lead = await signUpPerson(built);
    const tech = await memberWithRole(built, lead.labId, 'technician');
    const { pair, treatedId } = await sessionWithPair(lead.labId, tech.email);
    const photo = await sharp({
      create: { width: 8, height: 8, channels: 3, background: '#000000' },
    })
      .jpeg()
      .toBuffer();
    const res = await request(built.app)
      .post(`/api/labs/${lead.labId}/pairs/${pair.id}/photos`)
      .set(bearer(tech.token))
      .field('clientId', randomUUID())
      .field('specimenId', treatedId)
      .field('stage', 'after')
      .attach('photo', photo, { filename: 'p.jpg', contentType: 'image/jpeg' });
    const requestId = expectBareInternalError(res);
    expect(logged).toHaveLength(1);
    expect(String(logged[0]!.err)).toContain('EACCES');
    expect(logged[0]!.context).toEqual({
      requestId,
      method: 'POST',
      path: `/api/labs/${lead.labId}/pairs/${pair.id}/photos`,
    });
  });

  it('answers 500 with no SQL, table names or stack when the database fails', async () => {
    const lead = await signUpPerson(built);
    // This file's own throwaway database: the next query on the table fails inside PostgreSQL.
    await db.sequelize.query('DROP TABLE criteria_profiles CASCADE');
    const res = await request(built.app)
      .get(`/api/labs/${lead.labId}/criteria-profiles`)
      .set(bearer(lead.token));
    const requestId = expectBareInternalError(res);
    expect(logged).toHaveLength(1);
    expect(String(logged[0]!.err)).toMatch(/criteria_profiles/);
    expect(logged[0]!.context.requestId).toBe(requestId);
  });
});

describe('expected errors in production', () => {
  it('gives each answer its own request id, also on a 404', async () => {
    const a = await request(built.app).get('/api/no-such-route');
    const b = await request(built.app).get('/api/no-such-route');
    expect(a.status).toBe(404);
    expect(a.body.error.requestId).toMatch(uuid);
    expect(a.body.error.requestId).not.toBe(b.body.error.requestId);
    expect(logged).toEqual([]);
  });

  it('answers 400, not 500, for a path with a broken %-escape', async () => {
    const res = await request(built.app).get('/assets/%E0%A4%A.png');
    expect(res.status).toBe(400);
    expect(res.body.error.code).toBe('invalid_request');
    expect(logged).toEqual([]);
  });
});
