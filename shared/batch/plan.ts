import {
  B2O3_BORON_FRACTION,
  BORIC_ACID_BORON_FRACTION,
  boraxBoricAcidPhasePoints25C,
  referenceChemical,
} from '../chemistry/reference-chemicals';
import { crystallisationTemperature, solubilityAt } from '../chemistry/solubility';
import type { ChemicalData } from '../chemistry/types';

export type AmountUnit = 'pct_solution' | 'g_per_100g_water' | 'g_per_l_water' | 'parts';

export type BatchTarget =
  | { basis: 'solution_mass'; grams: number }
  | { basis: 'water_mass'; grams: number }
  | { basis: 'water_volume'; millilitres: number };

export type BatchIngredientInput = { chemical: ChemicalData; amount: number; unit: AmountUnit };

export type BatchPlanInput = {
  ingredients: BatchIngredientInput[];
  /** parts of water in the same ratio; required when any ingredient is in 'parts' */
  waterParts?: number;
  target: BatchTarget;
  mixingTempC: number;
  storageTempC: number;
};

/** A recipe the calculator cannot plan; `path` names the field, e.g. `ingredients.1.amount`. */
export class BatchPlanError extends Error {
  constructor(
    readonly path: string,
    message: string,
  ) {
    super(message);
    this.name = 'BatchPlanError';
  }
}

export type SaturationCheck = {
  status: 'ok' | 'near' | 'supersaturated' | 'outside_data_range' | 'no_data';
  ratio?: number;
  solubilityGPer100gWater?: number;
};

export type BatchWarningCode =
  | 'supersaturated_at_storage'
  | 'supersaturated_at_mixing'
  | 'near_saturation'
  | 'outside_data_range'
  | 'no_solubility_data'
  | 'combined_limit_at_25c_only';

export type BatchWarning = { code: BatchWarningCode; message: string; ingredientKey?: string };

export type CombinedBorateCheck = {
  /** borax (as decahydrate, by boron) / (borax as decahydrate + boric acid), by mass */
  boraxShare: number;
  solidsGPer100gWater: number;
  limitGPer100gWater: number;
  ratio: number;
  note: string;
};

export type BatchPlanIngredient = {
  key: string;
  name: string;
  gPer100gWater: number;
  massG: number;
  massPercentOfSolution: number;
  saturation: { mixing: SaturationCheck; storage: SaturationCheck };
  crystallisesBelow: ReturnType<typeof crystallisationTemperature>;
};

export type BatchPlan = {
  waterMassG: number;
  waterVolumeMl: number;
  solutionMassG: number;
  ingredients: BatchPlanIngredient[];
  totalSolidsPercent: number;
  boronPercent: number;
  boricAcidEquivalentG: number;
  b2o3EquivalentG: number;
  combinedBorate: CombinedBorateCheck | null;
  warnings: BatchWarning[];
  assumptions: string[];
};

const NEAR_SATURATION = 0.9;
// Water measured by volume is taken at 1.000 g/mL: the few-per-mille error at room temperature is
// far below what a kitchen or lab measuring jug resolves.
const WATER_G_PER_ML = 1;
// Likewise 1 L of water is taken as 1000 g for amounts given per litre of water.
const WATER_G_PER_L = 1000;

const sum = (values: number[]) => values.reduce((total, v) => total + v, 0);

function round(value: number): string {
  const size = Math.abs(value);
  const decimals = size < 10 ? 2 : size < 100 ? 1 : 0;
  return String(Number(value.toFixed(decimals)) + 0);
}

function celsius(value: number): string {
  return `${Number(value.toFixed(1)) + 0} °C`;
}

/**
 * The form a recipe stores: g of each ingredient, as weighed (water of crystallisation included),
 * per 100 g of added water. Mass % of solution is solved together with the other units, because a
 * percentage depends on everything else in the solution.
 */
