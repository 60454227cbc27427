import { Op, type Transaction } from 'sequelize';
import { BatchPlanError, toGramsPer100gWater } from '../../shared/batch/plan';
import type { Recipe, RecipeInput, Revision } from '../../shared/schemas/recipe';
import { AppError } from '../errors';
import {
  BatchModel,
  ChemicalModel,
  IngredientModel,
  RecipeModel,
  RecipeRevisionModel,
  UserModel,
} from '../models';
import { chemicalsByIds, toChemicalData } from './chemicals';

/** A calculator refusal (e.g. over 100 %) as a 400 on the field it names. */
export function planErrorToAppError(err: unknown): never {
  if (err instanceof BatchPlanError) {
    throw new AppError(400, 'invalid_request', 'Some fields are not valid.', [
      { path: err.path, message: err.message },
    ]);
  }
  throw err;
}

const revisionIncludes = [
  {
    model: IngredientModel,
    as: 'ingredients',
    include: [{ model: ChemicalModel, as: 'chemical' }],
  },
  { model: UserModel, as: 'author' },
];

async function batchCounts(revisionIds: string[]): Promise<Map<string, number>> {
  if (!revisionIds.length) return new Map();
  const rows = (await BatchModel.count({
    where: { revisionId: revisionIds },
    group: ['revisionId'],
  })) as unknown as {
    revisionId: string;
    count: number;
  }[];
  return new Map(rows.map((r) => [r.revisionId, Number(r.count)]));
}

function toRevision(row: RecipeRevisionModel, batchCount: number): Revision {
  const ingredients = [...(row.ingredients ?? [])].sort((a, b) => a.position - b.position);
  return {
    id: row.id,
    number: row.number,
    createdAt: row.createdAt.toISOString(),
    createdBy: row.author?.displayName ?? null,
    batchCount,
    ingredients: ingredients.map((i) => ({
      chemicalId: i.chemicalId,
      chemicalName: i.chemical?.name ?? 'Unknown',
      amount: i.amount,
      unit: i.unit,
      gPer100gWater: i.gPer100gWater,
    })),
    waterParts: row.waterParts,
    mixingTempC: row.mixingTempC,
    soakMinutes: row.soakMinutes,
    drainMinutes: row.drainMinutes,
    dryingMethod: row.dryingMethod as Revision['dryingMethod'],
    dryingMinutes: row.dryingMinutes,
    dryingTempC: row.dryingTempC,
    dryingRhPct: row.dryingRhPct,
    conditioning: row.conditioning,
    notes: row.notes,
  };
}

function toRecipe(row: RecipeModel, counts: Map<string, number>): Recipe {
  const revisions = [...(row.revisions ?? [])].sort((a, b) => b.number - a.number);
  const current = revisions[0];
  if (!current) throw new Error(`recipe ${row.id} has no revision`);
  return {
    id: row.id,
    name: row.name,
    substrate: row.substrate,
    updatedAt: row.updatedAt.toISOString(),
    revisionCount: revisions.length,
    current: toRevision(current, counts.get(current.id) ?? 0),
  };
}

async function writeRevision(
  labId: string,
  recipeId: string,
  number: number,
  input: RecipeInput,
  userId: string,
  transaction: Transaction,
  existing?: RecipeRevisionModel,
): Promise<void> {
  const chemicals = await chemicalsByIds(
    labId,
    input.ingredients.map((i) => i.chemicalId),
    (i) => `ingredients.${i}.chemicalId`,
    transaction,
  );
  let canonical: number[] = [];
  try {
    canonical = toGramsPer100gWater(
      input.ingredients.map((i) => ({
        chemical: toChemicalData(chemicals.get(i.chemicalId)!),
        amount: i.amount,
        unit: i.unit,
      })),
      input.waterParts,
    );
  } catch (err) {
    planErrorToAppError(err);
  }
  const fields = {
    recipeId,
    number,
    waterParts: input.waterParts ?? null,
    mixingTempC: input.mixingTempC,
    soakMinutes: input.soakMinutes,
    drainMinutes: input.drainMinutes ?? null,
    dryingMethod: input.dryingMethod,
    dryingMinutes: input.dryingMinutes ?? null,
    dryingTempC: input.dryingTempC ?? null,
    dryingRhPct: input.dryingRhPct ?? null,
    conditioning: input.conditioning ?? null,
    notes: input.notes ?? null,
    createdBy: userId,
  };
  let revision: RecipeRevisionModel;
  if (existing) {
    revision = await existing.update(fields, { transaction });
    await IngredientModel.destroy({ where: { revisionId: existing.id }, transaction });
  } else {
    revision = await RecipeRevisionModel.create(fields, { transaction });
  }
  await IngredientModel.bulkCreate(
    input.ingredients.map((i, position) => ({
      revisionId: revision.id,
      chemicalId: i.chemicalId,
      position,
      amount: i.amount,
      unit: i.unit,
      gPer100gWater: canonical[position]!,
    })),
    { transaction },
  );
}

