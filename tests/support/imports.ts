import { randomUUID } from 'node:crypto';
import Papa from 'papaparse';
import { ChemicalModel } from '../../server/models';
import { createBatch } from '../../server/services/batches';
import { createRecipe, updateRecipe } from '../../server/services/recipes';
import type { RecipeInput } from '../../shared/schemas/recipe';

/** A recipe of the lab under this name, edited until it has revision `revision`. */
export async function recipeNamed(labId: string, userId: string, name: string, revision = 1) {
  const boric = await ChemicalModel.findOne({ where: { labId: null, referenceKey: 'boric-acid' } });
  const input: RecipeInput = {
    name,
    substrate: 'cotton',
    ingredients: [{ chemicalId: boric!.id, amount: 4, unit: 'g_per_100g_water' }],
    mixingTempC: 40,
    soakMinutes: 10,
    dryingMethod: 'rack',
  };
  let recipe = await createRecipe(labId, userId, input);
  while (recipe.current.number < revision) {
    // A batch freezes the revision, so the next edit becomes a new one.
    await createBatch(labId, userId, {
      clientId: randomUUID(),
      recipeRevisionId: recipe.current.id,
      target: { basis: 'water_mass', grams: 1000 },
      storageTempC: 40,
      weighIns: [{ chemicalId: boric!.id, weighedG: 40 }],
      cautionsAcknowledged: true,
    });
    recipe = await updateRecipe(labId, recipe.id, userId, {
      ...input,
      soakMinutes: 10 + recipe.current.number,
    });
  }
  return recipe;
}

/** The session conditions every row of a test file shares unless it says otherwise. */
export const sitting = {
  held_at: '2025-11-03',
  exposure_s: '12',
  igniter: 'butane_lighter',
  orientation: 'vertical',
  draft: 'hood',
};

/** A pairs file from rows of cells; the header is the union of the rows' columns. */
export function pairsCsv(rows: Record<string, string | number | boolean>[]): string {
  const columns = [...new Set(rows.flatMap((r) => Object.keys(r)))];
  return Papa.unparse(rows, { columns });
}