export function toGramsPer100gWater(
  ingredients: readonly { amount: number; unit: AmountUnit }[],
  waterParts?: number,
): number[] {
  ingredients.forEach((ingredient, i) => {
    if (!Number.isFinite(ingredient.amount) || ingredient.amount <= 0) {
      throw new BatchPlanError(`ingredients.${i}.amount`, 'Enter an amount greater than zero.');
    }
  });
  const usesParts = ingredients.some((ingredient) => ingredient.unit === 'parts');
  if (usesParts && (waterParts === undefined || !Number.isFinite(waterParts) || waterParts <= 0)) {
    throw new BatchPlanError(
      'waterParts',
      'Enter the parts of water: amounts in parts need the water in the same ratio.',
    );
  }

  const direct = ingredients.map((ingredient) => {
    switch (ingredient.unit) {
      case 'g_per_100g_water':
        return ingredient.amount;
      case 'g_per_l_water':
        return (ingredient.amount * 100) / WATER_G_PER_L;
      case 'parts':
        return (100 * ingredient.amount) / (waterParts as number);
      case 'pct_solution':
        return 0;
    }
  });

  const percents = ingredients.filter((ingredient) => ingredient.unit === 'pct_solution');
  if (percents.length === 0) return direct;

  const otherSolids = sum(direct);
  const percentTotal = sum(percents.map((ingredient) => ingredient.amount));
  if (percentTotal >= 100) {
    throw new BatchPlanError(
      'ingredients',
      `The percentages of solution add up to ${round(percentTotal)} %, which leaves no room for ` +
        'water. Together they must stay below 100 %.',
    );
  }
  // With S g of the other solids per 100 g water, the %-ingredients together weigh X per 100 g
  // water where X = W·(100 + S + X), W their combined mass fraction.
  const fraction = percentTotal / 100;
  const percentSolids = (fraction * (100 + otherSolids)) / (1 - fraction);
  const solutionPer100gWater = 100 + otherSolids + percentSolids;
  if (!Number.isFinite(solutionPer100gWater)) {
    throw new BatchPlanError(
      'ingredients',
      'These amounts make a solution that is all solids and no water; reduce the percentages.',
    );
  }
  return ingredients.map((ingredient, i) =>
    ingredient.unit === 'pct_solution'
      ? (ingredient.amount / 100) * solutionPer100gWater
      : (direct[i] as number),
  );
}

function checkTemperature(value: number, path: string, label: string): void {
  if (!Number.isFinite(value)) throw new BatchPlanError(path, `Enter the ${label} temperature.`);
  if (value < 0) {
    throw new BatchPlanError(
      path,
      `The ${label} temperature is below freezing; a water-based soak needs 0 °C or warmer.`,
    );
  }
  if (value > 100) {
    throw new BatchPlanError(path, `The ${label} temperature is above boiling (100 °C).`);
  }
}

function waterMassFor(target: BatchTarget, solidsPer100gWater: number): number {
  const amount = target.basis === 'water_volume' ? target.millilitres : target.grams;
  if (!Number.isFinite(amount) || amount <= 0) {
    throw new BatchPlanError('target', 'Enter a batch size greater than zero.');
  }
  switch (target.basis) {
    case 'water_mass':
      return amount;
    case 'water_volume':
      return amount * WATER_G_PER_ML;
    case 'solution_mass':
      return (amount * 100) / (100 + solidsPer100gWater);
  }
}

function saturationAt(
  chemical: ChemicalData,
  concentration: number | null,
  tempC: number,
): SaturationCheck {
  const solubility = solubilityAt(chemical, tempC);
  if (solubility.status === 'no_data' || concentration === null) return { status: 'no_data' };
  if (solubility.status === 'out_of_range') return { status: 'outside_data_range' };
  const ratio = concentration / solubility.gPer100gWater;
  const status = ratio > 1 ? 'supersaturated' : ratio >= NEAR_SATURATION ? 'near' : 'ok';
  return { status, ratio, solubilityGPer100gWater: solubility.gPer100gWater };
}

let pureBoraxLimit: number | undefined;

// Pure borax at 25 °C closes the combined curve. The table counts anhydrous Na2B4O7 per 100 g of
// all water; the phase diagram counts weighed decahydrate per 100 g of the remaining free water.
function pureBoraxLimitAt25C(): number {
  if (pureBoraxLimit !== undefined) return pureBoraxLimit;
  const decahydrate = referenceChemical('borax-decahydrate');
  const solubility = solubilityAt(decahydrate, boraxBoricAcidPhasePoints25C.tempC);
  if (solubility.status !== 'ok') throw new Error('Borax decahydrate data must cover 25 °C.');
  const anhydrous = solubility.gPer100gWater;
  const asDecahydrate = anhydrous / (1 - decahydrate.hydrateWaterFraction);
  pureBoraxLimit = (100 * asDecahydrate) / (100 - (asDecahydrate - anhydrous));
  return pureBoraxLimit;
}