async function loadRecipe(
  labId: string,
  recipeId: string,
  transaction?: Transaction,
): Promise<RecipeModel> {
  const row = await RecipeModel.findOne({
    where: { id: recipeId, labId },
    include: [{ model: RecipeRevisionModel, as: 'revisions', include: revisionIncludes }],
    transaction,
  });
  if (!row) throw AppError.notFound('No such recipe in this lab.');
  return row;
}

async function present(labId: string, recipeId: string): Promise<Recipe> {
  const row = await loadRecipe(labId, recipeId);
  return toRecipe(row, await batchCounts((row.revisions ?? []).map((r) => r.id)));
}

export async function createRecipe(
  labId: string,
  userId: string,
  input: RecipeInput,
): Promise<Recipe> {
  const id = await RecipeModel.sequelize!.transaction(async (transaction) => {
    const recipe = await RecipeModel.create(
      { labId, name: input.name, substrate: input.substrate, createdBy: userId },
      { transaction },
    );
    await writeRevision(labId, recipe.id, 1, input, userId, transaction);
    return recipe.id;
  });
  return present(labId, id);
}

/**
 * Saves an edit. While no batch uses the current revision it is edited in place; once one
 * does, the revision is frozen and the edit becomes the next revision.
 */
export async function updateRecipe(
  labId: string,
  recipeId: string,
  userId: string,
  input: RecipeInput,
): Promise<Recipe> {
  await RecipeModel.sequelize!.transaction(async (transaction) => {
    const recipe = await loadRecipe(labId, recipeId, transaction);
    // Lock the recipe row so two edits at once cannot both become "revision n + 1".
    await RecipeModel.findOne({
      where: { id: recipe.id },
      lock: transaction.LOCK.UPDATE,
      transaction,
    });
    const current = [...(recipe.revisions ?? [])].sort((a, b) => b.number - a.number)[0]!;
    const used = await BatchModel.count({ where: { revisionId: current.id }, transaction });
    await recipe.update({ name: input.name, substrate: input.substrate }, { transaction });
    if (used === 0) {
      await writeRevision(labId, recipe.id, current.number, input, userId, transaction, current);
    } else {
      await writeRevision(labId, recipe.id, current.number + 1, input, userId, transaction);
    }
  });
  return present(labId, recipeId);
}

export async function getRecipe(labId: string, recipeId: string): Promise<Recipe> {
  return present(labId, recipeId);
}

export async function listRevisions(labId: string, recipeId: string): Promise<Revision[]> {
  const row = await loadRecipe(labId, recipeId);
  const revisions = [...(row.revisions ?? [])].sort((a, b) => b.number - a.number);
  const counts = await batchCounts(revisions.map((r) => r.id));
  return revisions.map((r) => toRevision(r, counts.get(r.id) ?? 0));
}

export async function listRecipes(
  labId: string,
  filter: { q?: string; substrate?: string },
): Promise<Recipe[]> {
  const rows = await RecipeModel.findAll({
    where: {
      labId,
      ...(filter.substrate ? { substrate: filter.substrate } : {}),
      ...(filter.q
        ? { name: { [Op.iLike]: `%${filter.q.replace(/[\\%_]/g, (c) => `\\${c}`)}%` } }
        : {}),
    },
    include: [{ model: RecipeRevisionModel, as: 'revisions', include: revisionIncludes }],
    order: [['name', 'ASC']],
  });
  const counts = await batchCounts(rows.flatMap((r) => (r.revisions ?? []).map((v) => v.id)));
  return rows.map((r) => toRecipe(r, counts));
}

/** A revision of a recipe in this lab, with its ingredients and their chemicals. */
export async function loadRevision(
  labId: string,
  revisionId: string,
  transaction?: Transaction,
): Promise<RecipeRevisionModel> {
  const row = await RecipeRevisionModel.findOne({
    where: { id: revisionId },
    include: [...revisionIncludes, { model: RecipeModel, as: 'recipe', where: { labId } }],
    transaction,
  });
  if (!row) {
    throw new AppError(400, 'invalid_request', 'Some fields are not valid.', [
      { path: 'recipeRevisionId', message: 'No such recipe revision in this lab' },
    ]);
  }
  return row;
}
