import { z } from 'zod';
import {
  checklistItems,
  drafts,
  igniters,
  orientations,
  pairModes,
  pairStatuses,
  type ChecklistKey,
} from '../terms/burn';
import { markKinds } from '../terms/marks';

export * from '../terms/burn';

export const checklistSchema = z.object(
  Object.fromEntries(checklistItems.map((i) => [i.key, z.boolean().optional()])) as Record<
    ChecklistKey,
    z.ZodOptional<z.ZodBoolean>
  >,
);

export const createSessionSchema = z
  .object({
    clientId: z.uuid(),
    heldAt: z.iso.datetime({ error: 'Give the date and time' }),
    place: z.string({ error: 'Say where' }).trim().min(2, 'Say where').max(200),
    secondPerson: z.string().trim().max(120).optional(),
    ambientTempC: z.number().min(-30).max(60).optional(),
    ambientRhPct: z.number().min(0).max(100).optional(),
    draft: z.enum(drafts, 'Choose the draft conditions'),
    wind: z.string().trim().max(120).optional(),
    igniter: z.enum(igniters, 'Choose the igniter'),
    igniterDetail: z.string().trim().max(120).optional(),
    exposureS: z
      .number()
      .positive('More than 0 seconds')
      .max(600, 'At most 10 minutes')
      .default(12),
    orientation: z.enum(orientations, 'Choose the orientation'),
    /** One of the lab's criteria profiles to judge this session's tests against. */
    criteriaProfileId: z.uuid('Unknown criteria profile').optional(),
    notes: z.string().trim().max(4000).optional(),
  })
  .meta({ id: 'CreateBurnSession' });
export type CreateSessionInput = z.input<typeof createSessionSchema>;

export const updateSessionSchema = z
  .object({ checklist: checklistSchema.optional(), notes: z.string().trim().max(4000).optional() })
  .meta({ id: 'UpdateBurnSession' });

export const controlSpecimenSchema = z.object({
  clientId: z.uuid(),
  code: z
    .string({ error: 'Give the control a code' })
    .trim()
    .min(1, 'Give the control a code')
    .max(40),
  substrate: z.string().trim().min(1).max(80),
  lengthMm: z.number().positive().max(10_000).optional(),
  widthMm: z.number().positive().max(10_000).optional(),
  thicknessMm: z.number().positive().max(1000).optional(),
  dryMassG: z.number().positive().max(1_000_000),
  conditioning: z.string().trim().max(300).optional(),
});

export const createPairSchema = z
  .object({
    clientId: z.uuid(),
    treatedSpecimenId: z.uuid('Choose the treated specimen'),
    control: controlSpecimenSchema,
    mode: z.enum(pairModes).default('simultaneous'),
  })
  .meta({ id: 'CreatePair' });
export type CreatePairInput = z.input<typeof createPairSchema>;

export const measurementInputSchema = z
  .object({
    charLengthMm: z.number().min(0, 'Not below 0').max(5000).optional(),
    charWidthMm: z.number().min(0).max(5000).optional(),
    massBeforeG: z.number().positive().max(1_000_000).optional(),
    massAfterG: z.number().min(0).max(1_000_000).optional(),
    flamingDrips: z.boolean().optional(),
    notes: z.string().trim().max(2000).optional(),
  })
  .refine(
    (v) =>
      v.massAfterG === undefined || v.massBeforeG === undefined || v.massAfterG <= v.massBeforeG,
    {
      path: ['massAfterG'],
      message: 'The mass after burning cannot be more than before',
    },
  )
  .meta({ id: 'MeasurementInput' });
export type MeasurementInput = z.infer<typeof measurementInputSchema>;

export const correctionSchema = z
  .object({
    specimenId: z.uuid(),
    changes: measurementInputSchema,
    reason: z
      .string({ error: 'Give a reason for the correction' })
      .trim()
      .min(5, 'Give a reason of a few words')
      .max(1000),
  })
  .meta({ id: 'Correction' });

export const returnSchema = z
  .object({
    comment: z.string({ error: 'Say what to fix' }).trim().min(3, 'Say what to fix').max(2000),
  })
  .meta({ id: 'ReturnPair' });

export const sessionParamsSchema = z.object({
  labId: z.uuid(),
  sessionId: z.uuid('Unknown session'),
});
export const pairParamsSchema = z.object({ labId: z.uuid(), pairId: z.uuid('Unknown pair') });
export const measurementParamsSchema = pairParamsSchema.extend({
  specimenId: z.uuid('Unknown specimen'),
});
export const photoParamsSchema = z.object({ labId: z.uuid(), photoId: z.uuid('Unknown photo') });
export const photoFieldsSchema = z.object({
  clientId: z.uuid(),
  specimenId: z.uuid('Unknown specimen'),
  stage: z.enum(['before', 'after'], 'Say whether the photo is from before or after the burn'),
});

export const postMarksSchema = z
  .object({
    marks: z
      .array(
        z.object({
          id: z.uuid(),
          specimenId: z.uuid(),
          kind: z.enum(markKinds),
          atMs: z.number().finite().min(0),
          undoes: z.uuid().optional(),
        }),
      )
      .min(1)
      .max(200),
  })
  .meta({ id: 'PostMarks' });
