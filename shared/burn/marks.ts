import { z } from 'zod';
import { markKinds } from '../terms/marks';

export * from '../terms/marks';

export const markSchema = z
  .object({
    id: z.uuid({ error: 'A mark needs a valid id' }),
    kind: z.enum(markKinds, { error: 'Unknown kind of mark' }),
    // zod 4 numbers are finite already: Infinity and NaN fail here.
    atMs: z
      .number({ error: 'A mark needs a time in milliseconds' })
      .min(0, 'A mark cannot be timed before the session started'),
    undoes: z.uuid({ error: 'An undo must name the mark it cancels by its id' }).optional(),
  })
  .superRefine((mark, ctx) => {
    if (mark.kind === 'undo' && mark.undoes === undefined) {
      ctx.addIssue({
        code: 'custom',
        path: ['undoes'],
        message: 'An undo must name the mark it cancels',
      });
    }
    if (mark.kind !== 'undo' && mark.undoes !== undefined) {
      ctx.addIssue({
        code: 'custom',
        path: ['undoes'],
        message: 'Only an undo names another mark',
      });
    }
  });
