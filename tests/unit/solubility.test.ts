import {
  boraxBoricAcidPhasePoints25C,
  referenceChemical,
  referenceChemicals,
} from '../../shared/chemistry/reference-chemicals';
import {
  crystallisationTemperature,
  massPercentToPer100gWater,
  per100gWaterToMassPercent,
  solubilityAt,
} from '../../shared/chemistry/solubility';

const boricAcid = referenceChemical('boric-acid');
const boraxDecahydrate = referenceChemical('borax-decahydrate');
const dap = referenceChemical('diammonium-phosphate');
const map = referenceChemical('monoammonium-phosphate');
const ammoniumSulfate = referenceChemical('ammonium-sulfate');

function solubilityValue(result: ReturnType<typeof solubilityAt>): number {
  if (result.status !== 'ok') throw new Error(`expected a value, got ${result.status}`);
  return result.gPer100gWater;
}

describe('reference chemicals', () => {
  it.each([
    // Source: domain-facts §1 molar masses, IUPAC atomic weights [D], agreeing with
    // published values [C]
    ['boric-acid', 61.83, 17.48],
    ['borax-decahydrate', 381.37, 11.34],
    ['borax-pentahydrate', 291.29, 14.84],
    ['borax-anhydrous', 201.22, 21.49],
    ['diammonium-phosphate', 132.06, null],
    ['monoammonium-phosphate', 115.03, null],
    ['ammonium-sulfate', 132.13, null],
  ])('gives %s its molar mass %s g/mol and boron content', (key, molarMass, boronPercent) => {
    const chemical = referenceChemical(key);
    // Within 0.02 g/mol: the table rounds, and B = 10.81 here puts decahydrate at 381.36.
    expect(Math.abs(chemical.molarMass - molarMass)).toBeLessThan(0.02);
    if (boronPercent === null) {
      expect(chemical.boronFraction).toBeNull();
    } else {
      expect((chemical.boronFraction ?? 0) * 100).toBeCloseTo(boronPercent, 2);
    }
  });

  it('counts the water of crystallisation of the borax hydrates', () => {
    // 10 H2O of 381.37 g/mol; derived from the molar masses above [D]
    expect(boraxDecahydrate.hydrateWaterFraction).toBeCloseTo(0.4724, 3);
    expect(boraxDecahydrate.anhydrousMolarMass).toBeCloseTo(201.22, 1);
    expect(referenceChemical('borax-anhydrous').hydrateWaterFraction).toBe(0);
  });

  it('marks borates reprotoxic and borax forms also eye irritants', () => {
    // Source: domain-facts §4, CLH report 2018 / RAC opinion 2019, Repr. 1B H360FD; borax H319 [C]
    expect(boricAcid.hazards.map((h) => h.code)).toEqual(['H360FD']);
    expect(boraxDecahydrate.hazards.map((h) => h.code)).toEqual(['H360FD', 'H319']);
    expect(boraxDecahydrate.cautions).toContain('eye_irritant');
    expect(dap.cautions).toContain('warm_ammonium_phosphate');
    expect(ammoniumSulfate.cautions).not.toContain('warm_ammonium_phosphate');
    expect(ammoniumSulfate.cautions).toContain('ammonium_no_bleach');
  });

  it('keys every chemical uniquely and refuses an unknown key', () => {
    const keys = referenceChemicals.map((c) => c.key);
    expect(new Set(keys).size).toBe(keys.length);
    expect(() => referenceChemical('sodium-silicate')).toThrow(/sodium-silicate/);
  });

  it('labels the borax series as from memory and MAP as having no data', () => {
    expect(boraxDecahydrate.solubility?.confidence).toBe('memory');
    expect(boraxDecahydrate.solubility?.source).toMatch(/pentahydrate/);
    expect(boricAcid.solubility?.confidence).toBe('confirmed');
    expect(map.solubility).toBeNull();
  });

  it('stores phase-diagram points that follow from the published compositions', () => {
    // Source: J. Chem. 2020, article 6687742, Table 1 [C], converted to per 100 g water [D]
    const published = [
      { label: 'A', borax: 0, boricAcid: 5.44 },
      { label: 'E1', borax: 10.4, boricAcid: 11.48 },
      { label: 'E2', borax: 16.8, boricAcid: 11.72 },
    ];
    for (const { label, borax, boricAcid: acid } of published) {
      const point = boraxBoricAcidPhasePoints25C.points.find((p) => p.label === label);
      const solids = borax + acid;
      expect(point?.solidsPer100gWater).toBeCloseTo((100 * solids) / (100 - solids), 1);
      expect(Math.abs((point?.boraxShare ?? -1) - borax / solids)).toBeLessThan(0.006);
    }
  });
});

