import { z } from 'zod';

export const auditActions = [
  'sign_in',
  'sign_in_failed',
  'sign_out',
  'sign_out_everywhere',
  'password_changed',
  'password_reset_requested',
  'password_reset',
  'lab_created',
  'invitation_sent',
  'invitation_revoked',
  'invitation_accepted',
  'role_changed',
  'member_removed',
  'checklist_completed',
  'pair_submitted',
  'pair_signed_off',
  'pair_returned',
  'measurement_corrected',
  'pairs_imported',
  'pair_imported',
] as const;
export const auditActionSchema = z.enum(auditActions);
export type AuditAction = z.infer<typeof auditActionSchema>;

const person = z.object({ id: z.uuid(), displayName: z.string(), email: z.string() }).nullable();

export const auditEventSchema = z
  .object({
    id: z.string(),
    at: z.iso.datetime(),
    action: auditActionSchema,
    actor: person,
    target: person,
    ip: z.string().nullable(),
    detail: z.record(z.string(), z.unknown()),
  })
  .meta({ id: 'AuditEvent' });
export type AuditEvent = z.infer<typeof auditEventSchema>;

export const auditQuerySchema = z.object({
  page: z.coerce.number().int().min(1).max(100_000).default(1),
  pageSize: z.coerce.number().int().min(1).max(100).default(25),
});

export const auditPageSchema = z
  .object({
    events: z.array(auditEventSchema),
    page: z.number().int(),
    pageSize: z.number().int(),
    total: z.number().int(),
  })
  .meta({ id: 'AuditPage' });
export type AuditPage = z.infer<typeof auditPageSchema>;
