import { UniqueConstraintError, type Transaction } from 'sequelize';
import { planBatch, type BatchPlan } from '../../shared/batch/plan';
import type {
  Batch,
  BatchPlanOutput,
  BatchPlanRequest,
  BatchStatus,
  BatchTargetInput,
  CreateBatchInput,
  Specimen,
  SpecimenInput,
} from '../../shared/schemas/batch';
import { AppError } from '../errors';
import {
  BatchModel,
  ChemicalModel,
  LabModel,
  RecipeModel,
  RecipeRevisionModel,
  SpecimenModel,
  UserModel,
  WeighInModel,
} from '../models';
import { chemicalsByIds, toChemicalData } from './chemicals';
import { loadRevision, planErrorToAppError } from './recipes';

const MINUTE_MS = 60_000;

function runPlan(input: Parameters<typeof planBatch>[0]): BatchPlanOutput {
  try {
    const plan: BatchPlan = planBatch(input);
    return { ...plan, ingredients: plan.ingredients.map((i) => ({ ...i, chemicalId: i.key })) };
  } catch (err) {
    return planErrorToAppError(err);
  }
}

export function planForRevision(
  revision: RecipeRevisionModel,
  target: BatchTargetInput,
  storageTempC: number,
  mixingTempC = revision.mixingTempC,
): BatchPlanOutput {
  const ingredients = [...(revision.ingredients ?? [])].sort((a, b) => a.position - b.position);
  return runPlan({
    // The stored canonical amounts: the plan matches the recipe whatever unit it was written in.
    ingredients: ingredients.map((i) => ({
      chemical: toChemicalData(i.chemical!),
      amount: i.gPer100gWater,
      unit: 'g_per_100g_water' as const,
    })),
    target,
    mixingTempC,
    storageTempC,
  });
}

/** The numbers a batch screen shows, computed without saving anything. */
export async function planFromRequest(
  labId: string,
  req: BatchPlanRequest,
): Promise<BatchPlanOutput> {
  if (req.recipeRevisionId) {
    const revision = await loadRevision(labId, req.recipeRevisionId);
    return planForRevision(revision, req.target, req.storageTempC, req.mixingTempC);
  }
  const inline = req.ingredients ?? [];
  const chemicals = await chemicalsByIds(
    labId,
    inline.map((i) => i.chemicalId),
    (i) => `ingredients.${i}.chemicalId`,
  );
  return runPlan({
    ingredients: inline.map((i) => ({
      chemical: toChemicalData(chemicals.get(i.chemicalId)!),
      amount: i.amount,
      unit: i.unit,
    })),
    ...(req.waterParts !== undefined ? { waterParts: req.waterParts } : {}),
    target: req.target,
    mixingTempC: req.mixingTempC!,
    storageTempC: req.storageTempC,
  });
}

// A factory: Sequelize annotates include objects in place.
const includes = () => [
  { model: RecipeRevisionModel, as: 'revision', include: [{ model: RecipeModel, as: 'recipe' }] },
  { model: UserModel, as: 'operator' },
  { model: WeighInModel, as: 'weighIns', include: [{ model: ChemicalModel, as: 'chemical' }] },
  { model: SpecimenModel, as: 'specimens' },
];

const pct = (part: number, whole: number) => Math.round((part / whole) * 100 * 100) / 100;

export function toSpecimen(row: SpecimenModel): Specimen {
  return {
    id: row.id,
    code: row.code,
    substrate: row.substrate,
    batchId: row.batchId,
    lengthMm: row.lengthMm,
    widthMm: row.widthMm,
    thicknessMm: row.thicknessMm,
    dryMassBeforeG: row.dryMassBeforeG,
    wetMassG: row.wetMassG,
    dryMassAfterG: row.dryMassAfterG,
    addOnPct:
      row.dryMassAfterG === null
        ? null
        : pct(row.dryMassAfterG - row.dryMassBeforeG, row.dryMassBeforeG),
    pickUpPct:
      row.wetMassG === null ? null : pct(row.wetMassG - row.dryMassBeforeG, row.dryMassBeforeG),
    notes: row.notes,
    createdAt: row.createdAt.toISOString(),
  };
}

