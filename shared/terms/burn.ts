/** Words and lists of a burn test, without zod (the web app's first load). */
export const drafts = ['hood', 'enclosure', 'open_air'] as const;
export const igniters = ['match', 'butane_lighter', 'bunsen', 'propane_torch', 'other'] as const;
export const orientations = ['vertical', 'angle_45', 'horizontal'] as const;
export const pairModes = ['simultaneous', 'sequential'] as const;
export const pairStatuses = ['draft', 'submitted', 'signed_off', 'returned'] as const;
export type PairStatus = (typeof pairStatuses)[number];

export const draftLabels: Record<(typeof drafts)[number], string> = {
  hood: 'Fume hood',
  enclosure: 'Draft-free enclosure',
  open_air: 'Open air',
};
export const igniterLabels: Record<(typeof igniters)[number], string> = {
  match: 'Match',
  butane_lighter: 'Butane lighter',
  bunsen: 'Bunsen burner (methane)',
  propane_torch: 'Propane torch',
  other: 'Other',
};
export const orientationLabels: Record<(typeof orientations)[number], string> = {
  vertical: 'Vertical',
  angle_45: '45°',
  horizontal: 'Horizontal',
};
export const statusLabels: Record<PairStatus, string> = {
  draft: 'Draft',
  submitted: 'Waiting for review',
  signed_off: 'Signed off',
  returned: 'Returned',
};

/** The checks made before the first flame; every one must be ticked. */
export const checklistItems = [
  { key: 'extinguisher', label: 'Extinguisher within reach' },
  { key: 'ventilation', label: 'Hood or ventilation running (or outdoors, downwind clear)' },
  { key: 'tongs', label: 'Tongs and a heat-proof surface ready' },
  { key: 'secondPerson', label: 'A second person present' },
  { key: 'flammablesCleared', label: 'Flammables cleared from the area' },
] as const;
export type ChecklistKey = (typeof checklistItems)[number]['key'];
