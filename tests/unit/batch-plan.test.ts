import {
  BatchPlanError,
  combinedBorateLimitAt25C,
  planBatch,
  toGramsPer100gWater,
  type BatchPlanInput,
} from '../../shared/batch/plan';
import { referenceChemical } from '../../shared/chemistry/reference-chemicals';

const boricAcid = referenceChemical('boric-acid');
const boraxDecahydrate = referenceChemical('borax-decahydrate');
const anhydrousBorax = referenceChemical('borax-anhydrous');
const dap = referenceChemical('diammonium-phosphate');
const map = referenceChemical('monoammonium-phosphate');
const ammoniumSulfate = referenceChemical('ammonium-sulfate');

const fiveLitreBoricAcid: BatchPlanInput = {
  ingredients: [{ chemical: boricAcid, amount: 5, unit: 'g_per_100g_water' }],
  target: { basis: 'water_volume', millilitres: 5000 },
  mixingTempC: 25,
  storageTempC: 25,
};

function planError(input: BatchPlanInput): BatchPlanError {
  try {
    planBatch(input);
  } catch (error) {
    if (error instanceof BatchPlanError) return error;
    throw error;
  }
  throw new Error('expected planBatch to refuse the recipe');
}

describe('planBatch amounts', () => {
  it('weighs 250 g boric acid for 5 L of water at 5 g per 100 g water', () => {
    const plan = planBatch(fiveLitreBoricAcid);
    expect(plan.waterMassG).toBe(5000);
    expect(plan.waterVolumeMl).toBe(5000);
    expect(plan.ingredients[0]?.massG).toBeCloseTo(250, 10);
    expect(plan.solutionMassG).toBeCloseTo(5250, 10);
    expect(plan.totalSolidsPercent).toBeCloseTo((100 * 250) / 5250, 10);
    expect(plan.assumptions.join(' ')).toMatch(/1\.000 g\/mL/);
  });

  it('makes 1 kg of a 10 % DAP solution from 100 g DAP and 900 g water', () => {
    const plan = planBatch({
      ingredients: [{ chemical: dap, amount: 10, unit: 'pct_solution' }],
      target: { basis: 'solution_mass', grams: 1000 },
      mixingTempC: 20,
      storageTempC: 20,
    });
    expect(plan.ingredients[0]?.massG).toBeCloseTo(100, 9);
    expect(plan.waterMassG).toBeCloseTo(900, 9);
    expect(plan.ingredients[0]?.massPercentOfSolution).toBeCloseTo(10, 9);
    expect(plan.ingredients[0]?.gPer100gWater).toBeCloseTo(100 / 9, 9);
  });

  it('scales a solution-mass target so that solution = water + solids', () => {
    const plan = planBatch({
      ...fiveLitreBoricAcid,
      target: { basis: 'solution_mass', grams: 1050 },
    });
    expect(plan.waterMassG).toBeCloseTo(1000, 9);
    expect(plan.ingredients[0]?.massG).toBeCloseTo(50, 9);
  });

  it('mixes g per litre of water with % of solution in one recipe', () => {
    const plan = planBatch({
      ingredients: [
        { chemical: boricAcid, amount: 50, unit: 'g_per_l_water' },
        { chemical: dap, amount: 10, unit: 'pct_solution' },
      ],
      target: { basis: 'water_mass', grams: 1000 },
      mixingTempC: 30,
      storageTempC: 30,
    });
    const [acid, phosphate] = plan.ingredients;
    expect(acid?.gPer100gWater).toBeCloseTo(5, 12);
    expect(acid?.massG).toBeCloseTo(50, 9);
    expect(phosphate?.massPercentOfSolution).toBeCloseTo(10, 9);
    expect(phosphate?.massG).toBeCloseTo(0.1 * plan.solutionMassG, 9);
    expect(plan.solutionMassG).toBeCloseTo(1000 + 50 + phosphate!.massG, 9);
    expect(plan.assumptions.join(' ')).toMatch(/1 L of water is taken as 1000 g/);
  });

  it('turns parts into g per 100 g water using the parts of water', () => {
    const ingredients = [
      { chemical: boricAcid, amount: 2, unit: 'parts' as const },
      { chemical: boraxDecahydrate, amount: 3, unit: 'parts' as const },
    ];
    expect(toGramsPer100gWater(ingredients, 50)).toEqual([4, 6]);
    const plan = planBatch({
      ingredients,
      waterParts: 100,
      target: { basis: 'water_mass', grams: 2000 },
      mixingTempC: 25,
      storageTempC: 25,
    });
    expect(plan.ingredients.map((i) => i.massG)).toEqual([40, 60]);
  });
});

