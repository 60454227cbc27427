import type { Locator, Page } from 'playwright-core';
import sharp from 'sharp';
import { sampleStandardDeviation } from 'simple-statistics';
import { DEMO_LAB_NAME, DEMO_PASSWORD, demoPeople } from '../../fixtures/demo';
import { LabModel, UserModel } from '../../server/models';
import { pairsForPower } from '../../shared/stats';
import { browserTestEnv } from '../support/browser-env';
import { viewports } from '../support/browser';
import { collectPageErrors } from '../support/page-errors';
import { screenshot } from '../support/screenshots';
import { signInThroughUi } from '../support/ui';
import { burnTreatment } from '../support/treatment';

jest.setTimeout(240_000);

const env = browserTestEnv({ demo: true });

let odd: { key: string; labId: string };

// A substrate with characters that mean something in a URL.
const ODD_SUBSTRATE = 'Linen / jute 50% #2?';

beforeAll(async () => {
  const lab = await LabModel.findOne({ where: { name: DEMO_LAB_NAME } });
  const technician = demoPeople.find((p) => p.role === 'technician')!;
  const user = await UserModel.findOne({ where: { email: technician.email } });
  // Long treated char lengths, so it ranks below the demo's leader.
  const burned = await burnTreatment(lab!.id, user!.id, {
    substrate: ODD_SUBSTRATE,
    pairs: [
      { controlMm: 300, treatedMm: 240, treatedAfterflameS: 9 },
      { controlMm: 290, treatedMm: 250, treatedAfterflameS: 11 },
      { controlMm: 300, treatedMm: 230, treatedAfterflameS: 8 },
    ],
  });
  odd = { key: burned.key, labId: lab!.id };
});

const viewer = demoPeople.find((p) => p.role === 'viewer')!;

// Signed-off demo pairs of the drape soak (fixtures/demo-burns.ts), control − treated:
// 300 − 52, 300 − 61, 285 − 48, 300 − 57 (the fifth pair waits for review).
const drapeDifferences = [248, 239, 237, 243];

/** The chart is drawn: its pixels are not all one colour. */
async function expectDrawn(chart: Locator, page: Page) {
  await chart.locator('canvas').waitFor({ timeout: 30_000 });
  await page.waitForTimeout(500);
  const stats = await sharp(await chart.screenshot()).stats();
  expect(Math.max(...stats.channels.map((c) => c.stdev))).toBeGreaterThan(10);
}

describe.each(Object.entries(viewports))(
  'treatment detail for a viewer at %s size',
  (name, viewport) => {
    it('opens from the rankings with the chosen criteria, draws both charts and sizes the next run', async () => {
      const context = await env.browser.newContext({ viewport });
      const page = await context.newPage();
      const errors = collectPageErrors(page);
      await signInThroughUi(page, env.server.url, viewer.email, DEMO_PASSWORD);
      await page.getByTestId('section-title').filter({ hasText: 'Today' }).waitFor();
      await page.getByTestId('nav-rankings').click();
      await page.getByTestId('leader-statement').waitFor();
      await page.getByTestId('profile').getByText('NFPA 705', { exact: false }).first().click();
      await page.getByTestId('profile-caution').waitFor();
      await page.getByTestId('open-treatment-1').scrollIntoViewIfNeeded();
      await screenshot(page, `rankings-links-${name}`);
      await page.getByTestId('open-treatment-1').click();

      await page.getByTestId('section-title').filter({ hasText: 'Muslin drape soak' }).waitFor();
      expect(new URL(page.url()).searchParams.get('profile')).toMatch(/^preset:nfpa-705/);
      await expect(page.getByTestId('verdict').textContent()).resolves.toMatch(/NFPA 705/);
      await expect(page.getByTestId('treatment-subtitle').textContent()).resolves.toContain(
        'rank 1',
      );
      // Mean of the differences above: 967 / 4 = 241.75 (arithmetic), shown to 0.1 mm.
      await expect(page.getByTestId('fig-difference').textContent()).resolves.toContain(
        'mean 241.8 mm',
      );

      await screenshot(page, `treatment-detail-${name}`);
      await expectDrawn(page.getByTestId('pair-lines-chart'), page);
      await expectDrawn(page.getByTestId('difference-chart'), page);
      await expect(
        page.getByTestId('pair-lines-figure').getAttribute('aria-label'),
      ).resolves.toMatch(/^Char length of 4 pairs/);
      await expect(
        page.getByTestId('difference-figure').getAttribute('aria-label'),
      ).resolves.toContain('Mean 241.8 mm, 95 % CI');

      const field = page.getByTestId('reduction-to-detect');
      await field.fill('5');
      // The pairs a paired t-test needs, from the SD of the demo differences above.
      const needed = pairsForPower({ sdDiff: sampleStandardDeviation(drapeDifferences), delta: 5 });
      await expect(page.getByTestId('pairs-needed').textContent()).resolves.toBe(
        `${needed} pairs needed at 80 % power, α = 0.05`,
      );
      await expect(page.getByTestId('pairs-needed-explained').textContent()).resolves.toContain(
        `You have 4: ${needed - 4} more to burn.`,
      );
      await page.getByTestId('pair-lines-figure').scrollIntoViewIfNeeded();
      await screenshot(page, `treatment-detail-charts-${name}`);
      await page.getByTestId('pairs-needed').scrollIntoViewIfNeeded();
      await screenshot(page, `treatment-detail-sample-size-${name}`);
      for (const [text, message] of [
        ['', 'Enter the reduction to detect.'],
        ['0', 'Enter a reduction larger than zero.'],
        ['-4', 'Enter a reduction larger than zero.'],
        ['lots', 'Enter a number, such as 20.'],
      ] as const) {
        await field.fill(text);
        await page.getByRole('alert').filter({ hasText: message }).waitFor();
        expect(await page.getByTestId('pairs-needed').count()).toBe(0);
      }

      await page.getByTestId('open-pair-1').click();
      await page.getByTestId('pair-status').waitFor();
      expect(errors).toEqual([]);
      await context.close();
    });
  },
);

describe('a treatment whose substrate has URL characters', () => {
  it('opens from the rankings and from a pasted link', async () => {
    const context = await env.browser.newContext({ viewport: viewports.wide });
    const page = await context.newPage();
    const errors = collectPageErrors(page);
    await signInThroughUi(page, env.server.url, viewer.email, DEMO_PASSWORD);
    await page.getByTestId('section-title').filter({ hasText: 'Today' }).waitFor();
    await page.getByTestId('nav-rankings').click();
    await page
      .locator('[data-testid^="open-treatment-"]')
      .filter({ hasText: ODD_SUBSTRATE })
      .click();
    const subtitle = page.getByTestId('treatment-subtitle');
    await subtitle.filter({ hasText: ODD_SUBSTRATE }).waitFor();
    await page.reload();
    await subtitle.filter({ hasText: ODD_SUBSTRATE }).waitFor();
    await page.goto(`${env.server.url}/labs/${odd.labId}/rankings/${encodeURIComponent(odd.key)}`);
    await subtitle.filter({ hasText: ODD_SUBSTRATE }).waitFor();
    await expect(page.getByTestId('verdict-none').count()).resolves.toBe(1);
    expect(errors).toEqual([]);
    await context.close();
  });
});