/**
 * Saturation limit of a borax decahydrate + boric acid mix at 25 °C, in g of both (as weighed)
 * per 100 g water, by linear interpolation between the phase-diagram points.
 */
export function combinedBorateLimitAt25C(boraxShare: number): number {
  const points = [
    ...boraxBoricAcidPhasePoints25C.points,
    { boraxShare: 1, solidsPer100gWater: pureBoraxLimitAt25C() },
  ];
  const share = Math.min(1, Math.max(0, boraxShare));
  for (let i = 0; i + 1 < points.length; i++) {
    const a = points[i]!;
    const b = points[i + 1]!;
    if (share >= a.boraxShare && share <= b.boraxShare) {
      const t = (share - a.boraxShare) / (b.boraxShare - a.boraxShare);
      return a.solidsPer100gWater + t * (b.solidsPer100gWater - a.solidsPer100gWater);
    }
  }
  return points[points.length - 1]!.solidsPer100gWater;
}

const COMBINED_NOTE =
  'Borax and boric acid dissolve together far beyond what either dissolves alone, so the ' +
  'single-salt ratios of these two are shown for reference and not flagged. The combined limit ' +
  'is read from 25 °C phase-diagram data (J. Chem. 2020, article 6687742), interpolated ' +
  'linearly in the borax share; its pure-borax end uses the borax table, which is from memory ' +
  'and unconfirmed.';

export function planBatch(input: BatchPlanInput): BatchPlan {
  const { ingredients, target, mixingTempC, storageTempC } = input;
  if (ingredients.length === 0) {
    throw new BatchPlanError('ingredients', 'Add at least one ingredient.');
  }
  const seen = new Set<string>();
  ingredients.forEach(({ chemical }, i) => {
    if (seen.has(chemical.key)) {
      throw new BatchPlanError(
        `ingredients.${i}.chemical`,
        `${chemical.name} is listed twice; put its whole amount on one line.`,
      );
    }
    seen.add(chemical.key);
  });

  const perWater = toGramsPer100gWater(ingredients, input.waterParts);
  const waterMassG = waterMassFor(target, sum(perWater));
  checkTemperature(mixingTempC, 'mixingTempC', 'mixing');
  checkTemperature(storageTempC, 'storageTempC', 'storage');

  const masses = perWater.map((g) => (waterMassG * g) / 100);
  const solidsG = sum(masses);
  const solutionMassG = waterMassG + solidsG;

  // Water of crystallisation is released on dissolving and becomes solvent like the added water.
  const hydrateWater = ingredients.map(
    ({ chemical }, i) => masses[i]! * chemical.hydrateWaterFraction,
  );
  const totalWater = waterMassG + sum(hydrateWater);

  const warnings: BatchWarning[] = [];
  const assumptions: string[] = [
    'Amounts are as weighed, water of crystallisation included, per 100 g of added water.',
    'Water by volume is taken at 1.000 g/mL.',
  ];
  if (ingredients.some(({ unit }) => unit === 'g_per_l_water')) {
    assumptions.push('For amounts per litre of water, 1 L of water is taken as 1000 g.');
  }
  if (target.basis === 'solution_mass') {
    assumptions.push('The solution weighs the water plus everything dissolved in it.');
  }

  const hasBorax = ingredients.some(({ chemical }) => chemical.borateGroup === 'borax');
  const hasBoricAcid = ingredients.some(({ chemical }) => chemical.borateGroup === 'boric_acid');
  const combinedApplies = hasBorax && hasBoricAcid;
  if (ingredients.length > 1) {
    assumptions.push(
      'Each salt is checked against its solubility in pure water; other dissolved salts can ' +
        `change it${combinedApplies ? ' (borax with boric acid is checked as a pair)' : ''}.`,
    );
  }

  const planned = ingredients.map(({ chemical }, i): BatchPlanIngredient => {
    const massG = masses[i]!;
    const data = chemical.solubility;
    let concentration: number | null = null;
    if (data) {
      const anhydrousBasis = data.kind === 'table' && data.solute === 'anhydrous';
      const solute = anhydrousBasis
        ? (massG * (chemical.anhydrousMolarMass ?? chemical.molarMass)) / chemical.molarMass
        : massG;
      // Counted as the hydrate itself, a salt keeps its own water of crystallisation.
      const water = anhydrousBasis ? totalWater : totalWater - hydrateWater[i]!;
      concentration = (100 * solute) / water;
    }
    const mixing = saturationAt(chemical, concentration, mixingTempC);
    const storage = saturationAt(chemical, concentration, storageTempC);
    const crystallisesBelow =
      concentration === null
        ? ({ kind: 'no_data' } as const)
        : crystallisationTemperature(chemical, concentration);

    if (!(combinedApplies && chemical.borateGroup)) {
      warnings.push(
        ...saturationWarnings(chemical, concentration, { mixing, storage }, crystallisesBelow, {
          mixingTempC,
          storageTempC,
        }),
      );
    }
    if (data?.confidence === 'memory') {
      assumptions.push(
        `${chemical.name}: its solubility figures are from memory and unconfirmed; treat its ` +
          'saturation check as a guide.',
      );
    }

    return {
      key: chemical.key,
      name: chemical.name,
      gPer100gWater: perWater[i]!,
      massG,
      massPercentOfSolution: (100 * massG) / solutionMassG,
      saturation: { mixing, storage },
      crystallisesBelow,
    };
  });

  const boronG = sum(
    ingredients.map(({ chemical }, i) => masses[i]! * (chemical.boronFraction ?? 0)),
  );

  let combinedBorate: CombinedBorateCheck | null = null;
  if (combinedApplies) {
    combinedBorate = combinedBorateCheck(ingredients, masses, totalWater, storageTempC, warnings);
    assumptions.push(
      'The combined borax + boric acid limit is interpolated linearly in the borax share ' +
        'between 25 °C phase-diagram points.',
    );
  }

  return {
    waterMassG,
    waterVolumeMl: waterMassG / WATER_G_PER_ML,
    solutionMassG,
    ingredients: planned,
    totalSolidsPercent: (100 * solidsG) / solutionMassG,
    boronPercent: (100 * boronG) / solutionMassG,
    boricAcidEquivalentG: boronG / BORIC_ACID_BORON_FRACTION,
    b2o3EquivalentG: boronG / B2O3_BORON_FRACTION,
    combinedBorate,
    warnings,
    assumptions,
  };
}

