import { z } from 'zod';
import {
  draftLabels,
  drafts,
  igniterLabels,
  igniters,
  orientationLabels,
  orientations,
  pairModes,
} from './burn';

export * from '../terms/pair-import';

/** Our own export also carries this; it names a pair of the other lab and is not imported. */
export const ignoredExportColumns = ['pair_id'];

/** Seconds in a file may be rounded to 0.01 s each: three of them may disagree by this much. */
export const ROUNDING_TOLERANCE_S = 0.02;

export const MAX_IMPORT_ROWS = 5000;

/**
 * Text → number the way the app's forms read it: empty is "not given" (undefined), a comma works
 * as the decimal mark. Stricter than Number(): no hex, exponents or thousands separators, which in
 * a spreadsheet cell are far more likely a mistake than meant.
 */
export function parseDecimal(text: string): number | undefined {
  const t = text.trim().replace(',', '.');
  if (t === '') return undefined;
  return /^[+-]?(\d+\.?\d*|\.\d+)$/.test(t) ? Number(t) : Number.NaN;
}

const yes = ['true', 'yes', 'y', '1'];
const no = ['false', 'no', 'n', '0'];

/** true / false, yes / no, 1 / 0 in any case; empty is undefined, anything else null. */
export function parseYesNo(text: string): boolean | undefined | null {
  const t = text.trim().toLowerCase();
  if (t === '') return undefined;
  if (yes.includes(t)) return true;
  if (no.includes(t)) return false;
  return null;
}

const num = (
  what: string,
  limits: { min: number; max: number; above?: boolean },
  required = false,
) =>
  z.string().transform((text, ctx) => {
    const n = parseDecimal(text);
    if (n === undefined) {
      if (required) ctx.addIssue({ code: 'custom', message: `Give ${what}` });
      return undefined;
    }
    if (Number.isNaN(n)) {
      ctx.addIssue({ code: 'custom', message: `"${text.trim()}" is not a number` });
    } else if (limits.above ? n <= limits.min : n < limits.min) {
      ctx.addIssue({
        code: 'custom',
        message: `${what} must be ${limits.above ? 'more than' : 'at least'} ${limits.min}`,
      });
    } else if (n > limits.max) {
      ctx.addIssue({ code: 'custom', message: `${what} must be at most ${limits.max}` });
    }
    return n;
  });

// Type only: `num` has already refused an empty or bad cell, so the pipe never runs on one.
const required = (what: string, limits: { min: number; max: number; above?: boolean }) =>
  num(what, limits, true).pipe(z.number());

const flag = (what: string) =>
  z.string().transform((text, ctx) => {
    const v = parseYesNo(text);
    if (v === null) ctx.addIssue({ code: 'custom', message: `${what}: write true or false` });
    return v ?? undefined;
  });

/** Accepts the stored key (as exported) or the label the app shows, in any case. */
const choice = <K extends string>(what: string, keys: readonly K[], labels: Record<K, string>) =>
  z.string().transform((text, ctx) => {
    const t = text.trim().toLowerCase();
    const key = keys.find((k) => k === t || labels[k].toLowerCase() === t);
    if (!key) {
      ctx.addIssue({
        code: 'custom',
        message: t
          ? `Unknown ${what} "${text.trim()}": use ${keys.join(', ')}`
          : `Give the ${what}`,
      });
    }
    return key as K;
  });

const code = (what: string) =>
  z
    .string()
    .trim()
    .max(40, `A ${what} code has at most 40 characters`)
    .transform((v) => v || undefined);

const SECONDS_MAX = 86_400;
const laneCells = (who: 'control' | 'treated') => ({
  char: required(`the ${who}'s char length`, { min: 0, max: 5000 }),
  afterflame: num(`The ${who}'s afterflame`, { min: 0, max: SECONDS_MAX }),
  complete: flag(`${who} afterflame complete`),
  afterglow: num(`The ${who}'s afterglow`, { min: 0, max: SECONDS_MAX }),
  burnTime: num(`The ${who}'s burn time`, { min: 0, max: SECONDS_MAX }),
  clamp: flag(`${who} burned to the clamp`),
  drips: flag(`${who} flaming drips`),
});

const DAY_MS = 24 * 3600 * 1000;

const heldAt = z.string().transform((text, ctx) => {
  const t = text.trim();
  // A day alone is taken at noon UTC, so it shows as the same day from UTC−11 to UTC+11.
  const iso = /^\d{4}-\d{2}-\d{2}$/.test(t) ? `${t}T12:00:00.000Z` : t;
  const ok = z.iso.datetime({ offset: true }).safeParse(iso).success;
  const at = ok ? new Date(iso) : undefined;
  if (!at || Number.isNaN(at.getTime())) {
    ctx.addIssue({
      code: 'custom',
      message: t ? 'Write the date as 2026-03-14 or an ISO date and time' : 'Give the date',
    });
    return '';
  }
  if (at.getTime() > Date.now() + DAY_MS) {
    ctx.addIssue({ code: 'custom', message: 'The date is in the future' });
  }
  return at.toISOString();
});

const c = laneCells('control');
const t = laneCells('treated');

