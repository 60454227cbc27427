import { randomUUID } from 'node:crypto';
import { ChemicalModel } from '../../server/models';
import { addSpecimen, createBatch } from '../../server/services/batches';
import {
  addMarks,
  createPair,
  createSession,
  putMeasurement,
  signOffPair,
  submitPair,
  updateSession,
} from '../../server/services/burn-tests';
import { createRecipe } from '../../server/services/recipes';
import { checklistItems, type igniters } from '../../shared/schemas/burn';

export type BurnedPair = { controlMm: number; treatedMm: number; treatedAfterflameS: number };

/**
 * Burns pairs of one treatment through the app's services: a recipe (or the given revision), a
 * batch, a session on `heldAt` and one signed-off pair per result. Treatment key as the ranking
 * builds it: revision id | substrate in lower case.
 */
export async function burnTreatment(
  labId: string,
  userId: string,
  opts: {
    substrate: string;
    pairs: BurnedPair[];
    revisionId?: string;
    heldAt?: string;
    igniter?: (typeof igniters)[number];
  },
) {
  const boric = await ChemicalModel.findOne({ where: { labId: null, referenceKey: 'boric-acid' } });
  const revisionId =
    opts.revisionId ??
    (
      await createRecipe(labId, userId, {
        name: `Soak ${randomUUID().slice(0, 8)}`,
        substrate: 'cotton',
        ingredients: [{ chemicalId: boric!.id, amount: 5, unit: 'g_per_100g_water' }],
        mixingTempC: 40,
        soakMinutes: 10,
        dryingMethod: 'rack',
      })
    ).current.id;
  const { batch } = await createBatch(labId, userId, {
    clientId: randomUUID(),
    recipeRevisionId: revisionId,
    target: { basis: 'water_mass', grams: 1000 },
    storageTempC: 22,
    weighIns: [{ chemicalId: boric!.id, weighedG: 50 }],
    cautionsAcknowledged: true,
  });
  const { session } = await createSession(labId, userId, {
    clientId: randomUUID(),
    heldAt: opts.heldAt ?? new Date().toISOString(),
    place: 'Test hood',
    draft: 'hood',
    igniter: opts.igniter ?? 'butane_lighter',
    orientation: 'vertical',
    exposureS: 12,
  });
  await updateSession(labId, session.id, userId, {
    checklist: Object.fromEntries(checklistItems.map((i) => [i.key, true])),
  });
  const pairIds: string[] = [];
  for (const r of opts.pairs) {
    const { specimen } = await addSpecimen(labId, batch.id, {
      clientId: randomUUID(),
      code: `T-${randomUUID().slice(0, 6)}`,
      substrate: opts.substrate,
      dryMassBeforeG: 4,
      dryMassAfterG: 4.2,
    });
    const { pair } = await createPair(labId, session.id, {
      clientId: randomUUID(),
      treatedSpecimenId: specimen.id,
      control: {
        clientId: randomUUID(),
        code: `C-${randomUUID().slice(0, 6)}`,
        substrate: opts.substrate,
        dryMassG: 4,
      },
    });
    const [control, treated] = pair.lanes;
    const lane = (specimenId: string, afterflameS: number) => [
      { id: randomUUID(), specimenId, kind: 'flame_applied' as const, atMs: 1_000 },
      { id: randomUUID(), specimenId, kind: 'flame_removed' as const, atMs: 13_000 },
      {
        id: randomUUID(),
        specimenId,
        kind: 'flame_out' as const,
        atMs: 13_000 + afterflameS * 1000,
      },
    ];
    await addMarks(labId, pair.id, userId, {
      marks: [
        ...lane(control!.specimen.id, 20),
        ...lane(treated!.specimen.id, r.treatedAfterflameS),
      ],
    });
    await putMeasurement(labId, pair.id, control!.specimen.id, { charLengthMm: r.controlMm });
    await putMeasurement(labId, pair.id, treated!.specimen.id, { charLengthMm: r.treatedMm });
    await submitPair(labId, pair.id, userId);
    await signOffPair(labId, pair.id, userId);
    pairIds.push(pair.id);
  }
  return { revisionId, key: `${revisionId}|${opts.substrate.trim().toLowerCase()}`, pairIds };
}
