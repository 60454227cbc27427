import { z } from 'zod';
import { ruleKinds, ruleNeedsLimit, ruleScopes } from '../terms/criteria';

export * from '../terms/criteria';

export const ruleSchema = z
  .object({
    kind: z.enum(ruleKinds, 'Choose what the rule checks'),
    limit: z
      .number({ error: 'Enter a limit' })
      .refine(Number.isFinite, 'Enter a limit')
      .min(0, 'A limit cannot be below 0')
      .max(100_000, 'That limit is too large')
      .optional(),
    appliesTo: z.enum(ruleScopes, 'Choose each specimen or the average'),
  })
  .superRefine((rule, ctx) => {
    if (ruleNeedsLimit(rule.kind)) {
      if (rule.limit === undefined) {
        ctx.addIssue({ code: 'custom', path: ['limit'], message: 'Enter a limit' });
      } else if (rule.kind === 'max_mass_loss_pct' && rule.limit > 100) {
        ctx.addIssue({ code: 'custom', path: ['limit'], message: 'Mass loss is at most 100 %' });
      }
      return;
    }
    // A limit or an average would suggest a meaning the yes/no rules do not have.
    if (rule.limit !== undefined) {
      ctx.addIssue({ code: 'custom', path: ['limit'], message: 'This rule takes no limit' });
    }
    if (rule.appliesTo !== 'each') {
      ctx.addIssue({
        code: 'custom',
        path: ['appliesTo'],
        message: 'This rule applies to each specimen',
      });
    }
  });
export type Rule = z.infer<typeof ruleSchema>;

export const criteriaProfileSchema = z.object({
  name: z
    .string({ error: 'Name the profile' })
    .trim()
    .min(2, 'Name the profile')
    .max(120, 'At most 120 characters'),
  description: z.string().trim().max(4000).optional(),
  /** The standard and its edition the profile follows. */
  source: z.string().trim().max(300).optional(),
  minSpecimens: z
    .number({ error: 'Enter a number of specimens' })
    .int('A whole number of specimens')
    .min(1, 'At least 1 specimen')
    .max(100, 'At most 100 specimens'),
  /** The exposure the profile assumes; shown to the user, not checked by the judge. */
  exposureS: z.number().positive('More than 0 seconds').max(600, 'At most 10 minutes').optional(),
  rules: z.array(ruleSchema).min(1, 'Add at least one rule').max(12, 'At most 12 rules'),
});
export type CriteriaProfileInput = z.input<typeof criteriaProfileSchema>;
export type CriteriaProfile = z.infer<typeof criteriaProfileSchema>;
