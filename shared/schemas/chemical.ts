import { z } from 'zod';

const solubilityPointSchema = z.object({
  tempC: z.number().min(0).max(100),
  value: z.number().positive(),
});

/** A lab's own solubility data: a table by temperature, with its basis and where it comes from. */
export const solubilityInputSchema = z
  .object({
    basis: z.enum(['g_per_100g_water', 'mass_percent']),
    points: z.array(solubilityPointSchema).min(2, 'Give at least two temperatures').max(30),
    source: z.string().trim().min(3, 'Say where the data come from').max(300),
  })
  .superRefine((v, ctx) => {
    v.points.forEach((p, i) => {
      const prev = v.points[i - 1];
      if (prev && p.tempC <= prev.tempC) {
        ctx.addIssue({
          code: 'custom',
          path: ['points', i, 'tempC'],
          message: 'List temperatures in rising order',
        });
      }
      if (v.basis === 'mass_percent' && p.value >= 100) {
        ctx.addIssue({
          code: 'custom',
          path: ['points', i, 'value'],
          message: 'A mass percent is below 100',
        });
      }
    });
  });

export const hazardSchema = z.object({
  code: z.string().trim().min(2).max(20),
  text: z.string().trim().min(2).max(300),
});

export const createChemicalSchema = z
  .object({
    name: z
      .string({ error: 'Name the chemical' })
      .trim()
      .min(2, 'Use at least 2 characters')
      .max(120),
    formula: z.string().trim().max(60).optional(),
    molarMass: z.number().positive().max(10_000).optional(),
    boronPercent: z.number().min(0).max(100).optional(),
    hazards: z.array(hazardSchema).max(20).default([]),
    notes: z.string().trim().max(2000).optional(),
    solubility: solubilityInputSchema.optional(),
  })
  .meta({ id: 'CreateChemical' });
export type CreateChemicalInput = z.input<typeof createChemicalSchema>;

export const chemicalSchema = z
  .object({
    id: z.uuid(),
    reference: z.boolean(),
    referenceKey: z.string().nullable(),
    name: z.string(),
    formula: z.string().nullable(),
    molarMass: z.number().nullable(),
    boronPercent: z.number().nullable(),
    hazards: z.array(hazardSchema),
    cautions: z.array(z.string()),
    notes: z.string().nullable(),
    solubility: z
      .object({
        kind: z.enum(['table', 'mole_fraction_fit']),
        summary: z.string(),
        source: z.string(),
        confidence: z.enum(['confirmed', 'derived', 'memory']),
        points: z.array(solubilityPointSchema.extend({ value: z.number() })).optional(),
        basis: z.string().optional(),
        solute: z.enum(['as_is', 'anhydrous']).optional(),
      })
      .nullable(),
  })
  .meta({ id: 'Chemical' });
export type Chemical = z.infer<typeof chemicalSchema>;

export const chemicalListSchema = z
  .object({ chemicals: z.array(chemicalSchema) })
  .meta({ id: 'ChemicalList' });
export const chemicalParamsSchema = z.object({
  labId: z.uuid(),
  chemicalId: z.uuid('Unknown chemical'),
});