describe('planBatch boron figures', () => {
  it('gives 1 g borax decahydrate the boron of 0.6485 g boric acid', () => {
    const plan = planBatch({
      ingredients: [{ chemical: boraxDecahydrate, amount: 1, unit: 'g_per_100g_water' }],
      target: { basis: 'water_mass', grams: 100 },
      mixingTempC: 25,
      storageTempC: 25,
    });
    expect(plan.ingredients[0]?.massG).toBeCloseTo(1, 12);
    // Source: domain-facts §1 check 0.6485 g/g [D]; crystalls.info 64.85 g per 100 g [C]
    expect(plan.boricAcidEquivalentG).toBeCloseTo(0.6485, 4);
    // Source: domain-facts §1 molar masses, borax decahydrate 11.34 % B [D]
    expect((plan.boronPercent * plan.solutionMassG) / 100).toBeCloseTo(0.1134, 4);
  });

  it('gives saturated boric acid at 25 °C its published B2O3 content', () => {
    const plan = planBatch({
      // Source: J. Chem. 2020, article 6687742, Table 1, point A: 5.44 wt % H3BO3 [C/D]
      ingredients: [{ chemical: boricAcid, amount: 5.44, unit: 'pct_solution' }],
      target: { basis: 'solution_mass', grams: 100 },
      mixingTempC: 25,
      storageTempC: 25,
    });
    // Source: J. Chem. 2020, article 6687742, Table 1, point A: 3.06 wt % B2O3 [C]
    expect(plan.b2o3EquivalentG).toBeCloseTo(3.06, 2);
    expect(plan.boricAcidEquivalentG).toBeCloseTo(5.44, 10);
  });
});

