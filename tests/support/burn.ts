import { randomUUID } from 'node:crypto';
import { ChemicalModel, UserModel } from '../../server/models';
import { addSpecimen, createBatch } from '../../server/services/batches';
import { createPair, createSession, updateSession } from '../../server/services/burn-tests';
import { createRecipe } from '../../server/services/recipes';
import { checklistItems } from '../../shared/schemas/burn';

/** A treated specimen in a lab, through the app's services: recipe → batch → specimen. */
export async function treatedSpecimen(
  labId: string,
  userId: string,
  code = `T-${randomUUID().slice(0, 6)}`,
) {
  const boric = await ChemicalModel.findOne({ where: { labId: null, referenceKey: 'boric-acid' } });
  const recipe = await createRecipe(labId, userId, {
    name: `Recipe ${randomUUID().slice(0, 8)}`,
    substrate: 'cotton',
    ingredients: [{ chemicalId: boric!.id, amount: 4, unit: 'g_per_100g_water' }],
    mixingTempC: 40,
    soakMinutes: 10,
    dryingMethod: 'rack',
  });
  const { batch } = await createBatch(labId, userId, {
    clientId: randomUUID(),
    recipeRevisionId: recipe.current.id,
    target: { basis: 'water_mass', grams: 1000 },
    storageTempC: 25,
    weighIns: [{ chemicalId: boric!.id, weighedG: 40 }],
    cautionsAcknowledged: true,
  });
  const { specimen } = await addSpecimen(labId, batch.id, {
    clientId: randomUUID(),
    code,
    substrate: 'Muslin',
    lengthMm: 300,
    widthMm: 75,
    dryMassBeforeG: 4,
    dryMassAfterG: 4.3,
  });
  return specimen;
}

/** A burn session (checklist ticked unless asked not to) with one pair. */
export async function sessionWithPair(
  labId: string,
  email: string,
  opts: { checklist?: boolean } = {},
) {
  const user = await UserModel.findOne({ where: { email } });
  const { session } = await createSession(labId, user!.id, {
    clientId: randomUUID(),
    heldAt: new Date().toISOString(),
    place: 'Paint shop hood',
    draft: 'hood',
    igniter: 'butane_lighter',
    orientation: 'vertical',
    exposureS: 12,
  });
  if (opts.checklist !== false) {
    await updateSession(labId, session.id, user!.id, {
      checklist: Object.fromEntries(checklistItems.map((i) => [i.key, true])),
    });
  }
  const treated = await treatedSpecimen(labId, user!.id);
  const { pair } = await createPair(labId, session.id, {
    clientId: randomUUID(),
    treatedSpecimenId: treated.id,
    control: {
      clientId: randomUUID(),
      code: `C-${randomUUID().slice(0, 6)}`,
      substrate: 'Muslin',
      dryMassG: 4.1,
    },
  });
  return {
    session,
    pair,
    controlId: pair.lanes[0]!.specimen.id,
    treatedId: pair.lanes[1]!.specimen.id,
  };
}
