import { z } from 'zod';
import { batchStatuses } from '../terms/batch';

export * from '../terms/batch';

import { ingredientInputSchema, temperatureCSchema } from './recipe';

const bigEnough = (what: string) =>
  z
    .number({ error: `Enter ${what}` })
    .positive(`${what} must be more than 0`)
    .max(10_000_000, `${what} is too large`);

export const batchTargetSchema = z.discriminatedUnion(
  'basis',
  [
    z.object({ basis: z.literal('solution_mass'), grams: bigEnough('the mass of solution') }),
    z.object({ basis: z.literal('water_mass'), grams: bigEnough('the mass of water') }),
    z.object({ basis: z.literal('water_volume'), millilitres: bigEnough('the volume of water') }),
  ],
  { error: 'Give the batch size as a mass of solution, a mass of water or a volume of water' },
);
export type BatchTargetInput = z.infer<typeof batchTargetSchema>;

/** Plan a batch without saving: from a recipe revision, or from ingredients given inline. */
export const batchPlanRequestSchema = z
  .object({
    recipeRevisionId: z.uuid().optional(),
    ingredients: z.array(ingredientInputSchema).min(1).max(12).optional(),
    waterParts: z.number().positive().optional(),
    mixingTempC: temperatureCSchema.optional(),
    storageTempC: temperatureCSchema,
    target: batchTargetSchema,
  })
  .superRefine((v, ctx) => {
    if (Boolean(v.recipeRevisionId) === Boolean(v.ingredients)) {
      ctx.addIssue({
        code: 'custom',
        path: ['recipeRevisionId'],
        message: 'Give either a recipe revision or ingredients, not both',
      });
    }
    if (v.ingredients && v.mixingTempC === undefined) {
      ctx.addIssue({
        code: 'custom',
        path: ['mixingTempC'],
        message: 'Give the mixing temperature',
      });
    }
  })
  .meta({ id: 'BatchPlanRequest' });
export type BatchPlanRequest = z.infer<typeof batchPlanRequestSchema>;

const thresholdSchema = z.object({ kind: z.string(), tempC: z.number().optional() });
const saturationSchema = z.object({
  status: z.enum(['ok', 'near', 'supersaturated', 'outside_data_range', 'no_data']),
  ratio: z.number().optional(),
  solubilityGPer100gWater: z.number().optional(),
});

export const batchPlanSchema = z
  .object({
    waterMassG: z.number(),
    waterVolumeMl: z.number(),
    solutionMassG: z.number(),
    ingredients: z.array(
      z.object({
        key: z.string(),
        name: z.string(),
        chemicalId: z.uuid().optional(),
        gPer100gWater: z.number(),
        massG: z.number(),
        massPercentOfSolution: z.number(),
        saturation: z.object({ mixing: saturationSchema, storage: saturationSchema }),
        crystallisesBelow: thresholdSchema,
      }),
    ),
    totalSolidsPercent: z.number(),
    boronPercent: z.number(),
    boricAcidEquivalentG: z.number(),
    b2o3EquivalentG: z.number(),
    combinedBorate: z
      .object({
        boraxShare: z.number(),
        solidsGPer100gWater: z.number(),
        limitGPer100gWater: z.number(),
        ratio: z.number(),
        note: z.string(),
      })
      .nullable(),
    warnings: z.array(
      z.object({ code: z.string(), message: z.string(), ingredientKey: z.string().optional() }),
    ),
    assumptions: z.array(z.string()),
  })
  .meta({ id: 'BatchPlan' });
export type BatchPlanOutput = z.infer<typeof batchPlanSchema>;

export const batchStatusSchema = z.enum(batchStatuses);

export const weighInInputSchema = z.object({
  chemicalId: z.uuid('Choose a chemical'),
  weighedG: bigEnough('the weighed mass'),
  lot: z.string().trim().max(80).optional(),
});

export const createBatchSchema = z
  .object({
    clientId: z.uuid(),
    recipeRevisionId: z.uuid('Choose a recipe'),
    target: batchTargetSchema,
    storageTempC: temperatureCSchema,
    waterTempC: temperatureCSchema.optional(),
    ph: z.number().min(0).max(14).optional(),
    densityGMl: z.number().min(0.5).max(3).optional(),
    weighIns: z.array(weighInInputSchema).min(1).max(12),
    cautionsAcknowledged: z.literal(true, 'Read the cautions and tick that you have'),
    notes: z.string().trim().max(4000).optional(),
  })
  .meta({ id: 'CreateBatch' });
export type CreateBatchInput = z.infer<typeof createBatchSchema>;