describe('planBatch saturation', () => {
  it('leaves a 5 g per 100 g boric acid solution unflagged at 25 °C', () => {
    const plan = planBatch(fiveLitreBoricAcid);
    const storage = plan.ingredients[0]?.saturation.storage;
    expect(storage?.status).toBe('ok');
    // Source: chemister.ru boric acid entry [C]: 5.74 g at 25 °C
    expect(storage?.ratio).toBeCloseTo(5 / 5.74, 10);
    expect(plan.warnings).toEqual([]);
  });

  it('warns that the recipe stored at 5 °C will crystallise, and below which temperature', () => {
    const plan = planBatch({ ...fiveLitreBoricAcid, storageTempC: 5 });
    expect(plan.ingredients[0]?.saturation.storage.status).toBe('supersaturated');
    // Source: chemister.ru boric acid entry [C] (0 °C 2.77, 10 °C 3.65), interpolated [D]
    expect(plan.ingredients[0]?.saturation.storage.solubilityGPer100gWater).toBeCloseTo(3.21, 10);
    const crystals = plan.ingredients[0]?.crystallisesBelow;
    // Source: chemister.ru boric acid entry [C] (20 °C 4.87, 25 °C 5.74), interpolated [D]
    const expected = 20 + ((5 - 4.87) / (5.74 - 4.87)) * 5;
    expect(crystals).toEqual({ kind: 'below', tempC: expect.closeTo(expected, 10) });
    const warning = plan.warnings.find((w) => w.code === 'supersaturated_at_storage');
    expect(warning?.ingredientKey).toBe('boric-acid');
    expect(warning?.message).toMatch(/crystallise on standing at 5 °C/);
    expect(warning?.message).toMatch(/below about 20\.7 °C/);
  });

  it('warns when an ingredient will not fully dissolve at the mixing temperature', () => {
    const plan = planBatch({
      ...fiveLitreBoricAcid,
      ingredients: [{ chemical: boricAcid, amount: 8, unit: 'g_per_100g_water' }],
      mixingTempC: 20,
      storageTempC: 60,
    });
    expect(plan.warnings.map((w) => w.code)).toEqual(['supersaturated_at_mixing']);
    expect(plan.warnings[0]?.message).toMatch(/will not fully dissolve at 20 °C/);
  });

  it('warns near saturation from 90 % of the solubility', () => {
    // Source: chemister.ru boric acid entry [C]: 5.74 g at 25 °C, so 5.3 g is 92 %
    const plan = planBatch({
      ...fiveLitreBoricAcid,
      ingredients: [{ chemical: boricAcid, amount: 5.3, unit: 'g_per_100g_water' }],
    });
    expect(plan.ingredients[0]?.saturation.storage.status).toBe('near');
    expect(plan.warnings.map((w) => w.code)).toEqual(['near_saturation']);
  });

  it('checks DAP against the IUPAC-NIST fit', () => {
    const plan = planBatch({
      ingredients: [{ chemical: dap, amount: 40, unit: 'g_per_100g_water' }],
      target: { basis: 'water_mass', grams: 1000 },
      mixingTempC: 20,
      storageTempC: 20,
    });
    const storage = plan.ingredients[0]?.saturation.storage;
    // Source: IUPAC-NIST Solubility Data Series 66 fit [C], evaluated in domain facts [D]
    expect(Math.abs((storage?.solubilityGPer100gWater ?? 0) - 68.5)).toBeLessThanOrEqual(0.2);
    expect(storage?.status).toBe('ok');
  });

  it('counts borax on the anhydrous basis with its water of crystallisation as solvent', () => {
    const plan = planBatch({
      ingredients: [{ chemical: boraxDecahydrate, amount: 5, unit: 'g_per_100g_water' }],
      target: { basis: 'water_mass', grams: 100 },
      mixingTempC: 30,
      storageTempC: 30,
    });
    const anhydrous = 5 * (1 - boraxDecahydrate.hydrateWaterFraction);
    const water = 100 + 5 * boraxDecahydrate.hydrateWaterFraction;
    const storage = plan.ingredients[0]?.saturation.storage;
    // from memory [M], unconfirmed: 3.86 g Na2B4O7 per 100 g water at 30 °C
    expect(storage?.solubilityGPer100gWater).toBe(3.86);
    expect(storage?.ratio).toBeCloseTo((100 * anhydrous) / water / 3.86, 10);
    expect(plan.assumptions.join(' ')).toMatch(/Borax decahydrate.*from memory/);
  });

  it('says a temperature outside the data range is not checked, naming the range', () => {
    const plan = planBatch({
      ingredients: [{ chemical: dap, amount: 20, unit: 'g_per_100g_water' }],
      target: { basis: 'water_mass', grams: 1000 },
      mixingTempC: 80,
      storageTempC: 20,
    });
    expect(plan.ingredients[0]?.saturation.mixing).toEqual({ status: 'outside_data_range' });
    const warning = plan.warnings.find((w) => w.code === 'outside_data_range');
    expect(warning?.message).toMatch(/at 80 °C/);
    expect(warning?.message).toMatch(/0–70 °C/);
  });

  it('says plainly that MAP has no solubility data', () => {
    const plan = planBatch({
      ingredients: [{ chemical: map, amount: 10, unit: 'g_per_100g_water' }],
      target: { basis: 'water_mass', grams: 1000 },
      mixingTempC: 20,
      storageTempC: 20,
    });
    expect(plan.ingredients[0]?.saturation.storage).toEqual({ status: 'no_data' });
    expect(plan.ingredients[0]?.crystallisesBelow).toEqual({ kind: 'no_data' });
    expect(plan.warnings).toEqual([
      {
        code: 'no_solubility_data',
        message: 'No saturation check for Monoammonium phosphate (MAP): no solubility data.',
        ingredientKey: 'monoammonium-phosphate',
      },
    ]);
  });
});

