import { randomUUID } from 'node:crypto';
import { ChemicalModel, UserModel } from '../../server/models';
import { createBatch } from '../../server/services/batches';
import { createRecipe, updateRecipe } from '../../server/services/recipes';
import { browserTestEnv } from '../support/browser-env';
import { viewports } from '../support/browser';
import { collectPageErrors } from '../support/page-errors';
import { screenshot } from '../support/screenshots';
import { seedLab, signInThroughUi } from '../support/ui';

jest.setTimeout(240_000);

const env = browserTestEnv();

describe.each(Object.entries(viewports))('preparing a soak batch at %s size', (name, viewport) => {
  it('writes a recipe, prepares 5 L, flags an out-of-tolerance weigh-in, and logs specimens with their add-on', async () => {
    const seeded = await seedLab(env.server.deps, `Batch lab ${name}`);
    const context = await env.browser.newContext({ viewport });
    const page = await context.newPage();
    const errors = collectPageErrors(page);
    await signInThroughUi(page, env.server.url, seeded.people.technician.email);
    await page.getByTestId('section-title').filter({ hasText: 'Today' }).waitFor();

    // The recipe: 6 g borax decahydrate + 4 g boric acid per 100 g water.
    await page.getByTestId('nav-recipes').click();
    await page.getByTestId('new-recipe').click();
    const recipeName = `Drape soak ${name}`;
    await page.getByTestId('field-name').fill(recipeName);
    await page
      .getByTestId('ingredient-0-chemical')
      .getByText('Borax decahydrate', { exact: true })
      .click();
    await page.getByTestId('field-ingredients.0.amount').fill('6');
    await page.getByTestId('add-ingredient').click();
    await page
      .getByTestId('ingredient-1-chemical')
      .getByText('Boric acid', { exact: true })
      .click();
    await page.getByTestId('field-ingredients.1.amount').fill('4');
    await page.getByTestId('recipe-preview').getByTestId('plan').waitFor();
    await screenshot(page, `recipe-editor-${name}`);
    await page.getByTestId('save-recipe').click();
    await page.getByTestId('section-title').filter({ hasText: recipeName }).waitFor();

    // The batch: 5 L of water → 300 g borax and 200 g boric acid (g per 100 g water × 50).
    await page.getByTestId('prepare-batch').click();
    await page.getByTestId('batch-size').fill('5');
    await page.getByTestId('weigh-in').waitFor();
    await expect(page.getByTestId('weigh-0').textContent()).resolves.toContain('target 300 g');
    await expect(page.getByTestId('weigh-1').textContent()).resolves.toContain('target 200 g');
    await page.getByTestId('weighed-0').fill('303');
    await page.getByTestId('weighed-1').fill('212');
    await expect(page.getByTestId('deviation-0').textContent()).resolves.toContain(
      '+1 % from target — within tolerance',
    );
    await expect(page.getByTestId('deviation-1').textContent()).resolves.toContain(
      '+6 % from target — outside ±2 %',
    );
    await expect(page.getByTestId('confirm-batch').getAttribute('aria-disabled')).resolves.toBe(
      'true',
    );
    await page
      .getByTestId('cautions')
      .getByText(/may damage fertility or the unborn child/)
      .waitFor();
    await page.getByTestId('cautions-ack').click();
    await screenshot(page, `batch-prepare-${name}`);
    await page.getByTestId('confirm-batch').click();
    await page
      .getByTestId('section-title')
      .filter({ hasText: /^Batch B-\d{6}-\d{2}$/ })
      .waitFor();
    await expect(page.getByTestId('deviation-flag-Boric acid').textContent()).resolves.toBe(
      '+6 % out of tolerance',
    );
    await expect(page.getByTestId('deviation-flag-Borax decahydrate').textContent()).resolves.toBe(
      '+1 %',
    );

    // Two specimens: add-on = (after − before)/before.
    for (const [code, before, after, addOn] of [
      ['M-01', '4.00', '4.26', '6.5 %'],
      ['M-02', '5.00', '5.40', '8 %'],
    ]) {
      await page.getByTestId('specimen-code').fill(code!);
      await page.getByTestId('specimen-dry-before').fill(before!);
      await page.getByTestId('specimen-dry-after').fill(after!);
      await page.getByTestId('log-specimen').click();
      await expect(page.getByTestId(`addon-${code}`).textContent()).resolves.toContain(
        `Add-on ${addOn}`,
      );
    }
    await screenshot(page, `batch-detail-${name}`);
    expect(errors).toEqual([]);
    await context.close();
  });
});

