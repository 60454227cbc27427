import { z } from 'zod';
import { labParamsSchema } from './lab';
import { rankingSchema, treatmentStatsSchema } from './ranking';

/** A treatment key is `<revision id>|<substrate in lower case>`; the substrate is free text. */
export const treatmentParamsSchema = labParamsSchema.extend({
  key: z.string().min(1, 'Unknown treatment').max(200, 'Unknown treatment'),
});

const num = z.number().nullable();
const specimenOutcomeSchema = z.object({
  code: z.string(),
  charLengthMm: num,
  afterflameS: num,
  /** False when the flame was still going when timing ended: afterflameS is a lower bound. */
  afterflameComplete: z.boolean(),
  afterglowS: num,
  massLossPct: num,
  flamingDrips: z.boolean().nullable(),
  burnedToClamp: z.boolean(),
});

export const treatmentPairSchema = z.object({
  pairId: z.uuid(),
  heldAt: z.iso.datetime(),
  batchCode: z.string(),
  addOnPct: num,
  control: specimenOutcomeSchema,
  treated: specimenOutcomeSchema,
});
export type TreatmentPairOutput = z.infer<typeof treatmentPairSchema>;

export const treatmentDetailSchema = z
  .object({
    treatment: treatmentStatsSchema,
    profile: rankingSchema.shape.profile,
    onlySignedOff: z.boolean(),
    /** Oldest first. */
    pairs: z.array(treatmentPairSchema),
  })
  .meta({ id: 'TreatmentDetail' });
export type TreatmentDetailOutput = z.infer<typeof treatmentDetailSchema>;