describe('combined borax + boric acid limit at 25 °C', () => {
  // Pure borax closes the curve: 3.21 g Na2B4O7 per 100 g water at 25 °C, interpolated from the
  // borax series (from memory [M], unconfirmed), as weighed decahydrate per 100 g free water.
  const anhydrous = (2.56 + 3.86) / 2;
  const asDecahydrate = anhydrous / (1 - boraxDecahydrate.hydrateWaterFraction);
  const pureBorax = (100 * asDecahydrate) / (100 - (asDecahydrate - anhydrous));

  it('matches the phase-diagram points exactly', () => {
    // Source: J. Chem. 2020, article 6687742, Table 1 [C], converted to weighed amounts [D]
    expect(combinedBorateLimitAt25C(0)).toBeCloseTo(5.75, 10);
    // Source: J. Chem. 2020, article 6687742, Table 1 [C], converted to weighed amounts [D]
    expect(combinedBorateLimitAt25C(0.48)).toBeCloseTo(28.0, 10);
    // Source: J. Chem. 2020, article 6687742, Table 1 [C], converted to weighed amounts [D]
    expect(combinedBorateLimitAt25C(0.59)).toBeCloseTo(39.9, 10);
    expect(combinedBorateLimitAt25C(1)).toBeCloseTo(pureBorax, 10);
  });

  it('interpolates between E1 and E2, and gives the 60 : 40 mix just past E2', () => {
    // Source: J. Chem. 2020, article 6687742, Table 1 [C], converted [D], interpolated [D]
    expect(combinedBorateLimitAt25C(0.535)).toBeCloseTo((28.0 + 39.9) / 2, 10);
    // Source: J. Chem. 2020, article 6687742, Table 1 [C]; borax end from memory [M], unconfirmed
    const sixtyForty = 39.9 + ((0.6 - 0.59) / (1 - 0.59)) * (pureBorax - 39.9);
    expect(combinedBorateLimitAt25C(0.6)).toBeCloseTo(sixtyForty, 10);
    // Source: NZ Farm Forestry citing a US Navy specification: 60 : 40 is about the maximum [C]
    expect(combinedBorateLimitAt25C(0.6)).toBeGreaterThan(combinedBorateLimitAt25C(0.48));
  });

  it('checks a 60 : 40 mix as a pair and does not flag either borate alone', () => {
    const plan = planBatch({
      ingredients: [
        { chemical: boraxDecahydrate, amount: 12, unit: 'g_per_100g_water' },
        { chemical: boricAcid, amount: 8, unit: 'g_per_100g_water' },
      ],
      target: { basis: 'water_mass', grams: 1000 },
      mixingTempC: 25,
      storageTempC: 25,
    });
    expect(plan.combinedBorate?.boraxShare).toBeCloseTo(0.6, 10);
    expect(plan.combinedBorate?.solidsGPer100gWater).toBeCloseTo(20, 10);
    expect(plan.combinedBorate?.ratio).toBeCloseTo(20 / combinedBorateLimitAt25C(0.6), 10);
    expect(plan.combinedBorate?.note).toMatch(/far beyond/);
    // Alone, 12 g decahydrate per 100 g water would not dissolve at 25 °C; mixed, it does.
    expect(plan.ingredients[0]?.saturation.storage.status).toBe('supersaturated');
    expect(plan.warnings.map((w) => w.code)).toEqual(['combined_limit_at_25c_only']);
  });

  it('flags a borate pair above the combined limit as crystallising on storage', () => {
    const plan = planBatch({
      ingredients: [
        { chemical: boraxDecahydrate, amount: 30, unit: 'g_per_100g_water' },
        { chemical: boricAcid, amount: 20, unit: 'g_per_100g_water' },
      ],
      target: { basis: 'water_mass', grams: 1000 },
      mixingTempC: 40,
      storageTempC: 15,
    });
    expect(plan.combinedBorate?.ratio).toBeGreaterThan(1);
    const storage = plan.warnings.filter((w) => w.code === 'supersaturated_at_storage');
    expect(storage).toHaveLength(1);
    expect(storage[0]?.ingredientKey).toBeUndefined();
    const at25Only = plan.warnings.find((w) => w.code === 'combined_limit_at_25c_only');
    expect(at25Only?.message).toMatch(/15 °C/);
  });

  it('counts anhydrous borax as decahydrate by boron and its missing water as no solvent', () => {
    const decahydratePerAnhydrous =
      (anhydrousBorax.boronFraction ?? 0) / (boraxDecahydrate.boronFraction ?? 1);
    const plan = planBatch({
      ingredients: [
        {
          chemical: anhydrousBorax,
          amount: 12 / decahydratePerAnhydrous,
          unit: 'g_per_100g_water',
        },
        { chemical: boricAcid, amount: 8, unit: 'g_per_100g_water' },
      ],
      target: { basis: 'water_mass', grams: 100 },
      mixingTempC: 25,
      storageTempC: 25,
    });
    const freeWater = 100 - 12 * boraxDecahydrate.hydrateWaterFraction;
    expect(plan.combinedBorate?.boraxShare).toBeCloseTo(0.6, 10);
    expect(plan.combinedBorate?.solidsGPer100gWater).toBeCloseTo((100 * 20) / freeWater, 10);
  });
});

