import type { Browser } from 'playwright-core';
import { loadDemoData } from '../../fixtures/demo';
import { ensureWebBuild } from '../../scripts/web-build';
import { startTestServer } from './app';
import { launchBrowser } from './browser';
import { freshDatabase, type TestDatabase } from './db';

export type BrowserEnv = {
  db: TestDatabase;
  server: Awaited<ReturnType<typeof startTestServer>>;
  browser: Browser;
};

/**
 * A browser test's world: a fresh database, the exported web app served by a real server (with
 * the demo data when asked), and Chromium; all closed after the file. A file's own beforeAll,
 * registered after this call, runs after it and may use every part.
 */
export function browserTestEnv(opts: { demo?: boolean } = {}): BrowserEnv {
  const env = {} as BrowserEnv;
  beforeAll(async () => {
    env.db = await freshDatabase();
    ensureWebBuild(env.db.config.webDir);
    env.server = await startTestServer(env.db);
    if (opts.demo) await loadDemoData(env.server.deps);
    env.browser = await launchBrowser();
  });
  afterAll(async () => {
    await env.browser?.close();
    await env.server?.close();
    await env.db?.drop();
  });
  return env;
}