describe('solubilityAt', () => {
  it('reads boric acid at a table point: 4.87 g per 100 g water at 20 °C', () => {
    // Source: chemister.ru boric acid entry [C]
    expect(solubilityValue(solubilityAt(boricAcid, 20))).toBe(4.87);
    // Source: chemister.ru boric acid entry [C]
    expect(solubilityValue(solubilityAt(boricAcid, 25))).toBe(5.74);
  });

  it('interpolates linearly between table points', () => {
    // Source: chemister.ru boric acid entry [C] (30 °C 6.77, 40 °C 8.9), interpolated [D]
    expect(solubilityValue(solubilityAt(boricAcid, 35))).toBeCloseTo((6.77 + 8.9) / 2, 10);
    // Source: chemister.ru boric acid entry [C] (20 °C 4.87, 25 °C 5.74), interpolated [D]
    expect(solubilityValue(solubilityAt(boricAcid, 22))).toBeCloseTo(4.87 + 0.4 * 0.87, 10);
  });

  it('agrees with an independent saturation point for boric acid at 25 °C', () => {
    // Source: J. Chem. 2020, article 6687742, Table 1, point A: 5.44 wt % H3BO3 [C/D]
    const fromPhaseDiagram = massPercentToPer100gWater(5.44);
    expect(Math.abs(solubilityValue(solubilityAt(boricAcid, 25)) - fromPhaseDiagram)).toBeLessThan(
      0.02,
    );
  });

  it('reads ammonium sulfate from its table', () => {
    // Source: chemister.ru ammonium sulfate entry [C]
    expect(solubilityValue(solubilityAt(ammoniumSulfate, 25))).toBe(76.9);
  });

  it('counts borax on the anhydrous basis, matching the data sheet at 20 °C', () => {
    // from memory [M], unconfirmed: 2.56 g Na2B4O7 per 100 g water at 20 °C
    const anhydrous = solubilityValue(solubilityAt(boraxDecahydrate, 20));
    expect(anhydrous).toBe(2.56);
    const decahydrate = anhydrous / (1 - boraxDecahydrate.hydrateWaterFraction);
    const wtPercent = (100 * decahydrate) / (100 + anhydrous);
    // Source: domain-facts §1, the [M] series as decahydrate wt % 4.73 [D]
    expect(wtPercent).toBeCloseTo(4.73, 2);
    // Source: producer data sheet, 4.71 wt % decahydrate, ±0.2 wt % per °C, quoted secondarily [C]
    expect(Math.abs(wtPercent - 4.71)).toBeLessThan(0.2);
  });

  it('evaluates the DAP mole-fraction fit: 68.5 g at 20 °C and 106.7 g at 70 °C', () => {
    // Source: IUPAC-NIST Solubility Data Series 66 fit [C], evaluated in domain facts [D]
    expect(Math.abs(solubilityValue(solubilityAt(dap, 20)) - 68.5)).toBeLessThanOrEqual(0.2);
    // Source: IUPAC-NIST Solubility Data Series 66 fit [C], evaluated in domain facts [D]
    expect(Math.abs(solubilityValue(solubilityAt(dap, 70)) - 106.7)).toBeLessThanOrEqual(0.2);
  });

  it('reports a temperature beyond the DAP fit as out of range instead of extrapolating', () => {
    expect(solubilityAt(dap, 80)).toEqual({ status: 'out_of_range', fromC: 0, toC: 70 });
    expect(solubilityAt(dap, -5)).toEqual({ status: 'out_of_range', fromC: 0, toC: 70 });
  });

  it('reports a temperature beyond a table as out of range', () => {
    expect(solubilityAt(boraxDecahydrate, 80)).toEqual({
      status: 'out_of_range',
      fromC: 0,
      toC: 60,
    });
    expect(solubilityAt(boricAcid, 101)).toEqual({ status: 'out_of_range', fromC: 0, toC: 100 });
  });

  it('says there is no data for a chemical without solubility data', () => {
    expect(solubilityAt(map, 20)).toEqual({ status: 'no_data' });
  });

  it('converts a mass-% table to g per 100 g water before interpolating', () => {
    // Source: CRC Handbook "Aqueous Solubility of Inorganic Compounds at Various Temperatures",
    // boric acid, mass % [C], converted [D]
    const crcBoricAcid = {
      ...boricAcid,
      solubility: {
        kind: 'table' as const,
        basis: 'mass_percent' as const,
        solute: 'as_is' as const,
        points: [
          { tempC: 0, value: 2.52 },
          { tempC: 20, value: 4.72 },
          { tempC: 80, value: 19.1 },
          { tempC: 100, value: 27.53 },
        ],
        source: 'CRC Handbook, mass %',
        confidence: 'confirmed' as const,
      },
    };
    // Source: CRC Handbook … mass % [C], converted [D]
    expect(solubilityValue(solubilityAt(crcBoricAcid, 100))).toBeCloseTo(37.99, 2);
    // Source: chemister.ru boric acid entry [C]: the converted CRC series agrees within 0.1 g
    expect(Math.abs(solubilityValue(solubilityAt(crcBoricAcid, 100)) - 38)).toBeLessThan(0.1);
  });
});

