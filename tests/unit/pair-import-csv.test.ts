import { AppError } from '../../server/errors';
import { readPairsCsv } from '../../server/services/pair-import-csv';

const header =
  'held_at,recipe,revision,substrate,exposure_s,igniter,orientation,draft,control_char_mm,treated_char_mm';

function refusal(text: string) {
  try {
    readPairsCsv(text);
  } catch (err) {
    if (err instanceof AppError) return { status: err.status, fields: err.fields };
    throw err;
  }
  throw new Error('the file was read');
}

describe('readPairsCsv', () => {
  it('numbers rows by the line they start on, past blank lines and quoted line breaks', () => {
    // A quoted field may hold a line break (RFC 4180 §2.6).
    const text = [
      header,
      '2025-11-03,Drape soak,1,Muslin,12,match,vertical,hood,300,52',
      '',
      '2025-11-03,"Drape',
      'soak",1,Muslin,12,match,vertical,hood,300,61',
      '2025-11-04,Drape soak,1,Muslin,12,match,vertical,hood,290,48',
    ].join('\r\n');
    const { rows } = readPairsCsv(text);
    expect(rows.map((r) => r.line)).toEqual([2, 4, 6]);
    expect(rows[1]!.cells.recipe).toBe('Drape\nsoak');
    expect(rows[2]!.cells.treated_char_mm).toBe('48');
  });

  it('reads a semicolon-separated file with decimal commas and a byte-order mark', () => {
    const text = `\uFEFF${header.replaceAll(',', ';')};add_on_pct\n2025-11-03;Drape soak;1;Muslin;12;match;vertical;hood;300;52,5;7,25\n`;
    const { rows } = readPairsCsv(text);
    expect(rows[0]!.cells).toMatchObject({ held_at: '2025-11-03', treated_char_mm: '52,5' });
    expect(rows[0]!.cells.add_on_pct).toBe('7,25');
    expect(rows[0]!.cells.batch).toBe('');
  });

  it('refuses a file without a required column, naming each missing column', () => {
    expect(refusal('held_at,recipe,revision\n2025-11-03,Drape soak,1\n')).toEqual({
      status: 400,
      fields: [
        'substrate',
        'exposure_s',
        'igniter',
        'orientation',
        'draft',
        'control_char_mm',
        'treated_char_mm',
      ].map((c) => ({ path: c, message: `The file has no "${c}" column` })),
    });
  });

  it('refuses an empty file, a header alone and a column given twice', () => {
    expect(refusal('  \n')).toEqual({
      status: 400,
      fields: [{ path: 'file', message: 'The file is empty' }],
    });
    expect(refusal(`${header}\n`).fields).toEqual([
      { path: 'file', message: 'The file has a header but no rows' },
    ]);
    expect(refusal(`${header},recipe\n1,2\n`).fields).toEqual([
      { path: 'recipe', message: 'The column "recipe" is in the header twice' },
    ]);
  });

  it('lists unknown columns as ignored and flags a row with more cells than the header', () => {
    const text = `${header},pair_id,colour\n2025-11-03,Drape soak,1,Muslin,12,match,vertical,hood,300,52,x,red,extra\n`;
    const { rows, ignoredColumns } = readPairsCsv(text);
    expect(ignoredColumns).toEqual(['colour']);
    expect(rows[0]!.problems).toEqual(['The row has 13 cells, the header 12']);
  });
});
