/** Words and lists of a recipe, without zod (the web app's first load). */
export const substrates = [
  'paper',
  'board',
  'cotton',
  'other_fabric',
  'wood',
  'loose_fill_cellulose',
  'other',
] as const;
export type Substrate = (typeof substrates)[number];

export const substrateLabels: Record<Substrate, string> = {
  paper: 'Paper',
  board: 'Board',
  cotton: 'Cotton',
  other_fabric: 'Other fabric',
  wood: 'Wood',
  loose_fill_cellulose: 'Loose-fill cellulose',
  other: 'Other',
};

export const amountUnits = ['pct_solution', 'g_per_100g_water', 'g_per_l_water', 'parts'] as const;
export const amountUnitLabels: Record<(typeof amountUnits)[number], string> = {
  pct_solution: '% of solution (by mass)',
  g_per_100g_water: 'g per 100 g water',
  g_per_l_water: 'g per litre of water',
  parts: 'parts by mass',
};

export const dryingMethods = ['air', 'rack', 'oven', 'press', 'other'] as const;