describe('massPercentToPer100gWater', () => {
  it('turns mass % of solution into g per 100 g water', () => {
    // Source: CRC Handbook … mass % [C], converted [D]
    expect(massPercentToPer100gWater(27.53)).toBeCloseTo(37.99, 2);
    // Source: CRC Handbook … mass % [C], converted [D]
    expect(massPercentToPer100gWater(2.52)).toBeCloseTo(2.585, 3);
    // Source: CRC Handbook … mass % [C], converted [D]
    expect(massPercentToPer100gWater(19.1)).toBeCloseTo(23.61, 2);
  });

  it('is undone by per100gWaterToMassPercent', () => {
    expect(per100gWaterToMassPercent(massPercentToPer100gWater(27.53))).toBeCloseTo(27.53, 10);
    expect(per100gWaterToMassPercent(25)).toBe(20);
  });
});

describe('crystallisationTemperature', () => {
  it('puts 6 g boric acid per 100 g water between the 25 °C and 30 °C table points', () => {
    const result = crystallisationTemperature(boricAcid, 6);
    expect(result.kind).toBe('below');
    if (result.kind !== 'below') return;
    // Source: chemister.ru boric acid entry [C] (25 °C 5.74, 30 °C 6.77), interpolated [D]
    expect(result.tempC).toBeCloseTo(25 + ((6 - 5.74) / (6.77 - 5.74)) * 5, 10);
    expect(result.tempC).toBeGreaterThan(25);
    expect(result.tempC).toBeLessThan(30);
  });

  it('gives the table temperature for a solution saturated at a table point', () => {
    // Source: chemister.ru boric acid entry [C]
    expect(crystallisationTemperature(boricAcid, 4.87)).toEqual({ kind: 'below', tempC: 20 });
  });

  it('says a dilute solution stays dissolved down to the lowest data point', () => {
    expect(crystallisationTemperature(boricAcid, 1)).toEqual({
      kind: 'dissolved_down_to',
      tempC: 0,
    });
  });

  it('says an over-strong solution never dissolves within the data', () => {
    expect(crystallisationTemperature(boricAcid, 50)).toEqual({
      kind: 'never_dissolves_up_to',
      tempC: 100,
    });
  });

  it('inverts the DAP fit', () => {
    const at30 = solubilityValue(solubilityAt(dap, 30));
    const result = crystallisationTemperature(dap, at30);
    expect(result.kind).toBe('below');
    if (result.kind === 'below') expect(result.tempC).toBeCloseTo(30, 6);
  });

  it('has no answer without data', () => {
    expect(crystallisationTemperature(map, 10)).toEqual({ kind: 'no_data' });
  });
});
