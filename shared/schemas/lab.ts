import { z } from 'zod';

export const labNameSchema = z.string().trim().min(2, 'Use at least 2 characters').max(120);

export const labSchema = z.object({
  id: z.uuid(),
  name: labNameSchema,
  createdAt: z.iso.datetime(),
});

export type Lab = z.infer<typeof labSchema>;
