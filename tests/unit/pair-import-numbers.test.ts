import { parseDecimal, parseYesNo } from '../../shared/schemas/pair-import';

describe('parseDecimal', () => {
  it('reads a decimal point or a decimal comma alike', () => {
    // Source: ISO 80000-1:2009 §7.3.2, the decimal sign is a comma or a point on the line [M]
    expect(parseDecimal('12.5')).toBe(12.5);
    expect(parseDecimal('12,5')).toBe(12.5);
    expect(parseDecimal(' 0,25 ')).toBe(0.25);
    expect(parseDecimal('.5')).toBe(0.5);
    expect(parseDecimal('-3')).toBe(-3);
  });

  it('answers undefined for an empty cell, so "not given" differs from zero', () => {
    expect(parseDecimal('')).toBeUndefined();
    expect(parseDecimal('   ')).toBeUndefined();
    expect(parseDecimal('0')).toBe(0);
  });

  it('answers NaN for text that is not a plain decimal number', () => {
    for (const text of ['abc', '1.234,5', '1,234.5', '1 234', '0x10', '1e3', 'Infinity', '12 mm']) {
      expect([text, parseDecimal(text)]).toEqual([text, Number.NaN]);
    }
  });
});

describe('parseYesNo', () => {
  it('reads true/false, yes/no and 1/0 in any case; empty is not given', () => {
    expect(['TRUE', 'yes', 'Y', '1'].map(parseYesNo)).toEqual([true, true, true, true]);
    expect(['false', 'No', 'n', '0'].map(parseYesNo)).toEqual([false, false, false, false]);
    expect(parseYesNo('')).toBeUndefined();
    expect(parseYesNo('maybe')).toBeNull();
  });
});