function toBatch(row: BatchModel): Batch {
  const revision = row.revision!;
  const weighIns = [...(row.weighIns ?? [])]
    .sort((a, b) => a.position - b.position)
    .map((w) => {
      const deviationPct = ((w.weighedG - w.targetG) / w.targetG) * 100;
      return {
        chemicalId: w.chemicalId,
        name: w.chemical?.name ?? 'Unknown',
        targetG: w.targetG,
        weighedG: w.weighedG,
        deviationPct: Math.round(deviationPct * 100) / 100,
        flagged: Math.abs(deviationPct) > row.tolerancePct,
        lot: w.lot,
      };
    });
  const soakEnds = row.soakStartedAt
    ? new Date(row.soakStartedAt.getTime() + revision.soakMinutes * MINUTE_MS)
    : null;
  const dryingReady =
    soakEnds && revision.dryingMinutes !== null
      ? new Date(
          soakEnds.getTime() + ((revision.drainMinutes ?? 0) + revision.dryingMinutes) * MINUTE_MS,
        )
      : null;
  return {
    id: row.id,
    code: row.code,
    status: row.status,
    recipe: {
      id: revision.recipeId,
      name: revision.recipe?.name ?? '',
      revisionId: revision.id,
      revisionNumber: revision.number,
    },
    operator: row.operator?.displayName ?? null,
    preparedAt: row.preparedAt.toISOString(),
    target: row.target,
    storageTempC: row.storageTempC,
    waterTempC: row.waterTempC,
    ph: row.ph,
    densityGMl: row.densityGMl,
    tolerancePct: row.tolerancePct,
    weighIns,
    anyOutOfTolerance: weighIns.some((w) => w.flagged),
    plan: row.plan,
    soakStartedAt: row.soakStartedAt?.toISOString() ?? null,
    soakEndsAt: soakEnds?.toISOString() ?? null,
    dryingReadyAt: dryingReady?.toISOString() ?? null,
    discardReason: row.discardReason,
    notes: row.notes,
    specimens: [...(row.specimens ?? [])]
      .sort((a, b) => a.createdAt.getTime() - b.createdAt.getTime())
      .map(toSpecimen),
  };
}

async function loadBatch(
  labId: string,
  batchId: string,
  transaction?: Transaction,
): Promise<BatchModel> {
  const row = await BatchModel.findOne({
    where: { id: batchId, labId },
    include: includes(),
    transaction,
  });
  if (!row) throw AppError.notFound('No such batch in this lab.');
  return row;
}

export async function getBatch(labId: string, batchId: string): Promise<Batch> {
  return toBatch(await loadBatch(labId, batchId));
}

export async function listBatches(
  labId: string,
  status?: BatchStatus,
): Promise<Omit<Batch, 'plan' | 'specimens'>[]> {
  const rows = await BatchModel.findAll({
    where: { labId, ...(status ? { status } : {}) },
    include: includes().slice(0, 3),
    order: [['preparedAt', 'DESC']],
    limit: 500,
  });
  return rows.map((r) => {
    const { plan: _plan, specimens: _specimens, ...rest } = toBatch(r);
    return rest;
  });
}

/** A short code to write on the bucket: B-YYMMDD-NN, counted per lab and day. */
async function nextCode(labId: string, transaction: Transaction): Promise<string> {
  const now = new Date();
  const day = now.toISOString().slice(2, 10).replace(/-/g, '');
  const prefix = `B-${day}-`;
  const [result] = (await BatchModel.sequelize!.query(
    'SELECT count(*)::int AS n FROM batches WHERE lab_id = :labId AND code LIKE :prefix',
    { replacements: { labId, prefix: `${prefix}%` }, transaction },
  )) as unknown as [{ n: number }[]];
  const n = (result[0]?.n ?? 0) + 1;
  return `${prefix}${String(n).padStart(2, '0')}`;
}

/**
 * Records a prepared batch. Retried with the same clientId (a phone on a bad connection),
 * it returns the batch already recorded instead of making a second one.
 */
export async function createBatch(
  labId: string,
  operatorId: string,
  input: CreateBatchInput,
): Promise<{ batch: Batch; created: boolean }> {
  const existing = await BatchModel.findOne({ where: { labId, clientId: input.clientId } });
  if (existing) return { batch: await getBatch(labId, existing.id), created: false };

  const revision = await loadRevision(labId, input.recipeRevisionId);
  const plan = planForRevision(revision, input.target, input.storageTempC);
  const planned = new Map(plan.ingredients.map((i) => [i.key, i]));
  const fields = input.weighIns.flatMap((w, i) =>
    planned.has(w.chemicalId)
      ? []
      : [{ path: `weighIns.${i}.chemicalId`, message: 'This chemical is not in the recipe' }],
  );
  const weighed = new Set(input.weighIns.map((w) => w.chemicalId));
  plan.ingredients.forEach((p) => {
    if (!weighed.has(p.key))
      fields.push({ path: 'weighIns', message: `Record what was weighed of ${p.name}` });
  });
  if (fields.length)
    throw new AppError(400, 'invalid_request', 'Some fields are not valid.', fields);
  const lab = await LabModel.findByPk(labId);

  for (let attempt = 0; ; attempt++) {
    try {
      const id = await BatchModel.sequelize!.transaction(async (transaction) => {
        const batch = await BatchModel.create(
          {
            labId,
            revisionId: revision.id,
            code: await nextCode(labId, transaction),
            clientId: input.clientId,
            operatorId,
            target: input.target,
            storageTempC: input.storageTempC,
            waterTempC: input.waterTempC ?? null,
            ph: input.ph ?? null,
            densityGMl: input.densityGMl ?? null,
            tolerancePct: lab?.weighTolerancePct ?? 2,
            cautionsAcknowledgedAt: new Date(),
            soakStartedAt: null,
            discardReason: null,
            plan,
            notes: input.notes ?? null,
          },
          { transaction },
        );
        await WeighInModel.bulkCreate(
          input.weighIns.map((w, position) => ({
            batchId: batch.id,
            chemicalId: w.chemicalId,
            position,
            targetG: planned.get(w.chemicalId)!.massG,
            weighedG: w.weighedG,
            lot: w.lot ?? null,
          })),
          { transaction },
        );
        return batch.id;
      });
      return { batch: await getBatch(labId, id), created: true };
    } catch (err) {
      if (!(err instanceof UniqueConstraintError) || attempt >= 4) throw err;
      // Either the same clientId arrived twice at once, or two batches took the same code.
      const twin = await BatchModel.findOne({ where: { labId, clientId: input.clientId } });
      if (twin) return { batch: await getBatch(labId, twin.id), created: false };
    }
  }
}

