import request from 'supertest';
import { PASSWORD, uniqueEmail } from '../support/accounts';
import { buildApp, type TestApp } from '../support/app';
import { freshDatabase, type TestDatabase } from '../support/db';

// The app as production serves it, behind its public address.
const PUBLIC = 'https://lab.quenchbook.example';
const OTHER = 'https://elsewhere.example';

let db: TestDatabase;
let built: TestApp;
beforeAll(async () => {
  db = await freshDatabase();
  built = buildApp(db, {
    config: {
      env: 'production',
      publicUrl: PUBLIC,
      auth: { ...db.config.auth, cookieSecure: true },
    },
  });
});
afterAll(async () => {
  await built?.close();
  await db?.drop();
});

function cookiesOf(res: request.Response): string[] {
  const raw = res.headers['set-cookie'] as unknown as string[] | string | undefined;
  return Array.isArray(raw) ? raw : raw ? [raw] : [];
}

/**
 * A web session: the cookies are Secure, which supertest's cookie jar keeps off plain http, so
 * each request carries them in a Cookie header as a browser on https would.
 */
async function cookieSession() {
  const res = await request(built.app)
    .post('/api/auth/sign-up')
    .send({ email: uniqueEmail(), password: PASSWORD, displayName: 'Cy', labName: 'Jute lab' });
  expect(res.status).toBe(201);
  const cookie = cookiesOf(res)
    .map((c) => c.split(';')[0])
    .join('; ');
  const as = (test: request.Test) => test.set('Cookie', cookie);
  const agent = {
    get: (url: string) => as(request(built.app).get(url)),
    post: (url: string) => as(request(built.app).post(url)),
    patch: (url: string) => as(request(built.app).patch(url)),
  };
  return { agent, res, csrf: res.body.me.csrfToken as string };
}

describe('CORS on /api', () => {
  it('answers a preflight from the public origin with credentialed CORS headers', async () => {
    const res = await request(built.app)
      .options('/api/me')
      .set('Origin', PUBLIC)
      .set('Access-Control-Request-Method', 'PATCH')
      .set('Access-Control-Request-Headers', 'content-type, x-csrf-token');
    expect(res.status).toBe(204);
    expect(res.headers['access-control-allow-origin']).toBe(PUBLIC);
    expect(res.headers['access-control-allow-credentials']).toBe('true');
    expect(res.headers['access-control-allow-methods']).toContain('PATCH');
    expect(res.headers['access-control-allow-headers']).toContain('X-CSRF-Token');
    expect(res.headers.vary).toMatch(/Origin/);
  });

  it('sends the public origin CORS headers on an ordinary answer', async () => {
    const res = await request(built.app).get('/api/health').set('Origin', PUBLIC);
    expect(res.headers['access-control-allow-origin']).toBe(PUBLIC);
  });

  it.each([
    OTHER,
    'null',
    'https://lab.quenchbook.example.evil.example',
    'http://lab.quenchbook.example',
  ])('sends no CORS header at all to the origin %s, for a read or a preflight', async (origin) => {
    const read = await request(built.app).get('/api/health').set('Origin', origin);
    const preflight = await request(built.app)
      .options('/api/me')
      .set('Origin', origin)
      .set('Access-Control-Request-Method', 'PATCH');
    for (const res of [read, preflight]) {
      expect(res.headers['access-control-allow-origin']).toBeUndefined();
      expect(res.headers['access-control-allow-credentials']).toBeUndefined();
      expect(res.headers['access-control-allow-methods']).toBeUndefined();
    }
  });
});

describe('writes sent by a browser from another site', () => {
  it('refuses a cookie-authenticated write with 403 cross_origin even with the CSRF token', async () => {
    const { agent, csrf } = await cookieSession();
    const res = await agent
      .patch('/api/me')
      .set('Origin', OTHER)
      .set('X-CSRF-Token', csrf)
      .send({ units: 'us' });
    expect(res.status).toBe(403);
    expect(res.body.error.code).toBe('cross_origin');
    expect(res.headers['access-control-allow-origin']).toBeUndefined();
    const me = await agent.get('/api/me');
    expect(me.status).toBe(200);
    expect(me.body.user.units).toBe('metric');
  });

  it.each([OTHER, 'null'])(
    'refuses a sign-in posted from the origin %s (no CSRF token protects sign-in)',
    async (origin) => {
      const res = await request(built.app)
        .post('/api/auth/sign-in')
        .set('Origin', origin)
        .send({ email: uniqueEmail(), password: PASSWORD });
      expect(res.status).toBe(403);
      expect(res.body.error.code).toBe('cross_origin');
      expect(cookiesOf(res)).toEqual([]);
    },
  );

  it('accepts a write from the public origin, from the origin it was addressed to, and with no Origin', async () => {
    const { agent, csrf } = await cookieSession();
    const fromPublic = await agent
      .patch('/api/me')
      .set('Origin', PUBLIC)
      .set('X-CSRF-Token', csrf)
      .send({ units: 'us' });
    expect(fromPublic.status).toBe(200);
    // `npm run dev` forwards the browser's Host and Origin unchanged from the web dev server.
    const sameHost = await agent
      .patch('/api/me')
      .set('Host', 'localhost:8081')
      .set('Origin', 'http://localhost:8081')
      .set('X-CSRF-Token', csrf)
      .send({ units: 'metric' });
    expect(sameHost.status).toBe(200);
    // API clients outside a browser send no Origin.
    const noOrigin = await agent.patch('/api/me').set('X-CSRF-Token', csrf).send({ units: 'us' });
    expect(noOrigin.status).toBe(200);
  });
});

describe('session cookies in production', () => {
  it('sets both cookies HttpOnly, Secure, SameSite=Lax, host-only, each on its narrowest path', async () => {
    const { res } = await cookieSession();
    const cookies = cookiesOf(res);
    expect(cookies.map((c) => c.split('=')[0]).sort()).toEqual(['qb_access', 'qb_refresh']);
    const access = cookies.find((c) => c.startsWith('qb_access='))!;
    const refresh = cookies.find((c) => c.startsWith('qb_refresh='))!;
    for (const cookie of [access, refresh]) {
      expect(cookie).toMatch(/; HttpOnly/);
      expect(cookie).toMatch(/; Secure/);
      expect(cookie).toMatch(/; SameSite=Lax/);
      expect(cookie).not.toMatch(/Domain=/i);
    }
    expect(access).toMatch(/; Path=\/api;/);
    expect(access).toMatch(/Max-Age=900;/);
    expect(refresh).toMatch(/; Path=\/api\/auth;/);
    expect(refresh).toMatch(/Max-Age=2592000;/);
    // The CSRF token travels in the body only, never in a cookie a script could be tricked into.
    expect(res.body.me.csrfToken).toEqual(expect.any(String));
  });

  it('clears both cookies on sign-out with the same path and flags', async () => {
    const { agent, csrf } = await cookieSession();
    const res = await agent.post('/api/auth/sign-out').set('X-CSRF-Token', csrf);
    expect(res.status).toBe(204);
    const cookies = cookiesOf(res);
    expect(cookies).toHaveLength(2);
    for (const cookie of cookies) {
      expect(cookie).toMatch(/Expires=Thu, 01 Jan 1970/);
      expect(cookie).toMatch(/; HttpOnly/);
      expect(cookie).toMatch(/; Secure/);
    }
    expect(cookies.find((c) => c.startsWith('qb_access='))).toMatch(/Path=\/api;/);
    expect(cookies.find((c) => c.startsWith('qb_refresh='))).toMatch(/Path=\/api\/auth;/);
  });
});
