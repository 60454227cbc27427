import { z } from 'zod';
import { newPasswordSchema, signedInSchema } from '../shared/schemas/auth';
import { createChemicalSchema, type CreateChemicalInput } from '../shared/schemas/chemical';

// Schemas only the app uses: form shapes that differ from a request body, and answers the shared
// schemas do not name. Reached only through the schema kit (components/schema-kit.ts).

/** An answer whose body the app does not read (sign-out, deletes). */
export const ignoredAnswerSchema = z.unknown();

/** Accepting an invitation: a newcomer is signed in; a member already signed in gets the lab. */
export const invitationAcceptedSchema = z.union([signedInSchema, z.object({ labId: z.uuid() })]);

export const newcomerFormSchema = z.object({
  displayName: z.string().trim().min(1, 'Enter your name').max(80),
  password: newPasswordSchema,
});

export const resetPasswordFormSchema = z.object({ newPassword: newPasswordSchema });

const blankToUndefined = (v: unknown) => {
  if (typeof v !== 'string') return v;
  const t = v.trim();
  return t === '' ? undefined : t;
};
const numberText = (v: unknown) => {
  const t = blankToUndefined(v);
  return typeof t === 'string' ? t.replace(',', '.') : t;
};
const optionalText = (max: number) =>
  z.preprocess(
    blankToUndefined,
    z
      .string()
      .min(2, 'Use at least 2 characters')
      .max(max, `Use at most ${max} characters`)
      .optional(),
  );

export const addChemicalFormSchema = z
  .object({
    name: createChemicalSchema.shape.name,
    formula: z.preprocess(
      blankToUndefined,
      z.string().max(60, 'Use at most 60 characters').optional(),
    ),
    molarMass: z.preprocess(
      numberText,
      z.coerce
        .number({ error: 'Enter the molar mass as a number, e.g. 132.06' })
        .positive('The molar mass must be more than 0')
        .max(10_000, 'That molar mass is too large')
        .optional(),
    ),
    boronPercent: z.preprocess(
      numberText,
      z.coerce
        .number({ error: 'Enter the boron content as a number, e.g. 11.3' })
        .min(0, 'Use a percentage from 0 to 100')
        .max(100, 'Use a percentage from 0 to 100')
        .optional(),
    ),
    hazardCode: optionalText(20),
    hazardText: optionalText(300),
    solubilityLines: z.string().max(2000),
    solubilitySource: optionalText(300),
  })
  .superRefine((v, ctx) => {
    const lines = v.solubilityLines
      .split('\n')
      .map((l) => l.trim())
      .filter(Boolean);
    lines.forEach((line) => {
      const parts = line
        .replace(/,/g, '.')
        .split(/[\s;:]+/)
        .map(Number);
      if (parts.length !== 2 || parts.some((n) => !Number.isFinite(n))) {
        ctx.addIssue({
          code: 'custom',
          path: ['solubilityLines'],
          message: `Write "${line}" as a temperature and a value, e.g. 20 4.87`,
        });
      }
    });
    const temps = lines.map((l) => Number(l.replace(/,/g, '.').split(/[\s;:]+/)[0]));
    if (temps.some((t, i) => i > 0 && !(t > temps[i - 1]!))) {
      ctx.addIssue({
        code: 'custom',
        path: ['solubilityLines'],
        message: 'List the temperatures in rising order',
      });
    }
    if (lines.length === 1) {
      ctx.addIssue({
        code: 'custom',
        path: ['solubilityLines'],
        message: 'Give at least two temperatures',
      });
    }
    if (lines.length && !v.solubilitySource) {
      ctx.addIssue({
        code: 'custom',
        path: ['solubilitySource'],
        message: 'Say where the data come from',
      });
    }
    if (v.hazardCode && !v.hazardText) {
      ctx.addIssue({ code: 'custom', path: ['hazardText'], message: 'Say what the hazard is' });
    }
    if (v.hazardText && !v.hazardCode) {
      ctx.addIssue({ code: 'custom', path: ['hazardCode'], message: 'Give the hazard code' });
    }
  })
  .transform((v): CreateChemicalInput => ({
    name: v.name,
    formula: v.formula,
    molarMass: v.molarMass,
    boronPercent: v.boronPercent,
    hazards: v.hazardCode && v.hazardText ? [{ code: v.hazardCode, text: v.hazardText }] : [],
    ...(v.solubilityLines.trim() && v.solubilitySource
      ? {
          solubility: {
            basis: 'g_per_100g_water' as const,
            source: v.solubilitySource,
            points: v.solubilityLines
              .split('\n')
              .map((l) => l.trim())
              .filter(Boolean)
              .map((l) => {
                const [tempC, value] = l
                  .replace(/,/g, '.')
                  .split(/[\s;:]+/)
                  .map(Number);
                return { tempC: tempC!, value: value! };
              }),
          },
        }
      : {}),
  }));