describe('chemicals, recipe history and the batch sheet', () => {
  it('lists the chemicals, shows two revisions side by side, and prints a sheet with the cautions', async () => {
    const seeded = await seedLab(env.server.deps, 'Sheet lab');
    const boric = await ChemicalModel.findOne({
      where: { labId: null, referenceKey: 'boric-acid' },
    });
    const manager = await UserModel.findOne({ where: { email: seeded.people.manager.email } });
    const input = {
      name: 'Board dip',
      substrate: 'board' as const,
      ingredients: [{ chemicalId: boric!.id, amount: 4, unit: 'g_per_100g_water' as const }],
      mixingTempC: 40,
      soakMinutes: 5,
      dryingMethod: 'press' as const,
    };
    const recipe = await createRecipe(seeded.labId, manager!.id, input);
    const { batch } = await createBatch(seeded.labId, manager!.id, {
      clientId: randomUUID(),
      recipeRevisionId: recipe.current.id,
      target: { basis: 'water_volume', millilitres: 1000 },
      storageTempC: 20,
      weighIns: [{ chemicalId: boric!.id, weighedG: 40 }],
      cautionsAcknowledged: true,
    });
    await updateRecipe(seeded.labId, recipe.id, manager!.id, { ...input, mixingTempC: 50 });

    const context = await env.browser.newContext({ viewport: viewports.wide });
    const page = await context.newPage();
    const errors = collectPageErrors(page);
    await signInThroughUi(page, env.server.url, seeded.people.viewer.email);
    await page.getByTestId('nav-recipes').click();
    await page.getByTestId('link-chemicals').click();
    await page.getByTestId('section-title').filter({ hasText: 'Chemicals' }).waitFor();
    await page.getByTestId('chemical-boric-acid').waitFor();
    expect(await page.getByTestId('add-chemical').count()).toBe(0);
    await screenshot(page, 'chemicals-wide');

    await page.goto(`${env.server.url}/labs/${seeded.labId}/recipes/${recipe.id}/history`);
    await page.getByTestId('revision-2').waitFor();
    await page.getByTestId('revision-1').waitFor();
    expect(await page.getByTestId('changed-value').count()).toBeGreaterThan(0);
    await screenshot(page, 'recipe-history-wide');

    await page.goto(`${env.server.url}/labs/${seeded.labId}/batches/${batch.id}/sheet`);
    await expect(page.getByTestId('sheet-code').textContent()).resolves.toBe(batch.code);
    await page
      .getByTestId('sheet-cautions')
      .getByText(/Authority Having Jurisdiction/)
      .waitFor();
    await screenshot(page, 'batch-sheet-wide');
    expect(errors).toEqual([]);
    await context.close();
  });
});

describe('a lab chemical with solubility data', () => {
  it('is added from the library screen and then shows its table', async () => {
    const seeded = await seedLab(env.server.deps, 'Own chemical lab');
    const context = await env.browser.newContext({ viewport: viewports.phone });
    const page = await context.newPage();
    const errors = collectPageErrors(page);
    await signInThroughUi(page, env.server.url, seeded.people.technician.email);
    await page.getByTestId('section-title').filter({ hasText: 'Today' }).waitFor();
    await page.goto(`${env.server.url}/labs/${seeded.labId}/chemicals`);
    await page.getByTestId('field-name').fill('Workshop borate blend');
    await page.getByTestId('field-solubilityLines').fill('10 12\n30 20\n50 31');
    await page
      .getByTestId('field-solubilitySource')
      .fill('Supplier data sheet, table 2 (invented for this test)');
    await page.getByTestId('add-chemical-submit').click();
    await page.getByTestId('chemical-added').waitFor();
    await page.getByText('Workshop borate blend').first().click();
    await page.getByTestId('solubility-table').waitFor();
    await page.getByTestId('solubility-row-30').waitFor();
    expect(errors).toEqual([]);
    await context.close();
  });
});
