import { cToF, formatMass, GRAMS_PER_OZ } from '../shared/units';
import { type UnitSystem } from '../shared/terms/roles';
import { useLab } from './lab-context';

/** The signed-in person's display units (Account screen). Storage is always metric. */
export function useUnitSystem(): UnitSystem {
  return useLab().me.user.units;
}

export function formatTemperature(c: number | null | undefined, system: UnitSystem): string {
  if (c === null || c === undefined || !Number.isFinite(c)) return '–';
  return system === 'metric' ? `${round(c, 1)} °C` : `${round(cToF(c), 1)} °F`;
}

/** Masses to weigh: finer than general display, because the scale reads to 0.1 g. */
export function formatWeighMass(g: number, system: UnitSystem): string {
  if (!Number.isFinite(g)) return '–';
  if (system === 'metric')
    return g >= 1000 ? `${round(g, 1)} g (${round(g / 1000, 3)} kg)` : `${round(g, 1)} g`;
  return `${round(g / GRAMS_PER_OZ, 2)} oz (${round(g, 1)} g)`;
}

export function formatLength(mm: number | null | undefined, system: UnitSystem): string {
  if (mm === null || mm === undefined) return '–';
  return system === 'metric' ? `${round(mm, 1)} mm` : `${round(mm / 25.4, 2)} in`;
}

export { formatMass };

export function round(value: number, digits: number): string {
  return String(Math.round(value * 10 ** digits) / 10 ** digits);
}

export function formatDuration(minutes: number | null | undefined): string {
  if (minutes === null || minutes === undefined) return '–';
  if (minutes < 120) return `${round(minutes, 0)} min`;
  const hours = minutes / 60;
  return hours < 48 ? `${round(hours, 1)} h` : `${round(hours / 24, 1)} days`;
}

export function formatWhen(iso: string | null | undefined): string {
  if (!iso) return '–';
  return new Date(iso).toLocaleString(undefined, { dateStyle: 'medium', timeStyle: 'short' });
}

/** Typed text → number: empty is "not given" (undefined); a comma works as the decimal mark. */
export function parseNumber(text: string): number | undefined {
  const t = text.trim().replace(',', '.');
  if (t === '') return undefined;
  const n = Number(t);
  return Number.isFinite(n) ? n : Number.NaN;
}

/** Typed text in the person's units → grams: undefined when empty, NaN when not a number. */
export function gramsFromText(text: string, system: UnitSystem): number | undefined {
  const n = parseNumber(text);
  return n === undefined || Number.isNaN(n) || system === 'metric' ? n : n * GRAMS_PER_OZ;
}

/** Typed text in the person's units → millimetres: undefined when empty, NaN when not a number. */
export function millimetresFromText(text: string, system: UnitSystem): number | undefined {
  const n = parseNumber(text);
  return n === undefined || Number.isNaN(n) || system === 'metric' ? n : n * 25.4;
}
