import type { CriteriaProfileInput } from './types';

export type CriteriaPreset = CriteriaProfileInput & { key: string; caution: string };

// Every limit here is one marked confirmed in ../shared/reference/domain-facts.md §2. Parts marked
// from memory there, or that we cannot record, are named in the description and never encoded.
// The reference names no editions, so each source asks the user to check the current one.
const caution =
  'Check the current edition of the standard you follow before relying on these rules. ' +
  'A bench test judged against them is not a certification: the Authority Having Jurisdiction ' +
  '(AHJ) decides acceptance.';

const edition = 'edition: check the current edition';

export const criteriaPresets: CriteriaPreset[] = [
  {
    key: 'cfr25-app-f-60s-vertical',
    name: '14 CFR 25 App. F Part I — 60 s vertical',
    source: `14 CFR Part 25, Appendix F, Part I, 60 s vertical test; ${edition}`,
    description:
      'A 60 s flame, at least 3 specimens, results averaged. Encoded: average burn length at most ' +
      '152 mm (6 in; recorded here as char length) and average afterflame at most 15 s. Not ' +
      'encoded: the average drip flame time (at most 3 s), because drips are recorded as yes or ' +
      'no, without a time.',
    minSpecimens: 3,
    exposureS: 60,
    rules: [
      { kind: 'max_char_length_mm', limit: 152, appliesTo: 'average' },
      { kind: 'max_afterflame_s', limit: 15, appliesTo: 'average' },
    ],
    caution,
  },
  {
    key: 'cfr25-app-f-12s-vertical',
    name: '14 CFR 25 App. F Part I — 12 s vertical',
    source: `14 CFR Part 25, Appendix F, Part I, 12 s vertical test; ${edition}`,
    description:
      'A 12 s flame, at least 3 specimens, results averaged. Encoded: average burn length at most ' +
      '203 mm (8 in; recorded here as char length) and average afterflame at most 15 s. Not ' +
      'encoded: the drip flame time (at most 5 s) — from memory, unconfirmed; drips are also ' +
      'recorded as yes or no, without a time.',
    minSpecimens: 3,
    exposureS: 12,
    rules: [
      { kind: 'max_char_length_mm', limit: 203, appliesTo: 'average' },
      { kind: 'max_afterflame_s', limit: 15, appliesTo: 'average' },
    ],
    caution,
  },
  {
    key: 'astm-f1506',
    name: 'ASTM F1506 — char length',
    source: `ASTM F1506, tested by the ASTM D6413 vertical method; ${edition}`,
    description:
      'Uses the ASTM D6413 method: a 12 s flame, 10 specimens (5 per direction). Encoded: char ' +
      'length at most 152 mm (6 in) on each specimen; our reference does not say whether the ' +
      'limit applies to each specimen or to the average, so the stricter reading is used, and ' +
      'directions are not judged apart. Not encoded: afterflame at most 2 s — from memory, ' +
      'unconfirmed.',
    minSpecimens: 10,
    exposureS: 12,
    rules: [{ kind: 'max_char_length_mm', limit: 152, appliesTo: 'each' }],
    caution,
  },
  {
    key: 'nfpa-2112',
    name: 'NFPA 2112 — char length',
    source: `NFPA 2112, tested by the ASTM D6413 vertical method; ${edition}`,
    description:
      'Uses the ASTM D6413 method: a 12 s flame, 10 specimens (5 per direction). Encoded: char ' +
      'length at most 102 mm (4 in) on each specimen; our reference does not say whether the ' +
      'limit applies to each specimen or to the average, so the stricter reading is used, and ' +
      'directions are not judged apart. Not encoded: afterflame at most 2 s and no melting or ' +
      'dripping — from memory, unconfirmed.',
    minSpecimens: 10,
    exposureS: 12,
    rules: [{ kind: 'max_char_length_mm', limit: 102, appliesTo: 'each' }],
    caution,
  },
  {
    key: 'nfpa-701-tm1',
    name: 'NFPA 701 Test Method 1',
    source: `NFPA 701, Test Method 1; ${edition}`,
    description:
      'A 45 s flame, 10 specimens. Encoded: average mass loss at most 40 %. Not encoded: the ' +
      'average burn time of drips (at most 2 s), because drips are recorded as yes or no, ' +
      'without a time.',
    minSpecimens: 10,
    exposureS: 45,
    rules: [{ kind: 'max_mass_loss_pct', limit: 40, appliesTo: 'average' }],
    caution,
  },
  {
    key: 'nfpa-705-field',
    name: 'NFPA 705 field flame test',
    source: `NFPA 705, field flame test; ${edition}`,
    description:
      'A 12 s match flame. Encoded: afterflame at most 2 s, no flaming drips, and char length at ' +
      'most 101.6 mm (4 in), each on every specimen. The standard limits how far flaming reaches ' +
      'from the bottom edge; we judge that by the char length, so measure it from the bottom edge. ' +
      'NFPA 705 states that its field test has no known correlation with NFPA 701 and must not be ' +
      'the only means of acceptance.',
    minSpecimens: 1,
    exposureS: 12,
    rules: [
      { kind: 'max_afterflame_s', limit: 2, appliesTo: 'each' },
      { kind: 'no_flaming_drips', appliesTo: 'each' },
      { kind: 'max_char_length_mm', limit: 101.6, appliesTo: 'each' },
    ],
    caution,
  },
  {
    key: 'ul94-v0',
    name: 'UL 94 V-0',
    source: `UL 94, V-0 classification; ${edition}`,
    description:
      '5 specimens. UL 94 applies a 10 s flame twice; our test applies it once, so the rules are ' +
      'checked on that one application. Encoded: each afterflame at most 10 s, each afterflame ' +
      'plus afterglow at most 30 s, and no burn to the clamp. Not encoded: the total afterflame ' +
      'of the set (at most 50 s), which counts both applications, and the cotton indicator (must ' +
      'not ignite), which we do not record.',
    minSpecimens: 5,
    exposureS: 10,
    rules: [
      { kind: 'max_afterflame_s', limit: 10, appliesTo: 'each' },
      { kind: 'max_afterflame_plus_afterglow_s', limit: 30, appliesTo: 'each' },
      { kind: 'no_burn_to_clamp', appliesTo: 'each' },
    ],
    caution,
  },
  {
    key: 'fmvss-302',
    name: 'FMVSS 302 — burn rate',
    source: `FMVSS 302 (49 CFR 571.302); ${edition}`,
    description:
      'A 15 s flame. Encoded: burn rate at most 102 mm/min on each specimen, taken here as char ' +
      'length over the total burn time, an approximation of the timed flame front; our reference ' +
      'does not say whether the limit applies to each specimen or to the average, so the ' +
      'stricter reading is used. Not encoded: the other way to pass, stopping within 60 s having ' +
      'burned at most 51 mm, so a specimen that passes that way can fail here.',
    minSpecimens: 1,
    exposureS: 15,
    rules: [{ kind: 'max_burn_rate_mm_per_min', limit: 102, appliesTo: 'each' }],
    caution,
  },
];
