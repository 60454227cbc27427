import type { Browser } from 'playwright-core';
import { sections } from '../../components/sections';
import { ensureWebBuild } from '../../scripts/web-build';
import { startTestServer } from '../support/app';
import { launchBrowser, viewports } from '../support/browser';
import { freshDatabase, type TestDatabase } from '../support/db';
import { collectPageErrors } from '../support/page-errors';
import { screenshot } from '../support/screenshots';

jest.setTimeout(240_000);

let db: TestDatabase;
let server: { url: string; close: () => Promise<void> };
let browser: Browser;

beforeAll(async () => {
  db = await freshDatabase();
  ensureWebBuild(db.config.webDir);
  server = await startTestServer(db);
  browser = await launchBrowser();
});

afterAll(async () => {
  await browser?.close();
  await server?.close();
  await db?.drop();
});

describe.each(Object.entries(viewports))('the app shell at %s size', (name, viewport) => {
  it('reaches every section from its navigation with no console errors', async () => {
    const page = await browser.newPage({ viewport });
    const errors = collectPageErrors(page);
    await page.goto(`${server.url}/`);
    await page.getByTestId('section-title').filter({ hasText: 'Today' }).waitFor();

    // Phone: tabs along the bottom edge. Wide: a bar down the left side.
    const today = await page.getByTestId('nav-today').boundingBox();
    if (name === 'phone') expect(today!.y).toBeGreaterThan(viewport.height - 100);
    else expect(today!.x + today!.width).toBeLessThan(260);

    for (const section of sections) {
      await page.getByTestId(`nav-${section.key}`).click();
      await page.getByTestId('section-title').filter({ hasText: section.title }).waitFor();
      expect(new URL(page.url()).pathname).toBe(String(section.href));
      await expect(
        page.getByTestId(`nav-${section.key}`).getAttribute('aria-current'),
      ).resolves.toBe('page');
      await screenshot(page, `shell-${name}-${section.key}`);
    }
    expect(errors).toEqual([]);
    await page.close();
  });

  it('sets body text in Source Sans 3, loaded from the app itself', async () => {
    const page = await browser.newPage({ viewport });
    await page.goto(`${server.url}/recipes`);
    const intro = page.getByTestId('section-intro');
    await intro.waitFor();
    const family = await intro.evaluate((el) => getComputedStyle(el).fontFamily);
    expect(family.split(',')[0]).toBe('"Source Sans 3"');
    const loaded = await page.evaluate(async () => {
      await document.fonts.ready;
      const faces: FontFace[] = [];
      document.fonts.forEach((f) => faces.push(f));
      return faces.some(
        (f) => f.family.replace(/"/g, '') === 'Source Sans 3' && f.status === 'loaded',
      );
    });
    expect(loaded).toBe(true);
    await page.close();
  });
});

describe('links', () => {
  it('opens a deep link straight on its section', async () => {
    const page = await browser.newPage({ viewport: viewports.phone });
    const errors = collectPageErrors(page);
    await page.goto(`${server.url}/rankings`);
    await page.getByTestId('section-title').filter({ hasText: 'Rankings' }).waitFor();
    expect(errors).toEqual([]);
    await page.close();
  });

  it('shows a plain not-found page with a way home for an unknown link', async () => {
    const page = await browser.newPage({ viewport: viewports.wide });
    await page.goto(`${server.url}/no/such/page`);
    await page.getByText('No such page').waitFor();
    await screenshot(page, 'not-found-wide');
    await page.getByTestId('not-found-home').click();
    await page.getByTestId('section-title').filter({ hasText: 'Today' }).waitFor();
    await page.close();
  });

  it('reports the server and database as up on Today', async () => {
    const page = await browser.newPage({ viewport: viewports.phone });
    await page.goto(`${server.url}/`);
    await page
      .getByTestId('server-status')
      .getByText(/Server and database are up/)
      .waitFor();
    await page.close();
  });
});