function saturationWarnings(
  chemical: ChemicalData,
  concentration: number | null,
  checks: { mixing: SaturationCheck; storage: SaturationCheck },
  crystallisesBelow: ReturnType<typeof crystallisationTemperature>,
  temps: { mixingTempC: number; storageTempC: number },
): BatchWarning[] {
  const { name, key } = chemical;
  const data = chemical.solubility;
  if (!data || concentration === null) {
    return [
      {
        code: 'no_solubility_data',
        message: `No saturation check for ${name}: no solubility data.`,
        ingredientKey: key,
      },
    ];
  }
  const basis =
    data.kind === 'table' && data.solute === 'anhydrous' ? ' (counted as the anhydrous salt)' : '';
  const held = `${round(concentration)} g per 100 g water${basis}`;
  const warnings: BatchWarning[] = [];
  const { mixing, storage } = checks;

  if (storage.status === 'supersaturated') {
    const start =
      crystallisesBelow.kind === 'below'
        ? `crystals start below about ${celsius(crystallisesBelow.tempC)}`
        : crystallisesBelow.kind === 'never_dissolves_up_to'
          ? `it does not fully dissolve even at ${celsius(crystallisesBelow.tempC)}`
          : 'crystals form on cooling';
    warnings.push({
      code: 'supersaturated_at_storage',
      message:
        `${name} will crystallise on standing at ${celsius(temps.storageTempC)}; ${start}. ` +
        `The solution holds ${held}; only ${round(storage.solubilityGPer100gWater!)} g ` +
        'dissolve at that temperature.',
      ingredientKey: key,
    });
  }
  if (mixing.status === 'supersaturated') {
    const needs =
      crystallisesBelow.kind === 'below'
        ? ` It needs about ${celsius(crystallisesBelow.tempC)} to dissolve fully.`
        : '';
    warnings.push({
      code: 'supersaturated_at_mixing',
      message:
        `${name} will not fully dissolve at ${celsius(temps.mixingTempC)}: the recipe asks for ` +
        `${held}; only ${round(mixing.solubilityGPer100gWater!)} g dissolve there.${needs}`,
      ingredientKey: key,
    });
  }
  const near = [
    { check: storage, tempC: temps.storageTempC, label: 'storage' },
    { check: mixing, tempC: temps.mixingTempC, label: 'mixing' },
  ].find(({ check }) => check.status === 'near');
  if (near && storage.status !== 'supersaturated' && mixing.status !== 'supersaturated') {
    warnings.push({
      code: 'near_saturation',
      message:
        `${name} is close to saturation at the ${near.label} temperature ` +
        `(${celsius(near.tempC)}): ${Math.round(near.check.ratio! * 100)} % of what dissolves. ` +
        'A little cooling can start crystals.',
      ingredientKey: key,
    });
  }
  const outside = [
    { check: mixing, tempC: temps.mixingTempC },
    { check: storage, tempC: temps.storageTempC },
  ].filter(({ check }) => check.status === 'outside_data_range');
  if (outside.length > 0) {
    const range = solubilityAt(chemical, outside[0]!.tempC);
    const span =
      range.status === 'out_of_range' ? `${range.fromC}–${range.toC} °C` : 'a narrower range';
    const at = [...new Set(outside.map(({ tempC }) => celsius(tempC)))].join(' and ');
    warnings.push({
      code: 'outside_data_range',
      message:
        `No saturation check for ${name} at ${at}: its solubility data cover ${span} only, and ` +
        'the calculator does not extrapolate.',
      ingredientKey: key,
    });
  }
  return warnings;
}

