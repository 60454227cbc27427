import type { UnitSystem } from './schemas/roles';

export type MassUnit = 'g' | 'kg' | 'oz' | 'lb';
export type VolumeUnit = 'mL' | 'L' | 'qt' | 'gal';
export type TemperatureUnit = 'C' | 'F';

// Exact by definition (avoirdupois ounce and pound, US liquid quart and gallon).
export const GRAMS_PER_OZ = 28.349523125;
export const GRAMS_PER_LB = 453.59237;
export const ML_PER_US_QT = 946.352946;
export const ML_PER_US_GAL = 3785.411784;
export const MM_PER_IN = 25.4;

const gramsPer: Record<MassUnit, number> = { g: 1, kg: 1000, oz: GRAMS_PER_OZ, lb: GRAMS_PER_LB };
const millilitresPer: Record<VolumeUnit, number> = {
  mL: 1,
  L: 1000,
  qt: ML_PER_US_QT,
  gal: ML_PER_US_GAL,
};

export function toGrams(value: number, unit: MassUnit): number {
  return value * gramsPer[unit];
}

export function fromGrams(g: number, unit: MassUnit): number {
  return g / gramsPer[unit];
}

export function toMillilitres(value: number, unit: VolumeUnit): number {
  return value * millilitresPer[unit];
}

export function fromMillilitres(mL: number, unit: VolumeUnit): number {
  return mL / millilitresPer[unit];
}

export function cToF(c: number): number {
  return (c * 9) / 5 + 32;
}

export function fToC(f: number): number {
  return ((f - 32) * 5) / 9;
}

export const LENGTH = {
  mmToIn: (mm: number): number => mm / MM_PER_IN,
  inToMm: (inches: number): number => inches * MM_PER_IN,
} as const;

// About three significant figures: enough to weigh with, without implying a balance we lack.
function decimalsFor(value: number): number {
  const size = Math.abs(value);
  if (size < 10) return 2;
  if (size < 100) return 1;
  return 0;
}

function rounded(value: number): number {
  // Number() drops the trailing zeros toFixed keeps ("2.50"), and `+ 0` turns -0 into 0.
  return Number(value.toFixed(decimalsFor(value))) + 0;
}

/** A mass for display: g or kg for metric, oz or lb for US, switching at 1 kg and 1 lb. */
export function formatMass(g: number, system: UnitSystem): string {
  if (!Number.isFinite(g)) return '–';
  if (system === 'metric') {
    // Compare after rounding so 999.7 g shows as 1 kg, not "1000 g".
    return Math.abs(rounded(g)) >= 1000 ? `${rounded(g / 1000)} kg` : `${rounded(g)} g`;
  }
  const ounces = rounded(g / GRAMS_PER_OZ);
  return Math.abs(ounces) >= 16 ? `${rounded(g / GRAMS_PER_LB)} lb` : `${ounces} oz`;
}
