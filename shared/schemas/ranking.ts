import { z } from 'zod';
import { igniters, orientations } from './burn';
import { substrateSchema } from './recipe';

export const rankingQuerySchema = z.object({
  substrate: substrateSchema.optional(),
  from: z.iso.date('Use a date like 2026-12-01').optional(),
  to: z.iso.date('Use a date like 2026-12-31').optional(),
  igniter: z.enum(igniters).optional(),
  exposureS: z.coerce.number().positive().max(600).optional(),
  orientation: z.enum(orientations).optional(),
  sort: z.enum(['treated_char', 'reduction']).default('treated_char'),
  /** A preset's key, e.g. preset:nfpa-705 */
  profile: z.string().max(80).optional(),
  /** The reduction in char length (mm) the sample-size helper should detect. */
  detectMm: z.coerce.number().positive().max(5000).optional(),
  /** Also count tests submitted but not yet signed off. */
  unreviewed: z
    .enum(['true', 'false'])
    .transform((v) => v === 'true')
    .optional(),
});
export type RankingQuery = z.infer<typeof rankingQuerySchema>;

const num = z.number().nullable();
export const treatmentStatsSchema = z.object({
  key: z.string(),
  recipeId: z.uuid(),
  recipeName: z.string(),
  revisionId: z.uuid(),
  revisionNumber: z.number().int(),
  substrate: z.string(),
  pairs: z.number().int(),
  treatedChar: z.object({ mean: num, median: num, sd: num }),
  controlChar: z.object({ mean: num, median: num, sd: num }),
  difference: z.object({
    mean: num,
    ci95: z.tuple([z.number(), z.number()]).nullable(),
    reductionPct: num,
    pairedP: num,
    wilcoxonP: num,
    wilcoxonMethod: z.enum(['exact', 'normal']).nullable(),
    cohenDz: num,
    sd: num,
  }),
  selfExtinguish: z.object({ rate: num, lo: num, hi: num, count: z.number().int() }),
  afterflameMedianS: num,
  afterglowMedianS: num,
  massLossMeanPct: num,
  addOnMeanPct: num,
  pairsNeeded: num,
  verdict: z
    .object({ pass: z.boolean(), failed: z.array(z.string()), notEnough: z.string().optional() })
    .nullable(),
  rank: z.number().int().nullable(),
});
export type TreatmentStatsOutput = z.infer<typeof treatmentStatsSchema>;

export const rankingSchema = z
  .object({
    ranked: z.array(treatmentStatsSchema),
    notEnoughPairs: z.array(treatmentStatsSchema),
    leaderStatement: z.string().nullable(),
    comparisons: z.array(
      z.object({ a: z.string(), b: z.string(), p: z.number(), adjustedP: z.number() }),
    ),
    profile: z
      .object({
        key: z.string(),
        name: z.string(),
        source: z.string().nullable(),
        caution: z.string(),
      })
      .nullable(),
    pairsCounted: z.number().int(),
    onlySignedOff: z.boolean(),
  })
  .meta({ id: 'Ranking' });
export type RankingOutput = z.infer<typeof rankingSchema>;
