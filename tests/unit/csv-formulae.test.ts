import fc from 'fast-check';
import Papa from 'papaparse';
import { escapeFormula, FORMULA_START, unescapeFormula } from '../../shared/csv/formulae';

// The characters that make a spreadsheet treat a cell as a formula: OWASP, "CSV Injection"
// (=, +, -, @, tab, carriage return).
describe('CSV cells that a spreadsheet would run', () => {
  it.each([
    ['=HYPERLINK("http://x.invalid","open")', `'=HYPERLINK("http://x.invalid","open")`],
    ['+1+1', "'+1+1"],
    ['-1+cmd|x', "'-1+cmd|x"],
    ['@SUM(A1)', "'@SUM(A1)"],
    ['\tTab first', "'\tTab first"],
    ["'=already quoted", "''=already quoted"],
  ])('puts an apostrophe before %j', (cell, exported) => {
    expect(escapeFormula(cell)).toBe(exported);
    expect(unescapeFormula(exported)).toBe(cell);
  });

  it.each(['Muslin drape soak', '-3.25', '-12', '0', "it's fine", "'plain quote"])(
    'leaves %j as it is',
    (cell) => {
      expect(escapeFormula(cell)).toBe(cell);
      expect(unescapeFormula(cell)).toBe(cell);
    },
  );

  it('gives back every text through papaparse export and import', () => {
    fc.assert(
      fc.property(
        fc.array(fc.string({ unit: 'grapheme', maxLength: 12 }), { minLength: 1, maxLength: 4 }),
        (cells) => {
          const csv = Papa.unparse([cells], { escapeFormulae: FORMULA_START, newline: '\n' });
          const parsed = Papa.parse<string[]>(csv, { newline: '\n' }).data[0] ?? [];
          const back = cells.length === 1 && cells[0] === '' ? [''] : parsed.map(unescapeFormula);
          expect(back).toEqual(cells);
        },
      ),
      { numRuns: 300 },
    );
  });
});