function combinedBorateCheck(
  ingredients: BatchIngredientInput[],
  masses: number[],
  totalWater: number,
  storageTempC: number,
  warnings: BatchWarning[],
): CombinedBorateCheck {
  const decahydrate = referenceChemical('borax-decahydrate');
  const decahydrateBoron = decahydrate.boronFraction ?? 0;
  let boraxAsDecahydrate = 0;
  let boricAcid = 0;
  ingredients.forEach(({ chemical }, i) => {
    const boron = masses[i]! * (chemical.boronFraction ?? 0);
    if (chemical.borateGroup === 'borax') boraxAsDecahydrate += boron / decahydrateBoron;
    if (chemical.borateGroup === 'boric_acid') boricAcid += boron / BORIC_ACID_BORON_FRACTION;
  });
  // The phase diagram counts weighed decahydrate, so its ten waters are not solvent there.
  const freeWater = totalWater - boraxAsDecahydrate * decahydrate.hydrateWaterFraction;
  if (freeWater <= 0) {
    throw new BatchPlanError(
      'ingredients',
      'There is too little water for this much borax: it would all be bound as decahydrate.',
    );
  }
  const borates = boraxAsDecahydrate + boricAcid;
  const boraxShare = boraxAsDecahydrate / borates;
  const solidsGPer100gWater = (100 * borates) / freeWater;
  const limitGPer100gWater = combinedBorateLimitAt25C(boraxShare);
  const ratio = solidsGPer100gWater / limitGPer100gWater;

  const mix = `${Math.round(boraxShare * 100)} : ${Math.round((1 - boraxShare) * 100)}`;
  const held =
    `${round(solidsGPer100gWater)} g per 100 g water, against about ` +
    `${round(limitGPer100gWater)} g that dissolve at 25 °C in a ${mix} borax : boric acid mix`;
  if (ratio > 1) {
    warnings.push({
      code: 'supersaturated_at_storage',
      message: `Borax and boric acid together will crystallise on standing: they make ${held}.`,
    });
  } else if (ratio >= NEAR_SATURATION) {
    warnings.push({
      code: 'near_saturation',
      message: `Borax and boric acid together are close to saturation: they make ${held}.`,
    });
  }
  const elsewhere =
    storageTempC === 25
      ? ''
      : ` Storage at ${celsius(storageTempC)} is not checked exactly; treat the result as a guide.`;
  warnings.push({
    code: 'combined_limit_at_25c_only',
    message: `The combined borax + boric acid limit is known from 25 °C data only.${elsewhere}`,
  });

  return { boraxShare, solidsGPer100gWater, limitGPer100gWater, ratio, note: COMBINED_NOTE };
}
