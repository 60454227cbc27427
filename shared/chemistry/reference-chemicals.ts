import type { CautionKey, ChemicalData, Confidence, SolubilityTable } from './types';

// IUPAC standard atomic weights, abridged. Every molar mass and mass fraction below is computed
// from these, so a boron figure never mixes two roundings.
export const ATOMIC_WEIGHTS = {
  B: 10.81,
  H: 1.008,
  O: 15.999,
  Na: 22.99,
  N: 14.007,
  P: 30.974,
  S: 32.06,
} as const;

type Element = keyof typeof ATOMIC_WEIGHTS;

export function molarMassOf(atoms: Partial<Record<Element, number>>): number {
  let sum = 0;
  for (const [element, count] of Object.entries(atoms) as [Element, number][]) {
    sum += ATOMIC_WEIGHTS[element] * count;
  }
  return sum;
}

export const WATER_MOLAR_MASS = molarMassOf({ H: 2, O: 1 });
const BORIC_ACID_MOLAR_MASS = molarMassOf({ H: 3, B: 1, O: 3 });
const ANHYDROUS_BORAX_MOLAR_MASS = molarMassOf({ Na: 2, B: 4, O: 7 });
const B2O3_MOLAR_MASS = molarMassOf({ B: 2, O: 3 });

/** g B per g boric acid (about 0.1748). */
export const BORIC_ACID_BORON_FRACTION = ATOMIC_WEIGHTS.B / BORIC_ACID_MOLAR_MASS;
/** g B per g B2O3 (about 0.3106). */
export const B2O3_BORON_FRACTION = (2 * ATOMIC_WEIGHTS.B) / B2O3_MOLAR_MASS;

const boraxHydrate = (waters: number) => {
  const molarMass = ANHYDROUS_BORAX_MOLAR_MASS + waters * WATER_MOLAR_MASS;
  return {
    molarMass,
    boronFraction: (4 * ATOMIC_WEIGHTS.B) / molarMass,
    hydrateWaterFraction: (waters * WATER_MOLAR_MASS) / molarMass,
  };
};

const REPROTOXIC = { code: 'H360FD', text: 'May damage fertility and may harm the unborn child' };
const EYE_IRRITANT = { code: 'H319', text: 'Can seriously irritate the eyes' };
const BORAX_CAUTIONS: CautionKey[] = ['reprotoxic_borate', 'eye_irritant', 'dust', 'disposal'];
const AMMONIUM_PHOSPHATE_CAUTIONS: CautionKey[] = [
  'warm_ammonium_phosphate',
  'ammonium_no_bleach',
  'dust',
  'disposal',
];

const CHEMISTER_NOTE = 'chemister.ru substance database';

// The temperature series is from memory; it is kept because the one checkable point agrees
// with a producer's data sheet and nothing better has been found. One table serves every borax
// form: on the anhydrous basis the saturation limit does not depend on which hydrate was weighed.
const boraxAnhydrousBasis = (): SolubilityTable => ({
  kind: 'table',
  basis: 'g_per_100g_water',
  solute: 'anhydrous',
  points: [
    { tempC: 0, value: 1.11 },
    { tempC: 10, value: 1.6 },
    { tempC: 20, value: 2.56 },
    { tempC: 30, value: 3.86 },
    { tempC: 40, value: 6.67 },
    { tempC: 50, value: 10.5 },
    { tempC: 60, value: 19.0 },
  ],
  source:
    'g Na2B4O7 (anhydrous basis) per 100 g water, from memory [M], unconfirmed. The 20 °C ' +
    'point agrees with the producer data sheet (saturated at 4.71 wt % decahydrate, quoted ' +
    'secondarily) [C]. Above about 56–61 °C the pentahydrate, not the decahydrate, crystallises (borichem) [C].',
  confidence: 'memory',
});

