import { z } from 'zod';
import { emailSchema } from './auth';
import { roleSchema } from './roles';

export const INVITATION_TTL_DAYS = 7;

export const createInvitationSchema = z
  .object({ email: emailSchema, role: roleSchema })
  .meta({ id: 'CreateInvitation' });
export type CreateInvitationInput = z.infer<typeof createInvitationSchema>;

export const invitationStatusSchema = z.enum(['pending', 'accepted', 'expired', 'revoked']);

export const invitationSchema = z
  .object({
    id: z.uuid(),
    email: z.string(),
    role: roleSchema,
    invitedBy: z.string().nullable(),
    createdAt: z.iso.datetime(),
    expiresAt: z.iso.datetime(),
    status: invitationStatusSchema,
  })
  .meta({ id: 'Invitation' });
export type Invitation = z.infer<typeof invitationSchema>;

export const invitationListSchema = z
  .object({ invitations: z.array(invitationSchema) })
  .meta({ id: 'InvitationList' });

export const invitationParamsSchema = z.object({
  labId: z.uuid('Unknown lab'),
  invitationId: z.uuid('Unknown invitation'),
});

export const invitationPreviewSchema = z
  .object({
    labName: z.string(),
    email: z.string(),
    role: roleSchema,
    inviterName: z.string().nullable(),
    expiresAt: z.iso.datetime(),
    accountExists: z.boolean(),
  })
  .meta({ id: 'InvitationPreview' });
export type InvitationPreview = z.infer<typeof invitationPreviewSchema>;
