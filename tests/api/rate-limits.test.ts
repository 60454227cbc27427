import type { Options } from 'express-rate-limit';
import request from 'supertest';
import { PostgresRateLimitStore } from '../../server/middleware/rate-limit-store';
import { RateLimitModel } from '../../server/models';
import { uniqueEmail } from '../support/accounts';
import { buildApp, type TestApp } from '../support/app';
import { freshDatabase, type TestDatabase } from '../support/db';

let db: TestDatabase;
const opened: TestApp[] = [];
beforeAll(async () => {
  db = await freshDatabase();
});
afterAll(async () => {
  for (const b of opened) await b.close();
  await db?.drop();
});

function limitedApp(limit: number, windowMs = 60_000): TestApp {
  const built = buildApp(db, {
    config: { auth: { ...db.config.auth, rateLimitMax: limit, rateLimitWindowMs: windowMs } },
  });
  opened.push(built);
  return built;
}

let address = 0;
/** A client address of its own for each test, so tests never share a count. */
const nextAddress = () => `198.51.100.${++address}`;

const signInFrom = (built: TestApp, ip: string, email = uniqueEmail()) =>
  request(built.app)
    .post('/api/auth/sign-in')
    .set('X-Forwarded-For', ip)
    .send({ email, password: 'wrong password' });

function storeWithWindow(windowMs: number): PostgresRateLimitStore {
  const store = new PostgresRateLimitStore();
  store.init({ windowMs } as Options);
  return store;
}

describe('POST /api/auth/sign-in rate limit', () => {
  it('counts tries made through one app instance in another (the count is in the database)', async () => {
    const a = limitedApp(3);
    const b = limitedApp(3);
    const ip = nextAddress();
    expect((await signInFrom(a, ip)).status).toBe(401);
    expect((await signInFrom(b, ip)).status).toBe(401);
    expect((await signInFrom(a, ip)).status).toBe(401);
    const fourth = await signInFrom(b, ip);
    expect(fourth.status).toBe(429);
    expect(fourth.body.error.code).toBe('rate_limited');
    expect(Number(fourth.headers['retry-after'])).toBeGreaterThan(0);
    // Another address is counted on its own.
    expect((await signInFrom(b, nextAddress())).status).toBe(401);
  });

  it('lets tries through again once the window has ended', async () => {
    const app = limitedApp(1, 1000);
    const ip = nextAddress();
    expect((await signInFrom(app, ip)).status).toBe(401);
    expect((await signInFrom(app, ip)).status).toBe(429);
    await new Promise((resolve) => setTimeout(resolve, 1100));
    expect((await signInFrom(app, ip)).status).toBe(401);
  });
});

describe('PostgresRateLimitStore', () => {
  it('counts concurrent hits on one key exactly once each (one atomic upsert)', async () => {
    const store = storeWithWindow(60_000);
    const key = `test:${nextAddress()}`;
    const results = await Promise.all(Array.from({ length: 25 }, () => store.increment(key)));
    expect(results.map((r) => r.totalHits).sort((x, y) => x - y)).toEqual(
      Array.from({ length: 25 }, (_, i) => i + 1),
    );
    // Every hit in one window reports the same reset time.
    expect(new Set(results.map((r) => r.resetTime?.getTime())).size).toBe(1);
    expect((await store.get(key))?.totalHits).toBe(25);
  });

  it('decrements, resets a key, and knows nothing of a key it never saw', async () => {
    const store = storeWithWindow(60_000);
    const key = `test:${nextAddress()}`;
    expect(await store.get(key)).toBeUndefined();
    await store.increment(key);
    await store.increment(key);
    await store.decrement(key);
    expect((await store.get(key))?.totalHits).toBe(1);
    await store.resetKey(key);
    expect(await store.get(key)).toBeUndefined();
  });

  it('starts a new window at 1 after the old one ended, and sweeps ended windows out', async () => {
    const store = storeWithWindow(1000);
    const ended = `test:${nextAddress()}`;
    const key = `test:${nextAddress()}`;
    await store.increment(ended);
    await store.increment(key);
    expect((await store.increment(key)).totalHits).toBe(2);
    await new Promise((resolve) => setTimeout(resolve, 1100));
    expect(await store.get(key)).toBeUndefined();
    const again = await store.increment(key);
    expect(again.totalHits).toBe(1);
    expect(again.resetTime!.getTime()).toBeGreaterThan(Date.now());
    expect(await RateLimitModel.findByPk(ended)).toBeNull();
  });
});
