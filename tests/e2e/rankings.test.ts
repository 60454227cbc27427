import Papa from 'papaparse';
import sharp from 'sharp';
import { DEMO_PASSWORD, demoPeople } from '../../fixtures/demo';
import { browserTestEnv } from '../support/browser-env';
import { viewports } from '../support/browser';
import { collectPageErrors } from '../support/page-errors';
import { screenshot } from '../support/screenshots';
import { signInThroughUi } from '../support/ui';

jest.setTimeout(240_000);

const env = browserTestEnv({ demo: true });

const viewer = demoPeople.find((p) => p.role === 'viewer')!;

describe.each(Object.entries(viewports))('rankings for a viewer at %s size', (name, viewport) => {
  it('shows the treatments in rank order with intervals, judges against a preset, and the CSV parses back', async () => {
    const context = await env.browser.newContext({ viewport, acceptDownloads: true });
    const page = await context.newPage();
    const errors = collectPageErrors(page);
    await signInThroughUi(page, env.server.url, viewer.email, DEMO_PASSWORD);
    await page.getByTestId('section-title').filter({ hasText: 'Today' }).waitFor();
    await page.getByTestId('nav-rankings').click();
    await page.getByTestId('leader-statement').waitFor();
    const first = name === 'phone' ? page.getByTestId('treatment-1') : page.getByTestId('row-1');
    await expect(first.textContent()).resolves.toContain('Muslin drape soak');
    // The chart is drawn: its pixels are not all one colour.
    const chart = page.getByTestId('ranking-chart');
    await chart.locator('canvas').waitFor({ timeout: 30_000 });
    await page.waitForTimeout(500);
    const stats = await sharp(await chart.screenshot()).stats();
    expect(Math.max(...stats.channels.map((c) => c.stdev))).toBeGreaterThan(10);
    await page.getByTestId('profile').getByText('NFPA 705', { exact: false }).first().click();
    await page.getByTestId('profile-caution').waitFor();
    await screenshot(page, `rankings-${name}`);

    const download = page.waitForEvent('download');
    await page.getByTestId('csv-ranking').click();
    const file = await (await download).path();
    const { readFileSync } = await import('node:fs');
    const rows = Papa.parse<Record<string, string>>(readFileSync(file!, 'utf8'), {
      header: true,
      skipEmptyLines: true,
    }).data;
    expect(rows[0]!.recipe).toBe('Muslin drape soak');
    // Signed-off demo drape pairs: 52, 61, 48, 57 mm → mean 54.5 (arithmetic)
    expect(Number(rows[0]!.treated_char_mean_mm)).toBe(54.5);
    // Filters: the demo burned with a butane lighter, so "Match" leaves nothing.
    await page.getByTestId('igniter').getByText('Match', { exact: true }).click();
    await page.getByText('No signed-off burn tests match.').waitFor();
    await page.getByTestId('igniter').getByText('Any igniter').click();
    await page.getByTestId('leader-statement').waitFor();

    // The printable report carries the criteria and the cautions.
    await page.getByTestId('open-report').click();
    await page.getByTestId('ranking-report').waitFor();
    await page
      .getByTestId('report-cautions')
      .getByText(/Authority Having Jurisdiction/)
      .waitFor();
    await expect(page.getByTestId('report-treatment-1').textContent()).resolves.toContain(
      'Muslin drape soak',
    );
    await screenshot(page, `ranking-report-${name}`);
    expect(errors).toEqual([]);
    await context.close();
  });
});

describe('CanvasKit', () => {
  it('is loaded on the rankings screen only, never with the timer', async () => {
    const context = await env.browser.newContext({ viewport: viewports.phone });
    const page = await context.newPage();
    const requested: string[] = [];
    page.on('request', (r) => requested.push(r.url()));
    await signInThroughUi(
      page,
      env.server.url,
      demoPeople.find((p) => p.role === 'technician')!.email,
      DEMO_PASSWORD,
    );
    await page.getByTestId('section-title').filter({ hasText: 'Today' }).waitFor();
    await page.getByTestId('nav-burn-tests').click();
    await page.locator('[data-testid^="session-"]').first().click();
    await page.locator('[data-testid^="timer-"]').first().click();
    await page.getByTestId('lane-treated').waitFor();
    await page.waitForTimeout(1000);
    expect(requested.filter((u) => u.includes('canvaskit'))).toEqual([]);
    await page.getByTestId('nav-rankings').click();
    await page.getByTestId('ranking-chart').locator('canvas').waitFor({ timeout: 30_000 });
    expect(requested.filter((u) => u.includes('canvaskit')).length).toBeGreaterThan(0);
    await context.close();
  });
});
