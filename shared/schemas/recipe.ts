import { z } from 'zod';
import { amountUnits, dryingMethods, substrates } from '../terms/recipe';

export * from '../terms/recipe';

export const substrateSchema = z.enum(substrates, 'Choose a substrate');
export const amountUnitSchema = z.enum(amountUnits, 'Choose a unit');

export const dryingMethodSchema = z.enum(dryingMethods, 'Choose a drying method');

const positive = (what: string) =>
  z
    .number({ error: `Enter ${what}` })
    .refine(Number.isFinite, `Enter ${what}`)
    .positive(`${what[0]!.toUpperCase()}${what.slice(1)} must be more than 0`);

export const temperatureCSchema = z
  .number({ error: 'Enter a temperature' })
  .min(0, 'Below 0 °C the water freezes: use a temperature of 0 °C or more')
  .max(100, 'Above 100 °C the water boils: use 100 °C or less');

export const ingredientInputSchema = z.object({
  chemicalId: z.uuid('Choose a chemical'),
  amount: positive('an amount').pipe(z.number().max(100_000, 'That amount is too large')),
  unit: amountUnitSchema,
});
export type IngredientInput = z.infer<typeof ingredientInputSchema>;

export const recipeInputSchema = z
  .object({
    name: z
      .string({ error: 'Name the recipe' })
      .trim()
      .min(2, 'Use at least 2 characters')
      .max(120),
    substrate: substrateSchema,
    ingredients: z
      .array(ingredientInputSchema)
      .min(1, 'Add at least one chemical')
      .max(12, 'At most 12 chemicals'),
    waterParts: positive('the parts of water').optional(),
    mixingTempC: temperatureCSchema,
    soakMinutes: positive('a soak time').pipe(z.number().max(14 * 24 * 60, 'At most 14 days')),
    drainMinutes: z
      .number()
      .min(0)
      .max(24 * 60)
      .optional(),
    dryingMethod: dryingMethodSchema,
    dryingMinutes: z
      .number()
      .min(0)
      .max(30 * 24 * 60)
      .optional(),
    dryingTempC: z.number().min(0).max(250).optional(),
    dryingRhPct: z.number().min(0).max(100).optional(),
    conditioning: z.string().trim().max(500).optional(),
    notes: z.string().trim().max(4000).optional(),
  })
  .superRefine((v, ctx) => {
    const ids = v.ingredients.map((i) => i.chemicalId);
    ids.forEach((id, index) => {
      if (ids.indexOf(id) !== index) {
        ctx.addIssue({
          code: 'custom',
          path: ['ingredients', index, 'chemicalId'],
          message: 'This chemical is already in the recipe',
        });
      }
    });
    if (v.ingredients.some((i) => i.unit === 'parts') && v.waterParts === undefined) {
      ctx.addIssue({
        code: 'custom',
        path: ['waterParts'],
        message: 'With parts by mass, give the parts of water too',
      });
    }
  })
  .meta({ id: 'RecipeInput' });
export type RecipeInput = z.infer<typeof recipeInputSchema>;

export const ingredientSchema = z.object({
  chemicalId: z.uuid(),
  chemicalName: z.string(),
  amount: z.number(),
  unit: amountUnitSchema,
  gPer100gWater: z.number(),
});

export const revisionSchema = z
  .object({
    id: z.uuid(),
    number: z.number().int(),
    createdAt: z.iso.datetime(),
    createdBy: z.string().nullable(),
    batchCount: z.number().int(),
    ingredients: z.array(ingredientSchema),
    waterParts: z.number().nullable(),
    mixingTempC: z.number(),
    soakMinutes: z.number(),
    drainMinutes: z.number().nullable(),
    dryingMethod: dryingMethodSchema,
    dryingMinutes: z.number().nullable(),
    dryingTempC: z.number().nullable(),
    dryingRhPct: z.number().nullable(),
    conditioning: z.string().nullable(),
    notes: z.string().nullable(),
  })
  .meta({ id: 'RecipeRevision' });
export type Revision = z.infer<typeof revisionSchema>;

export const recipeSchema = z
  .object({
    id: z.uuid(),
    name: z.string(),
    substrate: substrateSchema,
    updatedAt: z.iso.datetime(),
    revisionCount: z.number().int(),
    current: revisionSchema,
  })
  .meta({ id: 'Recipe' });
export type Recipe = z.infer<typeof recipeSchema>;

export const recipeListSchema = z
  .object({ recipes: z.array(recipeSchema) })
  .meta({ id: 'RecipeList' });
export const revisionListSchema = z
  .object({ revisions: z.array(revisionSchema) })
  .meta({ id: 'RevisionList' });

export const recipeQuerySchema = z.object({
  q: z.string().trim().max(120).optional(),
  substrate: substrateSchema.optional(),
});

export const recipeParamsSchema = z.object({ labId: z.uuid(), recipeId: z.uuid('Unknown recipe') });
