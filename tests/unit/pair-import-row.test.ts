import {
  pairImportColumnNames,
  pairImportRowSchema,
  pairImportTemplate,
} from '../../shared/schemas/pair-import';

// Invented bench values, shaped like a row of our own pairs.csv export.
const base: Record<string, string> = {
  held_at: '2025-11-03T09:30:00.000Z',
  recipe: 'Drape soak',
  revision: '2',
  substrate: 'Muslin',
  exposure_s: '12',
  igniter: 'butane_lighter',
  orientation: 'vertical',
  draft: 'hood',
  control_char_mm: '300',
  treated_char_mm: '52',
  treated_afterflame_s: '0.8',
  treated_afterflame_complete: 'true',
  treated_afterglow_s: '4',
};

const cells = (over: Record<string, string> = {}) =>
  Object.fromEntries(pairImportColumnNames.map((n) => [n, over[n] ?? base[n] ?? '']));

function errorsOf(over: Record<string, string>) {
  const r = pairImportRowSchema.safeParse(cells(over));
  return r.success ? [] : r.error.issues.map((i) => [i.path.join('.'), i.message]);
}

describe('pairImportRowSchema', () => {
  it('reads a row of the pairs export into typed values', () => {
    const v = pairImportRowSchema.parse(cells({ add_on_pct: '7,5', batch: 'B-251103-01' }));
    expect(v).toMatchObject({
      held_at: '2025-11-03T09:30:00.000Z',
      recipe: 'Drape soak',
      revision: 2,
      exposure_s: 12,
      igniter: 'butane_lighter',
      control_char_mm: 300,
      treated_char_mm: 52,
      treated_afterflame_s: 0.8,
      treated_afterflame_complete: true,
      treated_afterglow_s: 4,
      add_on_pct: 7.5,
      batch: 'B-251103-01',
      mode: 'simultaneous',
    });
    expect(v.control_afterflame_s).toBeUndefined();
    expect(v.treated_code).toBeUndefined();
  });

  it('names the column of every bad cell', () => {
    expect(
      errorsOf({
        held_at: '03/11/2025',
        revision: 'two',
        control_char_mm: 'abc',
        treated_char_mm: '',
        igniter: 'torch',
        exposure_s: '0',
      }),
    ).toEqual([
      ['held_at', 'Write the date as 2026-03-14 or an ISO date and time'],
      ['revision', 'The revision is a whole number, e.g. 2'],
      ['exposure_s', 'The exposure must be more than 0'],
      [
        'igniter',
        'Unknown igniter "torch": use match, butane_lighter, bunsen, propane_torch, other',
      ],
      ['control_char_mm', '"abc" is not a number'],
      ['treated_char_mm', "Give the treated's char length"],
    ]);
  });

  it('takes a day alone at noon UTC and refuses a date in the future', () => {
    expect(pairImportRowSchema.parse(cells({ held_at: '2025-11-03' })).held_at).toBe(
      '2025-11-03T12:00:00.000Z',
    );
    expect(errorsOf({ held_at: '2999-01-01' })).toEqual([['held_at', 'The date is in the future']]);
  });

  it('accepts the words the app shows as well as the stored keys', () => {
    const v = pairImportRowSchema.parse(
      cells({ igniter: 'Butane lighter', orientation: '45°', draft: 'FUME HOOD' }),
    );
    expect([v.igniter, v.orientation, v.draft]).toEqual(['butane_lighter', 'angle_45', 'hood']);
  });

  it('refuses times that no burn could give', () => {
    expect(errorsOf({ treated_afterflame_complete: 'false' })).toEqual([
      ['treated_afterglow_s', 'A flame still burning when timing ended has no afterglow'],
    ]);
    expect(errorsOf({ control_afterglow_s: '3' })).toEqual([
      ['control_afterglow_s', 'Give the afterflame too, or no afterglow'],
    ]);
    expect(errorsOf({ treated_burned_to_clamp: 'yes' })).toEqual([
      ['treated_afterglow_s', 'A glow that reached the clamp has no time when it went out'],
    ]);
    expect(errorsOf({ treated_burn_time_s: '4.7' })).toEqual([
      ['treated_burn_time_s', 'The burn time is less than afterflame + afterglow (4.8 s)'],
    ]);
  });

  it('lets a burn time differ from afterflame + afterglow by the rounding of the file', () => {
    // Three values each rounded to 0.01 s can disagree by up to 0.015 s (arithmetic).
    expect(errorsOf({ treated_burn_time_s: '4.79' })).toEqual([]);
  });

  it('refuses one code for both specimens of a pair', () => {
    expect(errorsOf({ control_code: 'S-1', treated_code: 'S-1' })).toEqual([
      ['treated_code', 'The treated specimen needs a code other than the control'],
    ]);
  });
});

describe('pairImportTemplate', () => {
  it('is a header with every column, the required ones first', () => {
    const header = pairImportTemplate().trim().split(',');
    expect(header.slice(0, 3)).toEqual(['held_at', 'recipe', 'revision']);
    expect(header).toEqual(pairImportColumnNames);
  });
});
