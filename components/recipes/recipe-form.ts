import { type amountUnits, type dryingMethods, type Substrate } from '../../shared/terms/recipe';
import type { recipeInputSchema, RecipeInput, Revision } from '../../shared/schemas/recipe';
import { type UnitSystem } from '../../shared/terms/roles';
import { cToF, fToC } from '../../shared/units';
import { parseNumber } from '../units';

/** What the editor's inputs hold: text as typed, temperatures in the person's units. */
export type RecipeFormValues = {
  name: string;
  substrate: Substrate;
  ingredients: { chemicalId: string; amount: string; unit: (typeof amountUnits)[number] }[];
  waterParts: string;
  mixingTemp: string;
  soakMinutes: string;
  drainMinutes: string;
  dryingMethod: (typeof dryingMethods)[number];
  dryingHours: string;
  dryingTemp: string;
  dryingRhPct: string;
  conditioning: string;
  notes: string;
};

const text = (n: number | null | undefined, digits = 2) =>
  n === null || n === undefined ? '' : String(Math.round(n * 10 ** digits) / 10 ** digits);

export function formFromRevision(
  name: string,
  substrate: Substrate,
  r: Revision,
  units: UnitSystem,
): RecipeFormValues {
  const temp = (c: number | null) => (c === null ? '' : text(units === 'us' ? cToF(c) : c, 1));
  return {
    name,
    substrate,
    ingredients: r.ingredients.map((i) => ({
      chemicalId: i.chemicalId,
      amount: text(i.amount, 4),
      unit: i.unit,
    })),
    waterParts: text(r.waterParts),
    mixingTemp: temp(r.mixingTempC),
    soakMinutes: text(r.soakMinutes),
    drainMinutes: text(r.drainMinutes),
    dryingMethod: r.dryingMethod,
    dryingHours: r.dryingMinutes === null ? '' : text(r.dryingMinutes / 60),
    dryingTemp: temp(r.dryingTempC),
    dryingRhPct: text(r.dryingRhPct),
    conditioning: r.conditioning ?? '',
    notes: r.notes ?? '',
  };
}

export const emptyRecipeForm = (units: UnitSystem): RecipeFormValues => ({
  name: '',
  substrate: 'cotton',
  ingredients: [{ chemicalId: '', amount: '', unit: 'g_per_100g_water' }],
  waterParts: '',
  mixingTemp: units === 'us' ? '104' : '40',
  soakMinutes: '30',
  drainMinutes: '5',
  dryingMethod: 'rack',
  dryingHours: '12',
  dryingTemp: '',
  dryingRhPct: '',
  conditioning: '',
  notes: '',
});

/** Which input shows an error the schema reports on a field. */
const formField: Record<string, keyof RecipeFormValues> = {
  mixingTempC: 'mixingTemp',
  dryingMinutes: 'dryingHours',
  dryingTempC: 'dryingTemp',
};
export function formPath(schemaPath: string): string {
  return formField[schemaPath] ?? schemaPath;
}

/** The form's text as a recipe request, checked with the shared schema (from the schema kit). */
export function toRecipeInput(
  v: RecipeFormValues,
  units: UnitSystem,
  schema: typeof recipeInputSchema,
): { ok: true; input: RecipeInput } | { ok: false; errors: { path: string; message: string }[] } {
  const celsius = (s: string) => {
    const n = parseNumber(s);
    return n === undefined || Number.isNaN(n) || units === 'metric' ? n : fToC(n);
  };
  const hours = parseNumber(v.dryingHours);
  const candidate = {
    name: v.name,
    substrate: v.substrate,
    ingredients: v.ingredients.map((i) => ({
      chemicalId: i.chemicalId,
      amount: parseNumber(i.amount),
      unit: i.unit,
    })),
    waterParts: parseNumber(v.waterParts),
    mixingTempC: celsius(v.mixingTemp),
    soakMinutes: parseNumber(v.soakMinutes),
    drainMinutes: parseNumber(v.drainMinutes),
    dryingMethod: v.dryingMethod,
    dryingMinutes: hours === undefined ? undefined : hours * 60,
    dryingTempC: celsius(v.dryingTemp),
    dryingRhPct: parseNumber(v.dryingRhPct),
    conditioning: v.conditioning.trim() || undefined,
    notes: v.notes.trim() || undefined,
  };
  const parsed = schema.safeParse(candidate);
  if (parsed.success) return { ok: true, input: parsed.data };
  return {
    ok: false,
    errors: parsed.error.issues.map((i) => ({
      path: formPath(i.path.join('.')),
      message: i.message,
    })),
  };
}