export const referenceChemicals: ChemicalData[] = [
  {
    key: 'boric-acid',
    name: 'Boric acid',
    formula: 'H3BO3',
    molarMass: BORIC_ACID_MOLAR_MASS,
    boronFraction: BORIC_ACID_BORON_FRACTION,
    hydrateWaterFraction: 0,
    borateGroup: 'boric_acid',
    hazards: [REPROTOXIC],
    cautions: ['reprotoxic_borate', 'dust', 'disposal'],
    solubility: {
      kind: 'table',
      basis: 'g_per_100g_water',
      solute: 'as_is',
      points: [
        { tempC: 0, value: 2.77 },
        { tempC: 10, value: 3.65 },
        { tempC: 20, value: 4.87 },
        { tempC: 25, value: 5.74 },
        { tempC: 30, value: 6.77 },
        { tempC: 40, value: 8.9 },
        { tempC: 50, value: 11.39 },
        { tempC: 60, value: 14.89 },
        { tempC: 80, value: 23.54 },
        { tempC: 100, value: 38 },
      ],
      source: `${CHEMISTER_NOTE}, boric acid, g per 100 g water [C]`,
      confidence: 'confirmed',
    },
  },
  {
    key: 'borax-decahydrate',
    name: 'Borax decahydrate',
    formula: 'Na2B4O7·10H2O',
    ...boraxHydrate(10),
    anhydrousMolarMass: ANHYDROUS_BORAX_MOLAR_MASS,
    borateGroup: 'borax',
    hazards: [REPROTOXIC, EYE_IRRITANT],
    cautions: BORAX_CAUTIONS,
    solubility: boraxAnhydrousBasis(),
  },
  {
    key: 'borax-pentahydrate',
    name: 'Borax pentahydrate',
    formula: 'Na2B4O7·5H2O',
    ...boraxHydrate(5),
    anhydrousMolarMass: ANHYDROUS_BORAX_MOLAR_MASS,
    borateGroup: 'borax',
    hazards: [REPROTOXIC, EYE_IRRITANT],
    cautions: BORAX_CAUTIONS,
    solubility: boraxAnhydrousBasis(),
  },
  {
    key: 'borax-anhydrous',
    name: 'Anhydrous borax',
    formula: 'Na2B4O7',
    ...boraxHydrate(0),
    borateGroup: 'borax',
    hazards: [REPROTOXIC, EYE_IRRITANT],
    cautions: BORAX_CAUTIONS,
    solubility: boraxAnhydrousBasis(),
  },
  {
    key: 'diammonium-phosphate',
    name: 'Diammonium phosphate (DAP)',
    formula: '(NH4)2HPO4',
    molarMass: molarMassOf({ N: 2, H: 9, P: 1, O: 4 }),
    boronFraction: null,
    hydrateWaterFraction: 0,
    // No sourced classification for the ammonium salts yet; an empty list is better than a guess.
    hazards: [],
    cautions: AMMONIUM_PHOSPHATE_CAUTIONS,
    solubility: {
      kind: 'mole_fraction_fit',
      A: -31.639,
      B: 697.129,
      C: 4.718,
      // Stops at 70 °C because DAP loses ammonia when warm and decomposes near 70 °C, so a
      // saturation figure above that would describe a solution nobody should make.
      validFromC: 0,
      validToC: 70,
      source:
        'IUPAC-NIST Solubility Data Series 66, J. Phys. Chem. Ref. Data 27, 1289 (1998), citing ' +
        'Vogel et al. 1963 [C]. Used from 0 to 70 °C only: DAP loses ammonia when warm and ' +
        'decomposes near 70 °C (supplier SDS as quoted) [C].',
      confidence: 'confirmed',
    },
  },
  {
    key: 'monoammonium-phosphate',
    name: 'Monoammonium phosphate (MAP)',
    formula: 'NH4H2PO4',
    molarMass: molarMassOf({ N: 1, H: 6, P: 1, O: 4 }),
    boronFraction: null,
    hydrateWaterFraction: 0,
    hazards: [],
    cautions: AMMONIUM_PHOSPHATE_CAUTIONS,
    // No sourced solubility data yet: the calculator says so instead of checking against a guess.
    solubility: null,
  },
  {
    key: 'ammonium-sulfate',
    name: 'Ammonium sulfate',
    formula: '(NH4)2SO4',
    molarMass: molarMassOf({ N: 2, H: 8, S: 1, O: 4 }),
    boronFraction: null,
    hydrateWaterFraction: 0,
    hazards: [],
    cautions: ['ammonium_no_bleach', 'dust', 'disposal'],
    solubility: {
      kind: 'table',
      basis: 'g_per_100g_water',
      solute: 'as_is',
      points: [
        { tempC: 0, value: 70.1 },
        { tempC: 10, value: 72.7 },
        { tempC: 20, value: 75.4 },
        { tempC: 25, value: 76.9 },
        { tempC: 30, value: 78.1 },
        { tempC: 40, value: 81.2 },
        { tempC: 50, value: 84.3 },
        { tempC: 60, value: 87.4 },
        { tempC: 80, value: 94.1 },
        { tempC: 100, value: 102 },
      ],
      source: `${CHEMISTER_NOTE}, ammonium sulfate, g per 100 g water [C]`,
      confidence: 'confirmed',
    },
  },
];

const byKey = new Map(referenceChemicals.map((chemical) => [chemical.key, chemical]));

export function referenceChemical(key: string): ChemicalData {
  const chemical = byKey.get(key);
  if (!chemical) throw new Error(`Unknown reference chemical: ${key}`);
  return chemical;
}

export type BoratePhasePoint = {
  label: 'A' | 'E1' | 'E2';
  /** borax decahydrate mass / (borax decahydrate + boric acid) mass */
  boraxShare: number;
  /** g of borax decahydrate + boric acid per 100 g of water, as weighed */
  solidsPer100gWater: number;
};

// Saturated borax decahydrate + boric acid solutions at 25 °C; A is boric acid alone, E1 and E2
// are where two solid phases coexist. Together the borates dissolve several times what either
// does alone, which is why a mix gets its own limit.
export const boraxBoricAcidPhasePoints25C: {
  tempC: number;
  points: readonly BoratePhasePoint[];
  source: string;
  confidence: Confidence;
} = {
  tempC: 25,
  points: [
    { label: 'A', boraxShare: 0, solidsPer100gWater: 5.75 },
    { label: 'E1', boraxShare: 0.48, solidsPer100gWater: 28.0 },
    { label: 'E2', boraxShare: 0.59, solidsPer100gWater: 39.9 },
  ],
  source:
    'Na2O–B2O3–H2O phase diagram at 25 °C, J. Chem. 2020, article 6687742, Table 1 [C], ' +
    'converted to weighed borax decahydrate and boric acid per 100 g water [D]',
  confidence: 'derived',
};
