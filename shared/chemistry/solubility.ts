import { WATER_MOLAR_MASS } from './reference-chemicals';
import type { ChemicalData, SolubilityFit, SolubilityTable } from './types';

export type SolubilityResult =
  | { status: 'ok'; gPer100gWater: number }
  | { status: 'out_of_range'; fromC: number; toC: number }
  | { status: 'no_data' };

export type CrystallisationTemperature =
  | { kind: 'below'; tempC: number }
  | { kind: 'dissolved_down_to'; tempC: number }
  | { kind: 'never_dissolves_up_to'; tempC: number }
  | { kind: 'no_data' };

const KELVIN = 273.15;

/** Mass % of a solution → g solute per 100 g water. */
export function massPercentToPer100gWater(w: number): number {
  return (100 * w) / (100 - w);
}

/** g solute per 100 g water → mass % of the solution. */
export function per100gWaterToMassPercent(r: number): number {
  return (100 * r) / (100 + r);
}

function tableCurve(table: SolubilityTable): { tempC: number; value: number }[] {
  if (table.basis === 'g_per_100g_water') return table.points;
  return table.points.map((p) => ({ tempC: p.tempC, value: massPercentToPer100gWater(p.value) }));
}

function fitAt(fit: SolubilityFit, molarMass: number, tempC: number): number {
  const t = tempC + KELVIN;
  const x = Math.exp(fit.A + fit.B / t + fit.C * Math.log(t));
  return ((100 * x) / (1 - x)) * (molarMass / WATER_MOLAR_MASS);
}

function interpolate(curve: { tempC: number; value: number }[], tempC: number): number | null {
  for (let i = 0; i + 1 < curve.length; i++) {
    const a = curve[i]!;
    const b = curve[i + 1]!;
    if (tempC >= a.tempC && tempC <= b.tempC) {
      return a.value + ((tempC - a.tempC) / (b.tempC - a.tempC)) * (b.value - a.value);
    }
  }
  // A one-point table has no segment; it still answers at its own temperature.
  const only = curve.length === 1 ? curve[0] : undefined;
  return only && only.tempC === tempC ? only.value : null;
}

function rangeOf(chem: ChemicalData): { fromC: number; toC: number } | null {
  const data = chem.solubility;
  if (!data) return null;
  if (data.kind === 'mole_fraction_fit') return { fromC: data.validFromC, toC: data.validToC };
  const first = data.points[0];
  const last = data.points[data.points.length - 1];
  return first && last ? { fromC: first.tempC, toC: last.tempC } : null;
}

/**
 * Saturation at a temperature, in g of the solute as the data count it (the chemical itself or
 * its anhydrous form) per 100 g water. Never extrapolates: outside the data it says so.
 */
export function solubilityAt(chem: ChemicalData, tempC: number): SolubilityResult {
  const data = chem.solubility;
  const range = rangeOf(chem);
  if (!data || !range) return { status: 'no_data' };
  if (!(tempC >= range.fromC && tempC <= range.toC)) return { status: 'out_of_range', ...range };
  if (data.kind === 'mole_fraction_fit') {
    return { status: 'ok', gPer100gWater: fitAt(data, chem.molarMass, tempC) };
  }
  const value = interpolate(tableCurve(data), tempC);
  return value === null
    ? { status: 'out_of_range', ...range }
    : { status: 'ok', gPer100gWater: value };
}

/**
 * The temperature below which a solution of this concentration (same basis as solubilityAt)
 * starts to crystallise, read backwards off the solubility curve, which rises with temperature
 * for every salt we carry.
 */
export function crystallisationTemperature(
  chem: ChemicalData,
  concentrationGPer100gWater: number,
): CrystallisationTemperature {
  const data = chem.solubility;
  const range = rangeOf(chem);
  if (!data || !range) return { kind: 'no_data' };
  const c = concentrationGPer100gWater;

  if (data.kind === 'mole_fraction_fit') {
    const at = (t: number) => fitAt(data, chem.molarMass, t);
    if (c < at(range.fromC)) return { kind: 'dissolved_down_to', tempC: range.fromC };
    if (c > at(range.toC)) return { kind: 'never_dissolves_up_to', tempC: range.toC };
    // The fit rises monotonically above about 150 K (dlnx/dT = (C·T − B)/T²), so bisection is safe.
    let low = range.fromC;
    let high = range.toC;
    for (let i = 0; i < 60; i++) {
      const mid = (low + high) / 2;
      if (at(mid) < c) low = mid;
      else high = mid;
    }
    return { kind: 'below', tempC: (low + high) / 2 };
  }

  const curve = tableCurve(data);
  const first = curve[0]!;
  const last = curve[curve.length - 1]!;
  if (c < first.value) return { kind: 'dissolved_down_to', tempC: first.tempC };
  if (c > last.value) return { kind: 'never_dissolves_up_to', tempC: last.tempC };
  for (let i = 0; i + 1 < curve.length; i++) {
    const a = curve[i]!;
    const b = curve[i + 1]!;
    if (c >= a.value && c <= b.value) {
      const tempC =
        b.value === a.value
          ? a.tempC
          : a.tempC + ((c - a.value) / (b.value - a.value)) * (b.tempC - a.tempC);
      return { kind: 'below', tempC };
    }
  }
  return { kind: 'below', tempC: first.tempC };
}