const transitions: Record<BatchStatus, BatchStatus[]> = {
  prepared: ['in_use', 'discarded'],
  in_use: ['used_up', 'discarded'],
  used_up: [],
  discarded: [],
};

export async function updateBatch(
  labId: string,
  batchId: string,
  input: { status?: BatchStatus; discardReason?: string; startSoak?: true; notes?: string },
): Promise<Batch> {
  const row = await loadBatch(labId, batchId);
  const changes: Partial<{
    status: BatchStatus;
    discardReason: string;
    soakStartedAt: Date;
    notes: string;
  }> = {};
  if (input.startSoak) {
    if (row.status !== 'prepared' && row.status !== 'in_use') {
      throw new AppError(
        409,
        'invalid_transition',
        `A ${row.status.replace('_', ' ')} batch cannot start a soak.`,
      );
    }
    changes.soakStartedAt = new Date();
    if (row.status === 'prepared') changes.status = 'in_use';
  }
  if (input.status && input.status !== row.status) {
    if (!transitions[row.status as BatchStatus].includes(input.status)) {
      throw new AppError(
        409,
        'invalid_transition',
        `A batch cannot go from ${row.status.replace('_', ' ')} to ${input.status.replace('_', ' ')}.`,
      );
    }
    changes.status = input.status;
    if (input.status === 'discarded') changes.discardReason = input.discardReason!;
  }
  if (input.notes !== undefined) changes.notes = input.notes;
  await row.update(changes);
  return getBatch(labId, batchId);
}

export async function addSpecimen(
  labId: string,
  batchId: string,
  input: SpecimenInput,
): Promise<{ specimen: Specimen; created: boolean }> {
  await loadBatch(labId, batchId);
  const same = await SpecimenModel.findOne({ where: { labId, clientId: input.clientId } });
  if (same) return { specimen: toSpecimen(same), created: false };
  try {
    const row = await SpecimenModel.create({
      labId,
      batchId,
      clientId: input.clientId,
      code: input.code,
      substrate: input.substrate,
      lengthMm: input.lengthMm ?? null,
      widthMm: input.widthMm ?? null,
      thicknessMm: input.thicknessMm ?? null,
      dryMassBeforeG: input.dryMassBeforeG,
      wetMassG: input.wetMassG ?? null,
      dryMassAfterG: input.dryMassAfterG ?? null,
      notes: input.notes ?? null,
    });
    return { specimen: toSpecimen(row), created: true };
  } catch (err) {
    if (!(err instanceof UniqueConstraintError)) throw err;
    const twin = await SpecimenModel.findOne({ where: { labId, clientId: input.clientId } });
    if (twin) return { specimen: toSpecimen(twin), created: false };
    throw new AppError(
      409,
      'already_exists',
      'A specimen with this code already exists in the lab.',
      [{ path: 'code', message: 'Already used in this lab' }],
    );
  }
}

export async function updateSpecimen(
  labId: string,
  batchId: string,
  specimenId: string,
  input: { wetMassG?: number; dryMassAfterG?: number; notes?: string },
): Promise<Specimen> {
  const row = await SpecimenModel.findOne({ where: { id: specimenId, batchId, labId } });
  if (!row) throw AppError.notFound('No such specimen in this batch.');
  await row.update(input);
  return toSpecimen(row);
}

export async function updateLabSettings(
  labId: string,
  input: { weighTolerancePct: number },
): Promise<void> {
  await LabModel.update({ weighTolerancePct: input.weighTolerancePct }, { where: { id: labId } });
}
