import {
  cToF,
  formatMass,
  fromGrams,
  fromMillilitres,
  fToC,
  LENGTH,
  toGrams,
  toMillilitres,
} from '../../shared/units';

describe('mass conversions', () => {
  it('converts one pound to exactly 453.59237 g and back', () => {
    // Source: domain-facts §1 unit constants, exact by definition [C]
    expect(toGrams(1, 'lb')).toBe(453.59237);
    expect(fromGrams(453.59237, 'lb')).toBe(1);
  });

  it('converts one ounce to exactly 28.349523125 g', () => {
    // Source: domain-facts §1 unit constants, exact by definition [C]
    expect(toGrams(1, 'oz')).toBe(28.349523125);
    // 16 oz = 1 lb by definition, no source needed beyond the constants above
    expect(toGrams(16, 'oz')).toBeCloseTo(toGrams(1, 'lb'), 9);
  });

  it('converts kilograms and grams', () => {
    expect(toGrams(2.5, 'kg')).toBe(2500);
    expect(fromGrams(250, 'kg')).toBe(0.25);
    expect(toGrams(7, 'g')).toBe(7);
  });
});

describe('volume conversions', () => {
  it('converts one US gallon to exactly 3785.411784 mL and back', () => {
    // Source: domain-facts §1 unit constants, exact by definition [C]
    expect(toMillilitres(1, 'gal')).toBe(3785.411784);
    expect(fromMillilitres(3785.411784, 'gal')).toBe(1);
  });

  it('converts one US quart to exactly 946.352946 mL, a quarter gallon', () => {
    // Source: domain-facts §1 unit constants, exact by definition [C]
    expect(toMillilitres(1, 'qt')).toBe(946.352946);
    expect(toMillilitres(4, 'qt')).toBeCloseTo(toMillilitres(1, 'gal'), 9);
  });

  it('converts litres', () => {
    expect(toMillilitres(5, 'L')).toBe(5000);
    expect(fromMillilitres(250, 'L')).toBe(0.25);
  });
});

describe('temperature conversions', () => {
  it('meets at −40 in both scales', () => {
    // common practice, no source (follows from F = 9/5·C + 32)
    expect(cToF(-40)).toBe(-40);
    expect(fToC(-40)).toBe(-40);
  });

  it('puts boiling water at 212 °F = 100 °C and freezing at 32 °F = 0 °C', () => {
    // common practice, no source (definition of the Fahrenheit scale)
    expect(fToC(212)).toBe(100);
    expect(cToF(100)).toBe(212);
    expect(fToC(32)).toBe(0);
  });

  it('round-trips a room temperature', () => {
    expect(fToC(cToF(23))).toBeCloseTo(23, 12);
  });
});

describe('length conversions', () => {
  it('uses 25.4 mm per inch exactly', () => {
    // common practice, no source (the international inch is 25.4 mm by definition)
    expect(LENGTH.inToMm(1)).toBe(25.4);
    expect(LENGTH.inToMm(6)).toBeCloseTo(152.4, 10);
    expect(LENGTH.mmToIn(101.6)).toBeCloseTo(4, 12);
  });
});

describe('formatMass', () => {
  it('shows grams below 1 kg and kilograms from 1 kg, to about three figures', () => {
    expect(formatMass(5.742, 'metric')).toBe('5.74 g');
    expect(formatMass(12.54, 'metric')).toBe('12.5 g');
    expect(formatMass(250, 'metric')).toBe('250 g');
    expect(formatMass(2500, 'metric')).toBe('2.5 kg');
    expect(formatMass(999.7, 'metric')).toBe('1 kg');
  });

  it('shows ounces below 1 lb and pounds from 1 lb', () => {
    expect(formatMass(28.349523125, 'us')).toBe('1 oz');
    expect(formatMass(250, 'us')).toBe('8.82 oz');
    expect(formatMass(453.59237 * 2.5, 'us')).toBe('2.5 lb');
  });

  it('shows a dash for a mass that is not a number', () => {
    expect(formatMass(Number.NaN, 'metric')).toBe('–');
  });
});
