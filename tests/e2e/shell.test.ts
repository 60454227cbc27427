import { sectionPath, sections } from '../../components/sections';
import { browserTestEnv } from '../support/browser-env';
import { viewports } from '../support/browser';
import { collectPageErrors } from '../support/page-errors';
import { screenshot } from '../support/screenshots';
import { seedLab, signInThroughUi } from '../support/ui';

jest.setTimeout(240_000);

const env = browserTestEnv();

let seeded: Awaited<ReturnType<typeof seedLab>>;

beforeAll(async () => {
  seeded = await seedLab(env.server.deps, 'Shell lab');
});

describe.each(Object.entries(viewports))('the app shell at %s size', (name, viewport) => {
  it('reaches every section from its navigation with no console errors', async () => {
    const context = await env.browser.newContext({ viewport });
    const page = await context.newPage();
    const errors = collectPageErrors(page);
    await signInThroughUi(page, env.server.url, seeded.people.technician.email);
    await page.getByTestId('section-title').filter({ hasText: 'Today' }).waitFor();

    // Phone: tabs along the bottom edge. Wide: a bar down the left side.
    const today = await page.getByTestId('nav-today').boundingBox();
    if (name === 'phone') expect(today!.y).toBeGreaterThan(viewport.height - 100);
    else expect(today!.x + today!.width).toBeLessThan(260);

    for (const section of sections) {
      await page.getByTestId(`nav-${section.key}`).click();
      await page.getByTestId('section-title').filter({ hasText: section.title }).waitFor();
      expect(new URL(page.url()).pathname).toBe(sectionPath(seeded.labId, section));
      await expect(
        page.getByTestId(`nav-${section.key}`).getAttribute('aria-current'),
      ).resolves.toBe('page');
      await screenshot(page, `shell-${name}-${section.key}`);
    }
    await page.getByTestId('nav-account').click();
    await page.getByTestId('section-title').filter({ hasText: 'Account' }).waitFor();
    await screenshot(page, `shell-${name}-account`);
    expect(errors).toEqual([]);
    await context.close();
  });

  it('sets body text in Source Sans 3, loaded from the app itself', async () => {
    const page = await env.browser.newPage({ viewport });
    await page.goto(`${env.server.url}/sign-up`);
    const intro = page.getByTestId('screen-intro');
    await intro.waitFor();
    const family = await intro.evaluate((el) => getComputedStyle(el).fontFamily);
    expect(family.split(',')[0]).toBe('"Source Sans 3"');
    const label = await page
      .getByText('Lab name', { exact: true })
      .evaluate((el) => getComputedStyle(el).fontFamily);
    expect(label.split(',')[0]).toBe('"Source Sans 3 SemiBold"');
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
  it('sends a signed-out deep link to sign-in, then back to the same page', async () => {
    const context = await env.browser.newContext({ viewport: viewports.phone });
    const page = await context.newPage();
    const errors = collectPageErrors(page);
    const deep = `/labs/${seeded.labId}/rankings`;
    await page.goto(`${env.server.url}${deep}`);
    await page.getByTestId('screen-title').filter({ hasText: 'Sign in' }).waitFor();
    expect(new URL(page.url()).searchParams.get('next')).toBe(deep);
    await page.getByTestId('field-email').fill(seeded.people.viewer.email);
    await page.getByTestId('field-password').fill('correct horse battery');
    await page.getByTestId('sign-in-submit').click();
    await page.getByTestId('section-title').filter({ hasText: 'Rankings' }).waitFor();
    expect(new URL(page.url()).pathname).toBe(deep);
    expect(errors).toEqual([]);
    await context.close();
  });

  it('shows a plain not-found page with a way home for an unknown link', async () => {
    const page = await env.browser.newPage({ viewport: viewports.wide });
    await page.goto(`${env.server.url}/no/such/page`);
    await page.getByText('No such page').waitFor();
    await screenshot(page, 'not-found-wide');
    await page.getByTestId('not-found-home').click();
    await page.getByTestId('screen-title').filter({ hasText: 'Sign in' }).waitFor();
    await page.close();
  });

  it('reports the server and database as up on Today', async () => {
    const context = await env.browser.newContext({ viewport: viewports.phone });
    const page = await context.newPage();
    await signInThroughUi(page, env.server.url, seeded.people.reviewer.email);
    await page
      .getByTestId('server-status')
      .getByText(/Server and database are up/)
      .waitFor();
    await context.close();
  });
});