export type PostMarksInput = z.infer<typeof postMarksSchema>;

const specimenBrief = z.object({
  id: z.uuid(),
  code: z.string(),
  substrate: z.string(),
  lengthMm: z.number().nullable(),
  widthMm: z.number().nullable(),
  dryMassBeforeG: z.number(),
  addOnPct: z.number().nullable(),
  conditioning: z.string().nullable(),
  batch: z
    .object({
      id: z.uuid(),
      code: z.string(),
      recipeName: z.string(),
      revisionNumber: z.number().int(),
    })
    .nullable(),
});

export const measurementSchema = z.object({
  charLengthMm: z.number().nullable(),
  charWidthMm: z.number().nullable(),
  massBeforeG: z.number().nullable(),
  massAfterG: z.number().nullable(),
  /** Mass lost in the burn, % of the mass before it. */
  massLossPct: z.number().nullable(),
  flamingDrips: z.boolean().nullable(),
  notes: z.string().nullable(),
  updatedAt: z.iso.datetime(),
});

export const laneSchema = z.object({
  role: z.enum(['control', 'treated']),
  specimen: specimenBrief,
  marks: z.array(
    z.object({ id: z.uuid(), kind: z.string(), atMs: z.number(), undoes: z.string().optional() }),
  ),
  derived: z.object({
    state: z.string(),
    exposureMs: z.number().nullable(),
    afterflameMs: z.number().nullable(),
    afterflameComplete: z.boolean(),
    afterglowMs: z.number().nullable(),
    totalMs: z.number().nullable(),
    reignitions: z.number(),
    flamingDrips: z.number(),
    burnedToClamp: z.boolean(),
    stopped: z.boolean(),
    problems: z.array(z.string()),
  }),
  measurement: measurementSchema.nullable(),
  photos: z.array(
    z.object({
      id: z.uuid(),
      stage: z.enum(['before', 'after']),
      width: z.number(),
      height: z.number(),
    }),
  ),
});
export type Lane = z.infer<typeof laneSchema>;

export const pairSummarySchema = z.object({
  id: z.uuid(),
  status: z.enum(pairStatuses),
  mode: z.enum(pairModes),
  controlCode: z.string(),
  treatedCode: z.string(),
  recipeName: z.string().nullable(),
  createdAt: z.iso.datetime(),
});

export const sessionSchema = z
  .object({
    id: z.uuid(),
    heldAt: z.iso.datetime(),
    place: z.string(),
    operator: z.string().nullable(),
    secondPerson: z.string().nullable(),
    ambientTempC: z.number().nullable(),
    ambientRhPct: z.number().nullable(),
    draft: z.enum(drafts),
    wind: z.string().nullable(),
    igniter: z.enum(igniters),
    igniterDetail: z.string().nullable(),
    exposureS: z.number(),
    orientation: z.enum(orientations),
    checklist: z.record(z.string(), z.boolean()),
    checklistCompletedAt: z.iso.datetime().nullable(),
    criteriaProfile: z.object({ id: z.uuid(), name: z.string() }).nullable(),
    notes: z.string().nullable(),
    pairs: z.array(pairSummarySchema),
  })
  .meta({ id: 'BurnSession' });
export type Session = z.infer<typeof sessionSchema>;
export const sessionListSchema = z
  .object({ sessions: z.array(sessionSchema) })
  .meta({ id: 'BurnSessionList' });

export const historyEntrySchema = z.object({
  at: z.iso.datetime(),
  who: z.string().nullable(),
  action: z.string(),
  detail: z.record(z.string(), z.unknown()),
});

export const pairSchema = z
  .object({
    id: z.uuid(),
    sessionId: z.uuid(),
    status: z.enum(pairStatuses),
    mode: z.enum(pairModes),
    exposureS: z.number(),
    checklistComplete: z.boolean(),
    reviewComment: z.string().nullable(),
    submittedAt: z.iso.datetime().nullable(),
    signedOffAt: z.iso.datetime().nullable(),
    lanes: z.array(laneSchema),
    history: z.array(historyEntrySchema),
  })
  .meta({ id: 'BurnPair' });
export type Pair = z.infer<typeof pairSchema>;
export const reviewQueueSchema = z
  .object({
    pairs: z.array(
      pairSummarySchema.extend({ sessionId: z.uuid(), submittedAt: z.iso.datetime().nullable() }),
    ),
  })
  .meta({ id: 'ReviewQueue' });

export const unburnedSchema = z
  .object({
    specimens: z.array(
      z.object({
        id: z.uuid(),
        code: z.string(),
        substrate: z.string(),
        addOnPct: z.number().nullable(),
        lengthMm: z.number().nullable(),
        widthMm: z.number().nullable(),
        dryMassBeforeG: z.number(),
        batchCode: z.string(),
        recipeName: z.string(),
      }),
    ),
  })
  .meta({ id: 'UnburnedSpecimens' });
