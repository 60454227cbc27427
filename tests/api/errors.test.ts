import request from 'supertest';
import { createApp } from '../../server/app';
import { createSequelize } from '../../server/db';
import { errorBodySchema } from '../../shared/schemas/error';
import { buildApp, type TestApp } from '../support/app';
import { freshDatabase, type TestDatabase } from '../support/db';

let db: TestDatabase;
let built: TestApp;
let logged: unknown[] = [];
beforeAll(async () => {
  db = await freshDatabase();
  built = buildApp(db, { logError: (e) => logged.push(e) });
});
afterAll(async () => {
  await built.close();
  await db.drop();
});
beforeEach(() => {
  logged = [];
});

const app = () => built.app;

describe('unknown API routes', () => {
  it('answers a JSON 404 with code not_found', async () => {
    const res = await request(app()).get('/api/no-such-thing');
    expect(res.status).toBe(404);
    expect(res.headers['content-type']).toMatch(/application\/json/);
    const body = errorBodySchema.parse(res.body);
    expect(body.error.code).toBe('not_found');
    expect(body.error.message).toContain('/api/no-such-thing');
  });

  it('answers a JSON 404 for a write to an unknown route', async () => {
    const res = await request(app()).post('/api/no-such-write').send({ name: 'x' });
    expect(res.status).toBe(404);
    expect(errorBodySchema.parse(res.body).error.code).toBe('not_found');
  });
});

describe('request bodies', () => {
  it('answers a JSON 400 with code malformed_json for a body that is not JSON', async () => {
    const res = await request(app())
      .post('/api/health')
      .set('Content-Type', 'application/json')
      .send('{"name": ');
    expect(res.status).toBe(400);
    expect(errorBodySchema.parse(res.body).error.code).toBe('malformed_json');
    expect(logged).toEqual([]);
  });

  it('answers 413 with code payload_too_large above the 1 MB limit', async () => {
    const res = await request(app())
      .post('/api/health')
      .set('Content-Type', 'application/json')
      .send(JSON.stringify({ notes: 'x'.repeat(1_100_000) }));
    expect(res.status).toBe(413);
    expect(errorBodySchema.parse(res.body).error.code).toBe('payload_too_large');
  });
});

// Found by the hostile-input tests: each of these used to be a 500 or to reach a handler as `{}`.
describe('requests that cannot be read', () => {
  it('answers 400 naming the path for a broken %-escape in a path parameter', async () => {
    const res = await request(app()).get('/api/invitations/%E0%A4%A');
    expect(res.status).toBe(400);
    expect(res.body.error.fields).toEqual([
      { path: 'path', message: 'Contains a broken %-escape' },
    ]);
    expect(logged).toEqual([]);
  });

  it('answers 400 for a body that claims to be gzip but is not', async () => {
    const res = await request(app())
      .post('/api/auth/sign-in')
      .set('Content-Type', 'application/json')
      .set('Content-Encoding', 'gzip')
      .send('{"email":"a@example.test","password":"x"}');
    expect(res.status).toBe(400);
    expect(res.body.error.fields).toHaveLength(1);
    expect(logged).toEqual([]);
  });

  it('answers 415 for a write whose body is text, a form or XML', async () => {
    for (const type of ['text/plain', 'application/x-www-form-urlencoded', 'application/xml']) {
      const res = await request(app())
        .post('/api/auth/sign-in')
        .set('Content-Type', type)
        .send('email=a@example.test');
      expect(res.status).toBe(415);
      expect(errorBodySchema.parse(res.body).error.code).toBe('unsupported_media_type');
    }
  });

  it('answers 415 for a body without a Content-Type, but takes an empty one', async () => {
    const withBody = await request(app()).post('/api/auth/refresh').send(Buffer.from('{"a":1}'));
    expect(withBody.status).toBe(415);
    const empty = await request(app()).post('/api/auth/refresh');
    expect(empty.status).toBe(401);
  });

  it('names the body as the field of a 400 for malformed JSON', async () => {
    const res = await request(app())
      .post('/api/auth/sign-in')
      .set('Content-Type', 'application/json')
      .send('{"email": ');
    expect(res.body.error).toMatchObject({
      code: 'malformed_json',
      fields: [{ path: '', message: 'Not valid JSON' }],
    });
  });
});

describe('a database that does not answer', () => {
  it('answers 503 unavailable with Retry-After, not a 500', async () => {
    // A loopback port where no server listens: what the app sees while PostgreSQL is stopped.
    const down = createSequelize('postgres://quenchbook:x@127.0.0.1:1/none');
    try {
      const res = await request(createApp({ ...built.deps, sequelize: down, logError: () => {} }))
        .post('/api/auth/sign-in')
        .send({ email: 'someone@example.test', password: 'long enough password' });
      expect(res.status).toBe(503);
      expect(res.body.error.code).toBe('unavailable');
      expect(Number(res.headers['retry-after'])).toBeGreaterThan(0);
    } finally {
      await down.close();
    }
  });
});

describe('security headers', () => {
  it('sends a Content-Security-Policy and hides the framework', async () => {
    const res = await request(app()).get('/api/health');
    expect(res.headers['content-security-policy']).toContain("default-src 'self'");
    expect(res.headers['x-powered-by']).toBeUndefined();
  });
});
