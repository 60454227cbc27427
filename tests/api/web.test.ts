import { mkdtempSync, mkdirSync, writeFileSync } from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import request from 'supertest';
import { buildApp, type TestApp } from '../support/app';
import { freshDatabase, type TestDatabase } from '../support/db';

let db: TestDatabase;
const opened: TestApp[] = [];
beforeAll(async () => {
  db = await freshDatabase();
});
afterAll(async () => {
  for (const b of opened) await b.close();
  await db.drop();
});

function webDirWith(files: Record<string, string>): string {
  const dir = mkdtempSync(path.join(os.tmpdir(), 'qb-web-'));
  for (const [name, content] of Object.entries(files)) {
    mkdirSync(path.dirname(path.join(dir, name)), { recursive: true });
    writeFileSync(path.join(dir, name), content);
  }
  return dir;
}

const appFor = (webDir: string) => {
  const built = buildApp(db, { config: { webDir } });
  opened.push(built);
  return built.app;
};

describe('the web app', () => {
  const webDir = webDirWith({
    'index.html': '<!doctype html><title>Quenchbook</title>',
    '_expo/static/js/web/entry-abc.js': 'console.log(1)',
    '_expo/static/js/web/big-abc.js': `/* ${'x'.repeat(20_000)} */ console.log(2)`,
    'canvaskit.wasm': '\0asm',
  });

  it('serves index.html for a client-side route (SPA fallback)', async () => {
    const res = await request(appFor(webDir)).get('/burn-tests/some/deep/link');
    expect(res.status).toBe(200);
    expect(res.text).toContain('<title>Quenchbook</title>');
    expect(res.headers['cache-control']).toBe('no-cache');
  });

  it('serves hashed bundles as immutable', async () => {
    const res = await request(appFor(webDir)).get('/_expo/static/js/web/entry-abc.js');
    expect(res.status).toBe(200);
    expect(res.headers['cache-control']).toContain('immutable');
  });

  it('sends bundles gzip-compressed to browsers that accept it, byte for byte the same', async () => {
    const res = await request(appFor(webDir))
      .get('/_expo/static/js/web/big-abc.js')
      .set('Accept-Encoding', 'gzip');
    expect(res.headers['content-encoding']).toBe('gzip');
    expect(res.text).toBe(`/* ${'x'.repeat(20_000)} */ console.log(2)`);
    const plain = await request(appFor(webDir))
      .get('/_expo/static/js/web/big-abc.js')
      .set('Accept-Encoding', 'identity');
    expect(plain.headers['content-encoding']).toBeUndefined();
  });

  it('serves WebAssembly as application/wasm', async () => {
    const res = await request(appFor(webDir)).get('/canvaskit.wasm');
    expect(res.headers['content-type']).toBe('application/wasm');
  });

  it('says how to build the app when the web export is missing', async () => {
    const res = await request(appFor(webDirWith({}))).get('/recipes');
    expect(res.status).toBe(503);
    expect(res.text).toContain('npm run build:web');
  });
});

describe('the development mail viewer', () => {
  it('exists outside production', async () => {
    const res = await request(appFor(webDirWith({}))).get('/api/dev/mail');
    expect(res.status).toBe(200);
    expect(Array.isArray(res.body.messages)).toBe(true);
  });

  it('does not exist in production', async () => {
    const built = buildApp(db, { config: { env: 'production' } });
    opened.push(built);
    const api = await request(built.app).get('/api/dev/mail');
    expect(api.status).toBe(404);
    const page = await request(built.app).get('/dev/mail');
    expect(page.text).not.toContain('Captured mail');
  });
});
