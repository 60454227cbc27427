import { z } from 'zod';
import { criteriaProfileSchema, ruleSchema } from '../criteria/types';

export const criteriaProfileInputSchema = criteriaProfileSchema.meta({
  id: 'CriteriaProfileInput',
});

export const criteriaProfileOutputSchema = z
  .object({
    id: z.uuid(),
    name: z.string(),
    description: z.string().nullable(),
    source: z.string().nullable(),
    presetKey: z.string().nullable(),
    minSpecimens: z.number().int(),
    exposureS: z.number().nullable(),
    rules: z.array(ruleSchema),
    updatedAt: z.iso.datetime(),
  })
  .meta({ id: 'CriteriaProfile' });
export type CriteriaProfileOutput = z.infer<typeof criteriaProfileOutputSchema>;

export const criteriaProfileListSchema = z
  .object({ profiles: z.array(criteriaProfileOutputSchema) })
  .meta({ id: 'CriteriaProfileList' });

export const copyPresetSchema = z
  .object({ presetKey: z.string().min(1).max(80) })
  .meta({ id: 'CopyPreset' });
export const profileParamsSchema = z.object({
  labId: z.uuid(),
  profileId: z.uuid('Unknown criteria profile'),
});

/** The built-in criteria presets a lab can start a profile from (GET criteria-presets). */
export const criteriaPresetListSchema = z
  .object({
    presets: z.array(
      z.object({
        key: z.string(),
        name: z.string(),
        source: z.string().nullable(),
        caution: z.string(),
        description: z.string().nullable(),
      }),
    ),
  })
  .meta({ id: 'CriteriaPresetList' });
