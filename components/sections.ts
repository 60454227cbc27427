export type Section = {
  key: string;
  title: string;
  /** The path inside a lab: /labs/<labId>/<segment> ('' is the lab's home, Today). */
  segment: string;
  /** One plain sentence of what the section holds. */
  summary: string;
  /** What the section will let you do, in the order a user meets it. */
  holds: string[];
};

export const sections: Section[] = [
  {
    key: 'today',
    title: 'Today',
    segment: '',
    summary:
      'Your day at the bench: what is soaking or drying, what is left to finish, what waits for review.',
    holds: [
      'Soak and drying timers running for your batches',
      'Drafts to finish: batches and burn tests not yet submitted',
      'Burn tests waiting for a reviewer',
    ],
  },
  {
    key: 'recipes',
    title: 'Recipes',
    segment: 'recipes',
    summary:
      'Soak recipes: which retardant salts, how much, and how to soak, drain, dry and condition.',
    holds: [
      'Recipes by substrate: paper, board, fabric, wood, loose-fill cellulose',
      'Concentrations as % of solution, g per 100 g water, g per litre or parts by mass',
      'A calculator that checks the salts stay dissolved at mixing and storage temperature',
      'Revisions: once a batch uses a recipe, an edit becomes a new revision',
    ],
  },
  {
    key: 'batches',
    title: 'Batches',
    segment: 'batches',
    summary: 'Each preparation of a recipe: what was weighed, by whom and when.',
    holds: [
      'Amounts to weigh for the batch size you need, in metric or US units',
      'Weighed against target, with deviations flagged, and chemical lot numbers',
      'Hazard cautions to read and confirm before mixing',
      'Soak and drying timers, and the log of specimens treated with their add-on',
    ],
  },
  {
    key: 'burn-tests',
    title: 'Burn tests',
    segment: 'burn-tests',
    summary:
      'Paired burn tests: a treated specimen beside an untreated control under the same conditions.',
    holds: [
      'Sessions with their conditions and a safety checklist ticked before the first flame',
      'A two-lane timer for exposure, afterflame and afterglow that works offline',
      'Char length, mass loss and before/after photos for every specimen',
      'Submission, review and sign-off, with every later correction kept in the history',
    ],
  },
  {
    key: 'rankings',
    title: 'Rankings',
    segment: 'rankings',
    summary: "Treatments ranked by char length, with honest intervals and your lab's criteria.",
    holds: [
      'Treated against control for every treatment, with 95 % confidence intervals',
      'Pass or fail against a criteria profile, naming the rule that failed',
      'How many more pairs would settle a close call',
      'A printable report and CSV export and import',
    ],
  },
  {
    key: 'lab',
    title: 'Lab',
    segment: 'lab',
    summary: "Your team's workspace: members, roles, criteria profiles and the audit log.",
    holds: [
      'Members as manager, technician, reviewer or viewer, and invitations',
      'Criteria profiles built from published test methods, editable for your lab',
      'The audit log of sign-ins, role changes and corrections',
      'Lab settings such as the weighing tolerance',
    ],
  },
];

/** Where a section lives in a lab: deep links carry the lab. */
export function sectionPath(labId: string, section: Section): string {
  return section.segment ? `/labs/${labId}/${section.segment}` : `/labs/${labId}`;
}

export function sectionByKey(key: string): Section {
  const found = sections.find((s) => s.key === key);
  if (!found) throw new Error(`Unknown section ${key}`);
  return found;
}
