import { z } from 'zod';
import { labNameSchema } from './lab';
import { roleSchema, unitSystemSchema } from './roles';

export const PASSWORD_MIN_LENGTH = 10;

export const emailSchema = z
  .string({ error: 'Enter your e-mail address' })
  .trim()
  .toLowerCase()
  .max(254, 'That e-mail address is too long')
  .pipe(z.email('Enter a valid e-mail address'));

export const newPasswordSchema = z
  .string({ error: 'Choose a password' })
  .min(PASSWORD_MIN_LENGTH, `Use at least ${PASSWORD_MIN_LENGTH} characters`)
  .max(200, 'Use at most 200 characters');

const displayNameSchema = z
  .string({ error: 'Enter your name' })
  .trim()
  .min(1, 'Enter your name')
  .max(80, 'Use at most 80 characters');

/** The password may not be the e-mail address (compared without case or spaces). */
export function passwordIsEmail(password: string, email: string): boolean {
  return password.trim().toLowerCase() === email.trim().toLowerCase();
}

const notEmail = { message: 'Your password must not be your e-mail address', path: ['password'] };

export const signUpSchema = z
  .object({
    email: emailSchema,
    password: newPasswordSchema,
    displayName: displayNameSchema,
    labName: labNameSchema,
  })
  .refine((v) => !passwordIsEmail(v.password, v.email), notEmail)
  .meta({ id: 'SignUp' });
export type SignUpInput = z.infer<typeof signUpSchema>;

export const tokenDeliverySchema = z.enum(['cookie', 'body']).default('cookie');

export const signInSchema = z
  .object({
    email: emailSchema,
    password: z.string({ error: 'Enter your password' }).min(1, 'Enter your password').max(200),
    tokenDelivery: tokenDeliverySchema,
  })
  .meta({ id: 'SignIn' });
export type SignInInput = z.input<typeof signInSchema>;

export const refreshSchema = z
  .object({
    refreshToken: z.string().min(20).max(200).optional(),
    tokenDelivery: tokenDeliverySchema,
  })
  .meta({ id: 'Refresh' });

export const changePasswordSchema = z
  .object({
    currentPassword: z
      .string({ error: 'Enter your current password' })
      .min(1, 'Enter your current password')
      .max(200),
    newPassword: newPasswordSchema,
  })
  .meta({ id: 'ChangePassword' });
export type ChangePasswordInput = z.infer<typeof changePasswordSchema>;

export const resetRequestSchema = z
  .object({ email: emailSchema })
  .meta({ id: 'PasswordResetRequest' });
export type ResetRequestInput = z.infer<typeof resetRequestSchema>;

export const tokenSchema = z.string().min(20, 'This link is not complete').max(200);

export const resetConfirmSchema = z
  .object({ token: tokenSchema, newPassword: newPasswordSchema })
  .meta({ id: 'PasswordResetConfirm' });
export type ResetConfirmInput = z.infer<typeof resetConfirmSchema>;

export const acceptInvitationSchema = z
  .object({ displayName: displayNameSchema.optional(), password: newPasswordSchema.optional() })
  .meta({ id: 'AcceptInvitation' });
export type AcceptInvitationInput = z.infer<typeof acceptInvitationSchema>;

export const userSchema = z.object({
  id: z.uuid(),
  email: z.string(),
  displayName: z.string(),
  units: unitSystemSchema,
});
export type User = z.infer<typeof userSchema>;

export const labMembershipSchema = z.object({ id: z.uuid(), name: z.string(), role: roleSchema });
export type LabMembership = z.infer<typeof labMembershipSchema>;

export const meSchema = z
  .object({ user: userSchema, labs: z.array(labMembershipSchema), csrfToken: z.string() })
  .meta({ id: 'Me' });
export type Me = z.infer<typeof meSchema>;

/** The web app's first question: who is signed in here, if anyone (never a 401). */
export const sessionStateSchema = z
  .object({ me: meSchema.nullable() })
  .meta({ id: 'SessionState' });

export const signedInSchema = z
  .object({
    me: meSchema,
    /** Only with tokenDelivery "body" (API clients); the web gets httpOnly cookies. */
    accessToken: z.string().optional(),
    refreshToken: z.string().optional(),
  })
  .meta({ id: 'SignedIn' });
export type SignedIn = z.infer<typeof signedInSchema>;

export const updateMeSchema = z
  .object({ displayName: displayNameSchema.optional(), units: unitSystemSchema.optional() })
  .meta({ id: 'UpdateMe' });
export type UpdateMeInput = z.infer<typeof updateMeSchema>;
