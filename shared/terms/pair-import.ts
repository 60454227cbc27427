import { drafts, igniters, orientations, pairModes } from './burn';

/**
 * The columns of a pairs file: the lab's own `pairs.csv` export, so one lab's export imports into
 * another. Required columns must be in the header; the others may be missing or left empty.
 */
export const pairImportColumns = [
  {
    name: 'held_at',
    required: true,
    about: 'Day of the burn: 2026-03-14, or an ISO date and time',
  },
  { name: 'recipe', required: true, about: 'Name of a recipe of this lab' },
  { name: 'revision', required: true, about: 'Revision number of that recipe' },
  { name: 'substrate', required: true, about: 'What was treated, as written on the specimens' },
  { name: 'exposure_s', required: true, about: 'How long the flame was applied, s' },
  { name: 'igniter', required: true, about: igniters.join(', ') },
  { name: 'orientation', required: true, about: orientations.join(', ') },
  { name: 'draft', required: true, about: drafts.join(', ') },
  { name: 'control_char_mm', required: true, about: 'Char length of the untreated control, mm' },
  { name: 'treated_char_mm', required: true, about: 'Char length of the treated specimen, mm' },
  { name: 'batch', required: false, about: "A batch code of this lab, or a new one's code" },
  { name: 'add_on_pct', required: false, about: 'Add-on of the treated specimen, %' },
  { name: 'mode', required: false, about: `${pairModes.join(' or ')} (simultaneous if empty)` },
  { name: 'control_code', required: false, about: 'Code for the control; made up if empty' },
  { name: 'control_afterflame_s', required: false, about: 'Afterflame, s; empty: not timed' },
  {
    name: 'control_afterflame_complete',
    required: false,
    about: 'false if still burning at the end',
  },
  { name: 'control_afterglow_s', required: false, about: 'Afterglow, s' },
  { name: 'control_burn_time_s', required: false, about: 'Flame removed to end, s' },
  { name: 'control_burned_to_clamp', required: false, about: 'true or false' },
  { name: 'control_flaming_drips', required: false, about: 'true or false' },
  { name: 'treated_code', required: false, about: 'Code for the treated specimen' },
  { name: 'treated_afterflame_s', required: false, about: 'Afterflame, s; empty: not timed' },
  {
    name: 'treated_afterflame_complete',
    required: false,
    about: 'false if still burning at the end',
  },
  { name: 'treated_afterglow_s', required: false, about: 'Afterglow, s' },
  { name: 'treated_burn_time_s', required: false, about: 'Flame removed to end, s' },
  { name: 'treated_burned_to_clamp', required: false, about: 'true or false' },
  { name: 'treated_mass_loss_pct', required: false, about: 'Mass lost in the burn, %' },
  { name: 'treated_flaming_drips', required: false, about: 'true or false' },
] as const;
export type PairImportColumn = (typeof pairImportColumns)[number]['name'];
export const pairImportColumnNames = pairImportColumns.map((c) => c.name);

/** A header-only file to fill in: every column, required ones first. */
export function pairImportTemplate(): string {
  return `${pairImportColumnNames.join(',')}\r\n`;
}