describe('planBatch refusals', () => {
  const refused = (input: Partial<BatchPlanInput>) =>
    planError({ ...fiveLitreBoricAcid, ...input });

  it('refuses percentages of solution that reach 100 %', () => {
    const error = refused({
      ingredients: [
        { chemical: dap, amount: 60, unit: 'pct_solution' },
        { chemical: ammoniumSulfate, amount: 45, unit: 'pct_solution' },
      ],
    });
    expect(error.path).toBe('ingredients');
    expect(error.message).toMatch(/105 %/);
    expect(
      refused({ ingredients: [{ chemical: dap, amount: 100, unit: 'pct_solution' }] }).path,
    ).toBe('ingredients');
  });

  it('refuses a chemical listed twice', () => {
    const error = refused({
      ingredients: [
        { chemical: boricAcid, amount: 2, unit: 'g_per_100g_water' },
        { chemical: boricAcid, amount: 3, unit: 'pct_solution' },
      ],
    });
    expect(error.path).toBe('ingredients.1.chemical');
    expect(error.message).toMatch(/Boric acid is listed twice/);
  });

  it('refuses a recipe without ingredients', () => {
    expect(refused({ ingredients: [] }).path).toBe('ingredients');
  });

  it.each([0, -1, Number.NaN, Number.POSITIVE_INFINITY])('refuses an amount of %s', (amount) => {
    const error = refused({
      ingredients: [
        { chemical: dap, amount: 5, unit: 'g_per_100g_water' },
        { chemical: boricAcid, amount, unit: 'g_per_100g_water' },
      ],
    });
    expect(error.path).toBe('ingredients.1.amount');
  });

  it('refuses parts without the parts of water', () => {
    const error = refused({ ingredients: [{ chemical: boricAcid, amount: 1, unit: 'parts' }] });
    expect(error.path).toBe('waterParts');
  });

  it('refuses an empty batch size', () => {
    expect(refused({ target: { basis: 'water_volume', millilitres: 0 } }).path).toBe('target');
    expect(refused({ target: { basis: 'solution_mass', grams: -5 } }).path).toBe('target');
  });

  it('refuses a storage temperature below freezing', () => {
    const error = refused({ storageTempC: -2 });
    expect(error.path).toBe('storageTempC');
    expect(error.message).toMatch(/below freezing/);
  });

  it('refuses a mixing temperature above boiling', () => {
    expect(refused({ mixingTempC: 101 }).path).toBe('mixingTempC');
  });
});