/** One row of a pairs file: every cell as text (empty when the column is missing). */
export const pairImportRowSchema = z
  .object({
    held_at: heldAt,
    recipe: z.string().trim().min(1, 'Give the recipe name').max(200),
    revision: z
      .string()
      .trim()
      .min(1, 'Give the revision number')
      .regex(/^\d{1,6}$/, 'The revision is a whole number, e.g. 2')
      .transform(Number),
    substrate: z
      .string()
      .trim()
      .min(1, 'Give the substrate')
      .max(80, 'The substrate has at most 80 characters'),
    exposure_s: required('The exposure', { min: 0, max: 600, above: true }),
    igniter: choice('igniter', igniters, igniterLabels),
    orientation: choice('orientation', orientations, orientationLabels),
    draft: choice('draft', drafts, draftLabels),
    batch: code('batch'),
    add_on_pct: num('The add-on', { min: -100, max: 1000, above: true }),
    mode: z.string().transform((text, ctx) => {
      const v = text.trim().toLowerCase() || 'simultaneous';
      const mode = pairModes.find((m) => m === v);
      if (!mode) ctx.addIssue({ code: 'custom', message: `Use ${pairModes.join(' or ')}` });
      return mode ?? 'simultaneous';
    }),
    control_code: code('control'),
    control_char_mm: c.char,
    control_afterflame_s: c.afterflame,
    control_afterflame_complete: c.complete,
    control_afterglow_s: c.afterglow,
    control_burn_time_s: c.burnTime,
    control_burned_to_clamp: c.clamp,
    control_flaming_drips: c.drips,
    treated_code: code('treated'),
    treated_char_mm: t.char,
    treated_afterflame_s: t.afterflame,
    treated_afterflame_complete: t.complete,
    treated_afterglow_s: t.afterglow,
    treated_burn_time_s: t.burnTime,
    treated_burned_to_clamp: t.clamp,
    treated_mass_loss_pct: num('The mass loss', { min: 0, max: 100 }),
    treated_flaming_drips: t.drips,
  })
  .superRefine((row, ctx) => {
    for (const who of ['control', 'treated'] as const) {
      const issue = (field: string, message: string) =>
        ctx.addIssue({ code: 'custom', path: [`${who}_${field}`], message });
      const flame = row[`${who}_afterflame_s`];
      const glow = row[`${who}_afterglow_s`];
      const total = row[`${who}_burn_time_s`];
      const complete = row[`${who}_afterflame_complete`] ?? true;
      const clamp = row[`${who}_burned_to_clamp`] ?? false;
      if (flame === undefined) {
        // An untimed lane: nothing else about its times can be true.
        if (glow !== undefined) issue('afterglow_s', 'Give the afterflame too, or no afterglow');
        if (total !== undefined) issue('burn_time_s', 'Give the afterflame too, or no burn time');
        if (clamp)
          issue('burned_to_clamp', 'Give the afterflame of a lane that burned to the clamp');
        continue;
      }
      if (!complete && glow !== undefined) {
        issue('afterglow_s', 'A flame still burning when timing ended has no afterglow');
      }
      if (complete && clamp && glow !== undefined) {
        issue('afterglow_s', 'A glow that reached the clamp has no time when it went out');
      }
      const least = flame + (complete ? (glow ?? 0) : 0);
      if (total !== undefined && total < least - ROUNDING_TOLERANCE_S) {
        issue(
          'burn_time_s',
          `The burn time is less than afterflame + afterglow (${Math.round(least * 1000) / 1000} s)`,
        );
      }
    }
    if (row.control_code && row.control_code === row.treated_code) {
      ctx.addIssue({
        code: 'custom',
        path: ['treated_code'],
        message: 'The treated specimen needs a code other than the control',
      });
    }
  });
export type PairImportRow = z.output<typeof pairImportRowSchema>;

const cell = z.union([z.string(), z.number(), z.boolean(), z.null()]);

export const pairImportPreviewSchema = z
  .object({
    importId: z.uuid(),
    fileName: z.string(),
    expiresAt: z.iso.datetime(),
    ignoredColumns: z.array(z.string()),
    rows: z.array(
      z.object({
        /** The line in the file, the header being line 1. */
        line: z.number().int(),
        ok: z.boolean(),
        errors: z.array(z.object({ field: z.string(), message: z.string() })),
        /** As read for a valid row (codes filled in); as written for a row with errors. */
        values: z.record(z.string(), cell),
      }),
    ),
    validCount: z.number().int(),
    errorCount: z.number().int(),
  })
  .meta({ id: 'PairImportPreview' });
export type PairImportPreview = z.infer<typeof pairImportPreviewSchema>;
export type PairImportPreviewRow = PairImportPreview['rows'][number];

export const pairImportResultSchema = z
  .object({
    importId: z.uuid(),
    fileName: z.string(),
    status: z.literal('accepted'),
    importedPairs: z.number().int(),
    sessions: z.array(z.object({ id: z.uuid(), heldAt: z.iso.datetime(), pairs: z.number() })),
  })
  .meta({ id: 'PairImportResult' });
export type PairImportResult = z.infer<typeof pairImportResultSchema>;

export const pairImportQuerySchema = z.object({
  fileName: z
    .string()
    .trim()
    .min(1)
    .max(200, 'The file name has at most 200 characters')
    .default('pasted.csv'),
});

/** The body of a preview: the pairs file itself, UTF-8 text. */
export const pairImportFileSchema = z
  .string()
  .describe('The pairs file as UTF-8 CSV (comma, semicolon or tab separated)');

export const pairImportParamsSchema = z.object({
  labId: z.uuid(),
  importId: z.uuid('Unknown import'),
});
