import { z } from 'zod';

export const healthSchema = z
  .object({
    status: z.enum(['ok', 'degraded']),
    db: z.enum(['ok', 'down']),
    version: z.string(),
  })
  .meta({ id: 'Health' });

export type Health = z.infer<typeof healthSchema>;
