import { DEMO_PASSWORD, demoPeople } from '../../fixtures/demo';
import { RecipeModel, RecipeRevisionModel } from '../../server/models';
import { browserTestEnv } from '../support/browser-env';
import { viewports } from '../support/browser';
import { pairsCsv, sitting } from '../support/imports';
import { collectPageErrors } from '../support/page-errors';
import { screenshot } from '../support/screenshots';
import { signInThroughUi } from '../support/ui';

jest.setTimeout(240_000);

const env = browserTestEnv({ demo: true });

let file: string;

beforeAll(async () => {
  const recipe = await RecipeModel.findOne({
    where: { name: 'Muslin drape soak' },
    include: [{ model: RecipeRevisionModel, as: 'revisions' }],
  });
  const revision = Math.max(...recipe!.revisions!.map((r) => r.number));
  // Invented past results of the demo workshop; the second row has a typo in a char length.
  const row = (treated: string) => ({
    ...sitting,
    recipe: 'Muslin drape soak',
    revision,
    substrate: 'Muslin, unbleached',
    control_char_mm: 300,
    treated_char_mm: treated,
    treated_afterflame_s: '1,1',
    treated_afterglow_s: 5,
  });
  file = pairsCsv([row('58'), row('abc'), row('63')]);
});

const technician = demoPeople.find((p) => p.role === 'technician')!;

describe.each(Object.entries(viewports))('importing past results at %s size', (name, viewport) => {
  it('shows the bad row by line and column, imports the others, and opens their session', async () => {
    const context = await env.browser.newContext({ viewport });
    const page = await context.newPage();
    const errors = collectPageErrors(page);
    await signInThroughUi(page, env.server.url, technician.email, DEMO_PASSWORD);
    await page.getByTestId('section-title').filter({ hasText: 'Today' }).waitFor();
    await page.getByTestId('nav-rankings').click();
    await page.getByTestId('open-import').click();
    await page.getByTestId('section-title').filter({ hasText: 'Import past results' }).waitFor();
    await page
      .getByTestId('import-review-rule')
      .getByText(/wait for review/)
      .waitFor();

    await page.getByTestId('import-file').setInputFiles({
      name: 'old-burns.csv',
      mimeType: 'text/csv',
      buffer: Buffer.from(file),
    });
    await page.getByTestId('import-preview').waitFor();
    await expect(page.getByTestId('import-counts').textContent()).resolves.toBe(
      '2 rows can be imported · 1 with errors',
    );
    await expect(page.getByTestId('row-errors-3').textContent()).resolves.toBe(
      'treated_char_mm: "abc" is not a number',
    );
    await expect(page.getByTestId('import-row-4').textContent()).resolves.toContain('63 mm');
    await screenshot(page, `pair-import-preview-${name}`);

    await page.getByTestId('accept-import').click();
    await page.getByTestId('import-done').waitFor();
    await page.getByTestId('open-review-queue').waitFor();
    await page.getByTestId('imported-session-0').click();
    await page
      .getByTestId('section-title')
      .filter({ hasText: `Imported from old-burns.csv by ${technician.displayName}` })
      .waitFor();
    await expect(page.getByText('Waiting for review').count()).resolves.toBe(2);
    await screenshot(page, `pair-import-session-${name}`);
    expect(errors).toEqual([]);
    await context.close();
  });
});
