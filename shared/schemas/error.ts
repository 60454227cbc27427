import { z } from 'zod';

/** Stable machine-readable codes; clients branch on these, never on message text. */
export const errorCodes = [
  'invalid_request',
  'malformed_json',
  'payload_too_large',
  'unsupported_media_type',
  'not_found',
  'internal',
  'unavailable',
  'unauthenticated',
  'token_expired',
  'invalid_credentials',
  'forbidden',
  'csrf_failed',
  'cross_origin',
  'rate_limited',
  'email_taken',
  'last_manager',
  'invalid_link',
  'sign_in_required',
  'wrong_account',
  'already_member',
  'invalid_transition',
  'already_exists',
  'locked',
  'checklist_required',
] as const;

export const errorCodeSchema = z.enum(errorCodes);
export type ErrorCode = z.infer<typeof errorCodeSchema>;

export const fieldErrorSchema = z.object({
  path: z.string(),
  message: z.string(),
});

export type FieldError = z.infer<typeof fieldErrorSchema>;

export const errorBodySchema = z
  .object({
    error: z.object({
      code: z.string(),
      message: z.string(),
      fields: z.array(fieldErrorSchema).optional(),
      /** Quote it when reporting a failure: it finds the request in the server's log. */
      requestId: z.string().optional(),
    }),
  })
  .meta({ id: 'Error' });

export type ErrorBody = z.infer<typeof errorBodySchema>;
