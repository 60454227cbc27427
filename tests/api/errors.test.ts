import request from 'supertest';
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

describe('security headers', () => {
  it('sends a Content-Security-Policy and hides the framework', async () => {
    const res = await request(app()).get('/api/health');
    expect(res.headers['content-security-policy']).toContain("default-src 'self'");
    expect(res.headers['x-powered-by']).toBeUndefined();
  });
});
