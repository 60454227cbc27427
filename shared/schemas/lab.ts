import { z } from 'zod';
import { roleSchema } from './roles';

export const labNameSchema = z
  .string({ error: 'Enter a name for the lab' })
  .trim()
  .min(2, 'Use at least 2 characters')
  .max(120, 'Use at most 120 characters');

export const labSchema = z
  .object({
    id: z.uuid(),
    name: labNameSchema,
    createdAt: z.iso.datetime(),
    role: roleSchema,
    weighTolerancePct: z.number(),
  })
  .meta({ id: 'Lab' });
export type Lab = z.infer<typeof labSchema>;

export const createLabSchema = z.object({ name: labNameSchema }).meta({ id: 'CreateLab' });

export const labParamsSchema = z.object({ labId: z.uuid('Unknown lab') });

export const memberSchema = z
  .object({
    userId: z.uuid(),
    email: z.string(),
    displayName: z.string(),
    role: roleSchema,
    joinedAt: z.iso.datetime(),
  })
  .meta({ id: 'Member' });
export type Member = z.infer<typeof memberSchema>;

export const memberListSchema = z
  .object({ members: z.array(memberSchema) })
  .meta({ id: 'MemberList' });

export const memberParamsSchema = labParamsSchema.extend({ userId: z.uuid('Unknown member') });
export const updateMemberSchema = z.object({ role: roleSchema }).meta({ id: 'UpdateMember' });