export const updateBatchSchema = z
  .object({
    status: batchStatusSchema.optional(),
    discardReason: z.string().trim().min(3, 'Say why the batch was discarded').max(500).optional(),
    startSoak: z.literal(true).optional(),
    notes: z.string().trim().max(4000).optional(),
  })
  .refine((v) => v.status !== 'discarded' || v.discardReason, {
    path: ['discardReason'],
    message: 'Say why the batch was discarded',
  })
  .meta({ id: 'UpdateBatch' });

export const specimenInputSchema = z
  .object({
    clientId: z.uuid(),
    code: z
      .string({ error: 'Give the specimen a code' })
      .trim()
      .min(1, 'Give the specimen a code')
      .max(40),
    substrate: z.string().trim().min(1).max(80),
    lengthMm: z.number().positive().max(10_000).optional(),
    widthMm: z.number().positive().max(10_000).optional(),
    thicknessMm: z.number().positive().max(1000).optional(),
    dryMassBeforeG: bigEnough('the dry mass before treatment'),
    wetMassG: bigEnough('the wet mass').optional(),
    dryMassAfterG: bigEnough('the dry mass after drying').optional(),
    notes: z.string().trim().max(1000).optional(),
  })
  .meta({ id: 'SpecimenInput' });
export type SpecimenInput = z.infer<typeof specimenInputSchema>;

export const updateSpecimenSchema = z
  .object({
    wetMassG: bigEnough('the wet mass').optional(),
    dryMassAfterG: bigEnough('the dry mass after drying').optional(),
    notes: z.string().trim().max(1000).optional(),
  })
  .meta({ id: 'UpdateSpecimen' });

export const specimenSchema = z
  .object({
    id: z.uuid(),
    code: z.string(),
    substrate: z.string(),
    batchId: z.uuid().nullable(),
    lengthMm: z.number().nullable(),
    widthMm: z.number().nullable(),
    thicknessMm: z.number().nullable(),
    dryMassBeforeG: z.number(),
    wetMassG: z.number().nullable(),
    dryMassAfterG: z.number().nullable(),
    /** Dry mass gained, % of the untreated dry mass. */
    addOnPct: z.number().nullable(),
    /** Solution taken up while soaking, % of the untreated dry mass. */
    pickUpPct: z.number().nullable(),
    notes: z.string().nullable(),
    createdAt: z.iso.datetime(),
  })
  .meta({ id: 'Specimen' });
export type Specimen = z.infer<typeof specimenSchema>;

export const weighInSchema = z.object({
  chemicalId: z.uuid(),
  name: z.string(),
  targetG: z.number(),
  weighedG: z.number(),
  deviationPct: z.number(),
  flagged: z.boolean(),
  lot: z.string().nullable(),
});

export const batchSchema = z
  .object({
    id: z.uuid(),
    code: z.string(),
    status: batchStatusSchema,
    recipe: z.object({
      id: z.uuid(),
      name: z.string(),
      revisionId: z.uuid(),
      revisionNumber: z.number().int(),
    }),
    operator: z.string().nullable(),
    preparedAt: z.iso.datetime(),
    target: batchTargetSchema,
    storageTempC: z.number(),
    waterTempC: z.number().nullable(),
    ph: z.number().nullable(),
    densityGMl: z.number().nullable(),
    tolerancePct: z.number(),
    weighIns: z.array(weighInSchema),
    anyOutOfTolerance: z.boolean(),
    plan: batchPlanSchema,
    soakStartedAt: z.iso.datetime().nullable(),
    soakEndsAt: z.iso.datetime().nullable(),
    dryingReadyAt: z.iso.datetime().nullable(),
    discardReason: z.string().nullable(),
    notes: z.string().nullable(),
    specimens: z.array(specimenSchema),
  })
  .meta({ id: 'Batch' });
export type Batch = z.infer<typeof batchSchema>;

export const batchListSchema = z
  .object({ batches: z.array(batchSchema.omit({ plan: true, specimens: true })) })
  .meta({ id: 'BatchList' });
export const batchParamsSchema = z.object({ labId: z.uuid(), batchId: z.uuid('Unknown batch') });
export const specimenParamsSchema = batchParamsSchema.extend({
  specimenId: z.uuid('Unknown specimen'),
});
export const batchQuerySchema = z.object({ status: batchStatusSchema.optional() });

export const labSettingsSchema = z
  .object({ weighTolerancePct: z.number().min(0.1, 'At least 0.1 %').max(25, 'At most 25 %') })
  .meta({ id: 'LabSettings' });
