/** How far a value can be trusted: confirmed in its source, derived from one, or from memory. */
export type Confidence = 'confirmed' | 'derived' | 'memory';

export type SolubilityTable = {
  kind: 'table';
  /** g solute per 100 g water, or mass % of the saturated solution */
  basis: 'g_per_100g_water' | 'mass_percent';
  /** the solute form the values count: the chemical itself, or its anhydrous form */
  solute: 'as_is' | 'anhydrous';
  points: { tempC: number; value: number }[]; // ascending tempC
  source: string;
  confidence: Confidence;
};

export type SolubilityFit = {
  kind: 'mole_fraction_fit'; // ln x = A + B/T + C ln T, x mole fraction, T in K
  A: number;
  B: number;
  C: number;
  validFromC: number;
  validToC: number;
  source: string;
  confidence: Confidence;
};

export type Solubility = SolubilityTable | SolubilityFit;

export type CautionKey =
  | 'reprotoxic_borate'
  | 'eye_irritant'
  | 'dust'
  | 'warm_ammonium_phosphate'
  | 'ammonium_no_bleach'
  | 'disposal';

export type ChemicalData = {
  key: string; // stable id, e.g. 'boric-acid'
  name: string; // e.g. 'Boric acid'
  formula: string; // e.g. 'H3BO3'
  molarMass: number; // g/mol
  boronFraction: number | null; // mass fraction of B (0.1748 for boric acid), null when no boron
  hydrateWaterFraction: number; // mass fraction that is water of crystallisation (0 if none)
  anhydrousMolarMass?: number; // for hydrates: molar mass of the anhydrous form
  borateGroup?: 'borax' | 'boric_acid'; // takes part in the combined borax + boric acid limit
  hazards: { code: string; text: string }[]; // wording our own
  cautions: CautionKey[];
  solubility: Solubility | null;
};
